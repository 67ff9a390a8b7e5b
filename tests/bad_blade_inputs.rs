//! Every malformed blade project input gets its own clear message naming the file and the line
//! or key, and none panics. Each case copies the fixture project, changes one file, and reads it
//! back through the library (the same messages reach users through the commands): the blade's
//! errors, which name stations and plies by index, are placed in the files by the reader's
//! positions (`Error::in_files`), as the command line does.

use std::fs;
use std::path::Path;

use layloft::Error;
use layloft::blade::Blade;
use layloft::input::read_project_sourced;

const FIXTURE: &str = "tests/data/blade-basic";

/// Copies the fixture, replaces `from` by `to` in `file` (or writes `to` as the file when `from`
/// is empty), and returns the error message of reading the project and building every section.
fn message(file: &str, from: &str, to: &str) -> String {
    let dir = tempfile::tempdir().unwrap();
    for entry in fs::read_dir(FIXTURE).unwrap() {
        let entry = entry.unwrap();
        fs::copy(entry.path(), dir.path().join(entry.file_name())).unwrap();
    }
    let path = dir.path().join(file);
    let text = if from.is_empty() {
        to.to_string()
    } else {
        let old = fs::read_to_string(&path).unwrap();
        assert!(old.contains(from), "fixture {file} lacks '{from}'");
        old.replacen(from, to, 1)
    };
    fs::write(&path, text).unwrap();
    let result = std::panic::catch_unwind(|| run(&dir.path().join("blade.toml")));
    let msg = result.expect("reading a bad input panicked").expect_err("bad input was accepted");
    msg.replace(&dir.path().display().to_string(), "DIR")
}

fn run(path: &Path) -> Result<(), String> {
    let (project, sources) = read_project_sourced(path).map_err(|e| e.to_string())?;
    let placed = |e| Error::in_files(e, &sources).to_string();
    let blade = Blade::from_project(&project).map_err(placed)?;
    for r in blade.analysis_radii(11) {
        blade.section_layout(r, 120).map_err(placed)?;
    }
    Ok(())
}

#[test]
fn spans_not_increasing() {
    let m = message("stations.csv", "1.5,0.4", "0.4,0.4");
    assert_eq!(
        m,
        "DIR/stations.csv line 3, r_m: radii must increase from root to tip: found 0.4 after 0.5 (line 2)"
    );
}

#[test]
fn chord_not_positive() {
    let m = message("stations.csv", "1.5,0.4", "1.5,-0.4");
    assert_eq!(m, "DIR/stations.csv line 3, chord_m: expected a positive chord, found -0.4");
}

#[test]
fn pitch_axis_outside_the_chord() {
    let m = message("stations.csv", "2.5,0.4,0,0.3", "2.5,0.4,0,1.2");
    assert_eq!(
        m,
        "DIR/stations.csv line 4, pitch_axis_frac: the pitch axis lies outside the chord: expected a fraction between 0 and 1, found 1.2"
    );
}

#[test]
fn airfoil_file_with_too_few_points() {
    let m = message("stations.csv", "naca0015\n2.5", "thin.dat\n2.5");
    assert!(m.contains("neither a NACA 4-digit code"), "{m}");
    let dir_case = |dat: &str| {
        let dir = tempfile::tempdir().unwrap();
        for entry in fs::read_dir(FIXTURE).unwrap() {
            let entry = entry.unwrap();
            fs::copy(entry.path(), dir.path().join(entry.file_name())).unwrap();
        }
        let st = fs::read_to_string(dir.path().join("stations.csv")).unwrap();
        fs::write(
            dir.path().join("stations.csv"),
            st.replacen("naca0015\n2.5", "foil.dat\n2.5", 1),
        )
        .unwrap();
        fs::write(dir.path().join("foil.dat"), dat).unwrap();
        run(&dir.path().join("blade.toml"))
            .unwrap_err()
            .replace(&dir.path().display().to_string(), "DIR")
    };
    let m = dir_case("1 0\n0.5 0.06\n0 0\n0.5 -0.06\n1 0\n");
    assert_eq!(m, "DIR/foil.dat: the outline has 5 points: expected at least 10");
    // An outline that doubles back on its upper surface.
    let m = dir_case(
        "1 0.001\n0.8 0.02\n0.9 0.03\n0.4 0.06\n0.2 0.05\n0 0\n0.2 -0.05\n0.4 -0.06\n0.6 -0.04\n0.8 -0.02\n1 -0.001\n",
    );
    assert_eq!(m, "DIR/foil.dat line 2: the upper surface doubles back towards the leading edge");
    // An outline that crosses itself: the lower surface rises through the upper.
    let m = dir_case(
        "1 0.001\n0.8 0.02\n0.6 0.04\n0.4 0.06\n0.2 0.05\n0 0\n0.2 -0.05\n0.4 0.09\n0.6 -0.04\n0.8 -0.02\n1 -0.001\n",
    );
    assert!(m.starts_with("DIR/foil.dat line") && m.contains("crosses itself"), "{m}");
}

