//! The input gate under careless edits: the demo projects mutated the way a user slips (a row
//! deleted or pasted twice, a number scaled by a power of ten, two columns swapped, a key
//! dropped, a unit suffix changed, a value made negative or not a number), each run through
//! the binary. Seeded and bounded in trials and time so that it runs well under a minute in a
//! debug build; a failure prints the seed, the trial and the edit, so it can be replayed.
//!
//! Asserted for every trial: no panic, no abort (a signal), an exit status of 0, 1 or 2 (an
//! input fault is never an internal failure, 3); every exit-2 message names a file and a line
//! or a key; and after an exit 2 nothing is left in the output folder.

use std::fs;
use std::path::{Path, PathBuf};
use std::time::{Duration, Instant};

use crate::support_run::Command;

/// The seed of the trials (any value; fixed so that a run is repeatable).
const SEED: u64 = 0x6c61_796c_6f66_7431;
/// Most trials in one run.
const MAX_TRIALS: usize = 40;
/// No trial starts after this much time, so that a slow machine stays well under a minute.
const BUDGET: Duration = Duration::from_secs(20);

/// SplitMix64 (Steele, Lea & Flood, "Fast splittable pseudorandom number generators", OOPSLA
/// 2014): a small, well-mixed generator so that the test needs no crate.
struct Rng(u64);

impl Rng {
    fn next(&mut self) -> u64 {
        self.0 = self.0.wrapping_add(0x9e37_79b9_7f4a_7c15);
        let mut z = self.0;
        z = (z ^ (z >> 30)).wrapping_mul(0xbf58_476d_1ce4_e5b9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94d0_49bb_1331_11eb);
        z ^ (z >> 31)
    }

    fn below(&mut self, n: usize) -> usize {
        (self.next() % n.max(1) as u64) as usize
    }

    fn pick<'a, T>(&mut self, items: &'a [T]) -> &'a T {
        &items[self.below(items.len())]
    }
}

/// The byte ranges of the numbers in `text` that stand alone (not part of a name such as
/// `E1_GPa` or `naca4418`).
fn numbers(text: &str) -> Vec<(usize, usize)> {
    let b = text.as_bytes();
    let is_word = |c: u8| c.is_ascii_alphanumeric() || c == b'_' || c == b'.';
    let mut out = Vec::new();
    let mut i = 0;
    while i < b.len() {
        let starts = (b[i].is_ascii_digit()
            || (b[i] == b'-' && b.get(i + 1).is_some_and(u8::is_ascii_digit)))
            && (i == 0 || !is_word(b[i - 1]));
        if !starts {
            i += 1;
            continue;
        }
        let mut j = i + 1;
        while j < b.len()
            && (b[j].is_ascii_digit()
                || b[j] == b'.'
                || ((b[j] == b'e' || b[j] == b'E') && j + 1 < b.len())
                || ((b[j] == b'-' || b[j] == b'+') && (b[j - 1] == b'e' || b[j - 1] == b'E')))
        {
            j += 1;
        }
        if j >= b.len() || !(b[j].is_ascii_alphabetic() || b[j] == b'_') {
            out.push((i, j));
        }
        i = j;
    }
    out
}

/// Lines that carry data (not blank, not a comment).
fn data_lines(text: &str) -> Vec<usize> {
    text.lines()
        .enumerate()
        .filter(|(_, l)| !l.trim().is_empty() && !l.trim_start().starts_with('#'))
        .map(|(i, _)| i)
        .collect()
}

fn with_lines(text: &str, f: impl FnOnce(&mut Vec<String>)) -> String {
    let mut lines: Vec<String> = text.lines().map(str::to_string).collect();
    f(&mut lines);
    lines.join("\n") + "\n"
}

