//! A CSV file read whole, with a header row, `#` comments and trimmed cells, whose cells are
//! taken by column name with the file and line in every error.

use std::path::Path;

use super::location::{InputError, Location};
use crate::text::{closest, excerpt};

/// A CSV file: header and rows, each row with its 1-based line number.
#[derive(Debug, Clone)]
pub struct CsvTable {
    /// Display name of the file.
    pub file: String,
    headers: Vec<String>,
    rows: Vec<(usize, Vec<String>)>,
}

impl CsvTable {
    /// Reads a CSV file; `display` is how messages name it.
    pub fn read(path: &Path, display: &str) -> Result<Self, InputError> {
        let text = super::location::read_text(path, display)?;
        Self::parse(&text, display)
    }

    /// Parses CSV text held in memory.
    pub fn parse(text: &str, display: &str) -> Result<Self, InputError> {
        let mut reader = csv::ReaderBuilder::new()
            .comment(Some(b'#'))
            .trim(csv::Trim::All)
            .flexible(true)
            .from_reader(text.as_bytes());
        let headers: Vec<String> = reader
            .headers()
            .map_err(|e| csv_error(display, &e))?
            .iter()
            .map(str::to_string)
            .collect();
        if headers.iter().all(String::is_empty) {
            return Err(InputError::at(
                Location::file(display),
                "the file is empty: expected a header row naming the columns",
            ));
        }
        // The csv crate's own line count skips comment lines, so lines come from byte offsets.
        let line_of = |byte: u64| line_number(text, byte as usize);
        let mut rows = Vec::new();
        for record in reader.records() {
            let record = record.map_err(|e| csv_error(display, &e))?;
            let line = record.position().map(|p| line_of(p.byte())).unwrap_or(0);
            if record.iter().all(str::is_empty) {
                continue;
            }
            if record.len() == 1 && headers.len() > 1 {
                if let Some(name) = separator(&record[0]) {
                    return Err(InputError::at(
                        Location::line(display, line),
                        format!(
                            "the cells are separated by {name}: expected commas between them, as \
                             in the header{}",
                            decimal_note(name)
                        ),
                    ));
                }
            }
            // A header in one column with another separator is reported by `check_columns`,
            // which can show the header expected.
            let foreign = headers.len() == 1 && separator(&headers[0]).is_some();
            if record.len() != headers.len() && !foreign {
                return Err(InputError::at(
                    Location::line(display, line),
                    format!(
                        "expected {} cells as in the header, found {}",
                        headers.len(),
                        record.len()
                    ),
                ));
            }
            rows.push((line, record.iter().map(str::to_string).collect()));
        }
        Ok(CsvTable { file: display.to_string(), headers, rows })
    }

    /// The column names as written.
    pub fn headers(&self) -> &[String] {
        &self.headers
    }

    /// Checks that every `required` column is present and every column is either required or
    /// `optional`; a misspelt column gets the closest known name as a hint.
    pub fn check_columns(&self, required: &[&str], optional: &[&str]) -> Result<(), InputError> {
        let known = || required.iter().chain(optional).copied();
        // One column holding the whole header: another separator than the comma.
        if let [header] = self.headers.as_slice()
            && let Some(name) = separator(header)
        {
            return Err(InputError::at(
                Location::line(&self.file, 1),
                format!(
                    "the columns are separated by {name}: expected commas between them, as in \
                     '{}'{}",
                    required.join(","),
                    decimal_note(name)
                ),
            ));
        }
        for (i, h) in self.headers.iter().enumerate() {
            if self.headers[..i].contains(h) {
                return Err(InputError::at(
                    Location::line(&self.file, 1).with_field(excerpt(h)),
                    format!(
                        "column '{}' appears twice in the header (columns {} and {}): expected \
                         each column once",
                        excerpt(h),
                        self.headers[..i].iter().position(|x| x == h).unwrap_or(0) + 1,
                        i + 1
                    ),
                ));
            }
            if !known().any(|k| k == h) {
                let hint = closest(h, known())
                    .map(|c| format!("; did you mean '{c}'?"))
                    .unwrap_or_else(|| format!("; expected columns: {}", required.join(", ")));
                return Err(InputError::at(
                    Location::line(&self.file, 1).with_field(excerpt(h)),
                    format!("unknown column '{}'{hint}", excerpt(h)),
                ));
            }
        }
        for r in required {
            if !self.headers.iter().any(|h| h == r) {
                return Err(InputError::at(
                    Location::line(&self.file, 1),
                    format!("missing column '{r}': expected the columns {}", required.join(", ")),
                ));
            }
        }
        Ok(())
    }

