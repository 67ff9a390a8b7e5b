//! Errors raised below the reader name a station or ply by its index and a place by its radius;
//! the command line places them at the file and line where the user wrote that station or ply.
//! Each case writes an invented project whose stations and plies files hold comment lines, so
//! that a row's line differs from its index, and checks the line the message names against the
//! line counted in the file the test wrote (the outside truth here is the file itself).

use std::fs;
use std::path::{Path, PathBuf};

use layloft::Error;
use layloft::blade::{Blade, BladeError};
use layloft::input::read_project_sourced;
use layloft::plybook::{PlyBookError, PlyBookParams, ply_regions};
use layloft::report::plybook_error_text;

use crate::support_cli::layloft;

const FIXTURE: &str = "tests/data/blade-basic";

/// Invented stations of a straight NACA 0015 blade; the third station (index 2) is on line 8.
const STATIONS: &str = "# Invented test stations: a straight, untwisted NACA 0015 blade.
r_m,chord_m,twist_deg,pitch_axis_frac,airfoil
# root
0.5,0.4,0,0.3,naca0015
1.0,0.4,0,0.3,naca0015
# the third station, two comment lines above it,
# so that its line is not its row
1.5,0.4,0,0.3,naca0015
2.5,0.4,0,0.3,naca0015
";

/// The line of the third station in [`STATIONS`], counted in the text.
fn third_station_line() -> usize {
    let rows: Vec<usize> = STATIONS
        .lines()
        .enumerate()
        .filter(|(_, l)| !l.starts_with('#') && !l.starts_with("r_m"))
        .map(|(i, _)| i + 1)
        .collect();
    rows[2]
}

/// A copy of the fixture's `blade.toml` and `materials.toml` with these stations and plies.
fn project(plies: &str) -> (tempfile::TempDir, PathBuf) {
    let dir = tempfile::tempdir().unwrap();
    for f in ["blade.toml", "materials.toml"] {
        fs::copy(Path::new(FIXTURE).join(f), dir.path().join(f)).unwrap();
    }
    fs::write(dir.path().join("stations.csv"), STATIONS).unwrap();
    fs::write(dir.path().join("plies.csv"), plies).unwrap();
    let toml = dir.path().join("blade.toml");
    (dir, toml)
}

fn shown(dir: &tempfile::TempDir, text: &str) -> String {
    text.replace(&dir.path().display().to_string(), "DIR")
}

/// 40 plies of 2 mm carbon on the upper surface near the third station only: 83 mm of laminate
/// against the 60 mm depth of a 0.4 m NACA 0015 (15 % thick, from the NACA 4-digit definition).
fn too_thick_plies() -> String {
    let mut s = String::from(
        "# Invented test plies, outermost first.\nply,material,angle_deg,r_start_m,r_end_m,region,from,to\n\
         skin,glass,0,0.5,2.5,both,0,1\n",
    );
    for i in 0..40 {
        s.push_str(&format!("c{i},carbon,0,1.4,1.6,upper,0.1,0.5\n"));
    }
    s.push_str("web,glass,0,0.5,2.5,web:spar,,\n");
    s
}

#[test]
fn walls_too_thick_at_the_third_station_name_its_line() {
    let (dir, toml) = project(&too_thick_plies());
    let (project, sources) = read_project_sourced(&toml).unwrap();
    let blade = Blade::from_project(&project).unwrap();
    let e = blade.section_layout(1.5, 120).expect_err("the walls fill the section");
    assert!(matches!(e, BladeError::TooThick { station: 2, .. }), "{e:?}");
    let line = third_station_line();
    assert_eq!(line, 8);
    let want = format!("DIR/plies.csv: at r = 1.5000 m (station near line {line}), x/c = ");
    let placed = shown(&dir, &Error::in_files(e, &sources).to_string());
    assert!(placed.starts_with(&want), "{placed}");
    // The same words when the error comes through the placing of a section's error.
    let e = blade.section_layout(1.5, 120).unwrap_err();
    let at = shown(&dir, &Error::at_station(&sources, 1.5, e.into()).to_string());
    assert_eq!(at, placed);
    // And through the command line.
    let (code, stdout, stderr) = layloft(&["sections", toml.to_str().unwrap()]);
    assert_eq!(code, Some(2), "{stderr}");
    assert!(stdout.is_empty(), "{stdout}");
    assert!(shown(&dir, &stderr).contains(&want), "{stderr}");
}

#[test]
fn a_hole_in_the_skin_is_placed_at_the_nearest_station_line() {
    let plies = "# Invented test plies: the skin stops short of the third station.
ply,material,angle_deg,r_start_m,r_end_m,region,from,to
skin-in,glass,0,0.5,1.4,both,0,1
skin-out,glass,0,1.6,2.5,both,0,1
web,glass,0,0.5,2.5,web:spar,,
";
    let (dir, toml) = project(plies);
    let (project, sources) = read_project_sourced(&toml).unwrap();
    let blade = Blade::from_project(&project).unwrap();
    let e = blade.section_layout(1.45, 120).expect_err("no ply covers r = 1.45 m");
    assert!(matches!(e, BladeError::NoPlies { .. }), "{e:?}");
    let placed = shown(&dir, &Error::at_station(&sources, 1.45, e.into()).to_string());
    let line = third_station_line();
    assert!(
        placed.starts_with(&format!(
            "DIR/stations.csv line {line}, r_m: DIR/plies.csv: no ply covers the "
        )),
        "{placed}"
    );
    assert!(placed.ends_with("(this is the station nearest to r = 1.4500 m)"), "{placed}");
    // The second station (line 5) is nearest to r = 1.2 m.
    let e = blade.section_layout(1.45, 120).unwrap_err();
    let placed = shown(&dir, &Error::at_station(&sources, 1.2, e.into()).to_string());
    assert!(placed.starts_with("DIR/stations.csv line 5, r_m: "), "{placed}");
}

#[test]
fn a_ply_without_area_names_its_line_of_the_plies_file() {
    // The third ply row, on line 7, spans 0.1 µm: read, but with no region to cut.
    let plies = "# Invented test plies, outermost first.
ply,material,angle_deg,r_start_m,r_end_m,region,from,to
skin,glass,0,0.5,2.5,both,0,1
# a comment line between the rows
cap,carbon,0,0.5,1.5,upper,0.2,0.4

sliver,glass,0,1.2,1.2000001,upper,0.2,0.4
web,glass,0,0.5,2.5,web:spar,,
";
    let line = plies.lines().position(|l| l.starts_with("sliver")).unwrap() + 1;
    assert_eq!(line, 7);
    let (dir, toml) = project(plies);
    let (project, sources) = read_project_sourced(&toml).unwrap();
    assert_eq!(sources.ply_line(2), line);
    let blade = Blade::from_project(&project).unwrap();
    let Err(e) = ply_regions(&blade, &PlyBookParams::default()) else {
        panic!("the sliver has no area, yet its region was made");
    };
    assert!(matches!(e, PlyBookError::ZeroArea { ply_index: 2, .. }), "{e:?}");
    let want = format!("DIR/plies.csv line {line}, ply 'sliver': the region has no area");
    let placed = shown(&dir, &plybook_error_text(&e, &sources));
    assert!(placed.starts_with(&want), "{placed}");
    let out = dir.path().join("book");
    let (code, _, stderr) =
        layloft(&["plybook", toml.to_str().unwrap(), "--out", out.to_str().unwrap()]);
    assert_eq!(code, Some(2), "{stderr}");
    assert!(shown(&dir, &stderr).contains(&want), "{stderr}");
}
