//! Reads `blade.toml` and the files it names into a [`Project`], checking every value.
//!
//! `blade.toml` tables and keys (units in the names; optional unless marked required):
//!
//! - top level: `name` (required);
//! - `[rotor]` (required): `blades`, `hub_radius_m`, `tip_radius_m`, `rpm_nominal`, `rpm_max`
//!   (required); `pitch_deg` (0), `pitch_range_deg = [least, greatest]` (the pitch setting),
//!   `root_clearance_m` (0), `tip_clearance_m` (0);
//! - `[files]`: `stations` ("stations.csv"), `plies` ("plies.csv"), `materials`
//!   ("materials.toml");
//! - `[[web]]`: `name`, `chord_frac` (required), `r_start_m`, `r_end_m` (the whole blade);
//! - `[[point_mass]]`: `name`, `r_m`, `mass_kg` (required), `y_m`, `z_m` (0, chord frame),
//!   `inertia_x_kg_m2`, `inertia_y_kg_m2`, `inertia_z_kg_m2` (0: the moments of inertia about
//!   the mass's own centre, axes parallel to the pitch axis, the chord and the chord normal);
//! - `[[load_case]]`: `name`, `rpm` (required), `pitch_deg`, `distributed` (a CSV file with
//!   `r_m, f_flap_N_m, f_edge_N_m, m_pitch_Nm_m`), `gravity_m_s2 = [x, y, z]` (rotor frame),
//!   `load_factor` (1), `delta_T_K` (0);
//! - `[criteria]`: `min_reserve_factor`, `frequency_margin_pct`, `harmonics` (12),
//!   `max_mass_kg`, `max_tip_deflection_m`, `min_buckling_factor` (`min_reserve_factor`);
//! - `[buckling]`: `edge_fixity` (`"simply_supported"`, `"clamped"` or a number from 0, simply
//!   supported, to 1, clamped; `"simply_supported"`);
//! - `[tooling]`: `core_alloy`, `injection_temperature_C`, `gel_temperature_C`,
//!   `cure_temperature_C`, `mould_margin_m` (0.03), `stl_unit` ("mm" or "m"), `tolerance_mm`
//!   (0.1), `mould_expansion_factor` (1), `core_shrink_factor` (1), `min_draft_deg` (1, from 0 to 30),
//!   `mould_material` (an `[isotropic.NAME]` record; its density gives the mould masses),
//!   `min_core_thickness_mm` (2);
//! - `[modal]`: `elements` (40), `modes` (8), `rpm_step`, `[modal.root_springs]` with
//!   `axial_N_m`, `flap_Nm_rad`, `edge_Nm_rad`, `torsion_Nm_rad`;
//! - `[sections]`: `contour_points` (240), `analysis_stations` (0: the project's stations),
//!   `wall_bending` (true: the walls bend and twist with the beam; false: wall curvatures held
//!   at zero, the membrane theory);
//! - `[fluid]`: `density_kg_m3` (required in the table; no fluid without the table);
//! - `[excitation]`: `vanes` (counts V of stationary vanes or struts: orders k·V),
//!   `vane_multiples` (2), `orders` (further rotor orders), `[[excitation.fixed]]` with `name`
//!   and `frequency_Hz`, or `from_Hz` and `to_Hz` for a band.

use std::path::Path;

use super::location::{InputError, SourceText};
use super::project::*;
use super::project_files::{read_distributed, read_plies, read_stations};
use super::toml_table::{Scalar, TableReader};
use crate::material::Material;
use crate::units::{Angle, MM};

/// The greatest load-case speed accepted, as a multiple of `rpm_max`: proof and burst tests of
/// rotors run up to about 1.2 to 1.5 times the greatest operating speed (common practice).
const OVERSPEED_LIMIT: f64 = 2.0;

