//! The crate's modules depend on each other in one direction only: a module may use the modules
//! before it in the flow
//!
//! `units, interp, parallel, text → mesh → material → laminate → failure → airfoil → project →
//! input → layout → blade → section → buckling, loads, modal → analysis → stress, tooling,
//! plybook → check → error → output → report → cli`
//!
//! and never one after it. The domain model `project` holds airfoil outlines and a material
//! library, so it comes after them; the reader `input` fills a `project::Project`, so it comes
//! after the model. The materials find a misspelt name with `text::closest`, and an airfoil
//! coordinate file reports its faults with its own error (`airfoil::CoordinateError`), so neither
//! needs the reader. `layout` (a section's walls) sits between the blade that builds it and the
//! section solver that takes it; `mesh` is a general triangle-mesh kit; `output` is the only
//! module that writes files.
//!
//! This test lists every `crate::module` reference outside test code and fails on an edge against
//! the flow that is not in `KNOWN_DEBTS`. The debts are the edges the structure issue names; each
//! is removed from the list when it is paid, and a listed debt that no longer occurs fails the
//! test, so the list only shrinks.

use std::collections::BTreeSet;
use std::path::Path;

/// The flow, earliest first; modules on one level do not use each other.
const LEVELS: &[&[&str]] = &[
    &["units", "interp", "parallel", "text"],
    &["mesh"],
    &["material"],
    &["laminate"],
    &["failure"],
    &["airfoil"],
    &["project"],
    &["input"],
    &["layout"],
    &["blade"],
    &["section"],
    &["buckling", "loads", "modal"],
    &["analysis"],
    &["stress", "tooling", "plybook"],
    &["check"],
    &["error"],
    &["output"],
    &["report"],
    &["cli"],
];

/// Edges against the flow that exist today, `(from, to)`: none left (`analysis` returns its own
/// error, which `error` places in the project's files).
const KNOWN_DEBTS: &[(&str, &str)] = &[];

fn level(module: &str) -> Option<usize> {
    LEVELS.iter().position(|l| l.contains(&module))
}

/// The code of a file without its test module and without comments (a doc link to a later
/// module is not a dependency).
fn code_of(text: &str) -> String {
    let text = match text.find("#[cfg(test)]") {
        Some(i) => &text[..i],
        None => text,
    };
    text.lines().filter(|l| !l.trim_start().starts_with("//")).collect::<Vec<_>>().join("\n")
}

fn edges() -> BTreeSet<(String, String, String)> {
    let src = Path::new(env!("CARGO_MANIFEST_DIR")).join("src");
    let mut out = BTreeSet::new();
    let mut stack = vec![src.clone()];
    while let Some(dir) = stack.pop() {
        for entry in std::fs::read_dir(&dir).expect("src folder") {
            let path = entry.expect("entry").path();
            if path.is_dir() {
                stack.push(path);
                continue;
            }
            if path.extension().and_then(|e| e.to_str()) != Some("rs") {
                continue;
            }
            let rel = path.strip_prefix(&src).expect("under src").to_string_lossy().to_string();
            let from =
                rel.split('/').next().unwrap_or_default().trim_end_matches(".rs").to_string();
            if from == "lib" || from == "main" {
                continue;
            }
            let text = std::fs::read_to_string(&path).expect("source file");
            let code = code_of(&text);
            for (i, _) in code.match_indices("crate::") {
                let rest = &code[i + "crate::".len()..];
                let word: String =
                    rest.chars().take_while(|c| c.is_ascii_alphanumeric() || *c == '_').collect();
                let to =
                    if word == "Error" || word == "Result" { "error".to_string() } else { word };
                if to != from && level(&to).is_some() {
                    out.insert((from.clone(), to, rel.clone()));
                }
            }
        }
    }
    out
}

#[test]
fn modules_use_only_modules_before_them_in_the_flow() {
    let edges = edges();
    assert!(!edges.is_empty(), "no module references found: the scan is broken");
    let mut against = Vec::new();
    let mut found_debts = BTreeSet::new();
    for (from, to, file) in &edges {
        let (Some(a), Some(b)) = (level(from), level(to)) else {
            against.push(format!("src/{file}: module '{from}' or '{to}' has no place in the flow"));
            continue;
        };
        if b >= a && from != "cli" {
            if KNOWN_DEBTS.contains(&(from.as_str(), to.as_str())) {
                found_debts.insert((from.clone(), to.clone()));
            } else {
                against.push(format!("src/{file}: '{from}' uses '{to}', which comes after it"));
            }
        }
    }
    assert!(against.is_empty(), "edges against the module flow:\n{}", against.join("\n"));
    let paid: Vec<_> = KNOWN_DEBTS
        .iter()
        .filter(|(f, t)| !found_debts.contains(&(f.to_string(), t.to_string())))
        .collect();
    assert!(paid.is_empty(), "debts no longer found, remove them from KNOWN_DEBTS: {paid:?}");
}
