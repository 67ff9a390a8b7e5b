//! Simple SVG drawings for sample reports: a line plot with labelled axes, a filled outline and
//! a colour map. Test scaffolding only; the report's real plots belong to `layloft::report`.

use std::fmt::Write as _;

const W: f64 = 720.0;
const H: f64 = 330.0;
const LEFT: f64 = 70.0;
const RIGHT: f64 = 150.0;
const TOP: f64 = 18.0;
const BOTTOM: f64 = 52.0;

/// Palette of the sample drawings.
pub const COLOURS: [&str; 6] = ["#0e5a66", "#c0632b", "#6a4c93", "#2f7d32", "#8d6e63", "#5b6874"];

/// One line of a plot.
pub struct Series<'a> {
    /// Legend text.
    pub name: &'a str,
    /// Points in plot units.
    pub points: Vec<(f64, f64)>,
    /// Stroke colour.
    pub colour: &'a str,
    /// Dashed (reference lines such as rotor harmonics).
    pub dashed: bool,
}

/// Tick positions: steps of 1, 2 or 5 times a power of ten, about five across the range.
fn ticks(lo: f64, hi: f64) -> Vec<f64> {
    let raw = (hi - lo) / 5.0;
    let mag = 10f64.powf(raw.log10().floor());
    let step = [1.0, 2.0, 5.0, 10.0].iter().map(|m| m * mag).find(|s| *s >= raw).unwrap_or(mag);
    let first = (lo / step).ceil() as i64;
    let last = (hi / step + 1e-9).floor() as i64;
    (first..=last).map(|k| k as f64 * step).collect()
}

fn label(v: f64) -> String {
    let s = format!("{v:.3}");
    let s = s.trim_end_matches('0').trim_end_matches('.').to_string();
    if s == "-0" { "0".into() } else { s }
}

