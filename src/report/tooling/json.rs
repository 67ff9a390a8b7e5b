//! The tooling summary as one JSON object, SI units in every key.

use serde_json::{Value, json};

use super::{CASTING_CAUTION, DRAIN_CAUTION, ToolingReport};

fn num(v: f64) -> Value {
    if v.is_finite() { json!(v) } else { Value::Null }
}

fn opt(v: Option<f64>) -> Value {
    v.map_or(Value::Null, num)
}

/// A part's machining frame and its file (the blade mould's parts and the casting moulds' alike).
fn machining_frame(m: &crate::tooling::MachinedPart) -> Value {
    json!({
        "part": m.part,
        "name": m.name,
        "file": format!("{}.stl", m.name),
        "x_axis": m.frame.axes[0].map(num),
        "y_axis": m.frame.axes[1].map(num),
        "z_axis": m.frame.axes[2].map(num),
        "origin_m": m.frame.origin.map(num),
    })
}

fn point(p: [f64; 3]) -> Value {
    json!({"x_m": num(p[0]), "y_m": num(p[1]), "z_m": num(p[2])})
}

impl ToolingReport<'_> {
    /// The summary as one JSON object, SI units in every key.
    pub fn to_json(&self) -> Value {
        let t = self.tooling;
        let parts: Vec<Value> = t
            .parts
            .iter()
            .zip(self.written)
            .zip(&self.summary.masses)
            .map(|((p, w), m)| {
                let b = w.summary.bounding_box;
                json!({
                    "name": p.name,
                    "file": w.path.display().to_string(),
                    "triangles": w.summary.triangles,
                    "volume_m3": num(p.nominal_volume),
                    "volume_in_file_m3": num(w.summary.volume),
                    "area_m2": num(w.summary.area),
                    "mass_kg": opt(m.mass),
                    "resin_mass_kg": opt(m.resin),
                    "mass_basis": m.basis,
                    "bounding_box": {"min": point(b.min), "max": point(b.max)},
                })
            })
            .collect();
        let e = t.ends;
        let melt = &self.summary.melt;
        let sc = self.summary.schedule;
        let halves: Vec<Value> = t
            .moulds
            .iter()
            .map(|h| {
                json!({
                    "half": h.side,
                    "pull": {"x": num(h.pull[0]), "y": num(h.pull[1]), "z": num(h.pull[2])},
                    "least_draft_deg": num(h.draft.min_draft.deg()),
                    "least_draft_at": point(h.draft.at.point),
                    "below_least_draft_area_m2": num(h.draft.below_min_area),
                    "undercut_area_m2": num(h.draft.undercut_area),
                    "cavity_area_m2": num(h.cavity_area),
                    "undercuts": h.undercuts.iter().map(|r| json!({
                        "area_m2": num(r.area),
                        "worst_draft_deg": num(r.worst.deg()),
                        "at": point(r.at.point),
                        "x_from_m": num(r.x_range[0]),
                        "x_to_m": num(r.x_range[1]),
                        "region": r.region,
                    })).collect::<Vec<_>>(),
                    "locators": h.locators.iter().map(|&p| point(p)).collect::<Vec<_>>(),
                    "block_size_m": h.block_size.map(num),
                })
            })
            .collect();
        let mut out = json!({
            "project": self.name,
            "format": self.format,
            "unit": self.unit().symbol(),
            "tolerance_m": num(t.params.tolerance),
            "pitch_deg": num(t.pitch.deg()),
            "cautions": crate::CAUTIONS,
            "parts": parts,
            "ends": {
                "shape": match t.params.ends {
                    crate::tooling::EndShape::Spheres => "spheres",
                    crate::tooling::EndShape::Planes => "planes",
                },
                "root_sphere_radius_m": num(e.root),
                "tip_sphere_radius_m": num(e.tip),
                "root_laminate_m": num(e.root_laminate),
                "tip_laminate_m": num(e.tip_laminate),
                "root_extension_m": num(t.root_extension),
                "tip_extension_m": num(t.tip_extension),
            },
            "core_ends": t.core_ends.iter().map(|c| json!({
                "r_m": num(c.r),
                "chord_fraction": num(c.chord_fraction),
                "solid_chord_m": num(c.solid_chord),
            })).collect::<Vec<_>>(),
            "min_core_thickness_m": num(t.params.min_core_thickness),
            "masses": {
                "core_alloy_kg": opt(self.summary.core_alloy),
                "schedule_volume_m3": num(sc.volume),
                "schedule_mass_kg": num(sc.mass),
                "schedule_resin_mass_kg": opt(sc.resin),
            },
            "core_alloy": {
                "name": melt.alloy,
                "solidus_C": opt(melt.melting_range.map(|r| r[0].celsius())),
                "liquidus_C": opt(melt.melting_range.map(|r| r[1].celsius())),
                "checks": melt.findings.iter().map(|f| json!({
                    "passed": f.passed,
                    "text": f.note.to_string(),
                })).collect::<Vec<_>>(),
                "failed": melt.failed(),
                "safety_note": melt.safety_note,
            },
            "moulds": halves,
            "mould_pull_chord_angle_deg": num(t.mould_pull_angle.deg()),
            "mould_parts": self.mould_parts().iter().map(|(name, h, volume, mass)| json!({
                "name": name,
                "pull": {"x": num(h.pull[0]), "y": num(h.pull[1]), "z": num(h.pull[2])},
                "least_draft_deg": num(h.draft.min_draft.deg()),
                "below_least_draft_area_m2": num(h.draft.below_min_area),
                "undercut_area_m2": num(h.draft.undercut_area),
                "volume_m3": num(*volume),
                "mass_kg": opt(*mass),
            })).collect::<Vec<_>>(),
            "end_pieces": t.end_pieces.iter().map(|h| json!({
                "part": h.side,
                "pull": {"x": num(h.pull[0]), "y": num(h.pull[1]), "z": num(h.pull[2])},
                "least_draft_deg": num(h.draft.min_draft.deg()),
                "least_draft_at": point(h.draft.at.point),
                "below_least_draft_area_m2": num(h.draft.below_min_area),
                "undercut_area_m2": num(h.draft.undercut_area),
                "cavity_area_m2": num(h.cavity_area),
                "size_m": h.block_size.map(num),
            })).collect::<Vec<_>>(),
            "machining_frames": t.machining.iter().map(machining_frame).collect::<Vec<_>>(),
            "earlier_files": {
                "removed": self.stale.remove,
                "left_in_place": self.stale.kept.iter().map(|(f, why)| json!({
                    "file": f,
                    "reason": why,
                })).collect::<Vec<_>>(),
                "manifest_unreadable": self.stale.unreadable,
            },
            "allowances": {
                "mould_expansion_factor": num(t.params.mould_expansion_factor),
                "core_shrink_factor": num(t.params.core_shrink_factor),
            },
        });
        // Prints and draining, after the keys above.
        let prints = json!({
            "core_prints": t.prints.iter().map(|p| json!({
                "core": p.core,
                "end": p.end.to_string(),
                "section_area_m2": num(p.section_area),
                "length_m": num(p.length),
                "x_end_m": num(p.x_end),
                "volume_m3": num(p.volume),
                "drain_point": point(p.drain_point),
                "down": p.down.map(num),
                "pool_depth_m": num(p.pool_depth),
                "section_m": p.section.iter().map(|q| [num(q[0]), num(q[1])]).collect::<Vec<_>>(),
            })).collect::<Vec<_>>(),
            "cores_without_print": t.unprinted,
            "core_print_fraction": num(t.params.print_fraction),
            "core_print_length_m": num(t.params.print_length),
            "drain": {
                "orientation": self.summary.drain_orientation.iter().map(ToString::to_string).collect::<Vec<_>>(),
                "checks": self.summary.drain_findings.iter().map(|f| json!({
                    "passed": f.passed,
                    "text": f.note.to_string(),
                })).collect::<Vec<_>>(),
                "caution": DRAIN_CAUTION,
            },
        });
        if let (Some(o), Value::Object(p)) = (out.as_object_mut(), prints) {
            o.extend(p);
        }
        // The cores' casting moulds, after the keys above.
        let channel = |c: &crate::tooling::Channel| {
            json!({
                "entry": point(c.entry),
                "outlet": point(c.outlet),
                "entry_diameter_m": num(c.entry_diameter),
                "outlet_diameter_m": num(c.outlet_diameter),
                "volume_m3": num(c.volume),
            })
        };
        let casting = json!({
            "casting_moulds": t.casting.iter().zip(&self.summary.casting_alloy).map(|(m, a)| json!({
                "core": m.core,
                "shrinkage_pct": num(m.shrinkage * 100.0),
                "core_volume_m3": num(m.core_volume),
                "cavity_volume_m3": num(m.cavity_volume),
                "alloy_volume_m3": num(m.metal_volume),
                "alloy_mass_kg": opt(a.mass),
                "alloy_mass_basis": a.basis,
                "pull_chord_angle_deg": num(m.pull_angle.deg()),
                "pouring_up": m.up.map(num),
                "highest_point": point(m.highest),
                "vent_below_highest_m": num(m.vent_shortfall),
                "sprue": channel(&m.sprue),
                "vent": channel(&m.vent),
                "block_volume_m3": num(m.block_volume),
                "parts": m.parts.iter().map(|p| json!({
                    "name": p.name,
                    "file": format!("{}.stl", p.name),
                    "pull": {"x": num(p.pull[0]), "y": num(p.pull[1]), "z": num(p.pull[2])},
                    "volume_m3": num(p.mesh.signed_volume()),
                })).collect::<Vec<_>>(),
                "halves": m.halves.iter().chain(&m.end_pieces).map(|h| json!({
                    "part": h.side,
                    "least_draft_deg": num(h.draft.min_draft.deg()),
                    "below_least_draft_area_m2": num(h.draft.below_min_area),
                    "undercut_area_m2": num(h.draft.undercut_area),
                })).collect::<Vec<_>>(),
                "machining_frames": m.machining.iter().map(machining_frame).collect::<Vec<_>>(),
            })).collect::<Vec<_>>(),
            "casting_notes": t.casting_notes.iter().map(ToString::to_string).collect::<Vec<_>>(),
            "casting_caution": CASTING_CAUTION,
        });
        if let (Some(o), Value::Object(c)) = (out.as_object_mut(), casting) {
            o.extend(c);
        }
        // A mould split along the span (only then: a mould of two halves keeps its keys).
        if let (Some(o), Some(m)) = (out.as_object_mut(), &t.modular) {
            o.insert(
                "mould_modules".into(),
                json!({
                    "modules": m.modules.iter().map(|k| json!({
                        "x_from_m": num(k.x_range[0]),
                        "x_to_m": num(k.x_range[1]),
                        "pull_chord_angle_deg": num(k.pull_angle.deg()),
                        "drawing_window_deg": num(k.window.deg()),
                    })).collect::<Vec<_>>(),
                    "block_size_m": m.block_size.map(num),
                }),
            );
        }
        out
    }
}
