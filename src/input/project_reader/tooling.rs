//! `[tooling]`: the core alloy, mould material, process temperatures and the tooling geometry,
//! checked against the blade and the materials file; the tolerance bounds of the STL output.

use super::*;

/// The message of a tooling material the file does not hold: with the closest name when one is
/// close, else with the file's isotropic records (those a core alloy or a mould material can
/// be), so that the reader sees what to write.
fn unknown_record(
    e: crate::material::MaterialError,
    materials: &crate::material::MaterialLibrary,
) -> String {
    let text = e.to_string();
    if !matches!(e, crate::material::MaterialError::Unknown { hint: None, .. }) {
        return text;
    }
    let names: Vec<String> = materials
        .iter()
        .filter_map(|m| match m {
            Material::Isotropic(i) => Some(format!("'{}'", i.name)),
            Material::Lamina(_) => None,
        })
        .collect();
    if names.is_empty() {
        format!(
            "{text}: expected the name of an [isotropic.NAME] record, and the materials file has none"
        )
    } else {
        format!("{text}: expected one of the isotropic records {}", names.join(", "))
    }
}

pub(super) fn read_tooling(
    t: &mut TableReader<'_>,
    materials: &crate::material::MaterialLibrary,
) -> Result<ToolingSpec, InputError> {
    let d = ToolingSpec::default();
    let core_alloy = t.optional_str("core_alloy")?;
    let mut core_alloy_shrinkage = d.core_alloy_shrinkage;
    if let Some(name) = &core_alloy {
        match materials.get(name) {
            Ok(Material::Isotropic(i)) => {
                // The record's own shrinkage, else its thermal contraction from the solidus
                // to 20 °C (the casting shrinks as a solid; the change of volume on freezing is
                // left out: bismuth alloys barely shrink or grow then).
                let solidus = i.melting_range.map(|[s, _]| s.celsius());
                core_alloy_shrinkage = match (i.shrinkage, i.cte, solidus) {
                    (Some(fraction), _, _) => fraction,
                    (None, Some(cte), Some(solidus)) if solidus > 20.0 => cte * (solidus - 20.0),
                    _ => d.core_alloy_shrinkage,
                };
            }
            Ok(Material::Lamina(_)) => {
                return Err(t.error("core_alloy", format!("'{name}' is a lamina: expected an [isotropic.NAME] record with a melting range")));
            }
            Err(e) => return Err(t.error("core_alloy", unknown_record(e, materials))),
        }
    }
    let mould_material = t.optional_str("mould_material")?;
    if let Some(name) = &mould_material {
        match materials.get(name) {
            Ok(Material::Isotropic(i)) if i.density.is_finite() && i.density > 0.0 => {}
            Ok(Material::Isotropic(i)) => {
                return Err(t.error(
                    "mould_material",
                    format!("'{name}' has density_kg_m3 = {}: expected a positive density for the mould masses", i.density),
                ));
            }
            Ok(Material::Lamina(_)) => {
                return Err(t.error("mould_material", format!("'{name}' is a lamina: expected an [isotropic.NAME] record with density_kg_m3 (a tooling board, an aluminium alloy)")));
            }
            Err(e) => return Err(t.error("mould_material", unknown_record(e, materials))),
        }
    }
    let stl_unit = t.optional_str("stl_unit")?.unwrap_or(d.stl_unit);
    if stl_unit != "mm" && stl_unit != "m" {
        return Err(t.error("stl_unit", format!("expected \"mm\" or \"m\", found \"{stl_unit}\"")));
    }
    let tolerance = match t.optional_f64("tolerance_mm")? {
        Some(v) if v > 0.0 => v * MM,
        Some(v) => {
            return Err(
                t.error("tolerance_mm", format!("expected a positive tolerance, found {v}"))
            );
        }
        None => d.tolerance,
    };
    let factor = |t: &mut TableReader<'_>, key: &str| -> Result<f64, InputError> {
        match t.optional_f64(key)? {
            Some(v) if v > 0.5 && v < 2.0 => Ok(v),
            Some(v) => {
                Err(t.error(key, format!("expected a scale factor near 1 (0.5..2), found {v}")))
            }
            None => Ok(1.0),
        }
    };
    let mould_expansion_factor = factor(t, "mould_expansion_factor")?;
    let core_shrink_factor = factor(t, "core_shrink_factor")?;
    let mould_margin = match t.optional_f64("mould_margin_m")? {
        Some(v) if v > 0.0 => v,
        Some(v) => {
            return Err(t.error("mould_margin_m", format!("expected a positive margin, found {v}")));
        }
        None => d.mould_margin,
    };
    let min_draft = match t.optional_f64("min_draft_deg")? {
        Some(v) if (0.0..=30.0).contains(&v) => Angle::from_deg(v),
        Some(v) => {
            return Err(t.error(
                "min_draft_deg",
                format!("expected a least draft of 0 to 30 degrees, found {v}"),
            ));
        }
        None => d.min_draft,
    };
    let min_core_thickness = match t.optional_f64("min_core_thickness_mm")? {
        Some(v) if v > 0.0 => v * MM,
        Some(v) => {
            return Err(t.error(
                "min_core_thickness_mm",
                format!("expected a positive thickness, found {v}"),
            ));
        }
        None => d.min_core_thickness,
    };
    let core_print_fraction = match t.optional_f64("core_print_fraction")? {
        Some(v) if (0.0..=0.9).contains(&v) => v,
        Some(v) => {
            return Err(t.error(
                "core_print_fraction",
                format!(
                    "expected a fraction of the core's end section from 0 (no prints) to 0.9, \
                     found {v}"
                ),
            ));
        }
        None => d.core_print_fraction,
    };
    let core_print_length = match t.optional_f64("core_print_length_mm")? {
        Some(v) if v > 0.0 => v * MM,
        Some(v) => {
            return Err(t.error(
                "core_print_length_mm",
                format!("expected a positive print length, found {v}"),
            ));
        }
        // Not given: 15 mm, or half the mould margin when that is less.
        None => d.core_print_length.min(0.5 * mould_margin),
    };
    Ok(ToolingSpec {
        core_alloy,
        mould_material,
        injection_temperature: t
            .optional_f64("injection_temperature_C")?
            .map(Temperature::from_celsius),
        gel_temperature: t.optional_f64("gel_temperature_C")?.map(Temperature::from_celsius),
        cure_temperature: t.optional_f64("cure_temperature_C")?.map(Temperature::from_celsius),
        mould_margin,
        stl_unit,
        tolerance,
        mould_expansion_factor,
        core_shrink_factor,
        min_draft,
        min_core_thickness,
        core_print_fraction,
        core_print_length,
        core_alloy_shrinkage,
    })
}