/// A line plot: axes with ticks and their labels (quantity and unit), a light grid, the
/// series clipped to the plot area, a legend on the right, and optional marked points.
pub fn line_plot(
    x_axis: (&str, f64, f64),
    y_axis: (&str, f64, f64),
    series: &[Series],
    marks: &[(f64, f64, &str)],
) -> String {
    let (xl, x0, x1) = x_axis;
    let (yl, y0, y1) = y_axis;
    let pw = W - LEFT - RIGHT;
    let ph = H - TOP - BOTTOM;
    let sx = |x: f64| LEFT + (x - x0) / (x1 - x0) * pw;
    let sy = |y: f64| TOP + ph - (y - y0) / (y1 - y0) * ph;
    let mut s = format!(
        "<svg xmlns=\"http://www.w3.org/2000/svg\" viewBox=\"0 0 {W} {H}\" width=\"{W}\" \
         height=\"{H}\" font-size=\"12\" fill=\"#1c2630\">\n"
    );
    let clip = format!("clip-{}", xl.len() * 31 + yl.len() * 7 + series.len());
    let _ = writeln!(
        s,
        "<defs><clipPath id=\"{clip}\"><rect x=\"{LEFT}\" y=\"{TOP}\" width=\"{pw}\" \
         height=\"{ph}\"/></clipPath></defs>"
    );
    for t in ticks(x0, x1) {
        let x = sx(t);
        let _ = writeln!(
            s,
            "<line x1=\"{x:.1}\" y1=\"{TOP}\" x2=\"{x:.1}\" y2=\"{}\" stroke=\"#e4e0d8\"/><text \
             x=\"{x:.1}\" y=\"{}\" text-anchor=\"middle\">{}</text>",
            TOP + ph,
            TOP + ph + 16.0,
            label(t)
        );
    }
    for t in ticks(y0, y1) {
        let y = sy(t);
        let _ = writeln!(
            s,
            "<line x1=\"{LEFT}\" y1=\"{y:.1}\" x2=\"{}\" y2=\"{y:.1}\" stroke=\"#e4e0d8\"/><text \
             x=\"{}\" y=\"{:.1}\" text-anchor=\"end\">{}</text>",
            LEFT + pw,
            LEFT - 6.0,
            y + 4.0,
            label(t)
        );
    }
    let _ = writeln!(
        s,
        "<rect x=\"{LEFT}\" y=\"{TOP}\" width=\"{pw}\" height=\"{ph}\" fill=\"none\" \
         stroke=\"#1c2630\"/>\n<text x=\"{}\" y=\"{}\" text-anchor=\"middle\">{xl}</text>\n<text \
         transform=\"translate(18 {}) rotate(-90)\" text-anchor=\"middle\">{yl}</text>",
        LEFT + pw / 2.0,
        H - 12.0,
        TOP + ph / 2.0
    );
    for (k, line) in series.iter().enumerate() {
        let pts: Vec<String> =
            line.points.iter().map(|(x, y)| format!("{:.1},{:.1}", sx(*x), sy(*y))).collect();
        let dash = if line.dashed { " stroke-dasharray=\"5 4\"" } else { "" };
        let width = if line.dashed { 1.0 } else { 2.0 };
        let _ = writeln!(
            s,
            "<polyline points=\"{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"{width}\"{dash} \
             clip-path=\"url(#{clip})\"/>",
            pts.join(" "),
            line.colour
        );
        let ly = TOP + 10.0 + 18.0 * k as f64;
        let lx = LEFT + pw + 14.0;
        let _ = writeln!(
            s,
            "<line x1=\"{lx}\" y1=\"{ly}\" x2=\"{}\" y2=\"{ly}\" stroke=\"{}\" \
             stroke-width=\"{width}\"{dash}/><text x=\"{}\" y=\"{}\">{}</text>",
            lx + 22.0,
            line.colour,
            lx + 28.0,
            ly + 4.0,
            line.name
        );
    }
    for (x, y, text) in marks {
        let _ = writeln!(
            s,
            "<circle cx=\"{:.1}\" cy=\"{:.1}\" r=\"5\" fill=\"none\" stroke=\"#a3231b\" \
             stroke-width=\"2\"/><text x=\"{:.1}\" y=\"{:.1}\" fill=\"#a3231b\">{text}</text>",
            sx(*x),
            sy(*y),
            sx(*x) + 8.0,
            sy(*y) - 8.0
        );
    }
    s.push_str("</svg>");
    s
}

/// A closed outline (e.g. a planform or a section) drawn to scale in a box, with a dimension
/// note under it.
pub fn outline(rings: &[(Vec<(f64, f64)>, &str)], note: &str) -> String {
    let all = rings.iter().flat_map(|(r, _)| r.iter());
    let (mut x0, mut x1, mut y0, mut y1) = (f64::MAX, f64::MIN, f64::MAX, f64::MIN);
    for (x, y) in all {
        (x0, x1, y0, y1) = (x0.min(*x), x1.max(*x), y0.min(*y), y1.max(*y));
    }
    let (w, h) = (W, 250.0);
    let scale = ((w - 80.0) / (x1 - x0)).min((h - 70.0) / (y1 - y0));
    let ox = (w - (x1 - x0) * scale) / 2.0;
    let oy = 20.0 + ((h - 70.0) - (y1 - y0) * scale) / 2.0;
    let mut s = format!(
        "<svg xmlns=\"http://www.w3.org/2000/svg\" viewBox=\"0 0 {w} {h}\" width=\"{w}\" \
         height=\"{h}\" font-size=\"12\" fill=\"#1c2630\">\n"
    );
    for (ring, fill) in rings {
        let pts: Vec<String> = ring
            .iter()
            .map(|(x, y)| format!("{:.1},{:.1}", ox + (x - x0) * scale, oy + (y1 - y) * scale))
            .collect();
        let _ = writeln!(
            s,
            "<polygon points=\"{}\" fill=\"{fill}\" stroke=\"#1c2630\" stroke-width=\"1\"/>",
            pts.join(" ")
        );
    }
    let _ = writeln!(
        s,
        "<text x=\"{}\" y=\"{}\" text-anchor=\"middle\">{note}</text>",
        w / 2.0,
        h - 16.0
    );
    s.push_str("</svg>");
    s
}

