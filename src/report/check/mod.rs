//! The design check in words: the demand and the value found with their unit, where the
//! governing value occurs, the verdict line, the `layloft check` table and its JSON.

mod json;
mod text;
mod words;

pub use json::{check_file_json, check_json};
pub use text::check_text;
pub use words::{demand_text, found_text, place_text, verdict_line, verdict_text};
