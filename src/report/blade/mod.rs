//! Spanwise plots of a blade for the report: planform, twist, mass and stiffness along the span,
//! the pitching moment over the pitch range, and mode shapes. Every axis is labelled with its
//! unit.

use crate::analysis::BladeModel;
use crate::modal::{ModeKind, ModeSet};
use crate::report::plot::{Anchor, Figure, LineStyle, Marker, palette};
use crate::stress::CaseStress;

fn span_grid(model: &BladeModel, n: usize) -> Vec<f64> {
    let (a, b) = (model.blade.root_radius(), model.blade.tip_radius());
    (0..=n).map(|i| a + (b - a) * i as f64 / n as f64).collect()
}

/// The planform seen normal to the chord: leading and trailing edges about the pitch axis, with
/// the stations marked.
pub fn planform_svg(model: &BladeModel) -> String {
    let b = &model.blade;
    let grid = span_grid(model, 120);
    let le: Vec<(f64, f64)> =
        grid.iter().map(|&r| (r, -b.pitch_axis_frac(r) * b.chord(r) * 1e3)).collect();
    let te: Vec<(f64, f64)> =
        grid.iter().map(|&r| (r, (1.0 - b.pitch_axis_frac(r)) * b.chord(r) * 1e3)).collect();
    let mut fig = Figure::new(
        "Planform (chord laid flat, pitch axis at 0, leading edge below)",
        "radius from the rotor axis (m)",
        "along the chord from the pitch axis (mm)",
    );
    fig.size(900.0, 420.0);
    let le_style = LineStyle::solid(palette::SERIES[0], 2.5);
    let te_style = LineStyle::solid(palette::SERIES[2], 1.5);
    let root_end = [le[0], te[0]];
    let tip_end = [le[le.len() - 1], te[te.len() - 1]];
    fig.line(&le, &le_style);
    fig.line(&te, &te_style);
    fig.line(&root_end, &te_style);
    fig.line(&tip_end, &te_style);
    let mid = grid.len() / 2;
    fig.label(grid[mid], le[mid].1, "leading edge", palette::INK, Anchor::Middle);
    fig.label(grid[mid], te[mid].1, "trailing edge", palette::INK, Anchor::Middle);
    fig.line(
        &[(grid[0], 0.0), (grid[grid.len() - 1], 0.0)],
        &LineStyle::dashed(palette::MUTED, 1.2, "6 4"),
    );
    for r in b.station_radii() {
        let c = b.chord(r);
        let pa = b.pitch_axis_frac(r);
        fig.line(
            &[(r, -pa * c * 1e3), (r, (1.0 - pa) * c * 1e3)],
            &LineStyle::solid(palette::GRID, 1.0),
        );
    }
    for w in b.webs() {
        let pts: Vec<(f64, f64)> = grid
            .iter()
            .filter(|&&r| r >= w.r_start - 1e-9 && r <= w.r_end + 1e-9)
            .map(|&r| (r, (w.chord_frac - b.pitch_axis_frac(r)) * b.chord(r) * 1e3))
            .collect();
        fig.line(&pts, &LineStyle::dashed(palette::SERIES[1], 1.5, "3 3"));
    }
    fig.legend_line("leading edge", &le_style);
    fig.legend_line("trailing edge and ends", &te_style);
    fig.legend_line("pitch axis", &LineStyle::dashed(palette::MUTED, 1.2, "6 4"));
    if !b.webs().is_empty() {
        fig.legend_line("shear webs", &LineStyle::dashed(palette::SERIES[1], 1.5, "3 3"));
    }
    fig.legend_line("stations", &LineStyle::solid(palette::GRID, 1.0));
    fig.render()
}

/// Chord and twist along the span.
pub fn twist_svg(model: &BladeModel) -> String {
    let b = &model.blade;
    let grid = span_grid(model, 120);
    let pitch = model.project.rotor.pitch;
    let title = if pitch.deg().abs() > 1e-9 { "Twist and chord angle" } else { "Twist" };
    let mut fig = Figure::new(title, "radius from the rotor axis (m)", "angle (°)");
    fig.size(900.0, 380.0);
    let twist: Vec<(f64, f64)> = grid.iter().map(|&r| (r, b.twist(r).deg())).collect();
    let chord_angle: Vec<(f64, f64)> =
        grid.iter().map(|&r| (r, (b.twist(r) + pitch).deg())).collect();
    fig.line(&twist, &LineStyle::solid(palette::SERIES[0], 2.0));
    fig.legend_line("station twist", &LineStyle::solid(palette::SERIES[0], 2.0));
    if pitch.deg().abs() > 1e-9 {
        fig.line(&chord_angle, &LineStyle::dashed(palette::SERIES[1], 1.5, "6 4"));
        fig.legend_line(
            &format!("chord angle at pitch {:.1}°", pitch.deg()),
            &LineStyle::dashed(palette::SERIES[1], 1.5, "6 4"),
        );
    }
    let st: Vec<(f64, f64)> = b.station_radii().iter().map(|&r| (r, b.twist(r).deg())).collect();
    fig.markers(&st, Marker::Dot, 6.0, palette::SERIES[0]);
    fig.legend_marker("stations", Marker::Dot, palette::SERIES[0]);
    fig.render()
}

