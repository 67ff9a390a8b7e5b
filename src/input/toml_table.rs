//! A reader over one TOML table that takes keys one at a time, converts and checks them, and
//! at the end refuses keys nobody asked for, suggesting the closest known key.

use std::ops::Range;

use toml::Spanned;
use toml::de::{DeTable, DeValue};

use super::location::{InputError, Location, SourceText};
use crate::text::{closest, excerpt};

/// A setting given by name or by value.
#[derive(Debug, Clone, PartialEq)]
pub enum Scalar {
    /// A string.
    Text(String),
    /// A finite number.
    Number(f64),
}

/// One TOML table being read. Keys are taken with the `required_*` and `optional_*` methods;
/// [`TableReader::finish`] then rejects any key left over.
#[derive(Debug)]
pub struct TableReader<'s> {
    source: &'s SourceText,
    path: String,
    span: Range<usize>,
    entries: Vec<(String, Spanned<DeValue<'s>>)>,
    used: Vec<bool>,
    asked: Vec<String>,
    /// Every key the table may hold, once [`TableReader::expect_keys`] declared them.
    known: Option<Vec<String>>,
}

impl<'s> TableReader<'s> {
    /// Parses a whole document; a syntax error names its line.
    pub fn parse_document(source: &'s SourceText) -> Result<Self, InputError> {
        let doc = DeTable::parse(&source.text).map_err(|e| {
            let loc = match e.span() {
                Some(span) => source.location(span.start),
                None => Location::file(source.name.clone()),
            };
            let message = e.message().trim_end();
            let named = match e.span() {
                Some(span) if message == "duplicate key" => duplicate_key(source, span),
                _ => None,
            };
            InputError::at(loc, format!("not valid TOML: {}", named.as_deref().unwrap_or(message)))
        })?;
        let span = doc.span();
        let table: DeTable<'s> = doc.into_inner();
        Ok(Self::from_table(source, String::new(), span, table))
    }

    fn from_table(
        source: &'s SourceText,
        path: String,
        span: Range<usize>,
        table: DeTable<'s>,
    ) -> Self {
        let entries: Vec<_> =
            table.into_iter().map(|(k, v)| (k.into_inner().into_owned(), v)).collect();
        let used = vec![false; entries.len()];
        TableReader { source, path, span, entries, used, asked: Vec::new(), known: None }
    }

    /// The dotted path of this table (`lamina.carbon-ud`), empty for the document.
    pub fn path(&self) -> &str {
        &self.path
    }

