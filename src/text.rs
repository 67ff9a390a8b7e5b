//! Small helpers on text shared by every module that names things in messages: the closest
//! valid name to a misspelt one, and a short excerpt of a runaway value. They sit at the bottom of
//! the module flow (beside `units`) so that a stage can suggest a name without the file reader.

/// At most `MAX` characters of a value for a message, with `…` and the full length when cut, so
/// that a runaway value (a 2 MB number) is not echoed whole.
pub fn excerpt(text: &str) -> String {
    const MAX: usize = 40;
    let count = text.chars().count();
    if count <= MAX {
        text.to_string()
    } else {
        let head: String = text.chars().take(MAX).collect();
        format!("{head}… ({count} characters)")
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
