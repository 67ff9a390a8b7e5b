//! Small helpers on text shared by every module that names things in messages: the closest
//! valid name to a misspelt one, a short excerpt of a runaway value, and JSON as text. They sit at
//! the bottom of the module flow (beside `units`) so that a stage can suggest a name without the file reader.

/// At most `MAX` characters of a value for a message, with `…` and the full length when cut, so
/// that a runaway value (a 2 MB number) is not echoed whole; control characters written as
/// escapes ([`printable`]).
pub fn excerpt(text: &str) -> String {
    const MAX: usize = 40;
    let count = text.chars().count();
    if count <= MAX {
        printable(text).into_owned()
    } else {
        let head: String = text.chars().take(MAX).collect();
        format!("{}… ({count} characters)", printable(&head))
    }
}

/// `text` with every control character, and every invisible character that reorders or hides
/// text (bidirectional controls, zero-width spaces and joiners, the byte-order mark), written as
/// its escape (`\u{0}` for a NUL, `\t` for a tab, `\u{202e}`), so that a message shows what a
/// file holds and cannot move the terminal's cursor, ring its bell or turn its text round.
pub fn printable(text: &str) -> std::borrow::Cow<'_, str> {
    escape(text, false)
}

/// [`printable`] for a whole message, which may run over several lines: its line breaks stay.
pub fn printable_lines(text: &str) -> std::borrow::Cow<'_, str> {
    escape(text, true)
}

fn escape(text: &str, keep_lines: bool) -> std::borrow::Cow<'_, str> {
    let hidden = |c: char| {
        (c.is_control() && !(keep_lines && c == '\n'))
            || matches!(c, '\u{200b}'..='\u{200f}' | '\u{202a}'..='\u{202e}' | '\u{2060}'..='\u{2064}'
                | '\u{2066}'..='\u{2069}' | '\u{feff}')
    };
    if !text.chars().any(hidden) {
        return std::borrow::Cow::Borrowed(text);
    }
    let mut out = String::with_capacity(text.len() + 8);
    for c in text.chars() {
        if hidden(c) {
            out.extend(c.escape_default());
        } else {
            out.push(c);
        }
    }
    std::borrow::Cow::Owned(out)
}

/// `digits` decimals, without a "-0.00" for a value that rounds to zero: a place or a value in a
/// message or a table shows no sign a reader should act on when it is zero at the digits shown.
pub fn fixed(v: f64, digits: usize) -> String {
    let s = format!("{v:.digits$}");
    match s.strip_prefix('-') {
        Some(rest) if rest.chars().all(|c| c == '0' || c == '.') => rest.to_string(),
        _ => s,
    }
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

/// `value` as pretty-printed JSON text, every negative zero written as `0.0`: a value that is
/// zero has no sign a reader should act on, and `-0.0` (a clamped root's displacement, an axis
/// component turned through 180°) reads as one.
pub fn json_pretty(mut value: serde_json::Value) -> Result<String, serde_json::Error> {
    unsign_zeros(&mut value);
    serde_json::to_string_pretty(&value)
}

fn unsign_zeros(value: &mut serde_json::Value) {
    use serde_json::Value;
    match value {
        Value::Number(n) => {
            if n.as_f64().is_some_and(|x| x == 0.0 && x.is_sign_negative()) {
                *value = Value::from(0.0);
            }
        }
        Value::Array(items) => items.iter_mut().for_each(unsign_zeros),
        Value::Object(map) => map.values_mut().for_each(unsign_zeros),
        Value::Null | Value::Bool(_) | Value::String(_) => {}
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use serde_json::{Value, json};

    #[test]
    fn control_and_invisible_characters_are_escaped_and_nothing_else() {
        assert_eq!(printable("gl\0ass"), "gl\\u{0}ass");
        assert_eq!(printable("a\tb\r\n\u{1b}[2J"), "a\\tb\\r\\n\\u{1b}[2J");
        assert_eq!(printable("x\u{202e}y\u{200b}"), "x\\u{202e}y\\u{200b}");
        assert_eq!(printable_lines("one\ntwo\0"), "one\ntwo\\u{0}");
        let plain = "naca4412 — 0.5 m, ü, 翼";
        assert!(matches!(printable(plain), std::borrow::Cow::Borrowed(t) if t == plain));
        assert_eq!(excerpt("bo\0th"), "bo\\u{0}th");
        let long = format!("{}\0", "x".repeat(50));
        assert_eq!(excerpt(&long), format!("{}… (51 characters)", "x".repeat(40)));
    }

    #[test]
    fn negative_zeros_are_written_as_zero_and_nothing_else_changes() {
        let v = json!({"a": -0.0, "b": [1.5, -0.0, -2.0, 0], "c": {"d": -0.0, "e": "-0.0"}});
        let text = json_pretty(v).unwrap();
        let back: Value = serde_json::from_str(&text).unwrap();
        assert!(!text.contains("-0.0,") && !text.contains("-0.0\n"), "{text}");
        assert_eq!(back["b"][2], json!(-2.0));
        assert_eq!(back["b"][3], json!(0));
        assert_eq!(back["c"]["e"], json!("-0.0"), "strings are left as they are");
        for x in [&back["a"], &back["b"][1], &back["c"]["d"]] {
            assert!(x.as_f64().is_some_and(|x| x == 0.0 && x.is_sign_positive()), "{x}");
        }
    }
}