/// A colour map of `values[row][col]` (rows top to bottom) with a scale bar, axis labels and a
/// marked cell.
pub fn colour_map(
    values: &[Vec<f64>],
    x_label: &str,
    y_label: &str,
    mark: (usize, usize),
) -> String {
    let (w, h) = (W, 300.0);
    let (left, top, pw, ph) = (70.0, 16.0, 520.0, 220.0);
    let rows = values.len();
    let cols = values.first().map_or(0, Vec::len);
    let (lo, hi) =
        values.iter().flatten().fold((f64::MAX, f64::MIN), |(a, b), v| (a.min(*v), b.max(*v)));
    let colour = |v: f64| {
        let t = ((v - lo) / (hi - lo)).clamp(0.0, 1.0);
        // From a warm red at the lowest reserve to a pale teal at the highest.
        let (r, g, b) =
            (163.0 + t * (215.0 - 163.0), 35.0 + t * (234.0 - 35.0), 27.0 + t * (236.0 - 27.0));
        format!("rgb({r:.0},{g:.0},{b:.0})")
    };
    let (cw, ch) = (pw / cols as f64, ph / rows as f64);
    let mut s = format!(
        "<svg xmlns=\"http://www.w3.org/2000/svg\" viewBox=\"0 0 {w} {h}\" width=\"{w}\" \
         height=\"{h}\" font-size=\"12\" fill=\"#1c2630\">\n"
    );
    for (i, row) in values.iter().enumerate() {
        for (j, v) in row.iter().enumerate() {
            let _ = writeln!(
                s,
                "<rect x=\"{:.1}\" y=\"{:.1}\" width=\"{:.1}\" height=\"{:.1}\" fill=\"{}\"/>",
                left + j as f64 * cw,
                top + i as f64 * ch,
                cw + 0.3,
                ch + 0.3,
                colour(*v)
            );
        }
    }
    let (mi, mj) = mark;
    let _ = writeln!(
        s,
        "<rect x=\"{:.1}\" y=\"{:.1}\" width=\"{cw:.1}\" height=\"{ch:.1}\" fill=\"none\" \
         stroke=\"#1c2630\" stroke-width=\"2.5\"/><text x=\"{:.1}\" y=\"{:.1}\">critical: {:.2}</text>",
        left + mj as f64 * cw,
        top + mi as f64 * ch,
        left + (mj as f64 + 1.0) * cw + 4.0,
        top + mi as f64 * ch + ch / 2.0 + 4.0,
        values[mi][mj]
    );
    let _ = writeln!(
        s,
        "<rect x=\"{left}\" y=\"{top}\" width=\"{pw}\" height=\"{ph}\" fill=\"none\" \
         stroke=\"#1c2630\"/>\n<text x=\"{}\" y=\"{}\" text-anchor=\"middle\">{x_label}</text>\n\
         <text transform=\"translate(20 {}) rotate(-90)\" text-anchor=\"middle\">{y_label}</text>",
        left + pw / 2.0,
        top + ph + 24.0,
        top + ph / 2.0
    );
    let bx = left + pw + 50.0;
    for k in 0..20 {
        let v = hi - (hi - lo) * k as f64 / 19.0;
        let _ = writeln!(
            s,
            "<rect x=\"{bx}\" y=\"{:.1}\" width=\"18\" height=\"11.5\" fill=\"{}\"/>",
            top + k as f64 * 11.0,
            colour(v)
        );
    }
    let _ = writeln!(
        s,
        "<text x=\"{}\" y=\"{}\">{hi:.2}</text><text x=\"{}\" y=\"{}\">{lo:.2}</text><text \
         x=\"{}\" y=\"{}\" text-anchor=\"middle\">reserve factor (-)</text>",
        bx + 24.0,
        top + 10.0,
        bx + 24.0,
        top + 220.0,
        bx + 9.0,
        top + ph + 24.0
    );
    s.push_str("</svg>");
    s
}