#[test]
fn ply_naming_an_unknown_material() {
    let m = message("plies.csv", "cap,carbon,", "cap,carbn,");
    assert_eq!(
        m,
        "DIR/plies.csv line 3, material: no material named 'carbn'; did you mean 'carbon'?"
    );
}

#[test]
fn ply_covering_span_outside_the_blade() {
    let m = message("plies.csv", "cap,carbon,0,0.5,1.5", "cap,carbon,0,0.5,2.7");
    assert_eq!(
        m,
        "DIR/plies.csv line 3, r_end_m: ply 'cap' covers r = 0.5..2.7 m, outside the blade (0.5..2.5 m)"
    );
}

#[test]
fn web_outside_the_chord() {
    let m = message("blade.toml", "chord_frac = 0.3", "chord_frac = 1.3");
    assert_eq!(
        m,
        "DIR/blade.toml line 15, web[1].chord_frac: web 'spar' lies outside the chord: expected a fraction between 0 and 1, found 1.3"
    );
}

#[test]
fn laminate_thicker_than_the_section() {
    // 40 plies of 2 mm carbon on the upper surface: with skin and cap 83 mm against the 60 mm
    // depth of a 0.4 m NACA 0015.
    let extra: String = (0..40).map(|i| format!("c{i},carbon,0,0.5,2.5,upper,0.1,0.5\n")).collect();
    let m = message("plies.csv", "web,glass", &format!("{extra}web,glass"));
    assert!(m.starts_with("DIR/plies.csv: at r = 0.5000 m (station near line 2), x/c = "), "{m}");
    assert!(m.contains("the laminates are thicker than the section: upper 83.00 mm + lower 1.00 mm against a depth of 60.00 mm"), "{m}");
}

#[test]
fn unknown_key_in_blade_toml() {
    let m = message("blade.toml", "rpm_max = 330", "rpm_maximum = 330");
    assert_eq!(
        m,
        "DIR/blade.toml line 9, rotor.rpm_maximum: unknown key 'rpm_maximum'; did you mean 'rpm_max'?"
    );
}

/// The least operating speed lies between 0 and the nominal speed (it starts the band over
/// which the frequency margin is demanded); above the nominal, zero or negative it is refused
/// at its key with what was expected (what a message must say: common practice).
#[test]
fn least_operating_speed_outside_zero_to_nominal() {
    for bad in ["310", "0", "-50"] {
        let m = message("blade.toml", "rpm_max = 330", &format!("rpm_max = 330\nrpm_min = {bad}"));
        assert_eq!(
            m,
            format!(
                "DIR/blade.toml line 10, rotor.rpm_min: expected the least operating speed, more \
                 than 0 and at most rpm_nominal = 300, found {bad}"
            )
        );
    }
}

#[test]
fn web_ply_naming_an_unknown_web() {
    let m = message("plies.csv", "web:spar", "web:spr");
    assert_eq!(
        m,
        "DIR/plies.csv line 4, region: no web named 'spr'; did you mean 'web:spar'?; the webs are \
         'web:spar'"
    );
}

#[test]
fn hole_in_the_skin() {
    let m =
        message("plies.csv", "skin,glass,0,0.5,2.5,both,0,1", "skin,glass,0,0.5,2.5,both,0,0.9");
    assert!(m.starts_with("DIR/plies.csv: no ply covers the upper surface at x/c = 0.9"), "{m}");
}

