//! The settings tables: `[excitation]`, `[criteria]`, `[buckling]`, `[modal]` and `[sections]`.

use super::*;

pub(super) fn read_excitation(t: &mut TableReader<'_>) -> Result<ExcitationSpec, InputError> {
    let whole = |t: &TableReader<'_>, key: &str, v: Vec<f64>| -> Result<Vec<u32>, InputError> {
        v.into_iter()
            .map(|x| {
                if x > MAX_ORDER {
                    Err(t.error(
                        key,
                        format!(
                            "expected at most {MAX_ORDER}, found {x}: no machine excites a blade \
                             at this order"
                        ),
                    ))
                } else if x.fract() != 0.0 || x < 1.0 {
                    Err(t.error(key, format!("expected whole numbers of 1 or more, found {x}")))
                } else {
                    Ok(x as u32)
                }
            })
            .collect()
    };
    let count = |t: &TableReader<'_>, key: &str, v: &[f64]| {
        if v.len() > MAX_EXCITATIONS {
            return Err(t.error(
                key,
                format!("expected at most {MAX_EXCITATIONS} values, found {}", v.len()),
            ));
        }
        Ok(())
    };
    let vanes = t.optional_f64_array("vanes")?.unwrap_or_default();
    count(t, "vanes", &vanes)?;
    let vanes = whole(t, "vanes", vanes)?;
    let orders = t.optional_f64_array("orders")?.unwrap_or_default();
    count(t, "orders", &orders)?;
    let orders = whole(t, "orders", orders)?;
    let vane_multiples = t.optional_u32("vane_multiples")?.unwrap_or(2);
    if vane_multiples == 0 || vane_multiples > MAX_VANE_MULTIPLES {
        return Err(t.error(
            "vane_multiples",
            format!("expected 1 to {MAX_VANE_MULTIPLES} multiples, found {vane_multiples}"),
        ));
    }
    let mut fixed = Vec::new();
    let fixed_tables = t.table_array("fixed")?;
    if fixed_tables.len() > MAX_EXCITATIONS {
        return Err(t.error(
            "fixed",
            format!(
                "expected at most {MAX_EXCITATIONS} fixed excitations, found {}",
                fixed_tables.len()
            ),
        ));
    }
    for mut f in fixed_tables {
        f.expect_keys(&["name", "frequency_Hz", "from_Hz", "to_Hz"])?;
        let name = f.required_str("name")?;
        let single = f.optional_positive("frequency_Hz")?;
        let from = f.optional_positive("from_Hz")?;
        let to = f.optional_positive("to_Hz")?;
        let (from_hz, to_hz) = match (single, from, to) {
            (Some(x), None, None) => (x, x),
            (None, Some(a), Some(b)) if b >= a => (a, b),
            (None, Some(a), Some(b)) => {
                return Err(f.error(
                    "to_Hz",
                    format!("expected the top of the band at or above from_Hz = {a}, found {b}"),
                ));
            }
            _ => {
                return Err(f.error(
                    "frequency_Hz",
                    "expected either frequency_Hz or both from_Hz and to_Hz",
                ));
            }
        };
        f.finish()?;
        fixed.push(FixedExcitation { name, from_hz, to_hz });
    }
    t.finish()?;
    Ok(ExcitationSpec { vanes, vane_multiples, orders, fixed })
}

pub(super) fn read_criteria(t: &mut TableReader<'_>) -> Result<Criteria, InputError> {
    let c = Criteria {
        min_reserve_factor: t.optional_positive("min_reserve_factor")?,
        frequency_margin: t.optional_positive("frequency_margin_pct")?.map(fraction_of_pct),
        harmonics: t.optional_u32("harmonics")?.unwrap_or(12),
        max_mass_kg: t.optional_positive("max_mass_kg")?,
        max_tip_deflection_m: t.optional_positive("max_tip_deflection_m")?,
        min_buckling_factor: t.optional_positive("min_buckling_factor")?,
    };
    if c.harmonics == 0 {
        return Err(t.error("harmonics", "expected at least one harmonic, found 0"));
    }
    if c.harmonics > MAX_HARMONICS {
        return Err(t.error(
            "harmonics",
            format!(
                "expected at most {MAX_HARMONICS} harmonics, found {}: excitation falls off fast \
                 with the order (blade passing is checked on its own)",
                c.harmonics
            ),
        ));
    }
    t.finish()?;
    Ok(c)
}

