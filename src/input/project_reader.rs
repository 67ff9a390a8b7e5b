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
//!   `min_core_thickness_mm` (2), `core_print_fraction` (0, no prints, to 0.9;
//!   try 0.5),
//!   `core_print_length_mm` (15, at most the mould margin);
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

use super::location::{InputError, Location, SourceText};
use super::project_files::{read_distributed, read_plies, read_stations};
use super::toml_table::{Scalar, TableReader};
use crate::material::Material;
use crate::project::*;
use crate::text::excerpt;
use crate::units::{Angle, MM};

/// The greatest load-case speed accepted, as a multiple of `rpm_max`: proof and burst tests of
/// rotors run up to about 1.2 to 1.5 times the greatest operating speed (common practice).
const OVERSPEED_LIMIT: f64 = 2.0;

/// Limits on the inputs (see `limits` in DESIGN notes of the report): each bounds a value to
/// what a real blade can be or needs, so that a typing error is refused with its reason and no
/// input can ask for unbounded work.
pub mod limits {
    /// Most blades on one rotor: axial fans carry up to a few dozen blades, compressor and
    /// ducted-fan stages rarely more than about 60 (common practice).
    pub const MAX_BLADES: u32 = 100;
    /// Greatest tip speed at `rpm_max`, m/s: the fastest composite fan blades (turbofan fans)
    /// run at about 450–500 m/s at the tip (common practice); beyond this the input is a typo.
    pub const MAX_TIP_SPEED_M_S: f64 = 700.0;
    /// Least and greatest load factor: partial load factors of design codes run from about 0.9
    /// (favourable loads) to 2 (common practice); outside 0.5–10 the factor is a typo.
    pub const LOAD_FACTOR: (f64, f64) = (0.5, 10.0);
    /// Pitch settings and ranges, degrees: from reverse pitch to feathered.
    pub const MAX_PITCH_DEG: f64 = 90.0;
    /// Most rotor harmonics checked: excitation falls off fast with the order; 12 is the
    /// default and blade passing is added on its own (common practice).
    pub const MAX_HARMONICS: u32 = 100;
    /// Most speeds of the Campbell sweep from `[modal] rpm_step` (each is an eigen solution).
    pub const MAX_SWEEP_STEPS: f64 = 1000.0;
    /// Most modes per speed.
    pub const MAX_MODES: usize = 100;
    /// Most vane counts, further orders and fixed excitations, and the greatest order.
    pub const MAX_EXCITATIONS: usize = 100;
    /// Greatest excitation order or vane count.
    pub const MAX_ORDER: f64 = 1000.0;
    /// Most multiples of a vane count.
    pub const MAX_VANE_MULTIPLES: u32 = 20;
    /// Greatest fluid density, kg/m³: sea water is 1,025, drilling mud about 2,000.
    pub const MAX_FLUID_DENSITY: f64 = 3000.0;
    /// Absolute zero, °C.
    pub const ABSOLUTE_ZERO_C: f64 = -273.15;
    /// Greatest process temperature, °C: epoxies cure below about 200 °C, high-temperature
    /// resins below about 400 °C.
    pub const MAX_PROCESS_C: f64 = 500.0;
    /// Greatest temperature change of a load case, K, either way.
    pub const MAX_DELTA_T_K: f64 = 400.0;
    /// The tip radius may lie beyond the last station by at most this fraction of the blade's
    /// length (a tip cap not described by a station).
    pub const TIP_GAP: f64 = 0.1;
    /// Least chordal tolerance of the tooling meshes, as a fraction of the blade's length: the
    /// facet count grows as the inverse of the tolerance; 1/50,000 of the length is finer than
    /// any mould is machined (common practice).
    pub const MIN_TOLERANCE: f64 = 2e-5;
    /// Greatest chordal tolerance, as a fraction of the least chord: a coarser mesh no longer
    /// follows the thin sections (the surfaces turn over).
    pub const MAX_TOLERANCE: f64 = 0.01;
    /// Least mould margin, as a fraction of the largest chord.
    pub const MIN_MARGIN: f64 = 0.02;
    /// Greatest mould margin, as a multiple of the blade's length plus its largest chord.
    pub const MAX_MARGIN: f64 = 2.0;
}
use limits::*;

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
    let mut warnings = Vec::new();
    let (rotor, range_given, places) = read_rotor(&mut doc.required_table("rotor")?)?;
    let keys = ["stations", "plies", "materials"];
    let (stations_file, plies_file, materials_file, file_places) =
        match doc.optional_table("files")? {
            Some(mut f) => {
                let s = f.optional_str("stations")?.unwrap_or_else(|| "stations.csv".into());
                let p = f.optional_str("plies")?.unwrap_or_else(|| "plies.csv".into());
                let m = f.optional_str("materials")?.unwrap_or_else(|| "materials.toml".into());
                f.finish()?;
                (s, p, m, keys.map(|k| f.location_of(k)))
            }
            None => (
                "stations.csv".into(),
                "plies.csv".into(),
                "materials.toml".into(),
                keys.map(|k| doc.location().with_field(format!("files.{k}"))),
            ),
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
            if density > MAX_FLUID_DENSITY {
                return Err(t.error(
                    "density_kg_m3",
                    format!(
                        "expected at most {MAX_FLUID_DENSITY} kg/m³, found {density}: denser than \
                         any fluid a blade runs in (sea water 1,025, drilling mud about 2,000)"
                    ),
                ));
            }
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
    let materials = super::materials::read_materials(&materials_path)
        .map_err(|e| named_by(&file_places[2], e))?;
    let stations = read_stations(&dir, &stations_file).map_err(|e| named_by(&file_places[0], e))?;
    let (r_root, r_tip) = (stations[0].r, stations[stations.len() - 1].r);
    check_rotor_against_stations(&places, &rotor, r_root, r_tip, &mut warnings)?;
    // The tip speed at the greatest speed, once the tip radius is known to fit the stations: a
    // rotor speed given in rad/s or per hour, or a radius in mm, shows here.
    let tip_speed = rotor.rpm_max * std::f64::consts::PI / 30.0 * rotor.tip_radius;
    if tip_speed > MAX_TIP_SPEED_M_S {
        return Err(InputError::at(
            places[2].clone(),
            format!(
                "rpm_max = {} rpm at tip_radius_m = {} gives a tip speed of {tip_speed:.0} m/s: \
                 expected at most {MAX_TIP_SPEED_M_S} m/s (the fastest composite fan blades run \
                 at about 500 m/s), at most {:.0} rpm",
                excerpt(&rotor.rpm_max.to_string()),
                rotor.tip_radius,
                MAX_TIP_SPEED_M_S * 30.0 / (std::f64::consts::PI * rotor.tip_radius)
            ),
        ));
    }
    if modal.rpm_step.is_some_and(|step| rotor.rpm_max / step > MAX_SWEEP_STEPS) {
        let step = modal.rpm_step.unwrap_or(1.0);
        return Err(InputError::at(
            doc.location_of("modal").with_field("modal.rpm_step"),
            format!(
                "a step of {step} rpm up to rpm_max = {} rpm makes {:.0} speeds: expected at most \
                 {MAX_SWEEP_STEPS} (each speed is an eigen solution), a step of at least {} rpm",
                rotor.rpm_max,
                rotor.rpm_max / step,
                rotor.rpm_max / MAX_SWEEP_STEPS
            ),
        ));
    }

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

    let plies = read_plies(&dir, &plies_file, &materials, &webs, r_root, r_tip)
        .map_err(|e| named_by(&file_places[1], e))?;
    let chords = stations.iter().map(|s| s.chord);
    let (c_min, c_max) = chords.fold((f64::INFINITY, 0.0_f64), |(a, b), c| (a.min(c), b.max(c)));
    let blade_length = r_tip - r_root;

    let mut point_masses = Vec::new();
    for mut t in masses_t {
        point_masses.push(read_point_mass(&mut t, r_root, r_tip)?);
        t.finish()?;
    }

    let mut load_cases: Vec<LoadCaseSpec> = Vec::new();
    let mut delta_t_places = Vec::new();
    for mut t in cases_t {
        let case = read_load_case(&mut t, &dir, r_root, r_tip)?;
        check_case(&t, &case, &rotor, range_given, &mut warnings)?;
        delta_t_places.push(t.location_of("delta_T_K"));
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
            check_tooling(&t, &spec, blade_length, c_min, c_max, &mut warnings)?;
            t.finish()?;
            if let Some(cure) = spec.cure_temperature_c {
                for (case, place) in load_cases.iter().zip(&delta_t_places) {
                    if cure + case.delta_t <= ABSOLUTE_ZERO_C {
                        return Err(InputError::at(
                            place.clone(),
                            format!(
                                "load case '{}': a change of {} K from the cure temperature \
                                 ({cure} °C) goes below absolute zero",
                                case.name, case.delta_t
                            ),
                        ));
                    }
                }
            }
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
    if let Some(min_rf) = criteria.min_reserve_factor.filter(|&v| v < 1.0) {
        warnings.push(format!(
            "{}: criteria.min_reserve_factor = {min_rf} accepts a failure index above 1 (a reserve \
             factor below 1 means the factored load breaks a ply)",
            display
        ));
    }
    Ok(Project {
        name,
        input_warnings: warnings,
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

/// Where the rotor's radii and greatest speed are given: `hub_radius_m`, `tip_radius_m`,
/// `rpm_max`.
type RotorPlaces = [Location; 3];

/// An error of a file the project names that has no line of its own (the file cannot be read,
/// is not a regular file, is too large or holds too few rows), placed at the key of
/// `blade.toml` that names the file; errors with a line are left as they are.
fn named_by(place: &Location, e: InputError) -> InputError {
    match e {
        InputError::Read { file, source } => {
            InputError::at(place.clone(), format!("cannot read {file}: {source}"))
        }
        InputError::Invalid { location, message } if location.line.is_none() => {
            InputError::at(place.clone(), format!("{location}: {message}"))
        }
        other => other,
    }
}

fn read_rotor(t: &mut TableReader<'_>) -> Result<(Rotor, bool, RotorPlaces), InputError> {
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
        rpm_nominal,
        rpm_max,
        pitch,
        pitch_range,
        root_clearance,
        tip_clearance,
    };
    let places =
        [t.location_of("hub_radius_m"), t.location_of("tip_radius_m"), t.location_of("rpm_max")];
    Ok((rotor, range_given, places))
}

/// A load case against the rotor: its speed, its pitch and its load factor.
fn check_case(
    t: &TableReader<'_>,
    case: &LoadCaseSpec,
    rotor: &Rotor,
    range_given: bool,
    warnings: &mut Vec<String>,
) -> Result<(), InputError> {
    let place = |key: &str| t.location_of(key).to_string();
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
        warnings.push(format!(
            "{}: load case '{}' has a load factor of {} below 1: the case is checked at less than \
             its load",
            place("load_factor"),
            case.name,
            case.load_factor
        ));
    } else if case.load_factor > 3.0 {
        warnings.push(format!(
            "{}: load case '{}' has a load factor of {}, above the 1.35 to 2 of design codes",
            place("load_factor"),
            case.name,
            case.load_factor
        ));
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

/// The tooling settings against the blade: the mesh tolerance and the mould margin against its
/// size (they set the facet count), the process temperatures against absolute zero and resins.
fn check_tooling(
    t: &TableReader<'_>,
    spec: &ToolingSpec,
    blade_length: f64,
    c_min: f64,
    c_max: f64,
    warnings: &mut Vec<String>,
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
        ("injection_temperature_C", spec.injection_temperature_c),
        ("gel_temperature_C", spec.gel_temperature_c),
        ("cure_temperature_C", spec.cure_temperature_c),
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
            warnings.push(format!(
                "{}: {} = {} °C lies below {} = {} °C: expected injection, gel and cure at rising \
                 temperatures",
                t.location_of(pair[1].0),
                pair[1].0,
                pair[1].1,
                pair[0].0,
                pair[0].1
            ));
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
        tolerance * 1e3
    )
}

fn check_rotor_against_stations(
    places: &RotorPlaces,
    rotor: &Rotor,
    r_root: f64,
    r_tip: f64,
    warnings: &mut Vec<String>,
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
        warnings.push(format!(
            "{}: the first station (r = {r_root} m) lies {:.3} m outboard of hub_radius_m = {}, \
             more than half the blade's length: a long root spindle, or a hub radius in the wrong \
             unit?",
            places[0].clone(),
            r_root - rotor.hub_radius,
            rotor.hub_radius
        ));
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

fn read_tooling(
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
                core_alloy_shrinkage = match (i.shrinkage_pct, i.cte, i.melting_range_c) {
                    (Some(pct), _, _) => pct / 100.0,
                    (None, Some(cte), Some([solidus, _])) if solidus > 20.0 => {
                        cte * (solidus - 20.0)
                    }
                    _ => d.core_alloy_shrinkage,
                };
            }
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
        core_print_fraction,
        core_print_length,
        core_alloy_shrinkage,
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
