//! A static check of the report's markup, for machines without a browser.
//!
//! Stricter than HTML needs, on purpose: the report builder closes every element it opens, so
//! every non-void element must be closed explicitly and in order (SVG elements may close
//! themselves with `/>`); `<` in text and `&` outside a character reference are errors; no
//! attribute or style may fetch anything from a network; `NaN` and `inf` must not appear as
//! words anywhere.

/// Elements that never have content or an end tag.
const VOID: [&str; 13] = [
    "area", "base", "br", "col", "embed", "hr", "img", "input", "link", "meta", "source", "track",
    "wbr",
];

/// Attributes whose value names a resource to fetch or follow.
const RESOURCE_ATTRS: [&str; 7] =
    ["src", "href", "xlink:href", "srcset", "poster", "action", "data"];

/// Every problem found, each with its line; empty when the document passes. `figure_ids` are
/// the `data-figure` values that must each be present.
pub fn static_problems(html: &str, figure_ids: &[String]) -> Vec<String> {
    let mut problems = Vec::new();
    check_markup(html, &mut problems);
    for id in figure_ids {
        if !html.contains(&format!("data-figure=\"{id}\"")) {
            problems.push(format!("figure '{id}' is missing"));
        }
    }
    for (n, line) in html.lines().enumerate() {
        for word in line.split(|c: char| !c.is_ascii_alphanumeric()) {
            if word == "NaN" || word == "inf" {
                problems.push(format!("line {}: '{word}' in the document", n + 1));
            }
        }
    }
    problems
}

fn line_of(html: &str, at: usize) -> usize {
    html[..at].matches('\n').count() + 1
}

fn check_markup(html: &str, problems: &mut Vec<String>) {
    let mut open: Vec<(String, usize)> = Vec::new();
    let mut i = 0;
    while i < html.len() {
        let Some(k) = html[i..].find(['<', '&']) else {
            break;
        };
        let at = i + k;
        let rest = &html[at..];
        if rest.starts_with('&') {
            if !is_reference(rest) {
                problems.push(format!(
                    "line {}: '&' that starts no character reference",
                    line_of(html, at)
                ));
            }
            i = at + 1;
        } else if rest.starts_with("<!--") {
            i = at + rest.find("-->").map_or(rest.len(), |e| e + 3);
        } else if rest.starts_with("<!") {
            i = at + rest.find('>').map_or(rest.len(), |e| e + 1);
        } else if let Some(name) = rest.strip_prefix("</") {
            let end = name.find('>').unwrap_or(name.len());
            let name = name[..end].trim();
            match open.pop() {
                Some((top, _)) if top == name => {}
                Some((top, line)) => problems.push(format!(
                    "line {}: </{name}> closes <{top}> opened on line {line}",
                    line_of(html, at)
                )),
                None => {
                    problems.push(format!("line {}: </{name}> closes nothing", line_of(html, at)))
                }
            }
            i = at + 2 + end + 1;
        } else if rest[1..].starts_with(|c: char| c.is_ascii_alphabetic()) {
            let Some(StartTag { name, attrs, self_closing, len }) = start_tag(rest) else {
                problems.push(format!("line {}: a tag that does not end", line_of(html, at)));
                break;
            };
            check_attributes(&name, &attrs, line_of(html, at), problems);
            i = at + len;
            if name == "style" || name == "script" {
                let close = format!("</{name}>");
                let body_end = html[i..].find(&close).map_or(html.len(), |e| i + e);
                if name == "style" {
                    check_style(&html[i..body_end], line_of(html, i), problems);
                }
                i = body_end; // the end tag is matched on the next pass
            }
            if !self_closing && !VOID.contains(&name.as_str()) {
                open.push((name, line_of(html, at)));
            }
        } else {
            problems.push(format!("line {}: '<' in text", line_of(html, at)));
            i = at + 1;
        }
    }
    for (name, line) in open {
        problems.push(format!("<{name}> opened on line {line} is never closed"));
    }
}

