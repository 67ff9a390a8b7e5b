//! Tick values, numbers and text for SVG.

pub(super) fn valid_range(min: f64, max: f64) -> Option<(f64, f64)> {
    (min.is_finite() && max.is_finite() && max > min).then_some((min, max))
}

/// Tick values covering `[min, max]` at a 1, 2 or 5 times power-of-ten step, about `target` of
/// them; the first tick is at or below `min` and the last at or above `max`.
pub fn nice_ticks(min: f64, max: f64, target: usize) -> Vec<f64> {
    if !(min.is_finite() && max.is_finite()) || max <= min || target < 2 {
        return Vec::new();
    }
    let raw = (max - min) / (target - 1) as f64;
    let power = 10f64.powf(raw.log10().floor());
    let step = [1.0, 2.0, 2.5, 5.0, 10.0]
        .iter()
        .map(|m| m * power)
        .find(|s| *s >= raw)
        .unwrap_or(10.0 * power);
    let first = (min / step).floor();
    let last = (max / step).ceil();
    let count = (last - first) as usize;
    (0..=count)
        .map(|i| (first + i as f64) * step)
        .map(|v| if v.abs() < step * 1e-9 { 0.0 } else { v })
        .collect()
}

/// Escapes `&`, `<`, `>`, `"` and `'` for XML text and attributes.
pub fn escape(text: &str) -> String {
    let mut out = String::with_capacity(text.len());
    for c in text.chars() {
        match c {
            '&' => out.push_str("&amp;"),
            '<' => out.push_str("&lt;"),
            '>' => out.push_str("&gt;"),
            '"' => out.push_str("&quot;"),
            '\'' => out.push_str("&apos;"),
            c if (c as u32) < 0x20 && c != '\n' && c != '\t' => {}
            c => out.push(c),
        }
    }
    out
}

/// A coordinate with two decimals (never `NaN`: non-finite values become 0).
pub(super) fn num(v: f64) -> String {
    if !v.is_finite() {
        return "0".to_string();
    }
    let s = format!("{v:.2}");
    let s = s.trim_end_matches('0').trim_end_matches('.');
    if s == "-0" { "0".to_string() } else { s.to_string() }
}

/// A tick label with as many decimals as the step needs.
/// The value of decade `d` (10^d) as a tick label.
pub(super) fn decade_text(d: f64, plain: bool) -> String {
    let e = d.round() as i32;
    if plain {
        let v = 10f64.powi(e);
        if e >= 0 { format!("{v:.0}") } else { format!("{v}") }
    } else {
        format!("1e{e}")
    }
}

pub(super) fn tick_text(v: f64, step: f64) -> String {
    let decimals = if step >= 1.0 { 0 } else { (-step.log10()).ceil().clamp(0.0, 9.0) as usize };
    let s = format!("{v:.decimals$}");
    if s.trim_start_matches('-').chars().all(|c| c == '0' || c == '.') { "0".into() } else { s }
}

pub(super) fn slug(title: &str) -> String {
    let s: String = title
        .chars()
        .map(|c| if c.is_ascii_alphanumeric() { c.to_ascii_lowercase() } else { '-' })
        .collect();
    if s.is_empty() { "plot".into() } else { s }
}

#[cfg(test)]
mod tests {
    use super::super::{Anchor, Figure, LineStyle};
    use super::*;

    #[test]
    fn ticks_are_nice_and_cover_the_range() {
        assert_eq!(
            nice_ticks(0.0, 1090.0, 8),
            vec![0.0, 200.0, 400.0, 600.0, 800.0, 1000.0, 1200.0]
        );
        let t = nice_ticks(0.13, 0.87, 5);
        let expected = [0.0, 0.2, 0.4, 0.6, 0.8, 1.0];
        assert_eq!(t.len(), expected.len());
        assert!(t.iter().zip(expected).all(|(a, b)| (a - b).abs() < 1e-12), "{t:?}");
        assert_eq!(tick_text(t[3], 0.2), "0.6");
        assert_eq!(nice_ticks(0.0, 0.7, 4), vec![0.0, 0.25, 0.5, 0.75]);
        assert!(nice_ticks(1.0, 1.0, 5).is_empty());
        assert!(nice_ticks(f64::NAN, 1.0, 5).is_empty());
    }

    #[test]
    fn text_is_escaped_and_nan_never_written() {
        assert_eq!(escape(r#"a<b & "c">'d'"#), "a&lt;b &amp; &quot;c&quot;&gt;&apos;d&apos;");
        let mut fig = Figure::new("T & <x>", "x (m)", "y (N)");
        fig.line(
            &[(0.0, 1.0), (f64::NAN, 2.0), (1.0, 2.0), (2.0, f64::INFINITY), (3.0, 0.5)],
            &LineStyle::solid("#000000", 1.0),
        );
        fig.label(f64::NAN, 0.0, "lost", "#000000", Anchor::Start);
        let svg = fig.render();
        assert!(!svg.contains("NaN") && !svg.contains("inf"), "{svg}");
        assert!(svg.contains("T &amp; &lt;x&gt;"));
        assert_eq!(svg.matches("<polyline").count(), 0, "no run has two finite points");
    }
}
