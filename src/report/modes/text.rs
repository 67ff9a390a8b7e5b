//! The terminal summary of `layloft modes`.

use std::fmt::Write as _;

use crate::modal::{ModalAnalysis, ModeCoverage};
use crate::report::{Align, Table, fixed, rpm_text, sig4};
use crate::units::pct_of;

/// Frequencies at standstill and at the checked speeds, the margins with their verdicts, and
/// the crossings inside the speed range.
pub fn modal_text(project: &str, a: &ModalAnalysis) -> String {
    let mut out = String::new();
    let _ = writeln!(out, "layloft modes — {project}");
    out.push_str(&crate::report::cautions_text());
    let _ = writeln!(out);
    let first = a.campbell.speeds.first();
    let mut headers: Vec<(String, Align)> =
        vec![("track".into(), Align::Right), ("mode".into(), Align::Left)];
    if let Some(s) = first {
        headers.push((format!("f at {} rpm (Hz)", rpm_text(s.speed.rpm())), Align::Right));
    }
    for m in &a.margins {
        headers
            .push((format!("f at {} {} rpm (Hz)", m.name, rpm_text(m.speed.rpm())), Align::Right));
        headers.push(("nearest".into(), Align::Left));
        headers.push(("margin (%)".into(), Align::Right));
    }
    let refs: Vec<(&str, Align)> = headers.iter().map(|(h, a)| (h.as_str(), *a)).collect();
    let mut t = Table::new(&refs);
    for track in &a.campbell.tracks {
        let mut row = vec![(track.id + 1).to_string(), track.label.clone()];
        if let Some(s) = first {
            row.push(
                s.modes
                    .iter()
                    .find(|m| m.track == Some(track.id))
                    .map_or("-".into(), |m| sig4(m.frequency_hz)),
            );
        }
        let mut any = false;
        for m in &a.margins {
            match m.modes.iter().find(|mm| mm.track == track.id) {
                Some(mm) => {
                    any = true;
                    row.push(sig4(mm.frequency_hz));
                    row.push(mm.excitation.label());
                    let verdict = match mm.pass {
                        Some(true) => "",
                        Some(false) => " FAIL",
                        None => "",
                    };
                    row.push(format!("{}{verdict}", fixed(mm.margin * 100.0, 1)));
                }
                None => row.extend(["-".to_string(), String::new(), String::new()]),
            }
        }
        if any || a.margins.is_empty() {
            t.row(row);
        }
    }
    out.push_str(&model_statement(a));
    let _ = writeln!(out);
    let _ = writeln!(
        out,
        "Natural frequencies of the spinning blade and the margin to the nearest excitation{}:",
        if a.dry.is_empty() { "" } else { " (wet: with the fluid's added mass)" }
    );
    out.push_str(&t.render(2));
    let _ = writeln!(out);
    if !a.dry.is_empty() {
        let _ = writeln!(
            out,
            "Dry and wet frequencies (Hz); each wet mode beside the dry mode of the closest shape:"
        );
        out.push_str(&dry_table(a).render(2));
        let _ = writeln!(out);
    }
    for m in &a.margins {
        let verdict = match (m.pass, m.required.map(pct_of)) {
            (Some(true), Some(req)) => {
                format!("PASS: every mode at least {req} % from every excitation")
            }
            (Some(false), Some(req)) => {
                format!("FAIL: a mode lies within {req} % of an excitation")
            }
            _ => "no margin required ([criteria] frequency_margin_pct)".to_string(),
        };
        let _ = writeln!(out, "  at {} speed ({} rpm): {verdict}", m.name, rpm_text(m.speed.rpm()));
    }
    let _ = writeln!(out);
    if a.crossings.is_empty() {
        let _ = writeln!(
            out,
            "No mode crosses an excitation line between {} and {} rpm.",
            rpm_text(a.range.from.rpm()),
            rpm_text(a.range.to.rpm())
        );
    } else {
        let _ = writeln!(
            out,
            "Crossings of modes with excitation lines between {} and {} rpm:",
            rpm_text(a.range.from.rpm()),
            rpm_text(a.range.to.rpm())
        );
        let t = crossings_table(a);
        out.push_str(&t.render(2));
    }
    out
}

/// The crossings of the modes with the excitation lines inside the speed range, one row each,
/// by track and, within a track, by speed.
pub fn crossings_table(a: &ModalAnalysis) -> Table {
    let mut t = Table::new(&[
        ("track", Align::Right),
        ("mode", Align::Left),
        ("excitation", Align::Left),
        ("speed (rpm)", Align::Right),
        ("frequency (Hz)", Align::Right),
    ]);
    let mut crossings: Vec<_> = a.crossings.iter().collect();
    crossings.sort_by(|p, q| p.track.cmp(&q.track).then(p.speed.total_cmp(&q.speed)));
    for c in crossings {
        let label = a
            .campbell
            .tracks
            .iter()
            .find(|t| t.id == c.track)
            .map_or(String::new(), |t| t.label.clone());
        let exc = a.excitations.get(c.excitation).map_or(String::new(), |e| e.label());
        t.row(vec![
            (c.track + 1).to_string(),
            label,
            exc,
            rpm_text(c.speed.rpm()),
            sig4(c.frequency_hz),
        ]);
    }
    t
}

