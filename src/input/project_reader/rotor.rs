//! `[rotor]`: blade count, radii, speeds, pitch and clearances, and the rotor checked against
//! the stations (radii, tip speed).

use super::*;

pub(super) fn read_rotor(
    t: &mut TableReader<'_>,
) -> Result<(Rotor, bool, RotorPlaces), InputError> {
    t.expect_keys(&[
        "blades",
        "hub_radius_m",
        "tip_radius_m",
        "rpm_nominal",
        "rpm_max",
        "rpm_min",
        "pitch_deg",
        "pitch_range_deg",
        "root_clearance_m",
        "tip_clearance_m",
    ])?;
    let blades = t
        .optional_u32("blades")?
        .ok_or_else(|| t.error("blades", "missing key: expected the number of blades"))?;
    if blades == 0 {
        return Err(t.error("blades", "expected at least one blade, found 0"));
    }
    if blades > MAX_BLADES {
        return Err(t.error(
            "blades",
            format!(
                "expected at most {MAX_BLADES} blades, found {blades}: no rotor of composite \
                 blades carries more"
            ),
        ));
    }
    let hub_radius = t.required_f64("hub_radius_m")?;
    if hub_radius < 0.0 {
        return Err(t.error("hub_radius_m", format!("expected zero or more, found {hub_radius}")));
    }
    let tip_radius = t.required_positive("tip_radius_m")?;
    if tip_radius <= hub_radius {
        return Err(t.error(
            "tip_radius_m",
            format!("expected more than hub_radius_m = {hub_radius}, found {tip_radius}"),
        ));
    }
    let rpm_nominal = t.required_positive("rpm_nominal")?;
    let rpm_max = t.required_positive("rpm_max")?;
    if rpm_max < rpm_nominal {
        return Err(t.error(
            "rpm_max",
            format!("expected at least rpm_nominal = {rpm_nominal}, found {rpm_max}"),
        ));
    }
    let rpm_min = match t.optional_f64("rpm_min")? {
        None => rpm_nominal,
        Some(v) if v > 0.0 && v <= rpm_nominal => v,
        Some(v) => {
            return Err(t.error(
                "rpm_min",
                format!(
                    "expected the least operating speed, more than 0 and at most rpm_nominal = \
                     {rpm_nominal}, found {v}"
                ),
            ));
        }
    };
    let pitch_deg = t.optional_f64("pitch_deg")?.unwrap_or(0.0);
    if pitch_deg.abs() > MAX_PITCH_DEG {
        return Err(t.error(
            "pitch_deg",
            format!("expected a pitch setting within -90..90 degrees, found {pitch_deg}"),
        ));
    }
    let pitch = Angle::from_deg(pitch_deg);
    let given = t.optional_f64_array("pitch_range_deg")?;
    let range_given = given.is_some();
    let pitch_range = match given {
        Some(v) if v.len() == 2 && v[0] <= v[1] => {
            if v[0] < -MAX_PITCH_DEG || v[1] > MAX_PITCH_DEG {
                return Err(t.error(
                    "pitch_range_deg",
                    format!(
                        "expected a range within -90..90 degrees (reverse to feathered), found \
                         [{}, {}]",
                        v[0], v[1]
                    ),
                ));
            }
            if pitch_deg < v[0] || pitch_deg > v[1] {
                return Err(t.error(
                    "pitch_deg",
                    format!(
                        "the pitch setting {pitch_deg}° lies outside pitch_range_deg = [{}, {}]: \
                         expected a setting inside the range",
                        v[0], v[1]
                    ),
                ));
            }
            (Angle::from_deg(v[0]), Angle::from_deg(v[1]))
        }
        Some(v) => {
            let shown: Vec<String> = v.iter().take(4).map(|x| x.to_string()).collect();
            return Err(t.error(
                "pitch_range_deg",
                format!(
                    "expected [least, greatest] with least <= greatest, found {} values [{}{}]",
                    v.len(),
                    shown.join(", "),
                    if v.len() > 4 { ", …" } else { "" }
                ),
            ));
        }
        None => (pitch, pitch),
    };
    let clearance = |t: &mut TableReader<'_>, key: &str| -> Result<f64, InputError> {
        let c = t.optional_f64(key)?.unwrap_or(0.0);
        if c < 0.0 {
            return Err(t.error(key, format!("expected zero or more, found {c}")));
        }
        Ok(c)
    };
    let root_clearance = clearance(t, "root_clearance_m")?;
    let tip_clearance = clearance(t, "tip_clearance_m")?;
    if root_clearance + tip_clearance >= tip_radius - hub_radius {
        return Err(t.error(
            "tip_clearance_m",
            format!(
                "the clearances ({root_clearance} m + {tip_clearance} m) are larger than the blade \
                 ({} m from hub to tip)",
                tip_radius - hub_radius
            ),
        ));
    }
    t.finish()?;
    let rotor = Rotor {
        blades,
        hub_radius,
        tip_radius,
        omega_nominal: rpm_to_rad_s(rpm_nominal),
        omega_max: rpm_to_rad_s(rpm_max),
        omega_min: rpm_to_rad_s(rpm_min),
        pitch,
        pitch_range,
        root_clearance,
        tip_clearance,
    };
    let places =
        [t.location_of("hub_radius_m"), t.location_of("tip_radius_m"), t.location_of("rpm_max")];
    Ok((rotor, range_given, places))
}

pub(super) fn check_rotor_against_stations(
    places: &RotorPlaces,
    rotor: &Rotor,
    r_root: f64,
    r_tip: f64,
    warnings: &mut Vec<InputWarning>,
) -> Result<(), InputError> {
    let eps = 1e-9;
    let length = r_tip - r_root;
    if rotor.tip_radius - r_tip > TIP_GAP * length {
        return Err(InputError::at(
            places[1].clone(),
            format!(
                "tip_radius_m = {} lies {:.4} m beyond the last station (r = {r_tip} m): expected \
                 the stations to reach the tip, within {} % of the blade's length ({:.4} m)",
                rotor.tip_radius,
                rotor.tip_radius - r_tip,
                TIP_GAP * 100.0,
                TIP_GAP * length
            ),
        ));
    }
    if r_root - rotor.hub_radius > 0.5 * length {
        warnings.push(InputWarning::FarFromHub {
            place: places[0].clone(),
            r_root,
            hub_radius: rotor.hub_radius,
        });
    }
    if r_root < rotor.hub_radius - eps {
        return Err(InputError::at(
            places[0].clone(),
            format!(
                "the first station (r = {r_root} m) lies inside the hub: expected hub_radius_m <= {r_root}, found {}",
                rotor.hub_radius
            ),
        ));
    }
    if r_tip > rotor.tip_radius + eps {
        return Err(InputError::at(
            places[1].clone(),
            format!(
                "the last station (r = {r_tip} m) lies beyond the tip: expected tip_radius_m >= {r_tip}, found {}",
                rotor.tip_radius
            ),
        ));
    }
    Ok(())
}
