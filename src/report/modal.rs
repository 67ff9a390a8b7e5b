//! Modal results as JSON and CSV, units in every field name.
//!
//! JSON (`modal_json`): `rpm_nominal`, `rpm_max`, `blades`; `speeds[]` with `rpm` and `modes[]`
//! (`frequency_hz`, `kind`, `track` and the kinetic energy shares `flap_share` ...);
//! `tracks[]` (`track`, `label`, `kind`); `excitations[]` (`harmonic`, `blade_passing`);
//! `crossings[]` (`track`, `harmonic`, `blade_passing`, `rpm`, `frequency_hz`); `margins[]`
//! (`speed`, `rpm`, `required_margin_pct`, `pass`, `modes[]` with `track`, `frequency_hz`,
//! `harmonic`, `harmonic_hz`, `margin_pct`, `pass`). A pass that was not asked for, or a value
//! that is not finite, is `null`.
//!
//! CSV: the Campbell data one row per mode and speed (`campbell_csv`), and mode shapes one row
//! per mode and node (`mode_shapes_csv`: `mode, track, frequency_hz, kind, r_m, axial_m,
//! in_plane_m, out_of_plane_m, twist_rad`, rotor frame, scaled as `modal::ModeShape` says).

use std::fmt::Write;

use serde_json::{Value, json};

use crate::input::Rotor;
use crate::modal::{Campbell, Crossing, Excitation, MarginCheck, ModeSet};

/// The modal results as one JSON document.
pub fn modal_json(
    campbell: &Campbell,
    rotor: &Rotor,
    excitations: &[Excitation],
    crossings: &[Crossing],
    margins: &[MarginCheck],
) -> Value {
    let speeds: Vec<Value> = campbell
        .speeds
        .iter()
        .map(|set| {
            let modes: Vec<Value> = set
                .modes
                .iter()
                .map(|m| {
                    json!({
                        "frequency_hz": m.frequency_hz,
                        "kind": m.kind.name(),
                        "track": m.track,
                        "flap_share": m.shares.flap,
                        "edge_share": m.shares.edge,
                        "torsion_share": m.shares.torsion,
                        "axial_share": m.shares.axial,
                    })
                })
                .collect();
            json!({ "rpm": set.rpm, "modes": modes })
        })
        .collect();
    let tracks: Vec<Value> = campbell
        .tracks
        .iter()
        .map(|t| json!({ "track": t.id, "label": t.label, "kind": t.kind.name() }))
        .collect();
    let excitations: Vec<Value> = excitations
        .iter()
        .map(|e| json!({ "harmonic": e.order, "blade_passing": e.blade_passing }))
        .collect();
    let crossings: Vec<Value> = crossings
        .iter()
        .map(|c| {
            json!({
                "track": c.track,
                "harmonic": c.order,
                "blade_passing": c.blade_passing,
                "rpm": c.rpm,
                "frequency_hz": c.frequency_hz,
            })
        })
        .collect();
    let margins: Vec<Value> = margins
        .iter()
        .map(|check| {
            let modes: Vec<Value> = check
                .modes
                .iter()
                .map(|m| {
                    json!({
                        "track": m.track,
                        "frequency_hz": m.frequency_hz,
                        "harmonic": m.excitation.order,
                        "blade_passing": m.excitation.blade_passing,
                        "harmonic_hz": m.excitation_hz,
                        "margin_pct": m.margin_pct,
                        "pass": m.pass,
                    })
                })
                .collect();
            json!({
                "speed": check.name,
                "rpm": check.rpm,
                "required_margin_pct": check.required_pct,
                "pass": check.pass,
                "modes": modes,
            })
        })
        .collect();
    json!({
        "rpm_nominal": rotor.rpm_nominal,
        "rpm_max": rotor.rpm_max,
        "blades": rotor.blades,
        "speeds": speeds,
        "tracks": tracks,
        "excitations": excitations,
        "crossings": crossings,
        "margins": margins,
    })
}

/// The Campbell data: `rpm, track, label, kind, frequency_hz`, one row per mode and speed.
pub fn campbell_csv(campbell: &Campbell) -> String {
    let mut s = String::from("rpm,track,label,kind,frequency_hz\n");
    for set in &campbell.speeds {
        for m in &set.modes {
            let (id, label) = match m.track.and_then(|t| campbell.tracks.get(t)) {
                Some(t) => (t.id.to_string(), t.label.as_str()),
                None => (String::new(), ""),
            };
            let _ = writeln!(s, "{},{id},{label},{},{}", set.rpm, m.kind.name(), m.frequency_hz);
        }
    }
    s
}

/// Mode shapes at one speed, one row per mode and node.
pub fn mode_shapes_csv(set: &ModeSet) -> String {
    let mut s = String::from(
        "mode,track,frequency_hz,kind,r_m,axial_m,in_plane_m,out_of_plane_m,twist_rad\n",
    );
    for (i, m) in set.modes.iter().enumerate() {
        let track = m.track.map(|t| t.to_string()).unwrap_or_default();
        let sh = &m.shape;
        for n in 0..sh.r.len() {
            let _ = writeln!(
                s,
                "{},{track},{},{},{},{},{},{},{}",
                i + 1,
                m.frequency_hz,
                m.kind.name(),
                sh.r[n],
                sh.axial[n],
                sh.in_plane[n],
                sh.out_of_plane[n],
                sh.twist[n]
            );
        }
    }
    s
}
