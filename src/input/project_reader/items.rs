//! The arrays of tables: `[[web]]`, `[[point_mass]]` and `[[load_case]]`, each checked against
//! the blade and the rotor, and a load case's temperature change against the plies' materials.

use super::*;

pub(super) fn read_web(
    t: &mut TableReader<'_>,
    r_root: f64,
    r_tip: f64,
) -> Result<WebSpec, InputError> {
    t.expect_keys(&["name", "chord_frac", "r_start_m", "r_end_m"])?;
    let name = t.required_str("name")?;
    let chord_frac = t.required_f64("chord_frac")?;
    if !(chord_frac > 0.0 && chord_frac < 1.0) {
        return Err(t.error(
            "chord_frac",
            format!("web '{name}' lies outside the chord: expected a fraction between 0 and 1, found {chord_frac}"),
        ));
    }
    let r_start = t.optional_f64("r_start_m")?.unwrap_or(r_root);
    let r_end = t.optional_f64("r_end_m")?.unwrap_or(r_tip);
    if r_start >= r_end || r_start < r_root - 1e-9 || r_end > r_tip + 1e-9 {
        return Err(t.error(
            "r_start_m",
            format!(
                "web '{name}' spans r = {r_start}..{r_end} m: expected a range inside the blade ({r_root}..{r_tip} m)"
            ),
        ));
    }
    Ok(WebSpec { name, chord_frac, r_start, r_end })
}

pub(super) fn read_point_mass(
    t: &mut TableReader<'_>,
    r_root: f64,
    r_tip: f64,
) -> Result<PointMass, InputError> {
    t.expect_keys(&[
        "name",
        "r_m",
        "mass_kg",
        "y_m",
        "z_m",
        "inertia_x_kg_m2",
        "inertia_y_kg_m2",
        "inertia_z_kg_m2",
    ])?;
    let name = t.required_str("name")?;
    let r = t.required_f64("r_m")?;
    if r < r_root - 1e-9 || r > r_tip + 1e-9 {
        return Err(t.error(
            "r_m",
            format!("expected a radius on the blade ({r_root}..{r_tip} m), found {r}"),
        ));
    }
    let mass = t.required_positive("mass_kg")?;
    let y = t.optional_f64("y_m")?.unwrap_or(0.0);
    let z = t.optional_f64("z_m")?.unwrap_or(0.0);
    let keys = ["inertia_x_kg_m2", "inertia_y_kg_m2", "inertia_z_kg_m2"];
    let mut inertia = [0.0; 3];
    for (slot, key) in inertia.iter_mut().zip(keys) {
        let v = t.optional_f64(key)?.unwrap_or(0.0);
        if v < 0.0 {
            return Err(
                t.error(key, format!("expected a moment of inertia of 0 or more, found {v}"))
            );
        }
        *slot = v;
    }
    // A body's principal moments obey the triangle inequality (I_a <= I_b + I_c).
    for i in 0..3 {
        let others = inertia[(i + 1) % 3] + inertia[(i + 2) % 3];
        if inertia[i] > others * (1.0 + 1e-9) {
            return Err(t.error(
                keys[i],
                format!(
                    "{} kg·m² exceeds the sum of the other two moments ({others} kg·m²): no body \
                     has such moments of inertia",
                    inertia[i]
                ),
            ));
        }
    }
    Ok(PointMass { name, r, mass, y, z, inertia })
}

pub(super) fn read_load_case(
    t: &mut TableReader<'_>,
    dir: &Path,
    r_root: f64,
    r_tip: f64,
) -> Result<LoadCaseSpec, InputError> {
    t.expect_keys(&[
        "name",
        "rpm",
        "pitch_deg",
        "distributed",
        "gravity_m_s2",
        "load_factor",
        "delta_T_K",
    ])?;
    let name = t.required_str("name")?;
    let rpm = t.required_f64("rpm")?;
    if rpm < 0.0 {
        return Err(t.error("rpm", format!("expected a rotor speed of zero or more, found {rpm}")));
    }
    let pitch = t.optional_f64("pitch_deg")?.map(Angle::from_deg);
    let (distributed, distributed_file) = match t.optional_str("distributed")? {
        Some(file) => {
            let rows = read_distributed(dir, &file, r_root, r_tip)
                .map_err(|e| named_by(&t.location_of("distributed"), e))?;
            (rows, Some(dir.join(&file).display().to_string()))
        }
        None => (Vec::new(), None),
    };
    let gravity = match t.optional_f64_array("gravity_m_s2")? {
        Some(v) if v.len() == 3 => Some([v[0], v[1], v[2]]),
        Some(v) => {
            return Err(t.error(
                "gravity_m_s2",
                format!("expected three components [x, y, z] in m/s2, found {} values", v.len()),
            ));
        }
        None => None,
    };
    let load_factor = t.optional_positive("load_factor")?.unwrap_or(1.0);
    let delta_t = t.optional_f64("delta_T_K")?.unwrap_or(0.0);
    Ok(LoadCaseSpec {
        name,
        omega: rpm_to_rad_s(rpm),
        pitch,
        distributed,
        distributed_file,
        gravity,
        load_factor,
        delta_t,
        buoyancy: None,
    })
}