/// A required key left out is named as missing at its table's line, not blamed on a valid key
/// of the table that is like it and not read yet (`rpm_nominal` left out once read as an unknown
/// `rpm_max`); a misspelt key is still named as unknown, with the key it resembles. What a
/// message must say: common practice (the file, the place, what was expected).
#[test]
fn required_key_left_out_is_missing_not_a_misspelling() {
    for key in ["hub_radius_m", "tip_radius_m", "rpm_nominal", "rpm_max"] {
        let line = fs::read_to_string(Path::new(FIXTURE).join("blade.toml"))
            .unwrap()
            .lines()
            .find(|l| l.starts_with(&format!("{key} =")))
            .unwrap()
            .to_string();
        let m = message("blade.toml", &format!("{line}\n"), "");
        assert_eq!(
            m,
            format!("DIR/blade.toml line 4, rotor.{key}: missing key '{key}': expected a number")
        );
    }
    let m = message("blade.toml", "rpm = 330", "rpms = 330");
    assert_eq!(
        m,
        "DIR/blade.toml line 19, load_case[1].rpms: unknown key 'rpms'; did you mean 'rpm'?"
    );
    // Too unlike any key for a hint: named as unknown with the keys of the table (it was once
    // reported as a missing 'rpm').
    let m = message("blade.toml", "rpm = 330", "rmp = 330");
    assert_eq!(
        m,
        "DIR/blade.toml line 19, load_case[1].rmp: unknown key 'rmp'; known keys here: name, rpm, \
         pitch_deg, distributed, gravity_m_s2, load_factor, delta_T_K"
    );
}

/// Two point masses of one name are refused as two load cases of one name are (the second is
/// likely a pasted copy that would double the mass); the message names the second one's line.
/// What a message must say: common practice.
#[test]
fn point_mass_named_twice() {
    let mass = |r: f64| format!("[[point_mass]]\nname = \"bolt\"\nr_m = {r}\nmass_kg = 0.1\n\n");
    let m =
        message("blade.toml", "[[load_case]]", &format!("{}{}[[load_case]]", mass(0.6), mass(0.7)));
    assert_eq!(m, "DIR/blade.toml line 23, point_mass[2].name: point mass 'bolt' is defined twice");
}

/// The fixture with `delta_T_K = -150` in its load case and `from` replaced by `to` in its
/// materials file (an empty `from` leaves it as it is): the result of reading it and building
/// every section.
fn thermal_case(from: &str, to: &str) -> Result<(), String> {
    let dir = tempfile::tempdir().unwrap();
    for entry in fs::read_dir(FIXTURE).unwrap() {
        let entry = entry.unwrap();
        fs::copy(entry.path(), dir.path().join(entry.file_name())).unwrap();
    }
    let edit = |file: &str, from: &str, to: &str| {
        let path = dir.path().join(file);
        let old = fs::read_to_string(&path).unwrap();
        assert!(old.contains(from), "fixture {file} lacks '{from}'");
        fs::write(&path, old.replacen(from, to, 1)).unwrap();
    };
    edit("blade.toml", "rpm = 330\n", "rpm = 330\ndelta_T_K = -150\n");
    edit("materials.toml", from, to);
    run(&dir.path().join("blade.toml"))
        .map_err(|e| e.replace(&dir.path().display().to_string(), "DIR"))
}

/// A temperature change needs the expansion coefficients of every ply's material; without them
/// the message names the case's line in blade.toml and the record's line in the materials file
/// (it once named neither, from the stress recovery). What a message must say: common practice.
#[test]
fn thermal_case_with_a_ply_material_without_expansion_coefficients() {
    let m = thermal_case("", "").unwrap_err();
    assert_eq!(
        m,
        "DIR/blade.toml line 20, load_case[1].delta_T_K: load case 'spin' has delta_T_K = -150 \
         but ply 'skin' is of material 'glass', which gives no thermal expansion coefficients \
         (DIR/materials.toml line 2, lamina.glass): add a1_ustrain_K and a2_ustrain_K to the \
         record, or remove delta_T_K"
    );
    // The glass given its coefficients, the carbon of the cap is named; an isotropic record is
    // asked for its own key.
    let glass_cte = "S12_MPa = 70\na1_ustrain_K = 6\na2_ustrain_K = 20\n";
    let m = thermal_case("S12_MPa = 70\n", glass_cte).unwrap_err();
    assert!(m.contains("ply 'cap' is of material 'carbon'"), "{m}");
    assert!(m.contains("(DIR/materials.toml line 17, lamina.carbon)"), "{m}");
    let carbon_isotropic = "[isotropic.carbon]\nE_GPa = 70\nnu = 0.3\ndensity_kg_m3 = 1550\n\
                            ply_thickness_mm = 2.0\n";
    let whole = fs::read_to_string(Path::new(FIXTURE).join("materials.toml")).unwrap();
    let carbon = &whole[whole.find("[lamina.carbon]").unwrap()..];
    let m = thermal_case(
        &format!("S12_MPa = 70\n\n{carbon}"),
        &format!("{glass_cte}\n{carbon_isotropic}"),
    )
    .unwrap_err();
    assert!(m.contains("(DIR/materials.toml line 17, isotropic.carbon): add cte_ustrain_K"), "{m}");
    // Every ply's material with its coefficients: the case is read.
    let both = format!("{glass_cte}\n{carbon}")
        .replace("S12_MPa = 80", "S12_MPa = 80\na1_ustrain_K = -0.3\na2_ustrain_K = 28");
    thermal_case(&format!("S12_MPa = 70\n\n{carbon}"), &both).unwrap();
}