/// One careless edit of one file's text, and its description.
fn mutate(rng: &mut Rng, file: &str, text: &str) -> (String, String) {
    let lines = data_lines(text);
    let csv = file.ends_with(".csv");
    match rng.below(8) {
        0 if !lines.is_empty() => {
            let i = *rng.pick(&lines);
            (format!("delete line {}", i + 1), with_lines(text, |l| drop(l.remove(i))))
        }
        1 if !lines.is_empty() => {
            let i = *rng.pick(&lines);
            (format!("paste line {} twice", i + 1), with_lines(text, |l| l.insert(i, l[i].clone())))
        }
        2 if csv => {
            // Swap two columns of the header: the data now sit under the wrong names.
            let header = lines[0];
            let mut cols: Vec<String> =
                text.lines().nth(header).unwrap_or("").split(',').map(str::to_string).collect();
            let (a, b) = (rng.below(cols.len()), rng.below(cols.len()));
            cols.swap(a, b);
            let joined = cols.join(",");
            (
                format!("swap columns {} and {}", a + 1, b + 1),
                with_lines(text, |l| l[header] = joined),
            )
        }
        3 if !csv => {
            // Drop a key.
            let keys: Vec<usize> = lines
                .iter()
                .copied()
                .filter(|&i| text.lines().nth(i).is_some_and(|l| l.contains('=')))
                .collect();
            if keys.is_empty() {
                return (String::from("no edit"), text.to_string());
            }
            let i = *rng.pick(&keys);
            (format!("drop the key on line {}", i + 1), with_lines(text, |l| drop(l.remove(i))))
        }
        4 => {
            // A unit suffix changed (a value now named in another unit, or an unknown key).
            let units = [
                ("_m", "_mm"),
                ("_mm", "_m"),
                ("_GPa", "_MPa"),
                ("_MPa", "_GPa"),
                ("_deg", "_rad"),
                ("_kg", "_g"),
                ("_C", "_K"),
            ];
            let (from, to) = *rng.pick(&units);
            let hits: Vec<usize> = text.match_indices(from).map(|(i, _)| i).collect();
            if hits.is_empty() {
                return (String::from("no edit"), text.to_string());
            }
            let at = *rng.pick(&hits);
            let edited = format!("{}{to}{}", &text[..at], &text[at + from.len()..]);
            (format!("unit {from} -> {to} at byte {at}"), edited)
        }
        _ => {
            let nums = numbers(text);
            if nums.is_empty() {
                return (String::from("no edit"), text.to_string());
            }
            let (a, b) = *rng.pick(&nums);
            let old = &text[a..b];
            let value: f64 = old.parse().unwrap_or(1.0);
            let new = match rng.below(6) {
                0 => "-".to_string() + old.trim_start_matches('-'),
                1 => "0".to_string(),
                2 => "nan".to_string(),
                _ => {
                    let k = *rng.pick(&[-12, -6, -3, -1, 1, 3, 6, 12]);
                    format!("{:e}", value * 10f64.powi(k))
                }
            };
            (
                format!("'{old}' -> '{new}' at byte {a}"),
                format!("{}{new}{}", &text[..a], &text[b..]),
            )
        }
    }
}

fn copy_demo(demo: &str, to: &Path) -> Vec<String> {
    let from = Path::new(env!("CARGO_MANIFEST_DIR")).join("layups").join(demo);
    let mut files = Vec::new();
    for entry in fs::read_dir(&from).expect("demo folder") {
        let entry = entry.expect("entry");
        let name = entry.file_name().to_string_lossy().into_owned();
        fs::copy(entry.path(), to.join(&name)).expect("copy");
        if name.ends_with(".toml") || name.ends_with(".csv") {
            files.push(name);
        }
    }
    files.sort();
    files
}

/// The copy's tooling at a 0.5 mm chordal tolerance (the mine-fan demo's is 0.1 mm), before
/// the edit, so that the edit can still fall on the key. What the gate asserts (exit status,
/// no panic, the place in the message, nothing left behind) does not depend on how fine the
/// meshes are, and a tooling trial then costs a fraction of its time: more trials fit in the
/// budget. The text keeps its length and its numbers, so the trials are the same edits.
fn coarse_tooling(dir: &Path) {
    let toml = dir.join("blade.toml");
    let text = fs::read_to_string(&toml).expect("blade.toml");
    if text.contains("tolerance_mm = 0.1\n") {
        fs::write(&toml, text.replace("tolerance_mm = 0.1\n", "tolerance_mm = 0.5\n"))
            .expect("write");
    }
}

/// Whether the copy's blade.toml names a tolerance.
fn has_tolerance_key(dir: &Path) -> bool {
    fs::read_to_string(dir.join("blade.toml")).is_ok_and(|t| t.contains("tolerance_mm"))
}

/// Whether an error message names a file with a line or a key: `FILE line N`, `FILE, KEY`, a
/// file and `(station near line N)`, or a command option (`--tolerance-mm: ...`).
fn names_its_place(message: &str) -> bool {
    let m = message.trim_start_matches("layloft: error: ");
    if m.starts_with("--") {
        return true;
    }
    let Some(colon) = m.find(": ") else { return false };
    let place = &m[..colon];
    let file = [".toml", ".csv", ".dat"].iter().any(|e| place.contains(e));
    // A blade error names the plies file and the nearest station's line in its text.
    let line = place.contains(" line ") || m.contains("(station near line ");
    let key = place.contains(", ");
    file && (line || key)
}

fn entries(dir: &Path) -> Vec<PathBuf> {
    fs::read_dir(dir)
        .map(|d| d.filter_map(|e| e.ok().map(|e| e.path())).collect())
        .unwrap_or_default()
}

