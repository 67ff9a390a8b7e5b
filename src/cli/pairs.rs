//! `KEY=VALUE,KEY=VALUE` option values (`--load Nx=1000,Mx=2.5`), checked against known keys.

use layloft::input::closest;

/// Parses `text`, the value of `option`, into one number per known key (zero where a key is not
/// given). Keys match without regard to case. Every fault is a message naming the option, the
/// item and what was expected.
pub fn parse_pairs(option: &str, text: &str, keys: &[&str]) -> Result<Vec<f64>, String> {
    let mut values: Vec<Option<f64>> = vec![None; keys.len()];
    let example = format!("{}=...", keys[0]);
    if text.trim().is_empty() {
        return Err(format!(
            "{option}: expected KEY=VALUE pairs separated by commas (keys {}), found nothing",
            keys.join(", ")
        ));
    }
    for (n, item) in text.split(',').enumerate() {
        let item = item.trim();
        if item.is_empty() {
            return Err(format!(
                "{option}: item {} is empty; expected KEY=VALUE such as {example}",
                n + 1
            ));
        }
        let Some((key, value)) = item.split_once('=') else {
            return Err(format!("{option}: '{item}' is not KEY=VALUE (such as {example})"));
        };
        let (key, value) = (key.trim(), value.trim());
        let Some(i) = keys.iter().position(|k| k.eq_ignore_ascii_case(key)) else {
            let hint = match closest(key, keys.iter().copied()) {
                Some(h) => format!("; did you mean '{h}'?"),
                None => format!("; known keys: {}", keys.join(", ")),
            };
            return Err(format!("{option}: unknown key '{key}'{hint}"));
        };
        if values[i].is_some() {
            return Err(format!("{option}: key '{}' is given twice", keys[i]));
        }
        let x: f64 = value.parse().map_err(|_| {
            format!("{option}: value of {} is '{value}', which is not a number", keys[i])
        })?;
        if !x.is_finite() {
            return Err(format!(
                "{option}: value of {} is '{value}'; expected a finite number",
                keys[i]
            ));
        }
        values[i] = Some(x);
    }
    Ok(values.into_iter().map(|v| v.unwrap_or(0.0)).collect())
}

#[cfg(test)]
mod tests {
    use super::*;

    const KEYS: [&str; 6] = ["Nx", "Ny", "Nxy", "Mx", "My", "Mxy"];

    #[test]
    fn keys_left_out_are_zero_and_case_does_not_matter() {
        let v = parse_pairs("--load", "nx=1e3, Mxy = -2.5", &KEYS).unwrap();
        assert_eq!(v, [1000.0, 0.0, 0.0, 0.0, 0.0, -2.5]);
    }

    #[test]
    fn faults_are_named() {
        let e = |t: &str| parse_pairs("--load", t, &KEYS).unwrap_err();
        assert_eq!(e("Nx=1,Nx=2"), "--load: key 'Nx' is given twice");
        assert_eq!(e("Nx=1e3x"), "--load: value of Nx is '1e3x', which is not a number");
        assert!(e("Nz=1").contains("unknown key 'Nz'"));
        assert!(e("Nx=1,").contains("item 2 is empty"));
        assert!(e("Nx").contains("is not KEY=VALUE"));
        assert!(e("Nx=inf").contains("finite"));
        assert!(e(" ").contains("found nothing"));
    }
}