/// Mass per unit length along the span.
pub fn mass_svg(model: &BladeModel) -> String {
    let props = model.properties();
    let mut fig = Figure::new(
        "Mass along the span",
        "radius from the rotor axis (m)",
        "mass per length (kg/m)",
    );
    fig.size(900.0, 380.0);
    let pts: Vec<(f64, f64)> = props.iter().map(|s| (s.r, s.mass_per_length)).collect();
    fig.line(&pts, &LineStyle::solid(palette::SERIES[3], 2.0));
    fig.markers(&pts, Marker::Dot, 5.0, palette::SERIES[3]);
    fig.legend_line("solved sections", &LineStyle::solid(palette::SERIES[3], 2.0));
    let y_top = pts.iter().map(|p| p.1).fold(0.0, f64::max) * 1.1;
    fig.y_range(0.0, y_top.max(1e-9));
    for pm in &model.project.point_masses {
        fig.label(
            pm.r,
            y_top * 0.95,
            &format!("{} {:.3} kg", pm.name, pm.mass),
            palette::INK,
            Anchor::Start,
        );
        fig.line(
            &[(pm.r, 0.0), (pm.r, y_top * 0.9)],
            &LineStyle::dashed(palette::MUTED, 1.0, "2 3"),
        );
    }
    fig.render()
}

/// A value read off a section.
type Pick = fn(&crate::section::SectionProperties) -> f64;

/// Bending and torsion stiffness along the span on a logarithmic scale.
pub fn stiffness_svg(model: &BladeModel) -> String {
    let props = model.properties();
    let mut fig = Figure::new(
        "Section stiffness along the span (logarithmic scale)",
        "radius from the rotor axis (m)",
        "stiffness (N·m²)",
    );
    fig.size(900.0, 420.0).y_log();
    let series: [(&str, Pick); 3] =
        [("EI flap", |s| s.ei_flap), ("EI edge", |s| s.ei_edge), ("GJ", |s| s.gj)];
    for (k, (name, f)) in series.iter().enumerate() {
        let pts: Vec<(f64, f64)> = props.iter().map(|s| (s.r, f(s))).collect();
        let style = LineStyle::solid(palette::SERIES[k], 2.0);
        fig.line(&pts, &style);
        fig.legend_line(name, &style);
    }
    fig.render()
}

/// The pitching moment at the root over the pitch range, every case, and its centrifugal part.
pub fn pitch_moment_svg(cases: &[CaseStress]) -> String {
    let mut fig = Figure::new(
        "Pitching moment about the pitch axis at the root",
        "pitch setting (°)",
        "pitching moment (N·m)",
    );
    fig.size(900.0, 420.0);
    for (k, c) in cases.iter().enumerate() {
        let colour = palette::SERIES[k % palette::SERIES.len()];
        let all: Vec<(f64, f64)> =
            c.pitch_sweep.iter().map(|p| (p.pitch.deg(), p.pitch_moment)).collect();
        let ctm: Vec<(f64, f64)> =
            c.pitch_sweep.iter().map(|p| (p.pitch.deg(), p.centrifugal_twisting_moment)).collect();
        fig.line(&all, &LineStyle::solid(colour, 2.0));
        fig.line(&ctm, &LineStyle::dashed(colour, 1.4, "5 4"));
        fig.markers(&all, Marker::Dot, 4.0, colour);
        fig.legend_line(&format!("{}: all loads", c.name), &LineStyle::solid(colour, 2.0));
        fig.legend_line(
            &format!("{}: centrifugal", c.name),
            &LineStyle::dashed(colour, 1.4, "5 4"),
        );
    }
    fig.render()
}

/// The first `count` mode shapes against radius, each by the component that names it (out of
/// plane for flap modes, in plane for edge modes, twist for torsion modes, the larger deflection
/// for mixed modes), scaled to a largest value of 1.
pub fn mode_shapes_svg(set: &ModeSet, count: usize, title: &str) -> String {
    let mut fig =
        Figure::new(title, "radius from the rotor axis (m)", "normalised deflection or twist (-)");
    fig.size(900.0, 420.0);
    for (k, m) in set.modes.iter().take(count).enumerate() {
        let s = &m.shape;
        let peak_of = |v: &Vec<f64>| v.iter().map(|x| x.abs()).fold(0.0, f64::max);
        // The component that names the mode; displacements and twist are not compared (their
        // units differ).
        let (name, values) = match m.kind {
            ModeKind::Flap => ("out of plane", &s.out_of_plane),
            ModeKind::Edge => ("in plane", &s.in_plane),
            ModeKind::Torsion => ("twist", &s.twist),
            ModeKind::Axial => ("radial", &s.axial),
            ModeKind::Mixed if peak_of(&s.in_plane) > peak_of(&s.out_of_plane) => {
                ("in plane", &s.in_plane)
            }
            ModeKind::Mixed => ("out of plane", &s.out_of_plane),
        };
        let peak = values.iter().copied().max_by(|a, b| a.abs().total_cmp(&b.abs())).unwrap_or(1.0);
        let scale = if peak != 0.0 { 1.0 / peak } else { 1.0 };
        let pts: Vec<(f64, f64)> =
            s.r.iter().zip(values.iter()).map(|(&r, &v)| (r, v * scale)).collect();
        let style = LineStyle::solid(palette::SERIES[k % palette::SERIES.len()], 2.0);
        fig.line(&pts, &style);
        fig.legend_line(&format!("{} {:.1} Hz ({name})", m.kind.name(), m.frequency_hz), &style);
    }
    fig.y_range(-1.1, 1.1);
    fig.render()
}
