//! Reads `blade.toml` and the files it names into a [`Project`], checking every value.
//!
//! `blade.toml` tables and keys (units in the names; optional unless marked required):
//!
//! - top level: `name` (required);
//! - `[rotor]` (required): `blades`, `hub_radius_m`, `tip_radius_m`, `rpm_nominal`, `rpm_max`
//!   (required); `rpm_min` (the least operating speed, `rpm_nominal` by default), `pitch_deg`
//!   (0), `pitch_range_deg = [least, greatest]` (the pitch setting), `root_clearance_m` (0),
//!   `tip_clearance_m` (0);
//! - `[files]`: `stations` ("stations.csv"), `plies` ("plies.csv"), `materials`
//!   ("materials.toml");
//! - `[[web]]`: `name`, `chord_frac` (required), `r_start_m`, `r_end_m` (the whole blade);
//! - `[[point_mass]]`: `name`, `r_m`, `mass_kg` (required), `y_m`, `z_m` (0, chord frame),
//!   `inertia_x_kg_m2`, `inertia_y_kg_m2`, `inertia_z_kg_m2` (0: the moments of inertia about
//!   the mass's own centre, axes parallel to the pitch axis, the chord and the chord normal);
//! - `[[load_case]]`: `name`, `rpm` (required), `pitch_deg`, `distributed` (a CSV file with
//!   `r_m, f_flap_N_m, f_edge_N_m, m_pitch_Nm_m`), `gravity_m_s2 = [x, y, z]` (rotor frame),
//!   `load_factor` (1), `delta_T_K` (0; when not 0, every ply's material needs its thermal
//!   expansion coefficients);
//! - `[criteria]`: `min_reserve_factor`, `frequency_margin_pct`, `harmonics` (12),
//!   `max_mass_kg`, `max_tip_deflection_m`, `min_buckling_factor` (`min_reserve_factor`);
//! - `[buckling]`: `edge_fixity` (`"simply_supported"`, `"clamped"` or a number from 0, simply
//!   supported, to 1, clamped; `"simply_supported"`);
//! - `[tooling]`: `core_alloy`, `injection_temperature_C`, `gel_temperature_C`,
//!   `cure_temperature_C`, `mould_margin_m` (0.03), `stl_unit` ("mm" or "m"), `tolerance_mm`
//!   (0.1), `mould_expansion_factor` (1), `core_shrink_factor` (1), `min_draft_deg` (1, from 0 to 30),
//!   `mould_material` (an `[isotropic.NAME]` record; its density gives the mould masses),
//!   `min_core_thickness_mm` (2), `core_print_fraction` (0.5, common practice; 0, no prints,
//!   to 0.9),
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

mod items;
/// Limits on the inputs (see `limits` in DESIGN notes of the report): each bounds a value to
/// what a real blade can be or needs, so that a typing error is refused with its reason and no
/// input can ask for unbounded work.
pub mod limits;
mod plies;
mod rotor;
mod settings;
mod stations;
mod tooling;

use std::path::Path;

use super::location::{InputError, Location, SourceText};
use super::materials::RecordPlaces;
use super::sources::{InputWarning, ProjectFiles, Sources};
use super::toml_table::{Scalar, TableReader};
use crate::material::{Material, MaterialLibrary};
use crate::project::*;
use crate::text::excerpt;
use crate::units::{Angle, MM, Temperature, fraction_of_pct, rpm_of, rpm_to_rad_s};
use plies::{read_distributed, read_plies};
use stations::{read_outlines, read_stations};

/// The greatest load-case speed accepted, as a multiple of `rpm_max`: proof and burst tests of
/// rotors run up to about 1.2 to 1.5 times the greatest operating speed (common practice).
const OVERSPEED_LIMIT: f64 = 2.0;

use items::*;
use limits::*;
use rotor::*;
use settings::*;
use tooling::*;
pub use tooling::{tolerance_message, tolerance_range};

/// Reads a blade project from its `blade.toml`, given as the file or as the folder that holds it.
/// The project's positions in its files are dropped: [`read_project_sourced`] keeps them.
pub fn read_project(path: &Path) -> Result<Project, InputError> {
    read_project_sourced(path).map(|(project, _)| project)
}

