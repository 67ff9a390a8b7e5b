//! Drawing primitives of our own: numbers and text for SVG, the palette, the chord-frame to
//! drawing map, the symbols of the centres, the scale bar's length and wrapped notes.

use std::fmt::Write as _;

/// Our own palette for laminates (muted, distinct on white and under dark symbols); beyond it,
/// hues step round by the golden angle.
const PALETTE: [&str; 10] = [
    "#7ea6c4", "#e2ad62", "#8fbf7a", "#c98a93", "#a597cf", "#d8cd75", "#6f9f9a", "#c0926a",
    "#9cc9e3", "#b3b38c",
];
pub(super) const INK: &str = "#22272e";

pub(super) fn colour(k: usize) -> String {
    match PALETTE.get(k) {
        Some(c) => (*c).to_string(),
        None => format!("hsl({:.0},42%,62%)", (k as f64 * 137.508) % 360.0),
    }
}

/// A number for SVG: three decimals without trailing zeros; zero for a value that is not finite
/// (never written as NaN).
pub(super) fn n(v: f64) -> String {
    if !v.is_finite() {
        return "0".into();
    }
    let s = format!("{v:.3}");
    let s = s.trim_end_matches('0').trim_end_matches('.');
    if s == "-0" || s.is_empty() { "0".into() } else { s.to_string() }
}

/// Text escaped for SVG character data and attribute values.
pub(super) fn esc(s: &str) -> String {
    crate::report::plot::escape(s)
}

/// Maps chord-frame points (m) to drawing coordinates (mm, y down).
pub(super) struct Frame {
    pub(super) x0: f64,
    pub(super) y0: f64,
}

impl Frame {
    pub(super) fn at(&self, p: [f64; 2]) -> (f64, f64) {
        (self.x0 + p[0] * 1e3, self.y0 - p[1] * 1e3)
    }

    pub(super) fn path(&self, pts: impl IntoIterator<Item = [f64; 2]>, close: bool) -> String {
        let mut d = String::new();
        for (i, p) in pts.into_iter().enumerate() {
            let (x, y) = self.at(p);
            let _ = write!(d, "{}{} {} ", if i == 0 { "M" } else { "L" }, n(x), n(y));
        }
        if close {
            d.push('Z');
        }
        d.trim_end().to_string()
    }
}

/// Symbol shapes of our own: 0 pitch axis (a cross in a circle), 1 elastic centre (filled
/// diamond), 2 shear centre (open triangle), 3 mass centre (ring round a dot).
pub(super) fn symbol(kind: usize, x: f64, y: f64, s: f64) -> String {
    let h = s / 2.0;
    let halo = format!("stroke=\"#ffffff\" stroke-width=\"{}\"", n(s * 0.35));
    let ink = format!("stroke=\"{INK}\" stroke-width=\"{}\"", n(s * 0.12));
    let draw = |body: String, fill: &str| {
        format!("<g fill=\"{fill}\"><g {halo}>{body}</g><g {ink}>{body}</g></g>")
    };
    match kind {
        0 => draw(
            format!(
                "<circle cx=\"{}\" cy=\"{}\" r=\"{}\"/><path d=\"M{} {}H{}M{} {}V{}\"/>",
                n(x),
                n(y),
                n(h * 0.7),
                n(x - h),
                n(y),
                n(x + h),
                n(x),
                n(y - h),
                n(y + h)
            ),
            "none",
        ),
        1 => draw(
            format!(
                "<path d=\"M{} {}L{} {}L{} {}L{} {}Z\"/>",
                n(x),
                n(y - h),
                n(x + h),
                n(y),
                n(x),
                n(y + h),
                n(x - h),
                n(y)
            ),
            INK,
        ),
        2 => draw(
            format!(
                "<path d=\"M{} {}L{} {}L{} {}Z\"/>",
                n(x),
                n(y - h),
                n(x + h * 0.95),
                n(y + h * 0.7),
                n(x - h * 0.95),
                n(y + h * 0.7)
            ),
            "#ffffff",
        ),
        _ => {
            let ring = format!("<circle cx=\"{}\" cy=\"{}\" r=\"{}\"/>", n(x), n(y), n(h * 0.8));
            let dot = format!(
                "<circle cx=\"{}\" cy=\"{}\" r=\"{}\" fill=\"{INK}\" stroke=\"none\"/>",
                n(x),
                n(y),
                n(h * 0.25)
            );
            format!("{}{dot}", draw(ring, "#ffffff"))
        }
    }
}

/// A round length for the scale bar near a quarter of `chord_mm`: 1, 2 or 5 times a power of ten.
pub(super) fn scale_length(chord_mm: f64) -> f64 {
    let target = (chord_mm / 4.0).max(1e-3);
    let p = 10f64.powf(target.log10().floor());
    [5.0, 2.0, 1.0].into_iter().map(|k| k * p).find(|&l| l <= target).unwrap_or(p)
}

/// Lines of at most `width` characters.
pub(super) fn wrap_lines(text: &str, width: usize) -> Vec<String> {
    let mut lines = vec![String::new()];
    for word in text.split_whitespace() {
        let cur = lines.last_mut().map_or(0, |l| l.chars().count());
        if cur > 0 && cur + 1 + word.chars().count() > width {
            lines.push(String::new());
        }
        if let Some(l) = lines.last_mut() {
            if !l.is_empty() {
                l.push(' ');
            }
            l.push_str(word);
        }
    }
    lines
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn numbers_and_text_are_safe_for_svg() {
        assert_eq!(n(f64::NAN), "0");
        assert_eq!(n(-0.0001), "0");
        assert_eq!(n(12.5), "12.5");
        assert_eq!(esc("a<b & 'c'"), "a&lt;b &amp; &apos;c&apos;");
    }

    #[test]
    fn scale_bar_is_a_round_length_near_a_quarter_chord() {
        assert_eq!(scale_length(280.0), 50.0);
        assert_eq!(scale_length(100.0), 20.0);
        assert_eq!(scale_length(40.0), 10.0);
    }
}