pub(super) fn read_buckling(t: &mut TableReader<'_>) -> Result<BucklingSpec, InputError> {
    let edge_fixity = match t.optional_scalar("edge_fixity")? {
        None => 0.0,
        Some(Scalar::Text(s)) if s == "simply_supported" => 0.0,
        Some(Scalar::Text(s)) if s == "clamped" => 1.0,
        Some(Scalar::Text(s)) => {
            return Err(t.error(
                "edge_fixity",
                format!(
                    "expected \"simply_supported\", \"clamped\" or a number from 0 to 1, found \"{s}\""
                ),
            ));
        }
        Some(Scalar::Number(v)) if (0.0..=1.0).contains(&v) => v,
        Some(Scalar::Number(v)) => {
            return Err(t.error(
                "edge_fixity",
                format!("expected a number from 0 (simply supported) to 1 (clamped), found {v}"),
            ));
        }
    };
    t.finish()?;
    Ok(BucklingSpec { edge_fixity })
}

pub(super) fn read_modal(t: &mut TableReader<'_>) -> Result<ModalSpec, InputError> {
    let d = ModalSpec::default();
    let elements = t.optional_u32("elements")?.map(|v| v as usize).unwrap_or(d.elements);
    if !(2..=2000).contains(&elements) {
        return Err(
            t.error("elements", format!("expected 2 to 2000 beam elements, found {elements}"))
        );
    }
    let modes = t.optional_u32("modes")?.map(|v| v as usize).unwrap_or(d.modes);
    if modes == 0 {
        return Err(t.error("modes", "expected at least one mode, found 0"));
    }
    if modes > MAX_MODES.min(elements) {
        return Err(t.error(
            "modes",
            format!(
                "expected at most {} modes (at most {MAX_MODES}, and no more than the {elements} \
                 beam elements can resolve), found {modes}",
                MAX_MODES.min(elements)
            ),
        ));
    }
    let omega_step = t.optional_positive("rpm_step")?.map(rpm_to_rad_s);
    let root_springs = match t.optional_table("root_springs")? {
        Some(mut s) => {
            // Every key is known before any is read, so a misspelt key is named as unknown (with
            // the closest known key) rather than reported as a missing one.
            s.expect_keys(&["axial_N_m", "flap_Nm_rad", "edge_Nm_rad", "torsion_Nm_rad"])?;
            let springs = RootSprings {
                axial: s.required_positive("axial_N_m")?,
                flap: s.required_positive("flap_Nm_rad")?,
                edge: s.required_positive("edge_Nm_rad")?,
                torsion: s.required_positive("torsion_Nm_rad")?,
            };
            s.finish()?;
            Some(springs)
        }
        None => None,
    };
    t.finish()?;
    Ok(ModalSpec { elements, modes, omega_step, root_springs })
}

pub(super) fn read_sections(t: &mut TableReader<'_>) -> Result<SectionSpec, InputError> {
    let d = SectionSpec::default();
    let contour_points =
        t.optional_u32("contour_points")?.map(|v| v as usize).unwrap_or(d.contour_points);
    if !(24..=20_000).contains(&contour_points) {
        return Err(t.error(
            "contour_points",
            format!("expected 24 to 20000 contour points, found {contour_points}"),
        ));
    }
    let analysis_stations = t.optional_u32("analysis_stations")?.map(|v| v as usize).unwrap_or(0);
    if analysis_stations == 1 || analysis_stations > 2000 {
        return Err(t.error(
            "analysis_stations",
            format!("expected 0 (the project's stations) or 2 to 2000, found {analysis_stations}"),
        ));
    }
    let wall_bending = t.optional_bool("wall_bending")?.unwrap_or(d.wall_bending);
    t.finish()?;
    Ok(SectionSpec { contour_points, analysis_stations, wall_bending })
}
