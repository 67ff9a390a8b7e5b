//! Where text goes: data on stdout, messages on stderr, colour only on a terminal.

// Progress bars, notes and coloured tables serve commands still to come (sweeps, meshes, the
// report); the unit tests below exercise them until a command does.
#![allow(dead_code)]

use std::io::{IsTerminal, Write};

use indicatif::{ProgressBar, ProgressStyle};
use layloft::text::printable_lines;

/// The terminal side of a run.
#[derive(Debug, Clone)]
pub struct Output {
    quiet: bool,
    colour: bool,
    /// Whether stderr is a terminal (progress bars are shown only then).
    pub stderr_is_terminal: bool,
}

impl Output {
    /// Decides colour and progress from the terminal and `NO_COLOR`.
    pub fn new(quiet: bool) -> Self {
        let stderr_is_terminal = std::io::stderr().is_terminal();
        let colour = stderr_is_terminal && std::env::var_os("NO_COLOR").is_none();
        Output { quiet, colour, stderr_is_terminal }
    }

    /// A progress bar of `len` steps on stderr, labelled `message`. It is drawn only when stderr
    /// is a terminal and the run is not `--quiet` (see [`Output::progress_allowed`]); otherwise
    /// every call on it does nothing.
    pub fn progress(&self, len: u64, message: &str) -> Progress {
        if !self.progress_allowed() {
            return Progress { bar: None };
        }
        let template = if self.colour {
            "{prefix:.cyan} {msg} {bar:36.cyan/blue} {pos}/{len} {elapsed}, about {eta} left"
        } else {
            "{prefix} {msg} {bar:36} {pos}/{len} {elapsed}, about {eta} left"
        };
        // The templates are fixed text: should one ever fail to parse, the plain bar serves.
        let style = ProgressStyle::with_template(template)
            .unwrap_or_else(|_| ProgressStyle::default_bar())
            .progress_chars("=> ");
        let bar = ProgressBar::new(len).with_style(style).with_prefix("layloft:");
        bar.set_message(message.to_string());
        Progress { bar: Some(bar) }
    }

    /// Whether progress bars may be drawn.
    pub fn progress_allowed(&self) -> bool {
        !self.quiet && self.stderr_is_terminal
    }

    /// Whether stdout is a terminal (for colour in tables printed there).
    pub fn stdout_colour(&self) -> bool {
        std::io::stdout().is_terminal() && std::env::var_os("NO_COLOR").is_none()
    }

    fn paint(&self, code: &str, text: &str) -> String {
        if self.colour { format!("\x1b[{code}m{text}\x1b[0m") } else { text.to_string() }
    }

    /// An error and its chain of causes, prefixed with the tool's name.
    pub fn error(&self, e: &anyhow::Error) {
        let mut err = std::io::stderr().lock();
        let _ = writeln!(
            err,
            "{} {}",
            self.paint("1;31", "layloft: error:"),
            compact_numbers(&printable_lines(&e.to_string()))
        );
        let mut said = e.to_string();
        for cause in e.chain().skip(1) {
            // A message that already quotes its cause (`{source}` in the text) says it once.
            let text = cause.to_string();
            if !said.contains(&text) {
                let _ = writeln!(err, "  caused by: {}", compact_numbers(&printable_lines(&text)));
                said.push_str(&text);
            }
        }
    }

    /// A note on stderr, unless quiet.
    pub fn note(&self, text: &str) {
        if !self.quiet {
            let _ = writeln!(
                std::io::stderr().lock(),
                "{} {}",
                self.paint("36", "layloft:"),
                printable_lines(text)
            );
        }
    }

    /// A warning on stderr, unless quiet.
    pub fn warn(&self, text: &str) {
        if !self.quiet {
            let _ = writeln!(
                std::io::stderr().lock(),
                "{} {}",
                self.paint("33", "layloft: warning:"),
                compact_numbers(&printable_lines(text))
            );
        }
    }

    /// Data on stdout. A closed pipe ends the output quietly.
    pub fn data(&self, text: &str) {
        let mut out = std::io::stdout().lock();
        let _ = out.write_all(text.as_bytes());
        if !text.ends_with('\n') {
            let _ = out.write_all(b"\n");
        }
        let _ = out.flush();
    }
}

