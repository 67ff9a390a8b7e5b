//! `plies.csv` (the ply schedule, checked against the span, the materials and the webs) and the
//! distributed load files of the load cases.

use std::path::Path;

use crate::input::csv_table::CsvTable;
use crate::input::location::{InputError, Location};
use crate::material::MaterialLibrary;
use crate::project::*;
use crate::text::closest;
use crate::units::Angle;

/// Tolerance on radii when comparing against the blade's span, m.
const R_EPS: f64 = 1e-9;

/// Most plies in a schedule: a large blade's schedule holds some thousands of plies.
const MAX_PLIES: usize = 10_000;

/// `plies.csv`: `ply, material, angle_deg, r_start_m, r_end_m, region, from, to`; the plies with
/// the line of each in the file.
pub(super) fn read_plies(
    dir: &Path,
    file: &str,
    materials: &MaterialLibrary,
    webs: &[WebSpec],
    r_root: f64,
    r_tip: f64,
) -> Result<(Vec<PlySpec>, Vec<usize>), InputError> {
    let path = dir.join(file);
    let display = path.display().to_string();
    let table = CsvTable::read(&path, &display)?;
    table.check_columns(
        &["ply", "material", "angle_deg", "r_start_m", "r_end_m", "region", "from", "to"],
        &[],
    )?;
    if table.is_empty() {
        return Err(InputError::at(
            Location::file(display),
            "expected at least one ply, found none",
        ));
    }
    if table.len() > MAX_PLIES {
        return Err(InputError::at(
            Location::file(display),
            format!(
                "expected at most {MAX_PLIES} plies, found {}: a large blade's schedule holds some \
                 thousands",
                table.len()
            ),
        ));
    }
    let mut plies: Vec<PlySpec> = Vec::with_capacity(table.len());
    let mut lines: Vec<usize> = Vec::with_capacity(table.len());
    for rec in table.records() {
        let id = rec.required_text("ply")?.to_string();
        if let Some(earlier) = plies.iter().position(|p| p.id == id) {
            return Err(rec.error(
                "ply",
                format!(
                    "ply '{}' is listed twice (first on line {}): expected each ply once, with \
                     its own id (a row pasted twice doubles the ply)",
                    crate::text::excerpt(&id),
                    lines[earlier]
                ),
            ));
        }
        let material = rec.required_text("material")?.to_string();
        if let Err(e) = materials.ply_material(&material) {
            return Err(rec.error("material", e.to_string()));
        }
        let angle = rec.number("angle_deg")?;
        if angle.abs() > 90.0 {
            return Err(rec.error(
                "angle_deg",
                format!("expected a ply angle within -90..90 degrees, found {angle}"),
            ));
        }
        let r_start = rec.number("r_start_m")?;
        let r_end = rec.number("r_end_m")?;
        if r_start >= r_end {
            return Err(rec.error(
                "r_end_m",
                format!("expected r_end_m above r_start_m = {r_start}, found {r_end}"),
            ));
        }
        if r_start < r_root - R_EPS || r_end > r_tip + R_EPS {
            return Err(rec.error(
                if r_start < r_root - R_EPS { "r_start_m" } else { "r_end_m" },
                format!(
                    "ply '{id}' covers r = {r_start}..{r_end} m, outside the blade ({r_root}..{r_tip} m)"
                ),
            ));
        }
        let region_text = rec.required_text("region")?;
        let region = match region_text {
            "upper" => Region::Upper,
            "lower" => Region::Lower,
            "both" => Region::Both,
            other => match other.strip_prefix("web:") {
                Some(name) => {
                    let web = webs.iter().find(|w| w.name == name).ok_or_else(|| {
                        let names: Vec<String> =
                            webs.iter().map(|w| format!("'web:{}'", w.name)).collect();
                        let known = if names.is_empty() {
                            "; the project has no webs: define one with a [[web]] table in \
                             blade.toml"
                                .to_string()
                        } else {
                            format!("; the webs are {}", names.join(", "))
                        };
                        let hint = closest(name, webs.iter().map(|w| w.name.as_str()))
                            .map(|h| format!("; did you mean 'web:{h}'?"))
                            .unwrap_or_default();
                        let hint = format!("{hint}{known}");
                        rec.error("region", format!("no web named '{name}'{hint}"))
                    })?;
                    if r_start < web.r_start - R_EPS || r_end > web.r_end + R_EPS {
                        return Err(rec.error(
                            "r_start_m",
                            format!(
                                "ply '{id}' covers r = {r_start}..{r_end} m but web '{name}' only spans {}..{} m",
                                web.r_start, web.r_end
                            ),
                        ));
                    }
                    Region::Web(name.to_string())
                }
                None => {
                    return Err(rec.error(
                        "region",
                        format!("expected upper, lower, both or web:NAME, found '{other}'"),
                    ));
                }
            },
        };
        let (from, to) = match &region {
            Region::Web(name) => {
                // A web ply covers the web's whole height: its chord cells stay empty (0 and 1,
                // the whole height, are taken as written); anything else would be ignored.
                for (column, whole) in [("from", 0.0), ("to", 1.0)] {
                    let cell = rec.text(column);
                    if !cell.is_empty() && cell.parse::<f64>().ok() != Some(whole) {
                        return Err(rec.error(
                            column,
                            format!(
                                "expected an empty cell for a web ply (ply '{}' on web:{} covers \
                                 the web's whole height; from and to are chord fractions of the \
                                 upper, lower or both regions), found '{}'",
                                crate::text::excerpt(&id),
                                crate::text::excerpt(name),
                                crate::text::excerpt(cell)
                            ),
                        ));
                    }
                }
                (0.0, 1.0)
            }
            _ => (rec.number("from")?, rec.number("to")?),
        };
        if !(0.0..=1.0).contains(&from) || !(0.0..=1.0).contains(&to) || from >= to {
            return Err(rec.error(
                "from",
                format!(
                    "expected chord fractions 0 <= from < to <= 1, found from = {from}, to = {to}"
                ),
            ));
        }
        plies.push(PlySpec {
            id,
            material,
            angle: Angle::from_deg(angle),
            r_start,
            r_end,
            region,
            from,
            to,
        });
        lines.push(rec.line);
    }
    Ok((plies, lines))
}

