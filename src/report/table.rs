//! Plain-text tables for the terminal: a header row with units, right-aligned numbers,
//! left-aligned words, and a rule under the header. Our own layout.

use std::fmt::Write as _;

/// How a column aligns.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Align {
    /// Words.
    Left,
    /// Numbers.
    Right,
}

/// A text table built row by row.
#[derive(Debug, Clone, Default)]
pub struct Table {
    headers: Vec<(String, Align)>,
    rows: Vec<Vec<String>>,
}

impl Table {
    /// A table with these column headers (units in the header text, e.g. "EA (MN)").
    pub fn new(headers: &[(&str, Align)]) -> Self {
        Table {
            headers: headers.iter().map(|(h, a)| (h.to_string(), *a)).collect(),
            rows: Vec::new(),
        }
    }

    /// Adds a row; missing cells are blank, extra cells are dropped.
    pub fn row(&mut self, cells: Vec<String>) {
        let mut cells = cells;
        cells.resize(self.headers.len(), String::new());
        self.rows.push(cells);
    }

    /// Whether the table has no rows.
    pub fn is_empty(&self) -> bool {
        self.rows.is_empty()
    }

    /// The column headers with their alignment.
    pub(crate) fn headers(&self) -> &[(String, Align)] {
        &self.headers
    }

    /// The rows, each with one cell per column.
    pub(crate) fn rows(&self) -> &[Vec<String>] {
        &self.rows
    }

    /// The table as text, each line indented by `indent` spaces.
    pub fn render(&self, indent: usize) -> String {
        let widths: Vec<usize> = (0..self.headers.len())
            .map(|c| {
                self.rows
                    .iter()
                    .map(|r| r[c].chars().count())
                    .chain(std::iter::once(self.headers[c].0.chars().count()))
                    .max()
                    .unwrap_or(0)
            })
            .collect();
        let pad = " ".repeat(indent);
        let mut out = String::new();
        let line = |cells: &[String], out: &mut String| {
            let mut text = pad.clone();
            for (c, cell) in cells.iter().enumerate() {
                let w = widths[c];
                let n = cell.chars().count();
                let fill = " ".repeat(w.saturating_sub(n));
                match self.headers[c].1 {
                    Align::Left => {
                        text.push_str(cell);
                        text.push_str(&fill);
                    }
                    Align::Right => {
                        text.push_str(&fill);
                        text.push_str(cell);
                    }
                }
                if c + 1 < cells.len() {
                    text.push_str("  ");
                }
            }
            let _ = writeln!(out, "{}", text.trim_end());
        };
        let header: Vec<String> = self.headers.iter().map(|h| h.0.clone()).collect();
        line(&header, &mut out);
        let total: usize = widths.iter().sum::<usize>() + 2 * widths.len().saturating_sub(1);
        let _ = writeln!(out, "{pad}{}", "-".repeat(total));
        for r in &self.rows {
            line(r, &mut out);
        }
        out
    }
}

/// Words of `text` wrapped to lines of at most `width` characters: the first line after
/// `first`, the others after `indent`.
pub(crate) fn wrap(out: &mut String, first: &str, indent: &str, text: &str, width: usize) {
    let mut line = first.to_string();
    for word in text.split_whitespace() {
        if line.chars().count() + word.chars().count() + 1 > width && !line.trim().is_empty() {
            out.push_str(line.trim_end());
            out.push('\n');
            line = indent.to_string();
        }
        if !line.trim().is_empty() {
            line.push(' ');
        }
        line.push_str(word);
    }
    out.push_str(line.trim_end());
    out.push('\n');
}

/// The standing cautions as a block for terminal reports: a heading and one wrapped line each.
pub fn cautions_text() -> String {
    let mut out = String::from("Caution\n");
    for c in crate::CAUTIONS {
        wrap(&mut out, "  !", "    ", c, 96);
    }
    out
}

/// A number with about four significant digits: fixed where that reads well, scientific for
/// very large or small magnitudes, "-" for a value that is not finite.
pub fn sig4(v: f64) -> String {
    let a = v.abs();
    if v == 0.0 {
        "0".to_string()
    } else if !v.is_finite() {
        "-".to_string()
    } else if (1e-3..1e5).contains(&a) {
        let digits = (3 - a.log10().floor() as i32).clamp(0, 6) as usize;
        fixed(v, digits)
    } else {
        format!("{v:.3e}")
    }
}

/// A rotor speed in rpm: whole revolutions from 100 rpm up (a fan's 1480 rpm), three
/// significant digits below (a large rotor's 12.5 rpm, a creep speed's 0.0100 rpm), so that a
/// slow rotor's speed is not rounded away.
pub fn rpm_text(rpm: f64) -> String {
    let a = rpm.abs();
    if a >= 100.0 || a == 0.0 || !a.is_finite() {
        fixed(rpm, 0)
    } else {
        fixed(rpm, (2 - a.log10().floor() as i32).clamp(0, 6) as usize)
    }
}

pub use crate::text::fixed;

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn rotor_speeds_keep_three_digits_below_100_rpm() {
        let cases = [
            (1480.4, "1480"),
            (100.0, "100"),
            (99.94, "99.9"),
            (12.5, "12.5"),
            (2.0, "2.00"),
            (0.01, "0.0100"),
            (0.0, "0"),
        ];
        for (rpm, text) in cases {
            assert_eq!(rpm_text(rpm), text, "{rpm} rpm");
        }
    }

    #[test]
    fn columns_align_by_kind() {
        let mut t = Table::new(&[("name", Align::Left), ("EA (MN)", Align::Right)]);
        t.row(vec!["root".into(), "12.5".into()]);
        t.row(vec!["tip".into(), "3".into()]);
        let s = t.render(2);
        let lines: Vec<&str> = s.lines().collect();
        assert_eq!(lines[0], "  name  EA (MN)");
        assert_eq!(lines[2], "  root     12.5");
        assert_eq!(lines[3], "  tip         3");
    }

    #[test]
    fn numbers_keep_four_significant_digits() {
        assert_eq!(sig4(12345.678), "12346");
        assert_eq!(sig4(1.234567), "1.235");
        assert_eq!(sig4(-0.0001234), "-1.234e-4");
        assert_eq!(sig4(f64::INFINITY), "-");
        assert_eq!(fixed(-0.0001, 2), "0.00");
    }
}
