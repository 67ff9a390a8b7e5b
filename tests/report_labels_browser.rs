//! Figures without defects, as the browser draws them: in the report of each demo and of a test
//! blade with point masses near the tip and a rotor harmonic that is also a blade-passing order,
//! no two text labels of a figure overlap and none leaves its drawing's box. The boxes are the
//! rendered ones (`getBoundingClientRect` in headless Chromium, after fonts and layout), read
//! from a copy of the report with a probe script added; the report itself has no scripts.
//!
//! Without Chromium the test says so and checks nothing more than that the reports are written
//! (`LAYLOFT_REQUIRE_BROWSER=1` makes a missing browser a failure), as the other browser tests.

use std::fs;
use std::path::Path;

use crate::support_browser::{browser_or_skip, demo_report};
use crate::support_run::Command;

/// The mine-fan demo, whose report is the one the binary's tests share.
const DEMO: &str = "layups/mine-fan";

/// Collects, for every figure, the texts that leave the drawing and the pairs that overlap by
/// more than a pixel each way (glyph boxes of neighbouring lines may touch), and writes them
/// into `<pre id="label-probe">`.
const PROBE: &str = r#"<script>
(function () {
  const found = [];
  const clean = (s) => s.replace(/\s+/g, ' ').trim();
  for (const fig of document.querySelectorAll('[data-figure]')) {
    const svg = fig.querySelector('svg');
    if (!svg) continue;
    const name = fig.getAttribute('data-figure');
    const box = svg.getBoundingClientRect();
    const texts = [...svg.querySelectorAll('text')]
      .filter((t) => clean(t.textContent).length > 0)
      .map((t) => ({ t: clean(t.textContent), b: t.getBoundingClientRect() }));
    for (const x of texts) {
      if (x.b.left < box.left - 1 || x.b.right > box.right + 1 ||
          x.b.top < box.top - 1 || x.b.bottom > box.bottom + 1) {
        found.push('outside ' + name + ': "' + x.t + '"');
      }
    }
    for (let i = 0; i < texts.length; i++) {
      for (let j = i + 1; j < texts.length; j++) {
        const a = texts[i].b, b = texts[j].b;
        const w = Math.min(a.right, b.right) - Math.max(a.left, b.left);
        const h = Math.min(a.bottom, b.bottom) - Math.max(a.top, b.top);
        if (w > 1 && h > 1) {
          found.push('overlap ' + name + ': "' + texts[i].t + '" and "' + texts[j].t + '"');
        }
      }
    }
  }
  const pre = document.createElement('pre');
  pre.id = 'label-probe';
  pre.textContent = found.join('\n');
  document.body.appendChild(pre);
})();
</script>"#;

/// Writes the report of `project` into `out` (the mine-fan demo's is the one the binary's
/// tests share, already written) and returns the probe page beside it.
fn report_with_probe(project: &Path, out: &Path) -> std::path::PathBuf {
    let (out, status) = if project == Path::new(DEMO) {
        let (dir, output) = demo_report();
        (dir.as_path(), output.clone())
    } else {
        let output = Command::cargo_bin("layloft")
            .unwrap()
            .current_dir(env!("CARGO_MANIFEST_DIR"))
            .arg("report")
            .arg(project)
            .arg("--out")
            .arg(out)
            .output()
            .unwrap();
        (out, output)
    };
    assert!(
        status.status.code().is_some_and(|c| c == 0 || c == 1),
        "report of {}: {}",
        project.display(),
        String::from_utf8_lossy(&status.stderr)
    );
    let html = fs::read_to_string(out.join("report.html")).unwrap();
    let probe = out.join("probe.html");
    fs::write(&probe, html.replace("</body>", &format!("{PROBE}\n</body>"))).unwrap();
    probe
}

/// A copy of the mine-fan demo with six blades (so that 6P is also the blade-passing order 1B)
/// and two point masses near the tip, with long names.
fn crowded_blade(dir: &Path) -> std::path::PathBuf {
    let src = Path::new(env!("CARGO_MANIFEST_DIR")).join("layups/mine-fan");
    for entry in fs::read_dir(&src).unwrap() {
        let entry = entry.unwrap();
        if entry.path().is_file() {
            fs::copy(entry.path(), dir.join(entry.file_name())).unwrap();
        }
    }
    let toml = fs::read_to_string(dir.join("blade.toml")).unwrap();
    assert!(toml.contains("blades = 9") && toml.contains("harmonics = 6"));
    // Before the first load case only: point mass names are unique.
    let toml = toml.replace("blades = 9", "blades = 6").replacen(
        "[[load_case]]",
        "[[point_mass]]\nname = \"tip balance weight, outer\"\nr_m = 0.88\nmass_kg = 0.004\n\n\
         [[point_mass]]\nname = \"tip balance weight, inner\"\nr_m = 0.87\nmass_kg = 0.003\n\n\
         [[load_case]]",
        1,
    );
    fs::write(dir.join("blade.toml"), toml).unwrap();
    dir.join("blade.toml")
}

#[test]
fn no_label_overlaps_another_or_leaves_its_figure() {
    let tmp = tempfile::tempdir().unwrap();
    let crowded = tmp.path().join("crowded");
    fs::create_dir(&crowded).unwrap();
    let projects = [
        Path::new(DEMO).to_path_buf(),
        Path::new("layups/small-wind").to_path_buf(),
        crowded_blade(&crowded),
    ];
    // The reports are written side by side, and the pages loaded side by side: each is a
    // process of its own (a browser run has its own profile folder).
    let pages: Vec<_> = std::thread::scope(|s| {
        let runs: Vec<_> = projects
            .iter()
            .enumerate()
            .map(|(i, project)| {
                let out = tmp.path().join(format!("report-{i}"));
                s.spawn(move || (project.clone(), report_with_probe(project, &out)))
            })
            .collect();
        runs.into_iter().map(|r| r.join().expect("the report run")).collect()
    });
    let Some(browser) = browser_or_skip("figure labels") else { return };
    let doms: Vec<String> = std::thread::scope(|s| {
        let loads: Vec<_> = pages
            .iter()
            .map(|(_, page)| {
                let browser = &browser;
                s.spawn(move || browser.load(page).unwrap().0)
            })
            .collect();
        loads.into_iter().map(|l| l.join().expect("the browser run")).collect()
    });
    let mut problems = Vec::new();
    for ((project, _), dom) in pages.iter().zip(&doms) {
        let marker = "<pre id=\"label-probe\">";
        let start = dom.find(marker).expect("the probe script ran") + marker.len();
        let end = start + dom[start..].find("</pre>").expect("the probe's output is closed");
        for line in dom[start..end].lines().filter(|l| !l.trim().is_empty()) {
            problems.push(format!("{}: {}", project.display(), line.trim()));
        }
    }
    assert!(problems.is_empty(), "figure labels:\n{}", problems.join("\n"));
}
