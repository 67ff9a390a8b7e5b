//! Where in which file something is, and the input error that says so.

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
        f.write_str(&self.file)?;
        if let Some(line) = self.line {
            write!(f, " line {line}")?;
        }
        if let Some(field) = &self.field {
            write!(f, ", {field}")?;
        }
        Ok(())
    }
}

/// Bad input: where, and what is wrong.
#[derive(Debug, thiserror::Error)]
pub enum InputError {
    /// A file that cannot be read.
    #[error("{file}: cannot read the file: {source}")]
    Read {
        /// The file.
        file: String,
        /// The reason.
        #[source]
        source: std::io::Error,
    },
    /// A value, key, row or reference that is wrong.
    #[error("{location}: {message}")]
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
    /// Reads a file; `display` is how messages name it.
    pub fn read(path: &Path, display: &str) -> Result<Self, InputError> {
        let text = std::fs::read_to_string(path)
            .map_err(|source| InputError::Read { file: display.to_string(), source })?;
        Ok(SourceText::new(display, text))
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

/// A path relative to a project folder, and the name messages use for it.
pub fn project_path(dir: &Path, file: &str) -> (PathBuf, String) {
    let path = dir.join(file);
    let display = path.display().to_string();
    (path, display)
}

/// The candidate closest to `name` by Jaro–Winkler similarity, when it is close enough to be a
/// likely typo.
pub fn closest<'a>(name: &str, candidates: impl Iterator<Item = &'a str>) -> Option<String> {
    candidates
        .map(|c| (strsim::jaro_winkler(&name.to_lowercase(), &c.to_lowercase()), c))
        .filter(|(score, _)| *score > 0.75)
        .max_by(|a, b| a.0.total_cmp(&b.0))
        .map(|(_, c)| c.to_string())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn byte_offsets_map_to_lines() {
        let s = SourceText::new("a.toml", "x = 1\ny = 2\n\nz = 3".to_string());
        assert_eq!(s.line_of(0), 1);
        assert_eq!(s.line_of(5), 1);
        assert_eq!(s.line_of(6), 2);
        assert_eq!(s.line_of(13), 4);
        assert_eq!(s.location(13).to_string(), "a.toml line 4");
    }
}
