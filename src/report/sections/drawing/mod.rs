//! A to-scale drawing of one blade section as standalone SVG: the outer mould line, every wall
//! drawn as a band inward of it as thick as its laminate and coloured by laminate, the shear
//! webs, the wall midline the solver used, the chord line and pitch axis, the elastic, shear and
//! mass centres, a legend naming each laminate by its ply stack, a title and a scale bar.
//!
//! Frame: the chord frame (`y` to the right, from the leading edge towards the trailing edge;
//! `z` up, towards the upper surface; seen from the tip), drawn 1:1 in millimetres: the SVG's
//! user unit is 1 mm of the section and its `width`/`height` are given in mm, so a print at 100 %
//! is full size. Walls are bands between the outer line and the line offset inward by the local
//! laminate thickness (mitred at vertices), clipped to the outer line so that the walls of a thin
//! trailing edge show as the solid laminate they are.
//!
//! Files written by `layloft sections --svg DIR` are named by [`section_svg_names`]:
//! `section-r0.600.svg` for r = 0.6 m (radius in metres with three decimals, more when two
//! sections would otherwise share a name).
//!
//! ```
//! use layloft::analysis::BladeModel;
//! use layloft::input::read_project;
//! use layloft::report::{section_svg, section_svg_names};
//!
//! # fn main() -> Result<(), layloft::Error> {
//! # let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR"));
//! let model = BladeModel::build(read_project(&dir.join("layups/mine-fan/blade.toml"))?)?;
//! let svg = section_svg(&model.project.name, &model.blade, &model.stations[0]);
//! assert!(svg.starts_with("<svg") && svg.contains("elastic centre"));
//! assert_eq!(section_svg_names(&[0.6, 0.75]), ["section-r0.600.svg", "section-r0.750.svg"]);
//! # Ok(())
//! # }
//! ```

mod shapes;
mod walls;

use std::fmt::Write as _;

use super::laminate_label;
use crate::analysis::AnalysisStation;
use crate::blade::Blade;
use crate::report::fixed;
use shapes::{Frame, INK, colour, esc, n, scale_length, symbol, wrap_lines};

/// File names for drawings of sections at `radii` (m): `section-r0.600.svg`, with more decimals
/// (up to six) when three would give two sections the same name.
pub fn section_svg_names(radii: &[f64]) -> Vec<String> {
    let names = |d: usize| -> Vec<String> {
        radii
            .iter()
            .map(|r| format!("section-r{}.svg", format!("{r:.d$}").replace('-', "m")))
            .collect()
    };
    for d in 3..6 {
        let v = names(d);
        let mut sorted = v.clone();
        sorted.sort();
        sorted.dedup();
        if sorted.len() == v.len() {
            return v;
        }
    }
    names(6)
}

/// The drawing of one section as a standalone SVG document; see the module documentation.
pub fn section_svg(project: &str, blade: &Blade, st: &AnalysisStation) -> String {
    drawing(project, blade, st, None)
}

/// The same drawing sized for a screen: its text at 12 px whatever the chord, so that a small tip
/// section is not drawn at half the size of the others with unreadable text. Proportions stay
/// true (one scale for both directions); the viewBox is the same as [`section_svg`]'s.
pub fn section_svg_screen(project: &str, blade: &Blade, st: &AnalysisStation) -> String {
    drawing(project, blade, st, Some(12.0))
}

