//! Where text goes: data on stdout, messages on stderr, colour only on a terminal.

// Progress bars, notes and coloured tables serve commands still to come.
#![allow(dead_code)]

use std::io::{IsTerminal, Write};

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
        let _ = writeln!(err, "{} {e}", self.paint("1;31", "layloft: error:"));
        let mut said = e.to_string();
        for cause in e.chain().skip(1) {
            // A message that already quotes its cause (`{source}` in the text) says it once.
            let text = cause.to_string();
            if !said.contains(&text) {
                let _ = writeln!(err, "  caused by: {text}");
                said.push_str(&text);
            }
        }
    }

    /// A note on stderr, unless quiet.
    pub fn note(&self, text: &str) {
        if !self.quiet {
            let _ = writeln!(std::io::stderr().lock(), "{} {text}", self.paint("36", "layloft:"));
        }
    }

    /// A warning on stderr, unless quiet.
    pub fn warn(&self, text: &str) {
        if !self.quiet {
            let _ = writeln!(
                std::io::stderr().lock(),
                "{} {text}",
                self.paint("33", "layloft: warning:")
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
