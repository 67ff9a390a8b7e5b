//! Airfoil coordinate files read from disk: the file is read as every input file is (a regular
//! file of bounded size) and parsed by [`crate::airfoil::parse_coordinates_noted`], whose error
//! becomes an input error at the same file and line.

use std::path::Path;

use super::location::{InputError, Location, read_bytes};
use crate::airfoil::{CoordinateError, Outline, parse_coordinates_noted};

impl From<CoordinateError> for InputError {
    fn from(e: CoordinateError) -> Self {
        let location = match e.line {
            Some(line) => Location::line(e.file, line),
            None => Location::file(e.file),
        };
        InputError::at(location, e.message)
    }
}

/// Reads a coordinate file; `display` is how messages name it.
pub fn read_coordinates(path: &Path, display: &str) -> Result<Outline, InputError> {
    read_coordinates_noted(path, display).map(|(o, _)| o)
}

/// Reads a coordinate file, with notes on what was changed to read it (points reversed,
/// repeated points removed, a base given as points along it), each naming the file.
pub fn read_coordinates_noted(
    path: &Path,
    display: &str,
) -> Result<(Outline, Vec<String>), InputError> {
    let bytes = read_bytes(path, display)?;
    let text = String::from_utf8_lossy(&bytes);
    Ok(parse_coordinates_noted(&text, display)?)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_coordinate_fault_keeps_its_file_and_line() {
        // A file with a word where a point belongs: the message names the file and line 3, as
        // every input error does (common practice of this crate's messages).
        let e = parse_coordinates_noted("title\n1 0\n0.5 x\n", "a.dat").unwrap_err();
        assert_eq!(e.line, Some(3));
        let input: InputError = e.clone().into();
        assert_eq!(input.to_string(), e.to_string());
        assert_eq!(input.location().and_then(|l| l.line), Some(3));
    }
}