/// Reads a blade project as [`read_project`] does, with where each part of it was written and
/// its input warnings ([`Sources`]), for naming the file and line of a later error.
pub fn read_project_sourced(path: &Path) -> Result<(Project, Sources), InputError> {
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
    doc.expect_keys(&[
        "name",
        "rotor",
        "files",
        "web",
        "point_mass",
        "load_case",
        "criteria",
        "tooling",
        "modal",
        "sections",
        "fluid",
        "excitation",
        "buckling",
    ])?;

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
    // The step's own place, for the check of the sweep's size against the greatest speed below.
    let (modal, step_place) = match doc.optional_table("modal")? {
        Some(mut t) => (read_modal(&mut t)?, t.location_of("rpm_step")),
        None => (ModalSpec::default(), doc.location_of("modal")),
    };
    let sections = match doc.optional_table("sections")? {
        Some(mut t) => read_sections(&mut t)?,
        None => SectionSpec::default(),
    };
    let fluid = match doc.optional_table("fluid")? {
        Some(mut t) => {
            t.expect_keys(&["density_kg_m3"])?;
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
    let (materials, material_places) = super::materials::read_materials_placed(&materials_path)
        .map_err(|e| named_by(&file_places[2], e))?;
    let (stations, station_lines) =
        read_stations(&dir, &stations_file).map_err(|e| named_by(&file_places[0], e))?;
    let (r_root, r_tip) = (stations[0].r, stations[stations.len() - 1].r);
    check_rotor_against_stations(&places, &rotor, r_root, r_tip, &mut warnings)?;
    // The tip speed at the greatest speed, once the tip radius is known to fit the stations: a
    // rotor speed given in rad/s or per hour, or a radius in mm, shows here.
    // The reader is an edge: the messages give the speeds in rpm, as they were written.
    let rpm_max = rpm_of(rotor.omega_max);
    let shown = excerpt(&rpm_max.to_string());
    if let Some(words) = limits::tip_speed_excess(&shown, rpm_max, rotor.tip_radius) {
        return Err(InputError::at(places[2].clone(), format!("rpm_max = {words}")));
    }
    let rpm_step = modal.omega_step.map(rpm_of);
    if let Some(step) = rpm_step.filter(|&step| step > rpm_max) {
        return Err(InputError::at(
            step_place,
            format!(
                "expected a step of at most rpm_max = {rpm_max} rpm (the sweep runs from 0 to \
                 rpm_max), found {step} rpm"
            ),
        ));
    }
    let up_to = format!(" up to rpm_max = {rpm_max} rpm");
    if let Some(words) = rpm_step.and_then(|step| sweep_excess(step, rpm_max, &up_to)) {
        return Err(InputError::at(step_place, words));
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

    let (plies, ply_lines) = read_plies(&dir, &plies_file, &materials, &webs, r_root, r_tip)
        .map_err(|e| named_by(&file_places[1], e))?;
    let chords = stations.iter().map(|s| s.chord);
    let (c_min, c_max) = chords.fold((f64::INFINITY, 0.0_f64), |(a, b), c| (a.min(c), b.max(c)));
    let blade_length = r_tip - r_root;

    let mut point_masses = Vec::new();
    for mut t in masses_t {
        let mass = read_point_mass(&mut t, r_root, r_tip)?;
        if point_masses.iter().any(|m: &PointMass| m.name == mass.name) {
            return Err(t.error("name", format!("point mass '{}' is defined twice", mass.name)));
        }
        // A mass further from the pitch axis than twice the largest chord: a balance arm, or an
        // offset in the wrong unit.
        let offset = mass.y.hypot(mass.z);
        if offset > 2.0 * c_max {
            let key = if mass.y.abs() >= mass.z.abs() { "y_m" } else { "z_m" };
            warnings.push(InputWarning::MassFarOff {
                place: t.location_of(key),
                name: mass.name.clone(),
                offset,
                chord: c_max,
            });
        }
        t.finish()?;
        point_masses.push(mass);
    }

    let mut load_cases: Vec<LoadCaseSpec> = Vec::new();
    let mut delta_t_places = Vec::new();
    for mut t in cases_t {
        let case = read_load_case(&mut t, &dir, r_root, r_tip)?;
        check_case(&t, &case, &rotor, range_given, &mut warnings)?;
        delta_t_places.push(t.location_of("delta_T_K"));
        // An overspeed or proof case may run above the greatest operating speed (it is then
        // named in the warnings); twice that speed is taken as a typing error.
        let rpm = rpm_of(case.omega);
        if rpm > OVERSPEED_LIMIT * rpm_max {
            return Err(t.error(
                "rpm",
                format!(
                    "expected at most {OVERSPEED_LIMIT} x rpm_max = {} rpm for a load case, found \
                     {}: an overspeed case runs above rpm_max, but not this far",
                    OVERSPEED_LIMIT * rpm_max,
                    rpm
                ),
            ));
        }
        if load_cases.iter().any(|c| c.name == case.name) {
            return Err(t.error("name", format!("load case '{}' is defined twice", case.name)));
        }
        check_case_expansion(&t, &case, &plies, &materials, &material_places)?;
        t.finish()?;
        load_cases.push(case);
    }

    let tooling = match tooling_t {
        Some(mut t) => {
            let spec = read_tooling(&mut t, &materials)?;
            check_tooling(&t, &spec, blade_length, c_min, c_max, &mut warnings)?;
            t.finish()?;
            if let Some(cure) = spec.cure_temperature.map(Temperature::celsius) {
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
    let mut stations = stations;
    read_outlines(&mut stations)?;
    let shown = |f: &str| dir.join(f).display().to_string();
    let files = ProjectFiles {
        stations: shown(&stations_file),
        plies: shown(&plies_file),
        materials: shown(&materials_file),
    };
    if let Some(min_rf) = criteria.min_reserve_factor.filter(|&v| v < 1.0) {
        warnings.push(InputWarning::ReserveBelowOne {
            file: display.clone(),
            min_reserve_factor: min_rf,
        });
    }
    // An isotropic ply material checked in compression at its tensile strength, once each.
    let mut named: Vec<&str> = Vec::new();
    for ply in &plies {
        let Ok(Material::Isotropic(i)) = materials.get(&ply.material) else { continue };
        if i.compressive_strength.is_some() || named.contains(&i.name.as_str()) {
            continue;
        }
        let Some(tensile) = i.tensile_strength else { continue };
        named.push(&i.name);
        let place = match material_places.iter().find(|(name, _)| *name == i.name) {
            Some((_, place)) => place.clone(),
            None => Location::file(materials_path.display().to_string()),
        };
        warnings.push(InputWarning::CompressionFromTension {
            place,
            material: i.name.clone(),
            tensile,
        });
    }
    if let Some(min_bf) = criteria.min_buckling_factor.filter(|&v| v < 1.0) {
        warnings.push(InputWarning::BucklingBelowOne {
            file: display.clone(),
            min_buckling_factor: min_bf,
        });
    }
    let station_radii = stations.iter().map(|s| s.r).collect();
    let sources =
        Sources { dir, file: display, files, station_lines, station_radii, ply_lines, warnings };
    let project = Project {
        name,
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
    };
    Ok((project, sources))
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