    /// The source this table is read from.
    pub fn source(&self) -> &'s SourceText {
        self.source
    }

    fn full_key(&self, key: &str) -> String {
        let key = excerpt(key);
        if self.path.is_empty() { key } else { format!("{}.{key}", self.path) }
    }

    /// The location of a key's value, or of the table when the key is absent.
    pub fn location_of(&self, key: &str) -> Location {
        let offset = self
            .entries
            .iter()
            .find(|(k, _)| k == key)
            .map(|(_, v)| v.span().start)
            .unwrap_or(self.span.start);
        self.source.location(offset).with_field(self.full_key(key))
    }

    /// The location of this table itself.
    pub fn location(&self) -> Location {
        let loc = self.source.location(self.span.start);
        if self.path.is_empty() { loc } else { loc.with_field(self.path.clone()) }
    }

    /// An error at a key.
    pub fn error(&self, key: &str, message: impl Into<String>) -> InputError {
        InputError::at(self.location_of(key), message)
    }

    fn take(&mut self, key: &str) -> Option<Spanned<DeValue<'s>>> {
        debug_assert!(
            self.known.as_ref().is_none_or(|known| known.iter().any(|k| k == key)),
            "key '{key}' is read from [{}] but missing from the keys it declares",
            self.path
        );
        self.asked.push(key.to_string());
        let i = self.entries.iter().position(|(k, _)| k == key)?;
        self.used[i] = true;
        Some(self.entries[i].1.clone())
    }

    /// Whether the table has the key (does not count as reading it).
    pub fn contains(&self, key: &str) -> bool {
        self.entries.iter().any(|(k, _)| k == key)
    }

    fn number(&self, key: &str, v: &DeValue<'_>) -> Result<f64, InputError> {
        let parsed = match v {
            DeValue::Float(f) => f.as_str().replace('_', "").parse::<f64>().ok(),
            DeValue::Integer(i) => {
                i64::from_str_radix(&i.as_str().replace('_', ""), i.radix()).ok().map(|n| n as f64)
            }
            other => {
                return Err(
                    self.error(key, format!("expected a number, found {}", describe(other)))
                );
            }
        };
        match parsed {
            Some(x) if x.is_finite() => Ok(x),
            _ => Err(self.error(key, format!("expected a finite number, found {}", describe(v)))),
        }
    }

    /// A number that must be present.
    pub fn required_f64(&mut self, key: &str) -> Result<f64, InputError> {
        match self.take(key) {
            Some(v) => self.number(key, v.get_ref()),
            None => Err(self.missing(key, "a number")),
        }
    }

    /// A number that may be absent.
    pub fn optional_f64(&mut self, key: &str) -> Result<Option<f64>, InputError> {
        match self.take(key) {
            Some(v) => self.number(key, v.get_ref()).map(Some),
            None => Ok(None),
        }
    }

    /// A positive number that must be present.
    pub fn required_positive(&mut self, key: &str) -> Result<f64, InputError> {
        let x = self.required_f64(key)?;
        self.check_positive(key, x)
    }

    /// A positive number that may be absent.
    pub fn optional_positive(&mut self, key: &str) -> Result<Option<f64>, InputError> {
        match self.optional_f64(key)? {
            Some(x) => self.check_positive(key, x).map(Some),
            None => Ok(None),
        }
    }

    fn check_positive(&self, key: &str, x: f64) -> Result<f64, InputError> {
        if x > 0.0 {
            Ok(x)
        } else {
            Err(self.error(key, format!("expected a positive number, found {x}")))
        }
    }

    /// A whole number that may be absent.
    pub fn optional_u32(&mut self, key: &str) -> Result<Option<u32>, InputError> {
        match self.take(key) {
            Some(v) => match v.get_ref() {
                DeValue::Integer(i) => i64::from_str_radix(&i.as_str().replace('_', ""), i.radix())
                    .ok()
                    .and_then(|n| u32::try_from(n).ok())
                    .map(Some)
                    .ok_or_else(|| {
                        self.error(
                            key,
                            format!(
                                "expected a whole number >= 0, found {}",
                                excerpt(&i.to_string())
                            ),
                        )
                    }),
                other => {
                    Err(self
                        .error(key, format!("expected a whole number, found {}", describe(other))))
                }
            },
            None => Ok(None),
        }
    }

    /// A string that must be present.
    pub fn required_str(&mut self, key: &str) -> Result<String, InputError> {
        match self.optional_str(key)? {
            Some(s) => Ok(s),
            None => Err(self.missing(key, "a string")),
        }
    }

    /// A string that may be absent.
    pub fn optional_str(&mut self, key: &str) -> Result<Option<String>, InputError> {
        match self.take(key) {
            Some(v) => match v.get_ref() {
                DeValue::String(s) => Ok(Some(s.to_string())),
                other => {
                    Err(self.error(key, format!("expected a string, found {}", describe(other))))
                }
            },
            None => Ok(None),
        }
    }

    /// A number or a string that may be absent (a setting given by name or by value).
    pub fn optional_scalar(&mut self, key: &str) -> Result<Option<Scalar>, InputError> {
        let is_text = match self.entries.iter().find(|(k, _)| k == key) {
            Some((_, v)) => matches!(v.get_ref(), DeValue::String(_)),
            None => return Ok(None),
        };
        if is_text {
            Ok(self.optional_str(key)?.map(Scalar::Text))
        } else {
            Ok(self.optional_f64(key)?.map(Scalar::Number))
        }
    }

    /// A boolean that may be absent.
    pub fn optional_bool(&mut self, key: &str) -> Result<Option<bool>, InputError> {
        match self.take(key) {
            Some(v) => {
                match v.get_ref() {
                    DeValue::Boolean(b) => Ok(Some(*b)),
                    other => Err(self
                        .error(key, format!("expected true or false, found {}", describe(other)))),
                }
            }
            None => Ok(None),
        }
    }

    /// An array of numbers that may be absent.
    pub fn optional_f64_array(&mut self, key: &str) -> Result<Option<Vec<f64>>, InputError> {
        match self.take(key) {
            Some(v) => match v.get_ref() {
                DeValue::Array(items) => items
                    .iter()
                    .map(|x| self.number(key, x.get_ref()))
                    .collect::<Result<_, _>>()
                    .map(Some),
                other => Err(self.error(
                    key,
                    format!("expected an array of numbers, found {}", describe(other)),
                )),
            },
            None => Ok(None),
        }
    }

    /// A sub-table that may be absent (`[rotor]`).
    pub fn optional_table(&mut self, key: &str) -> Result<Option<TableReader<'s>>, InputError> {
        match self.take(key) {
            Some(v) => {
                let span = v.span();
                match v.into_inner() {
                    DeValue::Table(t) => {
                        Ok(Some(Self::from_table(self.source, self.full_key(key), span, t)))
                    }
                    other => {
                        Err(self
                            .error(key, format!("expected a table, found {}", describe(&other))))
                    }
                }
            }
            None => Ok(None),
        }
    }

    /// A sub-table that must be present.
    pub fn required_table(&mut self, key: &str) -> Result<TableReader<'s>, InputError> {
        match self.optional_table(key)? {
            Some(t) => Ok(t),
            None => Err(self.missing(key, format!("a table [{}]", self.full_key(key)))),
        }
    }

    /// An array of tables (`[[web]]`), empty when absent.
    pub fn table_array(&mut self, key: &str) -> Result<Vec<TableReader<'s>>, InputError> {
        match self.take(key) {
            Some(v) => match v.into_inner() {
                DeValue::Array(items) => items
                    .into_iter()
                    .enumerate()
                    .map(|(i, item)| {
                        let span = item.span();
                        match item.into_inner() {
                            DeValue::Table(t) => Ok(Self::from_table(
                                self.source,
                                format!("{}[{}]", self.full_key(key), i + 1),
                                span,
                                t,
                            )),
                            other => Err(self.error(
                                key,
                                format!("expected tables [[{key}]], found {}", describe(&other)),
                            )),
                        }
                    })
                    .collect(),
                other => Err(self
                    .error(key, format!("expected [[{key}]] tables, found {}", describe(&other)))),
            },
            None => Ok(Vec::new()),
        }
    }

    /// Every sub-table of a table of named tables (`[lamina.NAME]`), in file order.
    pub fn named_tables(self) -> Result<Vec<(String, TableReader<'s>)>, InputError> {
        let source = self.source;
        let path = self.path.clone();
        let mut out = Vec::new();
        for (name, v) in self.entries {
            let span = v.span();
            let full = if path.is_empty() { name.clone() } else { format!("{path}.{name}") };
            match v.into_inner() {
                DeValue::Table(t) => out.push((name, Self::from_table(source, full, span, t))),
                other => {
                    return Err(InputError::at(
                        source.location(span.start).with_field(full),
                        format!("expected a table, found {}", describe(&other)),
                    ));
                }
            }
        }
        Ok(out)
    }

    /// A required key that is absent. It is never blamed on another key of the table: a key
    /// that is present may be a valid key not read yet (`Xc_MPa` missing while `Yt_MPa` waits
    /// its turn), and only the list of keys the table may hold tells the two apart. A misspelt
    /// key is refused before any key is read by [`TableReader::expect_keys`], which every table
    /// with a required key declares.
    fn missing(&self, key: &str, what: impl std::fmt::Display) -> InputError {
        debug_assert!(
            self.known.is_some(),
            "[{}] reads the required key '{key}' without declaring its keys (expect_keys)",
            self.path
        );
        let loc = self.location().with_field(self.full_key(key));
        InputError::at(loc, format!("missing key '{key}': expected {what}"))
    }

    /// Refuses, before any key is read, a key that is not one of `known`, with the closest known
    /// key as a hint; so that a misspelt required key (`E2_Gpa`) is reported as what it is rather
    /// than as a missing `E2_GPa`. Every key read afterwards must be one of `known`.
    pub fn expect_keys(&mut self, known: &[&str]) -> Result<(), InputError> {
        self.known = Some(known.iter().map(|k| k.to_string()).collect());
        for (key, value) in &self.entries {
            if !known.contains(&key.as_str()) {
                let hint = closest(key, known.iter().copied())
                    .map(|h| format!("; did you mean '{h}'?"))
                    .unwrap_or_else(|| format!("; known keys here: {}", known.join(", ")));
                let loc = self.source.location(value.span().start).with_field(self.full_key(key));
                return Err(InputError::at(loc, format!("unknown key '{}'{hint}", excerpt(key))));
            }
        }
        Ok(())
    }

    /// Refuses any key that was not read, with the closest key that was asked for as a hint.
    pub fn finish(&self) -> Result<(), InputError> {
        for ((key, value), used) in self.entries.iter().zip(&self.used) {
            if !used {
                let hint = closest(key, self.asked.iter().map(String::as_str))
                    .map(|h| format!("; did you mean '{h}'?"))
                    .unwrap_or_else(|| {
                        let mut known = self.asked.clone();
                        known.dedup();
                        format!("; known keys here: {}", known.join(", "))
                    });
                let loc = self.source.location(value.span().start).with_field(self.full_key(key));
                return Err(InputError::at(loc, format!("unknown key '{}'{hint}", excerpt(key))));
            }
        }
        Ok(())
    }
}