    /// The data rows.
    pub fn records(&self) -> impl Iterator<Item = CsvRecord<'_>> {
        self.rows.iter().map(move |(line, cells)| CsvRecord { table: self, line: *line, cells })
    }

    /// Number of data rows.
    pub fn len(&self) -> usize {
        self.rows.len()
    }

    /// Whether there are no data rows.
    pub fn is_empty(&self) -> bool {
        self.rows.is_empty()
    }
}

/// The separator, named for a message, of a line read as one cell that holds tabs or semicolons
/// (a spreadsheet's export in another form than comma-separated).
fn separator(cell: &str) -> Option<&'static str> {
    if cell.contains('\t') {
        Some("tabs")
    } else if cell.contains(';') {
        Some("semicolons")
    } else {
        None
    }
}

/// A file separated by semicolons often comes with decimal commas: say what numbers look like.
fn decimal_note(separator: &str) -> &'static str {
    if separator == "semicolons" { " (and numbers with a decimal point: 0.5, not 0,5)" } else { "" }
}

/// The 1-based line of the first record-bearing line at or after `byte` (the csv crate places a
/// record at the end of the previous one, before any blank or comment lines).
fn line_number(text: &str, byte: usize) -> usize {
    let start = byte.min(text.len());
    let line = 1 + text.as_bytes()[..start].iter().filter(|&&b| b == b'\n').count();
    let skipped = text[start..]
        .split_inclusive('\n')
        .take_while(|l| {
            let t = l.trim();
            t.is_empty() || t.starts_with('#')
        })
        .count();
    line + skipped
}

fn csv_error(display: &str, e: &csv::Error) -> InputError {
    let loc = match e.position() {
        Some(p) => Location::line(display, p.line() as usize),
        None => Location::file(display),
    };
    InputError::at(loc, format!("not valid CSV: {e}"))
}

/// One data row of a [`CsvTable`].
#[derive(Debug, Clone, Copy)]
pub struct CsvRecord<'t> {
    table: &'t CsvTable,
    /// 1-based line in the file.
    pub line: usize,
    cells: &'t [String],
}

impl<'t> CsvRecord<'t> {
    /// The location of a cell.
    pub fn location(&self, column: &str) -> Location {
        Location::line(&self.table.file, self.line).with_field(column)
    }

    /// An error at a cell.
    pub fn error(&self, column: &str, message: impl Into<String>) -> InputError {
        InputError::at(self.location(column), message)
    }

    /// The text of a cell; empty when the column is absent.
    pub fn text(&self, column: &str) -> &'t str {
        self.table
            .headers
            .iter()
            .position(|h| h == column)
            .map(|i| self.cells[i].as_str())
            .unwrap_or("")
    }

    /// A cell that must hold a finite number.
    pub fn number(&self, column: &str) -> Result<f64, InputError> {
        let t = self.text(column);
        if t.is_empty() {
            return Err(self.error(column, "expected a number, found an empty cell"));
        }
        match t.parse::<f64>() {
            Ok(x) if x.is_finite() => Ok(x),
            _ => Err(self.error(column, format!("'{}' is not a number", excerpt(t)))),
        }
    }

    /// A cell that may be empty, else must hold a finite number.
    pub fn optional_number(&self, column: &str) -> Result<Option<f64>, InputError> {
        if self.text(column).is_empty() { Ok(None) } else { self.number(column).map(Some) }
    }

    /// A cell that must not be empty.
    pub fn required_text(&self, column: &str) -> Result<&'t str, InputError> {
        let t = self.text(column);
        if t.is_empty() {
            Err(self.error(column, "expected a value, found an empty cell"))
        } else {
            Ok(t)
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn cells_are_read_by_column_with_line_numbers() {
        let t = CsvTable::parse("# comment\nr_m, chord_m\n0.4, 0.2\n\n0.9, x\n", "s.csv").unwrap();
        t.check_columns(&["r_m", "chord_m"], &[]).unwrap();
        let rows: Vec<_> = t.records().collect();
        assert_eq!(rows[0].number("chord_m").unwrap(), 0.2);
        let e = rows[1].number("chord_m").unwrap_err();
        assert_eq!(e.to_string(), "s.csv line 5, chord_m: 'x' is not a number");
    }

    #[test]
    fn a_column_given_twice_is_refused() {
        let t = CsvTable::parse("r_m,chord_m,chord_m\n1,2,3\n", "s.csv").unwrap();
        let e = t.check_columns(&["r_m", "chord_m"], &[]).unwrap_err();
        assert_eq!(
            e.to_string(),
            "s.csv line 1, chord_m: column 'chord_m' appears twice in the header (columns 2 and 3): expected each column once"
        );
    }

    #[test]
    fn misspelt_column_gets_a_hint() {
        let t = CsvTable::parse("r_m,chrd_m\n1,2\n", "s.csv").unwrap();
        let e = t.check_columns(&["r_m", "chord_m"], &[]).unwrap_err();
        assert!(e.to_string().contains("did you mean 'chord_m'"), "{e}");
    }
}
