//! `stations.csv`: the stations of the blade root to tip, each with its airfoil (a NACA code, a
//! built-in shape or a coordinate file), checked for order and spacing.

use std::path::Path;

use crate::input::csv_table::{CsvRecord, CsvTable};
use crate::input::location::{InputError, Location};
use crate::project::*;
use crate::units::Angle;

/// `stations.csv`: `r_m, chord_m, twist_deg, pitch_axis_frac, airfoil`; the stations with the
/// line of each in the file.
pub(super) fn read_stations(
    dir: &Path,
    file: &str,
) -> Result<(Vec<Station>, Vec<usize>), InputError> {
    let path = dir.join(file);
    let display = path.display().to_string();
    let table = CsvTable::read(&path, &display)?;
    table.check_columns(&["r_m", "chord_m", "twist_deg", "pitch_axis_frac", "airfoil"], &[])?;
    if table.len() < 2 {
        return Err(InputError::at(
            Location::file(display),
            format!("expected at least two stations (root and tip), found {}", table.len()),
        ));
    }
    if table.len() > MAX_STATIONS {
        return Err(InputError::at(
            Location::file(display),
            format!(
                "expected at most {MAX_STATIONS} stations, found {}: a blade is described by some \
                 tens of stations",
                table.len()
            ),
        ));
    }
    let mut stations: Vec<Station> = Vec::with_capacity(table.len());
    let mut lines: Vec<usize> = Vec::with_capacity(table.len());
    for rec in table.records() {
        let r = rec.number("r_m")?;
        if let (Some(prev), Some(prev_line)) = (stations.last(), lines.last()) {
            if r <= prev.r {
                return Err(rec.error(
                    "r_m",
                    format!(
                        "radii must increase from root to tip: found {r} after {} (line {})",
                        prev.r, prev_line
                    ),
                ));
            }
        }
        if r < 0.0 {
            return Err(rec.error("r_m", format!("expected a radius of zero or more, found {r}")));
        }
        if r > MAX_RADIUS_M {
            return Err(rec.error(
                "r_m",
                format!(
                    "a radius of {r} m is more than any rotor blade ({MAX_RADIUS_M} m): the radii look like millimetres; give them in metres ({} m?)",
                    r / 1000.0
                ),
            ));
        }
        let chord = rec.number("chord_m")?;
        if chord <= 0.0 {
            return Err(rec.error("chord_m", format!("expected a positive chord, found {chord}")));
        }
        let twist = rec.number("twist_deg")?;
        if twist.abs() > 90.0 {
            return Err(rec.error(
                "twist_deg",
                format!("expected a twist within -90..90 degrees, found {twist}"),
            ));
        }
        let pa = rec.number("pitch_axis_frac")?;
        if !(pa > 0.0 && pa < 1.0) {
            return Err(rec.error(
                "pitch_axis_frac",
                format!("the pitch axis lies outside the chord: expected a fraction between 0 and 1, found {pa}"),
            ));
        }
        let airfoil = parse_airfoil(&rec, dir)?;
        stations.push(Station {
            r,
            chord,
            twist: Angle::from_deg(twist),
            pitch_axis_frac: pa,
            airfoil,
        });
        lines.push(rec.line);
    }
    let tip = stations.last().map(|s| s.r).unwrap_or(0.0);
    check_station_spacing(&stations, &lines, &display)?;
    if let Some((s, &line)) = stations.iter().zip(&lines).find(|(s, _)| s.chord > tip) {
        return Err(InputError::at(
            Location::line(display.clone(), line).with_field("chord_m"),
            format!(
                "a chord of {} m is longer than the blade (tip radius {tip} m): the chords look like millimetres while the radii are in metres; give both in metres ({} m?)",
                s.chord,
                s.chord / 1000.0
            ),
        ));
    }
    Ok((stations, lines))
}

/// Most stations: a blade is described by some tens of stations; the analysis stations are set
/// apart (`[sections] analysis_stations`, at most 2000).
const MAX_STATIONS: usize = 2000;

/// Least spacing of two stations, as a fraction of the blade's length.
const MIN_STATION_GAP: f64 = 1e-4;

/// Steepest spanwise slope of the leading or trailing edge between two stations (chord, twist
/// and pitch-axis changes over the distance between them): beyond it the surface between the
/// stations turns more than about 56° from the span, which no blade does, and the lofted walls
/// and cores fold over (stations too close for the change between them).
const MAX_EDGE_SLOPE: f64 = 1.5;