#[test]
fn negative_rpm_in_a_load_case() {
    let m = message("blade.toml", "rpm = 330", "rpm = -330");
    assert_eq!(
        m,
        "DIR/blade.toml line 19, load_case[1].rpm: expected a rotor speed of zero or more, found -330"
    );
}

#[test]
fn clearances_larger_than_the_blade() {
    let m = message("blade.toml", "tip_clearance_m = 0.003", "tip_clearance_m = 3.0");
    assert!(
        m.contains(
            "the clearances (0.002 m + 3 m) are larger than the blade (2 m from hub to tip)"
        ),
        "{m}"
    );
}

/// The fixture with a distributed load file `loads.csv` holding `rows`.
fn with_loads(rows: &str) -> String {
    let dir = tempfile::tempdir().unwrap();
    for entry in fs::read_dir(FIXTURE).unwrap() {
        let entry = entry.unwrap();
        fs::copy(entry.path(), dir.path().join(entry.file_name())).unwrap();
    }
    let toml = fs::read_to_string(dir.path().join("blade.toml")).unwrap();
    fs::write(
        dir.path().join("blade.toml"),
        toml.replace("rpm = 330\n", "rpm = 330\ndistributed = \"loads.csv\"\n"),
    )
    .unwrap();
    fs::write(
        dir.path().join("loads.csv"),
        format!("r_m,f_flap_N_m,f_edge_N_m,m_pitch_Nm_m\n{rows}"),
    )
    .unwrap();
    run(&dir.path().join("blade.toml"))
        .unwrap_err()
        .replace(&dir.path().display().to_string(), "DIR")
}

#[test]
fn load_file_running_outside_the_blade() {
    let m = with_loads("0.5,100,10,0\n2.8,200,20,0\n");
    assert_eq!(
        m,
        "DIR/loads.csv line 3, r_m: the load runs outside the blade: expected a radius in 0.5..2.5 m, found 2.8"
    );
}

#[test]
fn load_file_with_a_cell_that_is_not_a_number() {
    let m = with_loads("0.5,100,10,0\n2.5,lots,20,0\n");
    assert_eq!(m, "DIR/loads.csv line 3, f_flap_N_m: 'lots' is not a number");
}

#[test]
fn ply_listed_twice() {
    // A row pasted twice would double the ply silently.
    let m = message(
        "plies.csv",
        "cap,carbon,0,0.5,1.5,upper,0.2,0.4\n",
        "cap,carbon,0,0.5,1.5,upper,0.2,0.4\ncap,carbon,0,0.5,1.5,upper,0.2,0.4\n",
    );
    assert_eq!(
        m,
        "DIR/plies.csv line 4, ply: ply 'cap' is listed twice (first on line 3): expected each ply once, with its own id (a row pasted twice doubles the ply)"
    );
}

#[test]
fn stations_closer_than_their_change_of_shape() {
    // 20° of twist over 10 mm moves the trailing edge of a 0.4 m chord by about 97 mm (0.28 m × 2 sin 10°).
    let m = message("stations.csv", "1.5,0.4,0,0.3", "0.51,0.4,20,0.3");
    assert!(
        m.starts_with("DIR/stations.csv line 3, r_m: the stations at r = 0.5 m (line 2) and r = 0.51 m lie 10.0 mm apart, but the leading or trailing edge moves 97.2 mm"),
        "{m}"
    );
}