#[test]
fn careless_edits_of_the_demos_never_crash_and_always_name_the_place() {
    // A longer search with another seed: LAYLOFT_MUTATION_SEED=N LAYLOFT_MUTATION_SECONDS=S.
    let env = |k: &str| std::env::var(k).ok().and_then(|v| v.parse::<u64>().ok());
    let seed = env("LAYLOFT_MUTATION_SEED").unwrap_or(SEED);
    let budget = env("LAYLOFT_MUTATION_SECONDS").map_or(BUDGET, Duration::from_secs);
    let max_trials = if budget > BUDGET { usize::MAX } else { MAX_TRIALS };
    let start = Instant::now();
    let mut rng = Rng(seed);
    let mut faults = Vec::new();
    let mut counts = [0usize; 4];
    let mut trials = 0;
    while trials < max_trials && start.elapsed() < budget {
        trials += 1;
        let demo = *rng.pick(&["mine-fan", "small-wind", "round-root"]);
        let dir = tempfile::tempdir().expect("temporary folder");
        let files = copy_demo(demo, dir.path());
        coarse_tooling(dir.path());
        let keyless = !has_tolerance_key(dir.path());
        let file = rng.pick(&files).clone();
        let path = dir.path().join(&file);
        let text = fs::read_to_string(&path).expect("demo file");
        let (edit, edited) = mutate(&mut rng, &file, &text);
        fs::write(&path, edited).expect("write");
        // Mostly the design check; now and then the tooling, which writes into a folder.
        // (Not the round root: its tooling is refused as a whole, sharp and blunt trailing
        // edges mixed, with a message that names blade.toml alone.)
        let tooling = rng.below(4) == 0 && demo != "round-root";
        let out_dir = dir.path().join("out");
        fs::create_dir(&out_dir).expect("output folder");
        let mut cmd = Command::cargo_bin("layloft").expect("binary");
        cmd.arg(if tooling { "tooling" } else { "check" }).arg(dir.path().join("blade.toml"));
        if tooling {
            cmd.arg("--out").arg(&out_dir);
            if keyless {
                // A demo without the key (no [tooling] table): the same coarse tolerance from
                // the command line, which then shadows nothing the edit could touch.
                cmd.args(["--tolerance-mm", "0.5"]);
            }
        }
        let out = cmd
            .arg("--quiet")
            .env("NO_COLOR", "1")
            .timeout(Duration::from_secs(60))
            .output()
            .expect("layloft runs");
        let stderr = String::from_utf8_lossy(&out.stderr).to_string();
        let what = format!("trial {trials} (seed {seed:#x}): {demo}/{file}: {edit}");
        match out.status.code() {
            Some(c @ 0..=2) => counts[c as usize] += 1,
            Some(c) => faults.push(format!("{what}: exit status {c}: {stderr}")),
            None => {
                faults.push(format!("{what}: killed by a signal (abort or time-out): {stderr}"))
            }
        }
        if stderr.contains("panicked") {
            faults.push(format!("{what}: panic: {stderr}"));
        }
        if out.status.code() == Some(2) {
            let message = stderr.lines().find(|l| l.starts_with("layloft: error:")).unwrap_or("");
            if !names_its_place(message) {
                faults.push(format!(
                    "{what}: the message names no file with a line or key: {stderr}"
                ));
            }
            let left = entries(&out_dir);
            if !left.is_empty() {
                faults.push(format!("{what}: files left in the output folder: {left:?}"));
            }
        }
    }
    eprintln!(
        "{trials} trials in {:.1} s: exit 0 x{}, 1 x{}, 2 x{}",
        start.elapsed().as_secs_f64(),
        counts[0],
        counts[1],
        counts[2]
    );
    assert!(trials >= 10, "only {trials} trials ran in the time budget");
    assert!(faults.is_empty(), "{} faults:\n{}", faults.len(), faults.join("\n"));
}

#[test]
fn the_place_checker_tells_placed_messages_from_bare_ones() {
    assert!(names_its_place("layloft: error: DIR/blade.toml line 7, rotor.blades: expected"));
    assert!(names_its_place(
        "layloft: error: DIR/plies.csv line 4, angle_deg: 'x' is not a number"
    ));
    assert!(names_its_place("layloft: error: --tolerance-mm: expected a tolerance"));
    assert!(!names_its_place(
        "layloft: error: section at r = 0.4000 m: degenerate outer contour: x"
    ));
    assert!(!names_its_place("layloft: error: DIR/plies.csv: expected at least one ply"));
    assert_eq!(numbers("E1_GPa = 135\nr_m,x\n0.40,-1e-3,naca4418"), [(9, 12), (19, 23), (24, 29)]);
}