/// The parser's "duplicate key" with the key it points at (the span of the second key, as
/// written) and, when that key sits in a table header, the header: `None` when the span does not
/// fall on the text.
fn duplicate_key(source: &SourceText, span: Range<usize>) -> Option<String> {
    let text = &source.text;
    let key = text.get(span.clone()).filter(|k| !k.trim().is_empty())?;
    let line_start = text.get(..span.start)?.rfind('\n').map_or(0, |i| i + 1);
    let line = text.get(line_start..)?.lines().next().unwrap_or("");
    let named = format!("duplicate key '{}'", excerpt(key.trim()));
    let header = line.trim_start();
    if !header.starts_with('[') {
        return Some(format!("{named}: a key may be given once in a table"));
    }
    // The header up to its closing bracket(s) after the key (a comment may follow).
    let after_key = span.end.checked_sub(line_start)?;
    let close = line.get(after_key..)?.find(']')? + after_key;
    let brackets = if header.starts_with("[[") { 2 } else { 1 };
    let start = line.len() - header.len();
    let shown = line.get(start..(close + brackets).min(line.len()))?;
    Some(format!("{named}: the header {} names a table or key defined earlier", excerpt(shown)))
}

fn describe(v: &DeValue<'_>) -> String {
    match v {
        DeValue::String(s) => format!("the string \"{}\"", excerpt(s)),
        DeValue::Integer(i) => excerpt(&i.to_string()),
        DeValue::Float(f) => excerpt(&f.to_string()),
        DeValue::Boolean(b) => format!("{b}"),
        DeValue::Datetime(d) => format!("the date {d}"),
        DeValue::Array(_) => "an array".to_string(),
        DeValue::Table(_) => "a table".to_string(),
    }
}