/// Reads a blade project from its `blade.toml`, given as the file or as the folder that holds it.
pub fn read_project(path: &Path) -> Result<Project, InputError> {
    let joined;
    let path = if path.is_dir() {
        joined = path.join("blade.toml");
        joined.as_path()
    } else {
        path
    };
    let display = path.display().to_string();
    let source = SourceText::read(path, &display)?;
    let dir = path.parent().map(Path::to_path_buf).unwrap_or_default();
    let mut doc = TableReader::parse_document(&source)?;

    let name = doc.required_str("name")?;
    let rotor = read_rotor(&mut doc.required_table("rotor")?)?;
    let (stations_file, plies_file, materials_file) = match doc.optional_table("files")? {
        Some(mut f) => {
            let s = f.optional_str("stations")?.unwrap_or_else(|| "stations.csv".into());
            let p = f.optional_str("plies")?.unwrap_or_else(|| "plies.csv".into());
            let m = f.optional_str("materials")?.unwrap_or_else(|| "materials.toml".into());
            f.finish()?;
            (s, p, m)
        }
        None => ("stations.csv".into(), "plies.csv".into(), "materials.toml".into()),
    };
    let webs_t = doc.table_array("web")?;
    let masses_t = doc.table_array("point_mass")?;
    let cases_t = doc.table_array("load_case")?;
    let criteria = match doc.optional_table("criteria")? {
        Some(mut t) => read_criteria(&mut t)?,
        None => Criteria { harmonics: 12, ..Criteria::default() },
    };
    let tooling_t = doc.optional_table("tooling")?;
    let modal = match doc.optional_table("modal")? {
        Some(mut t) => read_modal(&mut t)?,
        None => ModalSpec::default(),
    };
    let sections = match doc.optional_table("sections")? {
        Some(mut t) => read_sections(&mut t)?,
        None => SectionSpec::default(),
    };
    let fluid = match doc.optional_table("fluid")? {
        Some(mut t) => {
            let density = t.required_positive("density_kg_m3")?;
            t.finish()?;
            Some(FluidSpec { density })
        }
        None => None,
    };
    let excitation = match doc.optional_table("excitation")? {
        Some(mut t) => read_excitation(&mut t)?,
        None => ExcitationSpec { vane_multiples: 2, ..ExcitationSpec::default() },
    };
    let buckling = match doc.optional_table("buckling")? {
        Some(mut t) => read_buckling(&mut t)?,
        None => BucklingSpec::default(),
    };

    let materials_path = dir.join(&materials_file);
    let materials = super::materials::read_materials(&materials_path)?;
    let stations = read_stations(&dir, &stations_file)?;
    let (r_root, r_tip) = (stations[0].r, stations[stations.len() - 1].r);
    check_rotor_against_stations(&doc, &rotor, r_root, r_tip)?;

    let mut webs = Vec::new();
    for mut t in webs_t {
        let web = read_web(&mut t, r_root, r_tip)?;
        if webs.iter().any(|w: &WebSpec| w.name == web.name) {
            return Err(t.error("name", format!("web '{}' is defined twice", web.name)));
        }
        t.finish()?;
        webs.push(web);
    }
    webs.sort_by(|a, b| a.chord_frac.total_cmp(&b.chord_frac));

    let plies = read_plies(&dir, &plies_file, &materials, &webs, r_root, r_tip)?;

    let mut point_masses = Vec::new();
    for mut t in masses_t {
        point_masses.push(read_point_mass(&mut t, r_root, r_tip)?);
        t.finish()?;
    }

    let mut load_cases: Vec<LoadCaseSpec> = Vec::new();
    for mut t in cases_t {
        let case = read_load_case(&mut t, &dir, r_root, r_tip)?;
        // An overspeed or proof case may run above the greatest operating speed (it is then
        // named in the warnings); twice that speed is taken as a typing error.
        if case.rpm > OVERSPEED_LIMIT * rotor.rpm_max {
            return Err(t.error(
                "rpm",
                format!(
                    "expected at most {OVERSPEED_LIMIT} x rpm_max = {} rpm for a load case, found \
                     {}: an overspeed case runs above rpm_max, but not this far",
                    OVERSPEED_LIMIT * rotor.rpm_max,
                    case.rpm
                ),
            ));
        }
        if load_cases.iter().any(|c| c.name == case.name) {
            return Err(t.error("name", format!("load case '{}' is defined twice", case.name)));
        }
        t.finish()?;
        load_cases.push(case);
    }

    let tooling = match tooling_t {
        Some(mut t) => {
            let spec = read_tooling(&mut t, &materials)?;
            t.finish()?;
            Some(spec)
        }
        None => None,
    };
    doc.finish()?;
    let shown = |f: &str| dir.join(f).display().to_string();
    let files = ProjectFiles {
        stations: shown(&stations_file),
        plies: shown(&plies_file),
        materials: shown(&materials_file),
    };
    Ok(Project {
        name,
        file: display,
        files,
        dir,
        rotor,
        stations,
        plies,
        webs,
        point_masses,
        load_cases,
        criteria,
        tooling,
        modal,
        fluid,
        excitation,
        sections,
        buckling,
        materials,
    })
}