/// Whether `s` (starting at `&`) starts `&name;`, `&#123;` or `&#x1F;`.
fn is_reference(s: &str) -> bool {
    let body: String = s[1..].chars().take_while(|c| *c != ';').take(32).collect();
    if s[1..].chars().nth(body.chars().count()) != Some(';') || body.is_empty() {
        return false;
    }
    if let Some(hex) = body.strip_prefix("#x").or_else(|| body.strip_prefix("#X")) {
        !hex.is_empty() && hex.chars().all(|c| c.is_ascii_hexdigit())
    } else if let Some(dec) = body.strip_prefix('#') {
        !dec.is_empty() && dec.chars().all(|c| c.is_ascii_digit())
    } else {
        body.chars().all(|c| c.is_ascii_alphanumeric())
    }
}

/// A start tag as read.
struct StartTag {
    name: String,
    attrs: Vec<(String, String)>,
    /// Whether it ends in `/>`.
    self_closing: bool,
    /// Its length in bytes.
    len: usize,
}

/// The start tag at the beginning of `s`, or `None` when it does not end.
fn start_tag(s: &str) -> Option<StartTag> {
    let bytes = s.as_bytes();
    let mut k = 1;
    while k < bytes.len() && !bytes[k].is_ascii_whitespace() && bytes[k] != b'>' && bytes[k] != b'/'
    {
        k += 1;
    }
    let name = s[1..k].to_string();
    let mut attrs = Vec::new();
    loop {
        while k < bytes.len() && bytes[k].is_ascii_whitespace() {
            k += 1;
        }
        match bytes.get(k)? {
            b'>' => return Some(StartTag { name, attrs, self_closing: false, len: k + 1 }),
            b'/' if bytes.get(k + 1) == Some(&b'>') => {
                return Some(StartTag { name, attrs, self_closing: true, len: k + 2 });
            }
            _ => {}
        }
        let start = k;
        while k < bytes.len() && !b" \t\n\r=>/".contains(&bytes[k]) {
            k += 1;
        }
        let key = s[start..k].to_string();
        let mut value = String::new();
        if bytes.get(k) == Some(&b'=') {
            k += 1;
            let quote = *bytes.get(k)?;
            if quote == b'"' || quote == b'\'' {
                let end = s[k + 1..].find(quote as char)? + k + 1;
                value = s[k + 1..end].to_string();
                k = end + 1;
            } else {
                let end = s[k..].find(|c: char| c.is_ascii_whitespace() || c == '>')? + k;
                value = s[k..end].to_string();
                k = end;
            }
        } else if key.is_empty() {
            k += 1; // a stray '/' or '='
            continue;
        }
        attrs.push((key, value));
    }
}

fn check_attributes(
    tag: &str,
    attrs: &[(String, String)],
    line: usize,
    problems: &mut Vec<String>,
) {
    for (key, value) in attrs {
        let v = value.trim().to_ascii_lowercase();
        if RESOURCE_ATTRS.contains(&key.to_ascii_lowercase().as_str())
            && (v.contains("://") || v.starts_with("//"))
        {
            problems.push(format!(
                "line {line}: <{tag} {key}=\"{value}\"> refers to a network resource"
            ));
        }
        if key == "style" {
            check_style(value, line, problems);
        }
        if value.match_indices('&').any(|(k, _)| !is_reference(&value[k..])) {
            problems.push(format!(
                "line {line}: '&' in the attribute {key} of <{tag}> starts no reference"
            ));
        }
        if value.contains('<') {
            problems.push(format!("line {line}: '<' inside the attribute {key} of <{tag}>"));
        }
    }
}

fn check_style(css: &str, line: usize, problems: &mut Vec<String>) {
    if css.contains("@import") {
        problems.push(format!("line {line}: @import in a style sheet"));
    }
    let mut rest = css;
    while let Some(k) = rest.find("url(") {
        let arg: String = rest[k + 4..].chars().take_while(|c| *c != ')').collect();
        if arg.contains("://") || arg.trim_matches(['"', '\'', ' ']).starts_with("//") {
            problems.push(format!("line {line}: url({arg}) refers to a network resource"));
        }
        rest = &rest[k + 4..];
    }
}