/// Adjacent stations: far enough apart for the change of shape between them.
fn check_station_spacing(
    stations: &[Station],
    lines: &[usize],
    display: &str,
) -> Result<(), InputError> {
    let (Some(first), Some(last)) = (stations.first(), stations.last()) else { return Ok(()) };
    let length = last.r - first.r;
    // Leading and trailing edges in the plane normal to the span, pitch axis at the origin.
    let edges = |s: &Station| {
        let (sin, cos) = s.twist.rad().sin_cos();
        let le = -s.pitch_axis_frac * s.chord;
        let te = (1.0 - s.pitch_axis_frac) * s.chord;
        [[le * cos, le * sin], [te * cos, te * sin]]
    };
    for (pair, pair_lines) in stations.windows(2).zip(lines.windows(2)) {
        let (a, b) = (&pair[0], &pair[1]);
        let (a_line, b_line) = (pair_lines[0], pair_lines[1]);
        let dr = b.r - a.r;
        let at =
            |msg: String| InputError::at(Location::line(display, b_line).with_field("r_m"), msg);
        if dr < MIN_STATION_GAP * length {
            return Err(at(format!(
                "station at r = {} m lies {dr:.3e} m from the one before (line {}): expected \
                 stations at least {:.3e} m apart (1/{:.0} of the blade's length)",
                b.r,
                a_line,
                MIN_STATION_GAP * length,
                1.0 / MIN_STATION_GAP
            )));
        }
        let (ea, eb) = (edges(a), edges(b));
        let moved = (0..2)
            .map(|k| ((eb[k][0] - ea[k][0]).powi(2) + (eb[k][1] - ea[k][1]).powi(2)).sqrt())
            .fold(0.0, f64::max);
        if moved > MAX_EDGE_SLOPE * dr {
            return Err(at(format!(
                "the stations at r = {} m (line {}) and r = {} m lie {:.1} mm apart, but the \
                 leading or trailing edge moves {:.1} mm between them (chord, twist and pitch \
                 axis): expected at most {MAX_EDGE_SLOPE} times the distance, stations at least \
                 {:.1} mm apart, or a smaller change",
                a.r,
                a_line,
                b.r,
                dr * 1e3,
                moved * 1e3,
                moved / MAX_EDGE_SLOPE * 1e3
            )));
        }
    }
    Ok(())
}

/// The largest radius taken as metres: beyond it a radius is much more likely in millimetres
/// (the largest rotor blades are a little over 100 m long; common practice).
const MAX_RADIUS_M: f64 = 200.0;

/// `0012`, `naca0012`, `NACA 4412`, with `-closed` for a closed trailing edge; `circle`;
/// `ellipse:T` (thickness over chord); anything else, or a name of a file next to the project
/// (`naca4412.dat`: a file named for the section it holds), is a coordinate file relative to the
/// project folder.
fn parse_airfoil(rec: &CsvRecord<'_>, dir: &Path) -> Result<AirfoilSpec, InputError> {
    let text = rec.required_text("airfoil")?;
    if let Some(shape) =
        crate::airfoil::Shape::parse(text).map_err(|e| rec.error("airfoil", e.to_string()))?
    {
        return Ok(AirfoilSpec::Shape(shape));
    }
    let lower = text.to_ascii_lowercase();
    let (body, closed_te) = match lower.strip_suffix("-closed") {
        Some(b) => (b.to_string(), true),
        None => (lower.clone(), false),
    };
    let digits = body.trim_start_matches("naca").trim();
    let looks_naca = lower.starts_with("naca")
        || (digits.len() == 4 && digits.chars().all(|c| c.is_ascii_digit()));
    // A file of that name, or a name with a file's extension or folder, is a coordinate file.
    let path = dir.join(text);
    let file_like = path.is_file() || text.contains(['.', '/', '\\']);
    if looks_naca && !file_like {
        crate::airfoil::Naca4::parse(digits, closed_te)
            .map_err(|e| rec.error("airfoil", e.to_string()))?;
        return Ok(AirfoilSpec::Naca4 { code: digits.to_string(), closed_te });
    }
    if !path.is_file() {
        return Err(rec.error(
            "airfoil",
            format!(
                "'{text}' is neither a NACA 4-digit code (such as naca0012) nor a coordinate file next to the project (no file {}); built-in shapes are circle and ellipse:T",
                path.display()
            ),
        ));
    }
    // The outline is read by `read_outlines` once the whole project has been read.
    let outline = crate::airfoil::Outline { upper: Vec::new(), lower: Vec::new() };
    Ok(AirfoilSpec::File { path, outline, notes: Vec::new() })
}

/// Reads the coordinate file of every station given by one into its outline, with the notes of
/// what was changed to read it. The files are read last, after every other check of the project,
/// so that a project with several faults names the same one first as when the blade read them.
pub(super) fn read_outlines(stations: &mut [Station]) -> Result<(), InputError> {
    for s in stations {
        if let AirfoilSpec::File { path, outline, notes } = &mut s.airfoil {
            (*outline, *notes) =
                crate::input::read_coordinates_noted(path, &path.display().to_string())?;
        }
    }
    Ok(())
}
