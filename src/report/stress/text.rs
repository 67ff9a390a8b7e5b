//! The terminal summary of the stress results: the lowest reserve factor per case, the buckling
//! table and what the analysis does not cover.

use std::fmt::Write as _;

use crate::analysis::BladeModel;
use crate::report::{Align, Table, fixed, rpm_text, sig4};
use crate::stress::{CaseStress, PanelResult, WallLocation};
use crate::units::rpm_of;

/// The lowest reserve factor of each case with where it occurs, one row per case.
pub fn critical_table(cases: &[CaseStress]) -> Table {
    let mut t = Table::new(&[
        ("case", Align::Left),
        ("speed (rpm)", Align::Right),
        ("load factor", Align::Right),
        ("reserve factor", Align::Right),
        ("r (m)", Align::Right),
        ("where", Align::Left),
        ("ply", Align::Left),
        ("criterion, mode", Align::Left),
    ]);
    for c in cases {
        match &c.critical {
            Some(k) => t.row(vec![
                c.name.clone(),
                rpm_text(rpm_of(c.omega)),
                fixed(c.load_factor, 2),
                fixed(k.reserve_factor, 2),
                fixed(k.r, 3),
                k.location.to_string(),
                format!("{} ({}, {}°)", k.ply_id, k.material, fixed(k.angle.deg(), 0)),
                format!("{}, {}", k.criterion.label(), k.mode.label()),
            ]),
            None => {
                let rpm = rpm_text(rpm_of(c.omega));
                t.row(vec![c.name.clone(), rpm, fixed(c.load_factor, 2), "none".into()])
            }
        }
    }
    t
}

/// The lowest buckling reserve factor of each case with its panel, one row per case.
pub fn buckling_table(cases: &[CaseStress]) -> Table {
    let mut t = Table::new(&[
        ("case", Align::Left),
        ("buckling RF", Align::Right),
        ("mode", Align::Left),
        ("r (m)", Align::Right),
        ("panel", Align::Left),
        ("width (mm)", Align::Right),
        ("N_x (kN/m)", Align::Right),
        ("N_xs (kN/m)", Align::Right),
        ("N_cr (kN/m)", Align::Right),
    ]);
    for c in cases {
        match c.least_buckling() {
            Some((i, j)) => {
                let p = &c.buckling[i].panels[j];
                let k = &p.check;
                t.row(vec![
                    c.name.clone(),
                    if k.reserve_factor.is_finite() && k.reserve_factor >= 0.1 {
                        fixed(k.reserve_factor, 2)
                    } else if k.reserve_factor.is_finite() {
                        // Two decimals would show a panel far from holding as 0.00.
                        sig4(k.reserve_factor)
                    } else {
                        "none".into()
                    },
                    k.mode.label().to_string(),
                    fixed(c.buckling[i].r, 3),
                    panel_place(p),
                    sig4(p.panel.width * 1e3),
                    sig4(k.n_x / 1e3),
                    sig4(k.n_xs / 1e3),
                    sig4(p.panel.critical.compression / 1e3),
                ]);
            }
            None => t.row(vec![c.name.clone(), "no panel".into()]),
        }
    }
    t
}

/// A panel's place in words: "upper surface x/c 0.150 to 0.330" or "web 'main'".
pub fn panel_place(p: &PanelResult) -> String {
    match (&p.panel.part, &p.from, &p.to) {
        (crate::buckling::PanelPart::Web { name }, ..) => format!("web '{name}'"),
        (
            _,
            WallLocation::Surface { upper: u0, x_c: a, .. },
            WallLocation::Surface { upper: u1, x_c: b, .. },
        ) => {
            let side = |u: &bool| if *u { "upper" } else { "lower" };
            if u0 == u1 && format!("{a:.3}") == format!("{b:.3}") {
                // A face across the chord line (a flat-back's base, a box's front): one x/c.
                format!("{} skin at x/c {a:.3}", side(u0))
            } else if u0 == u1 {
                format!("{} skin x/c {:.3} to {:.3}", side(u0), a.min(*b), a.max(*b))
            } else {
                format!("skin from {} x/c {a:.3} to {} x/c {b:.3}", side(u0), side(u1))
            }
        }
        _ => format!("{} to {}", p.from, p.to),
    }
}

/// What the analysis does not cover, as an indented list.
pub fn not_covered_text() -> String {
    let mut out = String::from("Not covered by this analysis (check these by other means):\n");
    for line in crate::buckling::NOT_COVERED {
        let _ = writeln!(out, "  - {line}");
    }
    out
}

