//! The test binaries are few and grouped by purpose (`autotests = false` in Cargo.toml): every
//! file of `tests/` must be a module of exactly one group, or it would silently never run.

use std::collections::BTreeMap;
use std::path::Path;

/// The `[[test]]` paths declared in Cargo.toml.
fn group_roots(manifest: &str) -> Vec<String> {
    let mut roots = Vec::new();
    let mut in_test = false;
    for line in manifest.lines() {
        let line = line.trim();
        if line.starts_with('[') {
            in_test = line == "[[test]]";
        } else if in_test && line.starts_with("path") {
            if let Some(v) = line.split('"').nth(1) {
                roots.push(v.to_string());
            }
        }
    }
    roots
}

#[test]
fn every_test_file_belongs_to_exactly_one_group() {
    let root = Path::new(env!("CARGO_MANIFEST_DIR"));
    let manifest = std::fs::read_to_string(root.join("Cargo.toml")).expect("Cargo.toml");
    let roots = group_roots(&manifest);
    assert!(roots.len() >= 4, "expected the four test groups in Cargo.toml, found {roots:?}");
    let mut seen: BTreeMap<String, Vec<String>> = BTreeMap::new();
    for r in &roots {
        let text = std::fs::read_to_string(root.join(r)).expect("group root");
        for line in text.lines() {
            if let Some(rest) = line.trim().strip_prefix("#[path = \"") {
                let file = rest.split('"').next().unwrap_or_default().to_string();
                seen.entry(file).or_default().push(r.clone());
            }
        }
    }
    let mut problems = Vec::new();
    for entry in std::fs::read_dir(root.join("tests")).expect("tests folder") {
        let name = entry.expect("entry").file_name().to_string_lossy().to_string();
        if !name.ends_with(".rs") || roots.iter().any(|r| r == &format!("tests/{name}")) {
            continue;
        }
        match seen.get(&name).map(Vec::len) {
            Some(1) => {}
            Some(n) => problems.push(format!("{name} is in {n} groups")),
            None => problems.push(format!("{name} is in no group: it would never run")),
        }
    }
    assert!(problems.is_empty(), "{}", problems.join("\n"));
}
