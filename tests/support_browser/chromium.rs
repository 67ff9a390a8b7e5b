//! Headless Chromium on a local HTML file, with a closed network.

use std::io::Read;
use std::path::{Path, PathBuf};
use std::process::{Command, Stdio};
use std::time::{Duration, Instant};

/// Programs tried in order.
pub const CANDIDATES: [&str; 3] = ["chromium", "chromium-browser", "/usr/bin/chromium"];

/// Flags for a closed network and a reproducible, quiet run (besides the user-data folder and
/// the output flags of each run).
const FLAGS: [&str; 13] = [
    "--headless",
    "--no-sandbox",
    "--disable-gpu",
    "--no-first-run",
    "--disable-background-networking",
    "--disable-component-update",
    "--disable-sync",
    "--disable-extensions",
    "--hide-scrollbars",
    "--force-device-scale-factor=1",
    "--enable-logging=stderr",
    "--v=0",
    "--virtual-time-budget=5000",
];

/// A run longer than this is taken as hung and killed.
const TIMEOUT: Duration = Duration::from_secs(120);

/// A Chromium found on this machine.
#[derive(Debug, Clone)]
pub struct Chromium {
    /// The program as it was found.
    pub program: String,
    /// What `--version` printed.
    pub version: String,
}

/// One console message the page produced.
#[derive(Debug, Clone, PartialEq)]
pub struct ConsoleMessage {
    /// The message text (an uncaught exception starts with "Uncaught").
    pub text: String,
    /// The document and line, as Chromium names them.
    pub source: String,
}

/// What a page looked like in the browser.
#[derive(Debug)]
pub struct Rendering {
    /// The DOM after loading, serialised.
    pub dom: String,
    /// Every console message of the three runs (DOM, screenshot, PDF).
    pub console: Vec<ConsoleMessage>,
    /// The `data-figure` value of every figure in the DOM that holds an `<svg>`.
    pub figures: Vec<String>,
    /// The screenshot (PNG).
    pub screenshot: PathBuf,
    /// Width and height of the screenshot in pixels, from its PNG header.
    pub screenshot_size: (u32, u32),
    /// The page printed to PDF (A4 by the report's print stylesheet).
    pub pdf: PathBuf,
    /// Number of pages of the PDF.
    pub pdf_pages: usize,
}

impl Chromium {
    /// The first of [`CANDIDATES`] whose `--version` runs and succeeds.
    pub fn find() -> Option<Chromium> {
        CANDIDATES.iter().find_map(|program| {
            let out = Command::new(program).arg("--version").stdin(Stdio::null()).output().ok()?;
            let version = String::from_utf8_lossy(&out.stdout).trim().to_string();
            (out.status.success() && version.to_ascii_lowercase().contains("chrom"))
                .then(|| Chromium { program: program.to_string(), version })
        })
    }

    /// Loads `page` once (fresh profile) and returns the DOM after loading and the console
    /// messages, for checks that need neither a screenshot nor a PDF.
    pub fn load(&self, page: &Path) -> Result<(String, Vec<ConsoleMessage>), String> {
        let page = page.canonicalize().map_err(|e| format!("{}: {e}", page.display()))?;
        let (dom, err) =
            self.run(&["--dump-dom".to_string()], &format!("file://{}", page.display()))?;
        Ok((dom, console_messages(&err)))
    }

    /// Loads `page` three times (fresh profile each time): dumps the DOM, takes a screenshot of
    /// `window` pixels into `out_dir/STEM.png`, prints to `out_dir/STEM.pdf`.
    pub fn render(
        &self,
        page: &Path,
        out_dir: &Path,
        stem: &str,
        window: (u32, u32),
    ) -> Result<Rendering, String> {
        let page = page.canonicalize().map_err(|e| format!("{}: {e}", page.display()))?;
        let url = format!("file://{}", page.display());
        let screenshot = out_dir.join(format!("{stem}.png"));
        let pdf = out_dir.join(format!("{stem}.pdf"));
        for old in [&screenshot, &pdf] {
            let _ = std::fs::remove_file(old);
        }

        let (dom, err_dom) = self.run(&["--dump-dom".to_string()], &url)?;
        let shot_flags = [
            format!("--screenshot={}", screenshot.display()),
            format!("--window-size={},{}", window.0, window.1),
        ];
        let (_, err_shot) = self.run(&shot_flags, &url)?;
        let pdf_flags =
            [format!("--print-to-pdf={}", pdf.display()), "--no-pdf-header-footer".into()];
        let (_, err_pdf) = self.run(&pdf_flags, &url)?;

        let png = std::fs::read(&screenshot)
            .map_err(|e| format!("no screenshot at {}: {e}\n{err_shot}", screenshot.display()))?;
        let screenshot_size =
            png_size(&png).ok_or_else(|| format!("{} is not a PNG image", screenshot.display()))?;
        let pdf_bytes = std::fs::read(&pdf)
            .map_err(|e| format!("no PDF at {}: {e}\n{err_pdf}", pdf.display()))?;
        let console =
            [&err_dom, &err_shot, &err_pdf].iter().flat_map(|e| console_messages(e)).collect();
        Ok(Rendering {
            figures: drawn_figures(&dom),
            dom,
            console,
            screenshot,
            screenshot_size,
            pdf,
            pdf_pages: pdf_page_count(&pdf_bytes),
        })
    }