/// What the model holds: the boundary condition at the root, the point masses and the fluid.
pub fn model_statement(a: &ModalAnalysis) -> String {
    let mut out = String::new();
    let (root, tip) = a.model.span();
    let root_bc = match a.model.root_springs() {
        Some(k) => format!(
            "root on springs at r = {} m (axial {} N/m, flap {} N·m/rad, edge {} N·m/rad, \
             torsion {} N·m/rad; in-plane and out-of-plane displacements fixed)",
            fixed(root, 3),
            sig4(k.axial),
            sig4(k.flap),
            sig4(k.edge),
            sig4(k.torsion)
        ),
        None => format!("root clamped at r = {} m", fixed(root, 3)),
    };
    let _ = writeln!(out, "Boundary condition: {root_bc}; tip free at r = {} m.", fixed(tip, 3));
    let att = a.model.attachments();
    if att.bodies.is_empty() {
        let _ = writeln!(out, "Point masses: none.");
    } else {
        let total: f64 = att.bodies.iter().map(|b| b.mass).sum();
        let _ = writeln!(
            out,
            "Point masses: {} ({} kg in all), with their offsets and rotary inertia, in the mass, \
             the centrifugal stiffening and the propeller moment.",
            att.bodies.len(),
            sig4(total)
        );
    }
    match &att.fluid {
        Some((rho, _)) => {
            let _ = writeln!(
                out,
                "Fluid: density {} kg/m³; added mass of each section's ellipse (strip theory, \
                 potential flow); frequencies, crossings and margins are wet.",
                sig4(*rho)
            );
        }
        None => {
            let _ = writeln!(out, "Fluid: none (air's added mass neglected).");
        }
    }
    let _ = writeln!(out, "{}", coverage_statement(&a.coverage, a.model.elements()));
    out
}

/// Dry and wet frequencies per track at the compared speeds.
pub fn dry_table(a: &ModalAnalysis) -> Table {
    let mut headers: Vec<(String, Align)> =
        vec![("track".into(), Align::Right), ("mode".into(), Align::Left)];
    for d in &a.dry {
        headers.push((format!("dry at {} rpm", rpm_text(d.speed.rpm())), Align::Right));
        headers.push((format!("wet at {} rpm", rpm_text(d.speed.rpm())), Align::Right));
    }
    let refs: Vec<(&str, Align)> = headers.iter().map(|(h, a)| (h.as_str(), *a)).collect();
    let mut t = Table::new(&refs);
    for track in &a.campbell.tracks {
        let mut row = vec![(track.id + 1).to_string(), track.label.clone()];
        let mut any = false;
        for d in &a.dry {
            match d.modes.iter().find(|m| m.0 == track.id) {
                Some(&(_, wet, dry, mac)) => {
                    any = true;
                    // A loose pair (the fluid changed the shape) shows its MAC.
                    if mac < 0.8 {
                        row.push(format!("{} (MAC {})", sig4(dry), fixed(mac, 2)));
                    } else {
                        row.push(sig4(dry));
                    }
                    row.push(sig4(wet));
                }
                None => row.extend(["-".to_string(), "-".to_string()]),
            }
        }
        if any {
            t.row(row);
        }
    }
    t
}

/// What the modes solved cover: the highest excitation with the margin against the highest mode
/// (see [`ModeCoverage`]).
pub fn coverage_statement(c: &ModeCoverage, elements: usize) -> String {
    let at = format!("{} Hz at {} rpm", sig4(c.highest_hz), rpm_text(c.speed.rpm()));
    let needed = sig4(c.needed_hz);
    if !c.covered() {
        format!(
            "Modes: {}, the most the {elements} beam elements resolve; the highest ({at}) lies \
             below {needed} Hz, the highest excitation with the margin: modes above it are NOT \
             checked against the excitations near them.",
            c.solved
        )
    } else if c.solved > c.asked {
        format!(
            "Modes: {} solved ({} asked for), so that the highest ({at}) lies above {needed} Hz, \
             the highest excitation with the margin: every mode that may lie near an excitation \
             is checked.",
            c.solved, c.asked
        )
    } else {
        format!(
            "Modes: {}; the highest ({at}) lies above {needed} Hz, the highest excitation with \
             the margin: every mode that may lie near an excitation is checked.",
            c.solved
        )
    }
}