/// The terminal summary of `layloft stress`.
pub fn stress_text(model: &BladeModel, cases: &[CaseStress]) -> String {
    let mut out = String::new();
    let _ = writeln!(out, "layloft stress — {}", model.project.name);
    out.push_str(&crate::report::cautions_text());
    let _ = writeln!(out);
    let t = critical_table(cases);
    let _ =
        writeln!(out, "Lowest reserve factor per load case (strength ratio at the factored load):");
    out.push_str(&t.render(2));
    let _ = writeln!(out);
    let _ = writeln!(
        out,
        "Lowest buckling reserve factor per load case (wall panels, {}; sandwich modes):",
        fixity_words(model.project.buckling.edge_fixity)
    );
    out.push_str(&buckling_table(cases).render(2));
    let _ = writeln!(out);
    let mut t = Table::new(&[
        ("case", Align::Left),
        ("radial (kN)", Align::Right),
        ("flap M (N·m)", Align::Right),
        ("edge M (N·m)", Align::Right),
        ("pitch M (N·m)", Align::Right),
        ("tip defl. (mm)", Align::Right),
        ("tip twist (°)", Align::Right),
    ]);
    for c in cases {
        t.row(vec![
            c.name.clone(),
            sig4(c.root.force[0] / 1e3),
            sig4(c.root.moment[1]),
            sig4(c.root.moment[2]),
            sig4(c.root.moment[0]),
            sig4(c.tip_deflection.total * 1e3),
            fixed(c.tip_deflection.twist.to_degrees(), 3),
        ]);
    }
    let _ = writeln!(out, "Root reactions (rotor frame, about the pitch axis) and tip deflection:");
    out.push_str(&t.render(2));
    // The pitching moment over the pitch range of the case that demands most of the actuator.
    let sizing = cases.iter().filter(|c| c.pitch_sweep.len() > 1).max_by(|a, b| {
        let peak =
            |c: &CaseStress| c.pitch_sweep.iter().map(|p| p.pitch_moment.abs()).fold(0.0, f64::max);
        peak(a).total_cmp(&peak(b))
    });
    if let Some(c) = sizing {
        let _ = writeln!(out);
        let _ = writeln!(
            out,
            "Pitching moment over the pitch range, case '{}' (the largest; every case in --json):",
            c.name
        );
        let mut t = Table::new(&[
            ("pitch (°)", Align::Right),
            ("pitch M (N·m)", Align::Right),
            ("of which centrifugal (N·m)", Align::Right),
        ]);
        for p in &c.pitch_sweep {
            t.row(vec![
                fixed(p.pitch.deg(), 1),
                sig4(p.pitch_moment),
                sig4(p.centrifugal_twisting_moment),
            ]);
        }
        out.push_str(&t.render(2));
    }
    let _ = writeln!(out);
    out.push_str(&not_covered_text());
    out
}

/// The warning of `layloft stress` naming every case whose factored load fails a ply (reserve
/// factor below 1), or `None` when no case does.
pub fn ply_failure_warning(cases: &[CaseStress]) -> Option<String> {
    let failing: Vec<String> = cases
        .iter()
        .filter_map(|c| c.critical.as_ref().filter(|k| k.reserve_factor < 1.0).map(|k| (c, k)))
        .map(|(c, k)| format!("'{}' (reserve factor {:.3})", c.name, k.reserve_factor))
        .collect();
    (!failing.is_empty())
        .then(|| format!("a ply fails under the factored load of {}", failing.join(", ")))
}

/// The warning of `layloft stress` naming every case whose factored load buckles a wall panel
/// (buckling reserve factor below 1), or `None` when no case does.
pub fn buckling_warning(cases: &[CaseStress]) -> Option<String> {
    let buckling: Vec<String> = cases
        .iter()
        .filter_map(|c| c.least_buckling().map(|(i, j)| (c, &c.buckling[i].panels[j])))
        .filter(|(_, p)| p.check.reserve_factor < 1.0)
        .map(|(c, p)| {
            format!("'{}' (buckling reserve factor {:.3})", c.name, p.check.reserve_factor)
        })
        .collect();
    (!buckling.is_empty())
        .then(|| format!("a wall panel buckles under the factored load of {}", buckling.join(", ")))
}

/// The panels' edge support in words: simply supported (fixity 0), clamped (1) or the fixity
/// between.
pub(crate) fn fixity_words(fixity: f64) -> String {
    if fixity == 0.0 {
        "edges simply supported".to_string()
    } else if fixity == 1.0 {
        "edges clamped".to_string()
    } else {
        format!("edge fixity {} (0 simply supported, 1 clamped)", fixed(fixity, 2))
    }
}