/// The tooling settings against the blade: the mesh tolerance and the mould margin against its
/// size (they set the facet count), the process temperatures against absolute zero and resins.
pub(super) fn check_tooling(
    t: &TableReader<'_>,
    spec: &ToolingSpec,
    blade_length: f64,
    c_min: f64,
    c_max: f64,
    warnings: &mut Vec<InputWarning>,
) -> Result<(), InputError> {
    let (lo, hi) = tolerance_range(blade_length, c_min);
    if spec.tolerance < lo || spec.tolerance > hi {
        return Err(t.error("tolerance_mm", tolerance_message(spec.tolerance, lo, hi)));
    }
    let (lo, hi) = (MIN_MARGIN * c_max, MAX_MARGIN * (blade_length + c_max));
    if spec.mould_margin < lo || spec.mould_margin > hi {
        return Err(t.error(
            "mould_margin_m",
            format!(
                "expected a margin from {:.4} m ({} % of the largest chord) to {:.3} m (twice the \
                 blade's length and chord), found {}",
                lo,
                MIN_MARGIN * 100.0,
                hi,
                spec.mould_margin
            ),
        ));
    }
    if spec.core_print_fraction > 0.0 && spec.core_print_length > spec.mould_margin {
        return Err(t.error(
            "core_print_length_mm",
            format!(
                "expected a print no longer than the mould margin (mould_margin_m = {} m): the \
                 print seats in the mould block beyond the part; found {} mm",
                spec.mould_margin,
                (spec.core_print_length / MM * 1e6).round() / 1e6
            ),
        ));
    }
    let temps = [
        ("injection_temperature_C", spec.injection_temperature.map(Temperature::celsius)),
        ("gel_temperature_C", spec.gel_temperature.map(Temperature::celsius)),
        ("cure_temperature_C", spec.cure_temperature.map(Temperature::celsius)),
    ];
    for (key, v) in temps {
        let Some(v) = v else { continue };
        if v <= ABSOLUTE_ZERO_C {
            return Err(t.error(
                key,
                format!("{v} °C lies at or below absolute zero ({ABSOLUTE_ZERO_C} °C)"),
            ));
        }
        if v > MAX_PROCESS_C {
            return Err(t.error(
                key,
                format!(
                    "expected at most {MAX_PROCESS_C} °C, found {v}: resins cure below about \
                     400 °C (a temperature in K or °F?)"
                ),
            ));
        }
    }
    let given: Vec<(&str, f64)> = temps.iter().filter_map(|(k, v)| v.map(|v| (*k, v))).collect();
    for pair in given.windows(2) {
        if pair[1].1 < pair[0].1 {
            warnings.push(InputWarning::FallingTemperature {
                place: t.location_of(pair[1].0),
                key: pair[1].0.to_string(),
                value_c: pair[1].1,
                before_key: pair[0].0.to_string(),
                before_c: pair[0].1,
            });
        }
    }
    Ok(())
}

/// The accepted chordal tolerance of the tooling meshes, m: from [`MIN_TOLERANCE`] of the
/// blade's length to [`MAX_TOLERANCE`] of its least chord.
pub fn tolerance_range(blade_length: f64, least_chord: f64) -> (f64, f64) {
    (MIN_TOLERANCE * blade_length, MAX_TOLERANCE * least_chord)
}

/// Why a tolerance (m) outside `lo..hi` (m) is refused.
pub fn tolerance_message(tolerance: f64, lo: f64, hi: f64) -> String {
    format!(
        "expected a tolerance from {:.4} mm (1/{:.0} of the blade's length: finer multiplies \
         the facets for no mould that can be machined) to {:.3} mm ({} % of the least chord: \
         coarser no longer follows the thin sections), found {} mm",
        lo * 1e3,
        1.0 / MIN_TOLERANCE,
        hi * 1e3,
        MAX_TOLERANCE * 100.0,
        mm_text(tolerance)
    )
}

/// A length (m) in mm to nine decimals with the trailing zeros dropped: as typed, without the
/// round-off of the conversion (1e-6 mm, not 0.0000010000000000000002 mm).
fn mm_text(length: f64) -> String {
    let text = format!("{:.9}", length * 1e3);
    let text = text.trim_end_matches('0').trim_end_matches('.');
    if text.is_empty() || text == "-" || text == "-0" { "0".into() } else { text.into() }
}