    /// One browser run: stdout and stderr, or an error with stderr when it fails or hangs.
    fn run(&self, extra: &[String], url: &str) -> Result<(String, String), String> {
        let profile = tempfile::tempdir().map_err(|e| format!("no temporary profile: {e}"))?;
        let mut child = Command::new(&self.program)
            .args(FLAGS)
            .arg(format!("--user-data-dir={}", profile.path().display()))
            .args(extra)
            .arg(url)
            .stdin(Stdio::null())
            .stdout(Stdio::piped())
            .stderr(Stdio::piped())
            .spawn()
            .map_err(|e| format!("cannot start {}: {e}", self.program))?;
        // Read both pipes on their own threads so that neither can fill up and stall the browser.
        let mut stdout = child.stdout.take().ok_or("no stdout pipe")?;
        let mut stderr = child.stderr.take().ok_or("no stderr pipe")?;
        let out_reader = std::thread::spawn(move || {
            let mut s = Vec::new();
            let _ = stdout.read_to_end(&mut s);
            s
        });
        let err_reader = std::thread::spawn(move || {
            let mut s = Vec::new();
            let _ = stderr.read_to_end(&mut s);
            s
        });
        let start = Instant::now();
        let status = loop {
            match child.try_wait().map_err(|e| e.to_string())? {
                Some(status) => break status,
                None if start.elapsed() > TIMEOUT => {
                    let _ = child.kill();
                    let _ = child.wait();
                    return Err(format!(
                        "{} {extra:?} did not finish in {TIMEOUT:?}",
                        self.program
                    ));
                }
                None => std::thread::sleep(Duration::from_millis(50)),
            }
        };
        let out = String::from_utf8_lossy(&out_reader.join().unwrap_or_default()).into_owned();
        let err = String::from_utf8_lossy(&err_reader.join().unwrap_or_default()).into_owned();
        if !status.success() {
            return Err(format!("{} {extra:?} exited with {status}:\n{err}", self.program));
        }
        Ok((out, err))
    }
}

/// Console messages in Chromium's stderr log (`--enable-logging=stderr`): lines such as
/// `[..:INFO:CONSOLE:12] "text", source: file:///x.html (12)` (newer) or
/// `[..:INFO:CONSOLE(12)] "text", source: ...` (older), and any other line that reports an
/// uncaught exception. Chromium logs every console level the same way, so every message counts:
/// the report has no scripts, and any message means something is wrong.
pub fn console_messages(stderr: &str) -> Vec<ConsoleMessage> {
    stderr
        .lines()
        .filter_map(|line| {
            if let Some(at) = line.find(":CONSOLE") {
                let rest = &line[at..];
                let body = rest.find("] ").map(|k| &rest[k + 2..]).unwrap_or(rest);
                let (text, source) = match body.rfind(", source: ") {
                    Some(k) => (&body[..k], &body[k + ", source: ".len()..]),
                    None => (body, ""),
                };
                let text = text.trim().trim_matches('"').to_string();
                Some(ConsoleMessage { text, source: source.trim().to_string() })
            } else if line.contains("Uncaught") {
                Some(ConsoleMessage { text: line.trim().to_string(), source: String::new() })
            } else {
                None
            }
        })
        .collect()
}

/// The `data-figure` value of every `<figure>` in a serialised DOM whose content holds an
/// `<svg>` element, in document order.
pub fn drawn_figures(dom: &str) -> Vec<String> {
    let mut found = Vec::new();
    let mut rest = dom;
    while let Some(start) = rest.find("<figure") {
        let tail = &rest[start..];
        let tag_end = tail.find('>').unwrap_or(tail.len());
        let tag = &tail[..tag_end];
        let body_end = tail.find("</figure>").unwrap_or(tail.len());
        if let Some(k) = tag.find("data-figure=\"") {
            let value = &tag[k + "data-figure=\"".len()..];
            let value = &value[..value.find('"').unwrap_or(value.len())];
            if tail[tag_end..body_end].contains("<svg") {
                found.push(value.to_string());
            }
        }
        rest = &tail[tag_end.max(1)..];
    }
    found
}

/// Width and height from a PNG's IHDR chunk, or `None` when the bytes are not a PNG.
fn png_size(png: &[u8]) -> Option<(u32, u32)> {
    const SIGNATURE: [u8; 8] = [0x89, b'P', b'N', b'G', 0x0d, 0x0a, 0x1a, 0x0a];
    if png.len() < 24 || png[..8] != SIGNATURE || &png[12..16] != b"IHDR" {
        return None;
    }
    let be = |b: &[u8]| u32::from_be_bytes([b[0], b[1], b[2], b[3]]);
    Some((be(&png[16..20]), be(&png[20..24])))
}

/// Page objects in a PDF (`/Type /Page`, not `/Pages`); Chromium writes them uncompressed.
fn pdf_page_count(pdf: &[u8]) -> usize {
    let key = b"/Type /Page";
    pdf.windows(key.len() + 1)
        .filter(|w| &w[..key.len()] == key && !w[key.len()].is_ascii_alphabetic())
        .count()
}
