//! Modal results as JSON, units in every field name.
//!
//! JSON (`modal_json`): `rpm_nominal`, `rpm_max`, `rpm_min` (the least operating speed, the
//! nominal when the project gives none), `blades`; `speeds[]` with `rpm` and `modes[]`
//! (`frequency_hz`, `kind`, `track` and the kinetic energy shares `flap_share` ...);
//! `tracks[]` (`track`, `track_number` from 1, `label`, `kind`, `family`, `mean_*_share`);
//! `excitations[]` (`harmonic`, `blade_passing`, `label`, `vanes`, `fixed_name`,
//! `fixed_from_Hz`, `fixed_to_Hz`; `harmonic` is `null` for a fixed frequency);
//! `crossings[]` (`track`, `harmonic`, `excitation`, `blade_passing`, `rpm`, `frequency_hz`);
//! `margins[]` (`speed`, `rpm`, `required_margin_pct`, `pass`, `modes[]` with `track`,
//! `frequency_hz`, `harmonic`, `excitation`, `harmonic_hz` (the nearest frequency of the
//! excitation), `margin_pct`, `pass`). `modal_analysis_json` adds the model's boundary
//! condition, point masses, fluid and dry/wet frequencies. A pass that was not asked for, or a value
//! that is not finite, is `null`.

use serde_json::{Value, json};

use crate::modal::{Campbell, Crossing, Excitation, MarginCheck, ModalAnalysis};
use crate::project::Rotor;
use crate::units::{pct_of, rpm_of};

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
            json!({ "rpm": set.speed.rpm(), "modes": modes })
        })
        .collect();
    let tracks: Vec<Value> = campbell
        .tracks
        .iter()
        .map(|t| {
            json!({
                "track": t.id,
                "track_number": t.number,
                "label": t.label,
                "kind": t.kind.name(),
                "family": t.family.name(),
                "mean_flap_share": t.shares.flap,
                "mean_edge_share": t.shares.edge,
                "mean_torsion_share": t.shares.torsion,
                "mean_axial_share": t.shares.axial,
            })
        })
        .collect();
    let excitation_list: Vec<Value> = excitations
        .iter()
        .map(|e| {
            json!({
                "harmonic": (e.fixed.is_none()).then_some(e.order),
                "blade_passing": e.blade_passing,
                "label": e.label(),
                "vanes": e.vanes,
                "fixed_name": e.fixed.as_ref().map(|f| f.name.clone()),
                "fixed_from_Hz": e.fixed.as_ref().map(|f| f.from_hz),
                "fixed_to_Hz": e.fixed.as_ref().map(|f| f.to_hz),
            })
        })
        .collect();
    let crossings: Vec<Value> = crossings
        .iter()
        .map(|c| {
            json!({
                "track": c.track,
                "harmonic": (c.order > 0).then_some(c.order),
                "excitation": excitations.get(c.excitation).map(|e| e.label()),
                "blade_passing": c.blade_passing,
                "rpm": c.speed.rpm(),
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
                        "harmonic": (m.excitation.fixed.is_none()).then_some(m.excitation.order),
                        "excitation": m.excitation.label(),
                        "blade_passing": m.excitation.blade_passing,
                        "harmonic_hz": m.excitation_hz,
                        "margin_pct": m.margin * 100.0,
                        "pass": m.pass,
                    })
                })
                .collect();
            json!({
                "speed": check.name,
                "rpm": check.speed.rpm(),
                "required_margin_pct": check.required.map(pct_of),
                "pass": check.pass,
                "modes": modes,
            })
        })
        .collect();
    json!({
        "rpm_nominal": rpm_of(rotor.omega_nominal),
        "rpm_max": rpm_of(rotor.omega_max),
        "rpm_min": rpm_of(rotor.omega_min),
        "blades": rotor.blades,
        "speeds": speeds,
        "tracks": tracks,
        "excitations": excitation_list,
        "crossings": crossings,
        "margins": margins,
    })
}

/// [`modal_json`] of a whole modal stage, with what the model holds (`boundary_condition`,
/// `root_springs` with `axial_N_m`, `flap_Nm_rad`, `edge_Nm_rad`, `torsion_Nm_rad`,
/// `point_masses[]` with `r_m`, `mass_kg`, `y_m`, `z_m`, `inertia_x_kg_m2` ..., `fluid_density_kg_m3`)
/// and, with a fluid, `dry_wet[]`: `rpm` and `modes[]` with `track`, `frequency_wet_Hz`,
/// `frequency_dry_Hz`, `mac_dry_wet` (the sweep's `frequency_hz` are then wet); and
/// `mode_coverage` (`modes_asked`, `modes_solved`, `highest_excitation_with_margin_Hz`,
/// `highest_mode_Hz`, `rpm`, `covered`: whether every mode that may lie within the margin of an
/// excitation was solved).
pub fn modal_analysis_json(a: &ModalAnalysis) -> Value {
    let mut v = modal_json(&a.campbell, a.model.rotor(), &a.excitations, &a.crossings, &a.margins);
    let att = a.model.attachments();
    let springs = a.model.root_springs();
    let bodies: Vec<Value> = att
        .bodies
        .iter()
        .map(|b| {
            json!({
                "r_m": b.r,
                "mass_kg": b.mass,
                "y_m": b.offset[0],
                "z_m": b.offset[1],
                "inertia_x_kg_m2": b.inertia[0],
                "inertia_y_kg_m2": b.inertia[1],
                "inertia_z_kg_m2": b.inertia[2],
            })
        })
        .collect();
    let dry: Vec<Value> = a
        .dry
        .iter()
        .map(|d| {
            let modes: Vec<Value> = d
                .modes
                .iter()
                .map(|&(track, wet, dry, mac)| {
                    json!({
                        "track": track,
                        "frequency_wet_Hz": wet,
                        "frequency_dry_Hz": dry,
                        "mac_dry_wet": mac,
                    })
                })
                .collect();
            json!({ "rpm": d.speed.rpm(), "modes": modes })
        })
        .collect();
    if let Some(obj) = v.as_object_mut() {
        obj.insert(
            "boundary_condition".into(),
            json!(if springs.is_some() { "root springs" } else { "clamped root" }),
        );
        obj.insert(
            "root_springs".into(),
            springs.map_or(Value::Null, |k| {
                json!({
                    "axial_N_m": k.axial,
                    "flap_Nm_rad": k.flap,
                    "edge_Nm_rad": k.edge,
                    "torsion_Nm_rad": k.torsion,
                })
            }),
        );
        obj.insert("point_masses".into(), Value::Array(bodies));
        obj.insert("fluid_density_kg_m3".into(), json!(att.fluid.as_ref().map(|f| f.0)));
        obj.insert("dry_wet".into(), Value::Array(dry));
        let c = &a.coverage;
        obj.insert(
            "mode_coverage".into(),
            json!({
                "modes_asked": c.asked,
                "modes_solved": c.solved,
                "highest_excitation_with_margin_Hz": c.needed_hz,
                "highest_mode_Hz": c.highest_hz,
                "rpm": c.speed.rpm(),
                "covered": c.covered(),
            }),
        );
    }
    v
}