#[test]
fn carriage_return_line_ends_in_the_project_files() {
    // Old Mac line ends: a fault is still placed on its line.
    let m = message(
        "stations.csv",
        "",
        "r_m,chord_m,twist_deg,pitch_axis_frac,airfoil\r0.5,0.4,0,0.3,naca0015\r1.5,x,0,0.3,naca0015\r2.5,0.4,0,0.3,naca0015\r",
    );
    assert_eq!(m, "DIR/stations.csv line 3, chord_m: 'x' is not a number");
}

#[test]
fn chord_cells_on_a_web_ply() {
    // A web ply covers the web's whole height (docs/conventions.md, plies.csv): chord fractions
    // in its from/to cells would be ignored, so they are refused at the cell; empty cells, or
    // 0 and 1 (the whole height), are taken.
    let m = message("plies.csv", "web:spar,,", "web:spar,0.1,0.2");
    assert_eq!(
        m,
        "DIR/plies.csv line 4, from: expected an empty cell for a web ply (ply 'web' on web:spar \
         covers the web's whole height; from and to are chord fractions of the upper, lower or \
         both regions), found '0.1'"
    );
    let m = message("plies.csv", "web:spar,,", "web:spar,,0.9");
    assert!(m.starts_with("DIR/plies.csv line 4, to: expected an empty cell"), "{m}");
    assert!(m.ends_with("found '0.9'"), "{m}");
    // The whole height written out reads as the empty cells do: the next fault is reported.
    let m = message("plies.csv", "web:spar,,\n", "web:spar,0,1\nweb2,glass,0,0.5,2.5,web:x,,\n");
    assert!(m.contains("line 5, region: no web named 'x'"), "{m}");
}

#[test]
fn a_table_separated_by_tabs_or_semicolons() {
    // A spreadsheet saved as tab- or semicolon-separated text reads as one column named after
    // the whole header; the message says what separates the columns and that commas are
    // expected (docs/conventions.md: the CSV files are comma-separated).
    let stations = "r_m\tchord_m\ttwist_deg\tpitch_axis_frac\tairfoil\n0.5\t0.4\t0\t0.3\tnaca0015\n\
                    2.5\t0.4\t0\t0.3\tnaca0015\n";
    let m = message("stations.csv", "", stations);
    assert_eq!(
        m,
        "DIR/stations.csv line 1: the columns are separated by tabs: expected commas between \
         them, as in 'r_m,chord_m,twist_deg,pitch_axis_frac,airfoil'"
    );
    let plies = "ply;material;angle_deg;r_start_m;r_end_m;region;from;to\n\
                 skin;glass;0;0,5;2,5;both;0;1\n";
    let m = message("plies.csv", "", plies);
    assert_eq!(
        m,
        "DIR/plies.csv line 1: the columns are separated by semicolons: expected commas between \
         them, as in 'ply,material,angle_deg,r_start_m,r_end_m,region,from,to' (and numbers \
         with a decimal point: 0.5, not 0,5)"
    );
    // A comma-separated header over rows separated by tabs: the row's line.
    let m = message("stations.csv", "1.5,0.4,0,0.3,naca0015", "1.5\t0.4\t0\t0.3\tnaca0015");
    assert_eq!(
        m,
        "DIR/stations.csv line 3: the cells are separated by tabs: expected commas between them, \
         as in the header"
    );
}

#[test]
fn control_characters_in_a_cell_are_escaped_in_the_message() {
    // A NUL, an escape or a bidirectional override copied into a cell is shown as its escape
    // (`\u{0}`), never raw: a raw one hides the rest of the line on a terminal or rewrites it.
    let m = message("plies.csv", "skin,glass", "skin,gl\0ass");
    assert_eq!(
        m,
        "DIR/plies.csv line 2, material: no material named 'gl\\u{0}ass'; did you mean 'glass'?"
    );
    let m = message("plies.csv", "both,0,1", "bo\u{1b}[2Jth,0,1");
    assert_eq!(
        m,
        "DIR/plies.csv line 2, region: expected upper, lower, both or web:NAME, found \
         'bo\\u{1b}[2Jth'"
    );
    let m = message("stations.csv", "0.5,0.4,0,0.3,naca0015", "0.5,0.4,0,0.3,naca\u{202e}0015");
    assert!(m.contains("airfoil: '\\u{202e}0015' is not a NACA"), "{m}");
    let m = message("plies.csv", "skin,glass,0", "skin,glass,0\t\0");
    assert!(m.ends_with("angle_deg: '0\\t\\u{0}' is not a number"), "{m}");
    assert!(!m.chars().any(|c| c.is_control()), "{m:?}");
}
