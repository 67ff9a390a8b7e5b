//! The terminal summary of `layloft modes`.

use std::fmt::Write as _;

use super::{Align, Table, fixed, sig4};
use crate::modal::ModalAnalysis;

/// Frequencies at standstill and at the checked speeds, the margins with their verdicts, and
/// the crossings inside the speed range.
pub fn modal_text(project: &str, a: &ModalAnalysis) -> String {
    let mut out = String::new();
    let _ = writeln!(out, "layloft modes — {project}");
    out.push_str(&super::cautions_text());
    let _ = writeln!(out);
    let first = a.campbell.speeds.first();
    let mut headers: Vec<(String, Align)> =
        vec![("track".into(), Align::Right), ("mode".into(), Align::Left)];
    if let Some(s) = first {
        headers.push((format!("f at {} rpm (Hz)", fixed(s.rpm, 0)), Align::Right));
    }
    for m in &a.margins {
        headers.push((format!("f at {} {} rpm (Hz)", m.name, fixed(m.rpm, 0)), Align::Right));
        headers.push(("nearest".into(), Align::Left));
        headers.push(("margin (%)".into(), Align::Right));
    }
    let refs: Vec<(&str, Align)> = headers.iter().map(|(h, a)| (h.as_str(), *a)).collect();
    let mut t = Table::new(&refs);
    for track in &a.campbell.tracks {
        let mut row = vec![track.id.to_string(), track.label.clone()];
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
                    row.push(format!("{}{verdict}", fixed(mm.margin_pct, 1)));
                }
                None => row.extend(["-".to_string(), String::new(), String::new()]),
            }
        }
        if any || a.margins.is_empty() {
            t.row(row);
        }
    }
    let _ = writeln!(
        out,
        "Natural frequencies of the spinning blade and the margin to the nearest excitation:"
    );
    out.push_str(&t.render(2));
    let _ = writeln!(out);
    for m in &a.margins {
        let verdict = match (m.pass, m.required_pct) {
            (Some(true), Some(req)) => {
                format!("PASS: every mode at least {req} % from every excitation")
            }
            (Some(false), Some(req)) => {
                format!("FAIL: a mode lies within {req} % of an excitation")
            }
            _ => "no margin required ([criteria] frequency_margin_pct)".to_string(),
        };
        let _ = writeln!(out, "  at {} speed ({} rpm): {verdict}", m.name, fixed(m.rpm, 0));
    }
    let _ = writeln!(out);
    if a.crossings.is_empty() {
        let _ = writeln!(
            out,
            "No mode crosses an excitation line between {} and {} rpm.",
            fixed(a.range.from_rpm, 0),
            fixed(a.range.to_rpm, 0)
        );
    } else {
        let _ = writeln!(
            out,
            "Crossings of modes with excitation lines between {} and {} rpm:",
            fixed(a.range.from_rpm, 0),
            fixed(a.range.to_rpm, 0)
        );
        let t = crossings_table(a);
        out.push_str(&t.render(2));
    }
    out
}

/// The crossings of the modes with the excitation lines inside the speed range, one row each.
pub fn crossings_table(a: &ModalAnalysis) -> Table {
    let mut t = Table::new(&[
        ("track", Align::Right),
        ("mode", Align::Left),
        ("excitation", Align::Left),
        ("speed (rpm)", Align::Right),
        ("frequency (Hz)", Align::Right),
    ]);
    for c in &a.crossings {
        let label = a
            .campbell
            .tracks
            .iter()
            .find(|t| t.id == c.track)
            .map_or(String::new(), |t| t.label.clone());
        let exc = crate::modal::Excitation { order: c.order, blade_passing: c.blade_passing };
        t.row(vec![c.track.to_string(), label, exc.label(), fixed(c.rpm, 0), sig4(c.frequency_hz)]);
    }
    t
}
