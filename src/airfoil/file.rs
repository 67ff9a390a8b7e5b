//! Coordinate files: two numbers per line (`x y`, separated by spaces, tabs or a comma), `#`
//! comments, and an optional title line at the top.

use std::path::Path;

use super::{AirfoilError, Outline};
use crate::input::{InputError, Location};

/// Reads a coordinate file; `display` is how messages name it.
pub fn read_coordinates(path: &Path, display: &str) -> Result<Outline, InputError> {
    let text = std::fs::read_to_string(path)
        .map_err(|source| InputError::Read { file: display.to_string(), source })?;
    parse_coordinates(&text, display)
}

/// Parses the text of a coordinate file.
pub fn parse_coordinates(text: &str, display: &str) -> Result<Outline, InputError> {
    let mut points = Vec::new();
    let mut lines = Vec::new();
    let mut first = true;
    for (i, raw) in text.lines().enumerate() {
        let line = i + 1;
        let content = raw.split('#').next().unwrap_or("").trim();
        if content.is_empty() {
            continue;
        }
        let fields =
            content.split(|c: char| c.is_whitespace() || c == ',').filter(|s| !s.is_empty());
        let numbers: Option<Vec<f64>> =
            fields.map(|f| f.parse::<f64>().ok().filter(|x| x.is_finite())).collect();
        match numbers {
            Some(v) if v.len() == 2 => {
                points.push([v[0], v[1]]);
                lines.push(line);
            }
            // The first line may be a title.
            _ if first => {}
            _ => return Err(bad_line(display, line, content)),
        }
        first = false;
    }
    Outline::from_file_order(&points, &lines).map_err(|e| locate(display, e))
}

fn bad_line(display: &str, line: usize, content: &str) -> InputError {
    InputError::at(
        Location::line(display, line),
        format!("expected two numbers 'x y' in chord fractions, found '{content}'"),
    )
}

fn locate(display: &str, e: AirfoilError) -> InputError {
    let line = match &e {
        AirfoilError::Repeated { line } | AirfoilError::DoublesBack { line, .. } => Some(*line),
        AirfoilError::Crossing { line_a, .. } => Some(*line_a),
        _ => None,
    };
    let location = match line {
        Some(l) => Location::line(display, l),
        None => Location::file(display),
    };
    let message = e.to_string();
    let message = match message.split_once(": ") {
        Some((head, rest)) if head.starts_with("line ") => rest.to_string(),
        _ => message,
    };
    InputError::at(location, message)
}