/// `text_px`: the size of the text on screen in px, or `None` for millimetres at 1:1.
fn drawing(project: &str, blade: &Blade, st: &AnalysisStation, text_px: Option<f64>) -> String {
    let layout = &st.layout;
    let p = &st.section.properties;
    let pts = &layout.outer;
    let (mut y_lo, mut y_hi, mut z_lo, mut z_hi) = (f64::MAX, f64::MIN, f64::MAX, f64::MIN);
    for q in pts {
        (y_lo, y_hi) = (y_lo.min(q[0] * 1e3), y_hi.max(q[0] * 1e3));
        (z_lo, z_hi) = (z_lo.min(q[1] * 1e3), z_hi.max(q[1] * 1e3));
    }
    let chord_mm = layout.chord * 1e3;
    let f = (chord_mm / 45.0).clamp(2.5, 14.0); // font size, mm
    let margin = (0.06 * chord_mm).max(3.0 * f);
    let char_w = 0.56 * f;

    // Texts first: they set the width.
    let title = format!("{project}: section at r = {:.3} m", layout.r);
    let subtitle = format!(
        "chord {:.1} mm, twist {:.2}°, pitch axis at {:.3} c; drawn 1:1 in mm, seen from the tip",
        chord_mm,
        layout.twist.deg(),
        layout.pitch_axis_frac
    );
    let mut legend: Vec<(Option<usize>, usize, String)> = Vec::new(); // (laminate, symbol, text)
    for k in 0..layout.laminates.len() {
        let webs: Vec<&str> =
            layout.webs.iter().filter(|w| w.laminate == k).map(|w| w.name.as_str()).collect();
        let used_on_skin = layout.segment_laminate.contains(&k);
        let place = match (used_on_skin, webs.is_empty()) {
            (_, true) => String::new(),
            (false, false) => format!("web {}: ", webs.join(", ")),
            (true, false) => format!("walls and web {}: ", webs.join(", ")),
        };
        legend.push((Some(k), 0, format!("{place}{}", laminate_label(blade, st, k))));
    }
    let at =
        |c: [f64; 2]| format!("y = {} mm, z = {} mm", fixed(c[0] * 1e3, 1), fixed(c[1] * 1e3, 1));
    legend.push((None, 0, "pitch axis (origin of y, z) and chord line".into()));
    legend.push((None, 1, format!("elastic centre, {}", at(p.elastic_centre))));
    legend.push((None, 2, format!("shear centre, {}", at(p.shear_centre))));
    legend.push((None, 3, format!("mass centre, {}", at(p.mass_centre))));
    legend.push((None, 4, "wall midline of the section model".into()));
    let text_w = legend
        .iter()
        .map(|l| l.2.chars().count() as f64 * char_w + 3.5 * f)
        .chain([
            title.chars().count() as f64 * 0.68 * 1.15 * f,
            subtitle.chars().count() as f64 * char_w,
        ])
        .fold(0.0, f64::max);
    let width = (y_hi - y_lo + 2.0 * margin).max(text_w + 2.0 * margin);
    let note_chars = ((width - 2.0 * margin) / (0.85 * char_w)).max(20.0) as usize;
    let notes: Vec<String> =
        p.warnings.iter().flat_map(|w| wrap_lines(&format!("! {w}"), note_chars)).collect();

    let top = 4.2 * f + margin * 0.5;
    let frame =
        Frame { x0: margin + (width - 2.0 * margin - (y_hi - y_lo)) / 2.0 - y_lo, y0: top + z_hi };
    let bar_y = top + (z_hi - z_lo) + margin * 0.6 + f;
    let legend_y = bar_y + 3.2 * f;
    let row = 1.7 * f;
    let notes_y = legend_y + legend.len() as f64 * row + 0.8 * f;
    let height = notes_y + notes.len() as f64 * 1.3 * f + margin * 0.5;

    let mut s = String::new();
    let (shown_w, shown_h) = match text_px {
        None => (format!("{}mm", n(width)), format!("{}mm", n(height))),
        Some(px) => (n(width * px / f), n(height * px / f)),
    };
    let _ = writeln!(
        s,
        "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{sw}\" height=\"{sh}\" \
         viewBox=\"0 0 {w} {h}\" font-family=\"sans-serif\" font-size=\"{fs}\">",
        sw = shown_w,
        sh = shown_h,
        w = n(width),
        h = n(height),
        fs = n(f)
    );
    let _ = writeln!(s, "<title>{}</title>", esc(&title));
    let id = format!("oml-r{}", n(layout.r * 1e3).replace(['.', '-'], "_"));
    let outer = frame.path(pts.iter().copied(), true);
    let _ = writeln!(s, "<defs><clipPath id=\"{id}\"><path d=\"{outer}\"/></clipPath></defs>");
    let _ = writeln!(s, "<rect width=\"{}\" height=\"{}\" fill=\"#ffffff\"/>", n(width), n(height));
    let _ = writeln!(s, "<path d=\"{outer}\" fill=\"#f7f5f0\"/>");

    walls::draw(&mut s, st, &frame, f, &id, &outer);
    // Chord line from the leading to the trailing edge, dash-dot.
    let (x_le, y_c) = frame.at([-layout.pitch_axis_frac * layout.chord, 0.0]);
    let (x_te, _) = frame.at([(1.0 - layout.pitch_axis_frac) * layout.chord, 0.0]);
    let _ = writeln!(
        s,
        "<path d=\"M{} {}H{}\" stroke=\"{INK}\" stroke-opacity=\"0.6\" stroke-width=\"{}\" \
         stroke-dasharray=\"{} {} {} {}\"/>",
        n(x_le),
        n(y_c),
        n(x_te),
        n(0.03 * f),
        n(1.2 * f),
        n(0.3 * f),
        n(0.2 * f),
        n(0.3 * f)
    );
    let size = 1.1 * f;
    for (kind, c) in
        [(0, [0.0, 0.0]), (1, p.elastic_centre), (2, p.shear_centre), (3, p.mass_centre)]
    {
        let (x, y) = frame.at(c);
        let _ = writeln!(s, "{}", symbol(kind, x, y, size));
    }

    // Title, scale bar, legend, notes.
    let _ = writeln!(
        s,
        "<text x=\"{}\" y=\"{}\" font-size=\"{}\" font-weight=\"bold\" fill=\"{INK}\">{}</text>",
        n(margin),
        n(1.6 * f),
        n(1.15 * f),
        esc(&title)
    );
    let _ = writeln!(
        s,
        "<text x=\"{}\" y=\"{}\" fill=\"{INK}\">{}</text>",
        n(margin),
        n(3.1 * f),
        esc(&subtitle)
    );
    let bar = scale_length(chord_mm);
    let (bx, bh) = (margin, 0.45 * f);
    let _ = writeln!(
        s,
        "<g stroke=\"{INK}\" stroke-width=\"{}\"><rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" \
         fill=\"{INK}\"/><rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"#ffffff\"/></g>",
        n(0.04 * f),
        n(bx),
        n(bar_y),
        n(bar / 2.0),
        n(bh),
        n(bx + bar / 2.0),
        n(bar_y),
        n(bar / 2.0),
        n(bh)
    );
    for (x, label, anchor) in [
        (bx, "0".to_string(), "middle"),
        (bx + bar / 2.0, n(bar / 2.0), "middle"),
        (bx + bar, format!("{} mm", n(bar)), "start"),
    ] {
        let _ = writeln!(
            s,
            "<text x=\"{}\" y=\"{}\" text-anchor=\"{anchor}\" font-size=\"{}\" fill=\"{INK}\">{}</text>",
            n(x),
            n(bar_y + bh + 1.1 * f),
            n(0.85 * f),
            esc(&label)
        );
    }
    for (i, (lam, kind, text)) in legend.iter().enumerate() {
        let y = legend_y + i as f64 * row;
        let mark = match lam {
            Some(k) => format!(
                "<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"{}\" stroke=\"{INK}\" \
                 stroke-width=\"{}\"/>",
                n(margin),
                n(y - 0.9 * f),
                n(2.4 * f),
                n(1.1 * f),
                colour(*k),
                n(0.03 * f)
            ),
            None if *kind == 4 => format!(
                "<path d=\"M{} {}H{}\" stroke=\"{INK}\" stroke-width=\"{}\" stroke-dasharray=\"{} {}\"/>",
                n(margin),
                n(y - 0.35 * f),
                n(margin + 2.4 * f),
                n(0.06 * f),
                n(0.4 * f),
                n(0.25 * f)
            ),
            None => symbol(*kind, margin + 1.2 * f, y - 0.35 * f, size),
        };
        let _ = writeln!(
            s,
            "{mark}<text x=\"{}\" y=\"{}\" fill=\"{INK}\">{}</text>",
            n(margin + 3.2 * f),
            n(y),
            esc(text)
        );
    }
    for (i, line) in notes.iter().enumerate() {
        let _ = writeln!(
            s,
            "<text x=\"{}\" y=\"{}\" font-size=\"{}\" fill=\"#8a4b08\">{}</text>",
            n(margin),
            n(notes_y + i as f64 * 1.3 * f),
            n(0.85 * f),
            esc(line)
        );
    }
    s.push_str("</svg>\n");
    s
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn names_get_more_decimals_only_when_needed() {
        assert_eq!(section_svg_names(&[0.6]), ["section-r0.600.svg"]);
        assert_eq!(
            section_svg_names(&[0.6001, 0.6002]),
            ["section-r0.6001.svg", "section-r0.6002.svg"]
        );
    }
}
