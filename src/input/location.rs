//! Where in which file something is, and the input error that says so.

use crate::text::{printable, printable_lines};
use std::fmt;
use std::path::{Path, PathBuf};

/// A place in an input file: the file, and where known the line (1-based) and the key or column.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Location {
    /// The file as the user named it (or as joined to the project folder).
    pub file: String,
    /// 1-based line, where known.
    pub line: Option<usize>,
    /// The key (`lamina.carbon.E1_GPa`) or column (`angle_deg`), where known.
    pub field: Option<String>,
}

impl Location {
    /// The whole file.
    pub fn file(file: impl Into<String>) -> Self {
        Location { file: file.into(), line: None, field: None }
    }

    /// A line of a file.
    pub fn line(file: impl Into<String>, line: usize) -> Self {
        Location { file: file.into(), line: Some(line), field: None }
    }

    /// The same place with a key or column named.
    pub fn with_field(mut self, field: impl Into<String>) -> Self {
        self.field = Some(field.into());
        self
    }
}

impl fmt::Display for Location {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&printable(&self.file))?;
        if let Some(line) = self.line {
            write!(f, " line {line}")?;
        }
        if let Some(field) = &self.field {
            write!(f, ", {}", printable(field))?;
        }
        Ok(())
    }
}

/// Bad input: where, and what is wrong.
#[derive(Debug, thiserror::Error)]
pub enum InputError {
    /// A file that cannot be read.
    #[error("{}: cannot read the file: {source}", printable(file))]
    Read {
        /// The file.
        file: String,
        /// The reason.
        #[source]
        source: std::io::Error,
    },
    /// A value, key, row or reference that is wrong.
    #[error("{location}: {}", printable_lines(message))]
    Invalid {
        /// Where.
        location: Location,
        /// What was expected and what was found, with a hint where one helps.
        message: String,
    },
}

impl InputError {
    /// An error at `location`.
    pub fn at(location: Location, message: impl Into<String>) -> Self {
        InputError::Invalid { location, message: message.into() }
    }

    /// The location, where there is one.
    pub fn location(&self) -> Option<&Location> {
        match self {
            InputError::Invalid { location, .. } => Some(location),
            InputError::Read { .. } => None,
        }
    }
}

/// The text of an input file with its display name, able to turn byte offsets into lines.
#[derive(Debug, Clone)]
pub struct SourceText {
    /// Display name of the file.
    pub name: String,
    /// The whole text.
    pub text: String,
    line_starts: Vec<usize>,
}

impl SourceText {
    /// Reads a file; `display` is how messages name it. Only a regular file of at most
    /// [`MAX_INPUT_BYTES`] is read; line ends `\n`, `\r\n` and `\r` are all accepted.
    pub fn read(path: &Path, display: &str) -> Result<Self, InputError> {
        Ok(SourceText::new(display, read_text(path, display)?))
    }

    /// A text held in memory.
    pub fn new(name: &str, text: String) -> Self {
        let mut line_starts = vec![0];
        line_starts.extend(text.match_indices('\n').map(|(i, _)| i + 1));
        SourceText { name: name.to_string(), text, line_starts }
    }

    /// 1-based line of a byte offset.
    pub fn line_of(&self, offset: usize) -> usize {
        match self.line_starts.binary_search(&offset) {
            Ok(i) => i + 1,
            Err(i) => i,
        }
    }

    /// A location at a byte offset.
    pub fn location(&self, offset: usize) -> Location {
        Location::line(self.name.clone(), self.line_of(offset))
    }
}

/// The largest input file read, bytes. The largest inputs of a real blade are load tables and
/// ply schedules of some thousands of rows (a few hundred kB); 16 MiB leaves room for a finely
/// sampled load file while a device or a runaway file (`/dev/zero`) is refused at once.
pub const MAX_INPUT_BYTES: u64 = 16 << 20;

/// Reads an input file as bytes: only a regular file (not a device, a FIFO or a folder), of at
/// most [`MAX_INPUT_BYTES`], checked before it is opened and again while it is read.
pub fn read_bytes(path: &Path, display: &str) -> Result<Vec<u8>, InputError> {
    use std::io::Read;
    let io_error = |source| InputError::Read { file: display.to_string(), source };
    let meta = std::fs::metadata(path).map_err(io_error)?;
    if !meta.is_file() {
        let kind = if meta.is_dir() {
            "a folder"
        } else {
            "not a regular file (a device, a pipe or a socket)"
        };
        return Err(InputError::at(
            Location::file(display),
            format!("expected a regular file, found {kind}"),
        ));
    }
    let too_big = |size: u64| {
        InputError::at(
            Location::file(display),
            format!(
                "the file holds {size} bytes or more: expected at most {MAX_INPUT_BYTES} bytes \
                 (16 MiB) for an input file"
            ),
        )
    };
    if meta.len() > MAX_INPUT_BYTES {
        return Err(too_big(meta.len()));
    }
    let file = std::fs::File::open(path).map_err(io_error)?;
    let mut bytes = Vec::with_capacity(meta.len() as usize);
    file.take(MAX_INPUT_BYTES + 1).read_to_end(&mut bytes).map_err(io_error)?;
    if bytes.len() as u64 > MAX_INPUT_BYTES {
        return Err(too_big(bytes.len() as u64));
    }
    Ok(bytes)
}

/// Reads an input file as UTF-8 text as [`read_bytes`] does, with `\r` line ends (old Mac
/// style) turned into `\n` so that lines count alike whatever wrote the file; `\r\n` is kept.
pub fn read_text(path: &Path, display: &str) -> Result<String, InputError> {
    let bytes = read_bytes(path, display)?;
    let text = String::from_utf8(bytes).map_err(|e| {
        let before = &e.as_bytes()[..e.utf8_error().valid_up_to()];
        let line = 1 + before.iter().filter(|&&b| b == b'\n').count();
        InputError::at(
            Location::line(display, line),
            "expected UTF-8 text, found bytes that are not (a binary file, or text in another \
             encoding)",
        )
    })?;
    Ok(lone_cr_to_lf(text))
}

/// Turns every `\r` not followed by `\n` into `\n`.
pub fn lone_cr_to_lf(text: String) -> String {
    if !text.contains('\r') {
        return text;
    }
    let mut out = String::with_capacity(text.len());
    let mut chars = text.chars().peekable();
    while let Some(c) = chars.next() {
        if c == '\r' && chars.peek() != Some(&'\n') {
            out.push('\n');
        } else {
            out.push(c);
        }
    }
    out
}

/// A path relative to a project folder, and the name messages use for it.
pub fn project_path(dir: &Path, file: &str) -> (PathBuf, String) {
    let path = dir.join(file);
    let display = path.display().to_string();
    (path, display)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::text::excerpt;

    #[test]
    fn byte_offsets_map_to_lines() {
        let s = SourceText::new("a.toml", "x = 1\ny = 2\n\nz = 3".to_string());
        assert_eq!(s.line_of(0), 1);
        assert_eq!(s.line_of(5), 1);
        assert_eq!(s.line_of(6), 2);
        assert_eq!(s.line_of(13), 4);
        assert_eq!(s.location(13).to_string(), "a.toml line 4");
    }

    #[test]
    fn lone_carriage_returns_become_line_ends_and_long_values_are_cut() {
        assert_eq!(lone_cr_to_lf("a\rb\r\nc\r".to_string()), "a\nb\r\nc\n");
        assert_eq!(excerpt("12.5"), "12.5");
        let long = "9".repeat(100);
        assert_eq!(excerpt(&long), format!("{}… (100 characters)", "9".repeat(40)));
    }
}