fn read_rotor(t: &mut TableReader<'_>) -> Result<Rotor, InputError> {
    let blades = t
        .optional_u32("blades")?
        .ok_or_else(|| t.error("blades", "missing key: expected the number of blades"))?;
    if blades == 0 {
        return Err(t.error("blades", "expected at least one blade, found 0"));
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
    let pitch = Angle::from_deg(t.optional_f64("pitch_deg")?.unwrap_or(0.0));
    let pitch_range = match t.optional_f64_array("pitch_range_deg")? {
        Some(v) if v.len() == 2 && v[0] <= v[1] => (Angle::from_deg(v[0]), Angle::from_deg(v[1])),
        Some(v) => {
            return Err(t.error(
                "pitch_range_deg",
                format!("expected [least, greatest] with least <= greatest, found {v:?}"),
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
    Ok(Rotor {
        blades,
        hub_radius,
        tip_radius,
        rpm_nominal,
        rpm_max,
        pitch,
        pitch_range,
        root_clearance,
        tip_clearance,
    })
}

fn check_rotor_against_stations(
    doc: &TableReader<'_>,
    rotor: &Rotor,
    r_root: f64,
    r_tip: f64,
) -> Result<(), InputError> {
    let eps = 1e-9;
    if r_root < rotor.hub_radius - eps {
        return Err(InputError::at(
            doc.location_of("rotor").with_field("rotor.hub_radius_m"),
            format!(
                "the first station (r = {r_root} m) lies inside the hub: expected hub_radius_m <= {r_root}, found {}",
                rotor.hub_radius
            ),
        ));
    }
    if r_tip > rotor.tip_radius + eps {
        return Err(InputError::at(
            doc.location_of("rotor").with_field("rotor.tip_radius_m"),
            format!(
                "the last station (r = {r_tip} m) lies beyond the tip: expected tip_radius_m >= {r_tip}, found {}",
                rotor.tip_radius
            ),
        ));
    }
    Ok(())
}

fn read_web(t: &mut TableReader<'_>, r_root: f64, r_tip: f64) -> Result<WebSpec, InputError> {
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

fn read_point_mass(
    t: &mut TableReader<'_>,
    r_root: f64,
    r_tip: f64,
) -> Result<PointMass, InputError> {
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

fn read_excitation(t: &mut TableReader<'_>) -> Result<ExcitationSpec, InputError> {
    let whole = |t: &TableReader<'_>, key: &str, v: Vec<f64>| -> Result<Vec<u32>, InputError> {
        v.into_iter()
            .map(|x| {
                if x.fract() != 0.0 || !(1.0..=1.0e6).contains(&x) {
                    Err(t.error(key, format!("expected whole numbers of 1 or more, found {x}")))
                } else {
                    Ok(x as u32)
                }
            })
            .collect()
    };
    let vanes = t.optional_f64_array("vanes")?.unwrap_or_default();
    let vanes = whole(t, "vanes", vanes)?;
    let orders = t.optional_f64_array("orders")?.unwrap_or_default();
    let orders = whole(t, "orders", orders)?;
    let vane_multiples = t.optional_u32("vane_multiples")?.unwrap_or(2);
    if vane_multiples == 0 {
        return Err(t.error("vane_multiples", "expected at least 1 multiple, found 0"));
    }
    let mut fixed = Vec::new();
    for mut f in t.table_array("fixed")? {
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

fn read_load_case(
    t: &mut TableReader<'_>,
    dir: &Path,
    r_root: f64,
    r_tip: f64,
) -> Result<LoadCaseSpec, InputError> {
    let name = t.required_str("name")?;
    let rpm = t.required_f64("rpm")?;
    if rpm < 0.0 {
        return Err(t.error("rpm", format!("expected a rotor speed of zero or more, found {rpm}")));
    }
    let pitch = t.optional_f64("pitch_deg")?.map(Angle::from_deg);
    let (distributed, distributed_file) = match t.optional_str("distributed")? {
        Some(file) => {
            let rows = read_distributed(dir, &file, r_root, r_tip)?;
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
        rpm,
        pitch,
        distributed,
        distributed_file,
        gravity,
        load_factor,
        delta_t,
        buoyancy: None,
    })
}

fn read_criteria(t: &mut TableReader<'_>) -> Result<Criteria, InputError> {
    let c = Criteria {
        min_reserve_factor: t.optional_positive("min_reserve_factor")?,
        frequency_margin_pct: t.optional_positive("frequency_margin_pct")?,
        harmonics: t.optional_u32("harmonics")?.unwrap_or(12),
        max_mass_kg: t.optional_positive("max_mass_kg")?,
        max_tip_deflection_m: t.optional_positive("max_tip_deflection_m")?,
        min_buckling_factor: t.optional_positive("min_buckling_factor")?,
    };
    if c.harmonics == 0 {
        return Err(t.error("harmonics", "expected at least one harmonic, found 0"));
    }
    t.finish()?;
    Ok(c)
}

fn read_tooling(
    t: &mut TableReader<'_>,
    materials: &crate::material::MaterialLibrary,
) -> Result<ToolingSpec, InputError> {
    let d = ToolingSpec::default();
    let core_alloy = t.optional_str("core_alloy")?;
    if let Some(name) = &core_alloy {
        match materials.get(name) {
            Ok(Material::Isotropic(_)) => {}
            Ok(Material::Lamina(_)) => {
                return Err(t.error("core_alloy", format!("'{name}' is a lamina: expected an [isotropic.NAME] record with a melting range")));
            }
            Err(e) => return Err(t.error("core_alloy", e.to_string())),
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
            Err(e) => return Err(t.error("mould_material", e.to_string())),
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
    Ok(ToolingSpec {
        core_alloy,
        mould_material,
        injection_temperature_c: t.optional_f64("injection_temperature_C")?,
        gel_temperature_c: t.optional_f64("gel_temperature_C")?,
        cure_temperature_c: t.optional_f64("cure_temperature_C")?,
        mould_margin,
        stl_unit,
        tolerance,
        mould_expansion_factor,
        core_shrink_factor,
        min_draft,
        min_core_thickness,
    })
}

fn read_buckling(t: &mut TableReader<'_>) -> Result<BucklingSpec, InputError> {
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

fn read_modal(t: &mut TableReader<'_>) -> Result<ModalSpec, InputError> {
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
    let rpm_step = t.optional_positive("rpm_step")?;
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
    Ok(ModalSpec { elements, modes, rpm_step, root_springs })
}

fn read_sections(t: &mut TableReader<'_>) -> Result<SectionSpec, InputError> {
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
