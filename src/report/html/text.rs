//! Text for HTML: escaping, element ids, relative links, and the calendar date of a moment.

use std::time::{SystemTime, UNIX_EPOCH};

/// `text` with the characters that HTML gives a meaning (`& < > " '`) written as character
/// references (and control characters dropped): the XML escaping of the SVG kit, which is safe
/// both as HTML element content and as a quoted attribute value.
pub(crate) fn escape(text: &str) -> String {
    crate::report::plot::escape(text)
}

/// An element id from free text: ASCII letters, digits, `-` and `_` kept, every other run of
/// characters turned into one `-`, lower case; `fallback` when nothing is left.
pub(crate) fn element_id(text: &str, fallback: &str) -> String {
    let mut out = String::new();
    for c in text.chars() {
        if c.is_ascii_alphanumeric() || c == '_' || c == '-' {
            out.push(c.to_ascii_lowercase());
        } else if !out.ends_with('-') {
            out.push('-');
        }
    }
    let trimmed = out.trim_matches('-');
    if trimmed.is_empty() { fallback.to_string() } else { trimmed.to_string() }
}

/// A relative path as an `href`: path separators kept (`\` turned into `/`), unreserved
/// characters kept, every other byte percent-encoded (RFC 3986, section 2), so a file name with
/// spaces or `#` still links to itself.
pub(crate) fn relative_href(path: &str) -> String {
    let mut out = String::with_capacity(path.len());
    for b in path.bytes() {
        match b {
            b'\\' => out.push('/'),
            b'/' | b'-' | b'.' | b'_' | b'~' => out.push(b as char),
            b if b.is_ascii_alphanumeric() => out.push(b as char),
            _ => out.push_str(&format!("%{b:02X}")),
        }
    }
    out
}

/// What kind of side file a path names, from its extension, for the tag shown beside a link
/// (`CSV`, `JSON`, `STL`, `SVG`, ...; `FILE` without an extension).
pub(crate) fn file_kind(path: &str) -> String {
    let name = path.rsplit(['/', '\\']).next().unwrap_or(path);
    match name.rsplit_once('.') {
        Some((stem, ext)) if !stem.is_empty() && !ext.is_empty() => ext.to_ascii_uppercase(),
        _ => "FILE".to_string(),
    }
}

/// The UTC calendar date of a moment as `YYYY-MM-DD`, by the days-to-civil algorithm of
/// H. Hinnant, "chrono-Compatible Low-Level Date Algorithms" (2013, `civil_from_days`), valid
/// for the proleptic Gregorian calendar. A moment before 1970 counts back from the epoch.
///
/// The library does not read the clock itself: the command passes `SystemTime::now()`.
pub fn utc_date(moment: SystemTime) -> String {
    let seconds: i64 = match moment.duration_since(UNIX_EPOCH) {
        Ok(d) => i64::try_from(d.as_secs()).unwrap_or(i64::MAX),
        Err(e) => -i64::try_from(e.duration().as_secs()).unwrap_or(i64::MAX),
    };
    let (y, m, d) = civil_from_days(seconds.div_euclid(86_400));
    format!("{y:04}-{m:02}-{d:02}")
}

/// Year, month (1..=12) and day (1..=31) of the day `z` days after 1970-01-01.
fn civil_from_days(z: i64) -> (i64, u32, u32) {
    let z = z + 719_468;
    let era = z.div_euclid(146_097);
    let doe = z.rem_euclid(146_097); // day of the 400-year era, 0..=146096
    let yoe = (doe - doe / 1460 + doe / 36_524 - doe / 146_096) / 365; // 0..=399
    let doy = doe - (365 * yoe + yoe / 4 - yoe / 100); // day of the year from 1 March
    let mp = (5 * doy + 2) / 153; // month from March, 0..=11
    let d = (doy - (153 * mp + 2) / 5 + 1) as u32;
    let m = if mp < 10 { mp + 3 } else { mp - 9 } as u32;
    let y = yoe + era * 400 + i64::from(m <= 2);
    (y, m, d)
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::time::Duration;

    #[test]
    fn markup_characters_are_escaped() {
        assert_eq!(
            escape(r#"<b>"A&B"</b> 'x'"#),
            "&lt;b&gt;&quot;A&amp;B&quot;&lt;/b&gt; &apos;x&apos;"
        );
        assert_eq!(escape("±45° N·m"), "±45° N·m");
    }

    #[test]
    fn ids_keep_safe_characters_only() {
        assert_eq!(element_id("Campbell diagram (rpm)", "f"), "campbell-diagram-rpm");
        assert_eq!(element_id("r = 0.45 m", "f"), "r-0-45-m");
        assert_eq!(element_id("±°", "figure"), "figure");
    }

    #[test]
    fn hrefs_are_percent_encoded_and_relative_separators_kept() {
        assert_eq!(relative_href("stl/core 1.stl"), "stl/core%201.stl");
        assert_eq!(relative_href(r"stl\mould#a.stl"), "stl/mould%23a.stl");
        assert_eq!(relative_href("ø.csv"), "%C3%B8.csv");
        assert_eq!(file_kind("data/sections.csv"), "CSV");
        assert_eq!(file_kind("README"), "FILE");
        assert_eq!(file_kind(".hidden"), "FILE");
    }

    #[test]
    fn dates_of_known_moments() {
        // Day counts worked by hand: 1970..2000 holds 30 years with 7 leap days (1972..1996),
        // 10957 days; January and February 2000 add 31 + 28, so 2000-02-29 starts at
        // 11016 * 86400 s = 951 782 400 s. 1e9 s is 11574 days and a fraction: 2001-09-09.
        let at = |s: u64| utc_date(UNIX_EPOCH + Duration::from_secs(s));
        assert_eq!(at(0), "1970-01-01");
        assert_eq!(at(951_782_400), "2000-02-29");
        assert_eq!(at(951_782_400 + 86_400), "2000-03-01");
        assert_eq!(at(1_000_000_000), "2001-09-09");
        assert_eq!(utc_date(UNIX_EPOCH - Duration::from_secs(1)), "1969-12-31");
    }
}
