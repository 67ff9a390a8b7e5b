//! The Campbell diagram as SVG: every track a line coloured by its kind, the rotor orders as
//! dashed lines labelled `nP`, blade-passing orders in a heavier dash-dot, vane-passing orders
//! dotted in their own colour (labelled with every source, e.g. `11P (11 vanes)`), fixed
//! frequencies as horizontal lines (bands shaded), crossings marked (filled
//! inside the operating range), the operating range shaded, axes "rotor speed (rpm)" and
//! "frequency (Hz)".

use crate::modal::{Campbell, Crossing, Excitation, ModeKind};
use crate::report::plot::{Anchor, Figure, LineStyle, Marker, palette};
use crate::units::RotorSpeed;

/// Colour of a mode kind.
pub fn kind_colour(kind: ModeKind) -> &'static str {
    match kind {
        ModeKind::Flap => palette::SERIES[0],
        ModeKind::Edge => palette::SERIES[1],
        ModeKind::Torsion => palette::SERIES[2],
        ModeKind::Axial => palette::SERIES[3],
        ModeKind::Mixed => palette::SERIES[4],
    }
}

/// The Campbell diagram of `campbell` with its excitation lines and crossings; `operating` is
/// the shaded speed range (rpm), e.g. nominal to maximum.
pub fn campbell_svg(
    campbell: &Campbell,
    excitations: &[Excitation],
    crossings: &[Crossing],
    operating: (f64, f64),
    title: &str,
) -> String {
    let mut fig = Figure::new(title, "rotor speed (rpm)", "frequency (Hz)");
    // The plot's speed axis is in rpm.
    let rpm_max = campbell.speeds.last().map_or(1.0, |s| s.speed.rpm()).max(1e-9);
    let rpm_min = campbell.speeds.first().map_or(0.0, |s| s.speed.rpm()).min(rpm_max - 1e-9);
    let (at_max, at_min) = (RotorSpeed::from_rpm(rpm_max), RotorSpeed::from_rpm(rpm_min));
    let f_max = campbell
        .speeds
        .iter()
        .flat_map(|s| s.modes.iter().map(|m| m.frequency_hz))
        .filter(|f| f.is_finite())
        .fold(0.0, f64::max);
    // Modes far above every excitation line cannot be excited in the range: the plot stops a
    // little above the highest line (or the lowest mode, whichever is higher) and says how many
    // modes lie above it.
    let f_exc = excitations.iter().map(|e| e.range_hz(at_max).1).fold(0.0, f64::max);
    let f_low = campbell
        .speeds
        .iter()
        .flat_map(|s| s.modes.first().map(|m| m.frequency_hz))
        .filter(|f| f.is_finite())
        .fold(0.0, f64::max);
    let y_full = if f_max > 0.0 { f_max * 1.08 } else { 1.0 };
    let y_top = if f_exc > 0.0 { y_full.min((1.6 * f_exc).max(1.25 * f_low)) } else { y_full };
    let hidden = campbell
        .tracks
        .iter()
        .filter(|t| campbell.track_points(t.id).iter().all(|p| p.1 > y_top))
        .count();
    fig.x_range(rpm_min, rpm_max).y_range(0.0, y_top);
    let (lo, hi) = (operating.0.min(operating.1), operating.0.max(operating.1));
    fig.band_x(lo, hi, palette::BAND, 0.55);
    let order_style = LineStyle::dashed(palette::MUTED, 1.0, "5 4");
    let passing_style = LineStyle::dashed(palette::INK, 1.6, "10 3 2 3");
    let vane_style = LineStyle::dashed(palette::SERIES[5], 1.6, "2 3");
    let fixed_style = LineStyle::dashed(palette::SERIES[6], 1.4, "8 2 2 2 2 2");
    for e in excitations {
        if let Some(f) = &e.fixed {
            // A fixed frequency: a horizontal line, a band shaded between its edges.
            if f.to_hz > f.from_hz {
                fig.rect(rpm_min, f.from_hz, rpm_max, f.to_hz.min(y_top), palette::SERIES[6], 0.15);
            }
            for y in e.lines_hz(at_max) {
                fig.line(&[(rpm_min, y), (rpm_max, y)], &fixed_style);
            }
            if f.from_hz <= y_top {
                fig.label(rpm_max, f.to_hz.min(y_top), &e.label(), palette::SERIES[6], Anchor::End);
            }
            continue;
        }
        let (style, colour) = if e.blade_passing {
            (&passing_style, palette::INK)
        } else if !e.vanes.is_empty() {
            (&vane_style, palette::SERIES[5])
        } else {
            (&order_style, palette::MUTED)
        };
        let f_end = e.frequency_hz(at_max);
        fig.line(&[(rpm_min, e.frequency_hz(at_min)), (rpm_max, f_end)], style);
        // Label where the line leaves the plot: at the right edge or at the top. An order with
        // vane passing names every source (one line for coinciding orders).
        let (x, y) =
            if f_end <= y_top { (rpm_max, f_end) } else { (y_top * 60.0 / e.order as f64, y_top) };
        if x >= rpm_min {
            let text = if e.vanes.is_empty() { format!("{}P", e.order) } else { e.label() };
            fig.label(x, y, &text, colour, Anchor::End);
        }
    }
    let visible = |id: usize| campbell.track_points(id).iter().any(|p| p.1 <= y_top);
    for track in campbell.tracks.iter().filter(|t| visible(t.id)) {
        let style = LineStyle::solid(kind_colour(track.kind), 2.0);
        let runs = campbell.track_runs(track.id);
        for run in &runs {
            let points: Vec<(f64, f64)> = run.iter().map(|&(s, f)| (s.rpm(), f)).collect();
            fig.line(&points, &style);
        }
        // Track labels sit just above the start of each track, clear of the order labels at
        // the right and top edges.
        if let Some(&(x, y)) = runs.first().and_then(|r| r.first()) {
            let x = x.rpm() + 0.01 * (rpm_max - rpm_min);
            fig.label(x, y + 0.015 * y_top, &track.label, kind_colour(track.kind), Anchor::Start);
        }
    }
    let points = crossings.iter().map(|c| (c.speed.rpm(), c.frequency_hz));
    let inside: Vec<(f64, f64)> = points.clone().filter(|c| c.0 >= lo && c.0 <= hi).collect();
    let outside: Vec<(f64, f64)> = points.filter(|c| !(c.0 >= lo && c.0 <= hi)).collect();
    fig.markers(&outside, Marker::Ring, 9.0, palette::INK);
    fig.markers(&inside, Marker::Dot, 9.0, palette::SERIES[1]);
    let mut kinds: Vec<ModeKind> =
        campbell.tracks.iter().filter(|t| visible(t.id)).map(|t| t.kind).collect();
    kinds.sort();
    kinds.dedup();
    for kind in kinds {
        fig.legend_line(
            &format!("{} mode", kind.name()),
            &LineStyle::solid(kind_colour(kind), 2.0),
        );
    }
    fig.legend_line("rotor order nP", &order_style);
    if excitations.iter().any(|e| e.blade_passing) {
        fig.legend_line("blade passing", &passing_style);
    }
    if excitations.iter().any(|e| !e.vanes.is_empty() && !e.blade_passing) {
        fig.legend_line("vane passing k·V", &vane_style);
    }
    if excitations.iter().any(|e| e.fixed.is_some()) {
        fig.legend_line("fixed frequency", &fixed_style);
    }
    fig.legend_marker("crossing", Marker::Ring, palette::INK);
    fig.legend_marker("crossing in operating range", Marker::Dot, palette::SERIES[1]);
    fig.legend_band("operating range", palette::BAND, 0.55);
    if hidden > 0 {
        let note = format!(
            "{hidden} higher mode{} above {:.0} Hz, far from every excitation, not drawn",
            if hidden == 1 { "" } else { "s" },
            y_top
        );
        fig.label(
            rpm_min + 0.01 * (rpm_max - rpm_min),
            y_top * 0.97,
            &note,
            palette::MUTED,
            Anchor::Start,
        );
    }
    fig.render()
}