/// A load case against the rotor: its speed, its pitch and its load factor.
pub(super) fn check_case(
    t: &TableReader<'_>,
    case: &LoadCaseSpec,
    rotor: &Rotor,
    range_given: bool,
    warnings: &mut Vec<InputWarning>,
) -> Result<(), InputError> {
    if let Some(p) = case.pitch {
        // Degrees back from radians, rounded to what was typed.
        let typed = |x: f64| (x * 1e9).round() / 1e9;
        let (lo, hi) = (typed(rotor.pitch_range.0.deg()), typed(rotor.pitch_range.1.deg()));
        if p.deg().abs() > MAX_PITCH_DEG {
            return Err(t.error(
                "pitch_deg",
                format!(
                    "expected a pitch setting within -90..90 degrees, found {}",
                    typed(p.deg())
                ),
            ));
        }
        if range_given && (p.deg() < lo - 1e-9 || p.deg() > hi + 1e-9) {
            return Err(t.error(
                "pitch_deg",
                format!(
                    "load case '{}' at pitch {}° lies outside the rotor's pitch_range_deg = \
                     [{lo}, {hi}]: expected a setting inside the range, or a wider range",
                    case.name,
                    typed(p.deg())
                ),
            ));
        }
    }
    let (lo, hi) = LOAD_FACTOR;
    if !(lo..=hi).contains(&case.load_factor) {
        return Err(t.error(
            "load_factor",
            format!(
                "expected a load factor from {lo} to {hi}, found {}: design codes factor loads \
                 by about 0.9 to 2",
                case.load_factor
            ),
        ));
    }
    if case.load_factor < 1.0 {
        warnings.push(InputWarning::LowLoadFactor {
            place: t.location_of("load_factor"),
            case: case.name.clone(),
            factor: case.load_factor,
        });
    } else if case.load_factor > 3.0 {
        warnings.push(InputWarning::HighLoadFactor {
            place: t.location_of("load_factor"),
            case: case.name.clone(),
            factor: case.load_factor,
        });
    }
    if case.delta_t.abs() > MAX_DELTA_T_K {
        return Err(t.error(
            "delta_T_K",
            format!(
                "expected a temperature change within ±{MAX_DELTA_T_K} K from the stress-free \
                 (cure) state, found {}",
                case.delta_t
            ),
        ));
    }
    if case.gravity.is_some_and(|g| g.iter().map(|x| x * x).sum::<f64>().sqrt() > 100.0) {
        return Err(t.error(
            "gravity_m_s2",
            "expected a gravity vector of at most 100 m/s² (1 g is 9.81 m/s²): is it in mm/s²?",
        ));
    }
    Ok(())
}

/// A load case with a temperature change against the plies: the residual stresses of the
/// change come from the thermal expansion coefficients of every ply's material, so each must
/// give them. Refused here, where the case's line and the record's line are known, rather than
/// by the stress recovery, which knows neither.
pub(super) fn check_case_expansion(
    t: &TableReader<'_>,
    case: &LoadCaseSpec,
    plies: &[PlySpec],
    materials: &MaterialLibrary,
    records: &RecordPlaces,
) -> Result<(), InputError> {
    if case.delta_t == 0.0 {
        return Ok(());
    }
    for ply in plies {
        let keys = match materials.get(&ply.material) {
            Ok(Material::Lamina(l)) if l.cte.is_none() => "a1_ustrain_K and a2_ustrain_K",
            Ok(Material::Isotropic(i)) if i.cte.is_none() => "cte_ustrain_K",
            // With its coefficients, or unknown (refused with the plies).
            _ => continue,
        };
        let record = match records.iter().find(|(name, _)| *name == ply.material) {
            Some((_, place)) => format!(" ({place})"),
            None => String::new(),
        };
        return Err(t.error(
            "delta_T_K",
            format!(
                "load case '{}' has delta_T_K = {} but ply '{}' is of material '{}', which gives \
                 no thermal expansion coefficients{record}: add {keys} to the record, or remove \
                 delta_T_K",
                case.name,
                case.delta_t,
                excerpt(&ply.id),
                ply.material
            ),
        ));
    }
    Ok(())
}