/// A progress bar from [`Output::progress`], or nothing when bars are not shown. The bar is
/// cleared from the terminal when finished or dropped, so a message printed after it (an error
/// on the way out included) starts on a clean line.
#[derive(Debug)]
pub struct Progress {
    bar: Option<ProgressBar>,
}

impl Progress {
    /// Advances by `steps`.
    pub fn inc(&self, steps: u64) {
        if let Some(bar) = &self.bar {
            bar.inc(steps);
        }
    }

    /// Changes the number of steps (when it is known only once the work starts).
    pub fn set_length(&self, len: u64) {
        if let Some(bar) = &self.bar {
            bar.set_length(len);
        }
    }

    /// Changes the label (e.g. the load case or station being worked on).
    pub fn set_message(&self, message: &str) {
        if let Some(bar) = &self.bar {
            bar.set_message(message.to_string());
        }
    }

    /// Steps done so far (0 when not shown).
    pub fn position(&self) -> u64 {
        self.bar.as_ref().map_or(0, ProgressBar::position)
    }

    /// Whether a bar is shown.
    pub fn is_visible(&self) -> bool {
        self.bar.is_some()
    }

    /// Ends the bar and clears it from the terminal.
    pub fn finish(self) {}
}

impl Drop for Progress {
    fn drop(&mut self) {
        if let Some(bar) = &self.bar {
            bar.finish_and_clear();
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn output(quiet: bool, terminal: bool) -> Output {
        Output { quiet, colour: terminal, stderr_is_terminal: terminal }
    }

    #[test]
    fn bars_show_only_on_a_terminal_and_not_when_quiet() {
        assert!(output(false, true).progress(10, "stations").is_visible());
        assert!(!output(true, true).progress(10, "stations").is_visible());
        assert!(!output(false, false).progress(10, "stations").is_visible());
    }

    #[test]
    fn a_bar_counts_its_steps_and_a_hidden_one_does_nothing() {
        let shown = output(false, true).progress(10, "speeds");
        shown.inc(3);
        shown.set_message("speeds, 990 rpm");
        shown.inc(2);
        assert_eq!(shown.position(), 5);
        shown.finish();
        let hidden = output(false, false).progress(10, "speeds");
        hidden.inc(3);
        assert_eq!(hidden.position(), 0);
    }
}

/// A message with every number written out in more than [`LONGEST_NUMBER`] characters (`1e-300`
/// is displayed as 0.000…0001, 302 characters, and `1e300` as 301 digits) put in scientific
/// notation: a message echoes what was typed, but never as a wall of digits.
fn compact_numbers(text: &str) -> std::borrow::Cow<'_, str> {
    let long = |run: &str| run.len() > LONGEST_NUMBER && run.parse::<f64>().is_ok();
    let runs = text.split(|c: char| !(c.is_ascii_digit() || c == '.'));
    if !runs.clone().any(long) {
        return std::borrow::Cow::Borrowed(text);
    }
    let mut out = String::with_capacity(text.len());
    let mut run = String::new();
    let flush = |run: &mut String, out: &mut String| {
        match run.parse::<f64>() {
            Ok(v) if run.len() > LONGEST_NUMBER => out.push_str(&format!("{v:e}")),
            _ => out.push_str(run),
        }
        run.clear();
    };
    for c in text.chars() {
        if c.is_ascii_digit() || c == '.' {
            run.push(c);
        } else {
            flush(&mut run, &mut out);
            out.push(c);
        }
    }
    flush(&mut run, &mut out);
    std::borrow::Cow::Owned(out)
}

/// The longest number a message shows as it is: 17 significant digits, a point, a few zeros.
const LONGEST_NUMBER: usize = 24;

#[cfg(test)]
mod number_tests {
    use super::*;

    #[test]
    fn walls_of_digits_become_scientific_and_the_rest_stays() {
        let tiny = format!("found {}: too small", 1e-300);
        assert!(tiny.len() > 300);
        assert_eq!(compact_numbers(&tiny), "found 1e-300: too small");
        let huge = format!("found {} m.", 1e300);
        assert_eq!(compact_numbers(&huge), "found 1e300 m.");
        let plain = "blade.toml line 36, load_factor: found 0.35 (version 1.2.3, 1090 rpm)";
        assert_eq!(compact_numbers(plain), plain);
        assert_eq!(
            compact_numbers("-1.25e-7 and 123456789012345678901234567890"),
            "-1.25e-7 and 1.2345678901234568e29"
        );
    }
}