/// The greatest magnitude of a distributed load's force (N/m) or moment (N·m/m).
const LOAD_LIMIT: f64 = 1e9;

/// A distributed load file: `r_m, f_flap_N_m, f_edge_N_m, m_pitch_Nm_m`.
pub(super) fn read_distributed(
    dir: &Path,
    file: &str,
    r_root: f64,
    r_tip: f64,
) -> Result<Vec<DistributedLoadRow>, InputError> {
    let path = dir.join(file);
    let display = path.display().to_string();
    let table = CsvTable::read(&path, &display)?;
    table.check_columns(&["r_m", "f_flap_N_m", "f_edge_N_m"], &["m_pitch_Nm_m"])?;
    if table.len() < 2 {
        return Err(InputError::at(
            Location::file(display),
            format!("expected at least two rows of distributed load, found {}", table.len()),
        ));
    }
    let mut rows: Vec<DistributedLoadRow> = Vec::with_capacity(table.len());
    for rec in table.records() {
        let r = rec.number("r_m")?;
        if r < r_root - R_EPS || r > r_tip + R_EPS {
            return Err(rec.error(
                "r_m",
                format!("the load runs outside the blade: expected a radius in {r_root}..{r_tip} m, found {r}"),
            ));
        }
        if let Some(prev) = rows.last() {
            if r <= prev.r {
                return Err(
                    rec.error("r_m", format!("radii must increase: found {r} after {}", prev.r))
                );
            }
        }
        // Far beyond any blade (a large rotor's blade carries some 1e4 to 1e5 N/m): a value
        // beyond it is a slip, and near the floating-point range the sums lose every digit.
        let bounded = |column: &str, v: f64, unit: &str| {
            if v.abs() > LOAD_LIMIT {
                Err(rec.error(
                    column,
                    format!("expected a load within ±{LOAD_LIMIT:e} {unit}, found {v:e}"),
                ))
            } else {
                Ok(v)
            }
        };
        rows.push(DistributedLoadRow {
            r,
            f_flap: bounded("f_flap_N_m", rec.number("f_flap_N_m")?, "N/m")?,
            f_edge: bounded("f_edge_N_m", rec.number("f_edge_N_m")?, "N/m")?,
            m_pitch: bounded(
                "m_pitch_Nm_m",
                rec.optional_number("m_pitch_Nm_m")?.unwrap_or(0.0),
                "N·m/m",
            )?,
        });
    }
    Ok(rows)
}
