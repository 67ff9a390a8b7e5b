//! A generated blade project of any size, for the cost benchmarks: an invented 20 m diameter
//! rotor blade (every number made up, described by no real machine) with two shear webs, foam
//! cored aft panels and webs, and spar caps built of many short unidirectional plies laid in a
//! staircase along the span, so that the schedule's ply count grows while each wall stays as
//! thick as a real cap. Written to a folder as the files a user would write.

use std::fmt::Write as _;
use std::path::Path;

/// The size of a generated blade.
#[derive(Debug, Clone, Copy)]
pub struct Size {
    /// Analysis stations (`[sections] analysis_stations`).
    pub stations: usize,
    /// Plies in the schedule.
    pub plies: usize,
    /// Contour points per section (`[sections] contour_points`).
    pub points: usize,
}

const HUB: f64 = 1.0;
const TIP: f64 = 10.0;

const MATERIALS: &str = r#"# INVENTED benchmark materials: typical values of each class, from memory, not allowables.
[lamina.ud]
E1_GPa = 40
E2_GPa = 10
G12_GPa = 3.8
nu12 = 0.28
density_kg_m3 = 1950
ply_thickness_mm = 0.05
Xt_MPa = 900
Xc_MPa = 650
Yt_MPa = 40
Yc_MPa = 130
S12_MPa = 55
a1_ustrain_K = 6
a2_ustrain_K = 30

[lamina.biax]
E1_GPa = 20
E2_GPa = 20
G12_GPa = 4.5
nu12 = 0.15
density_kg_m3 = 1850
ply_thickness_mm = 0.4
Xt_MPa = 300
Xc_MPa = 260
Yt_MPa = 300
Yc_MPa = 260
S12_MPa = 60
a1_ustrain_K = 15
a2_ustrain_K = 15

[isotropic.foam]
E_GPa = 0.07
nu = 0.3
density_kg_m3 = 80
ply_thickness_mm = 8
tensile_strength_MPa = 1.5
compressive_strength_MPa = 1.2
shear_strength_MPa = 0.9
cte_ustrain_K = 40
core = true
core_shear_modulus_MPa = 27
core_shear_strength_MPa = 0.9
core_compression_modulus_MPa = 90
"#;

/// Writes the project of `size` into `dir` (which must exist) and returns its `blade.toml`.
pub fn write(dir: &Path, size: Size) -> std::io::Result<std::path::PathBuf> {
    let toml = format!(
        r#"# INVENTED benchmark blade: every number is made up; it describes no real machine.
name = "Generated benchmark blade ({} stations, {} plies, {} contour points)"

[rotor]
blades = 3
hub_radius_m = {HUB}
tip_radius_m = {TIP}
rpm_nominal = 40
rpm_max = 44
pitch_deg = 0.0
pitch_range_deg = [0, 0]
root_clearance_m = 0.0
tip_clearance_m = 0.0

[files]
stations = "stations.csv"
plies = "plies.csv"
materials = "materials.toml"

[[web]]
name = "front"
chord_frac = 0.2

[[web]]
name = "rear"
chord_frac = 0.5

[[load_case]]
name = "rated"
rpm = 40
distributed = "loads.csv"
gravity_m_s2 = [0.0, -9.81, 0.0]
load_factor = 1.35

[criteria]
min_reserve_factor = 1.5
min_buckling_factor = 1.0
frequency_margin_pct = 5
harmonics = 3
max_mass_kg = 5000
max_tip_deflection_m = 2.0

[sections]
contour_points = {}
analysis_stations = {}
"#,
        size.stations, size.plies, size.points, size.points, size.stations
    );
    std::fs::write(dir.join("blade.toml"), toml)?;
    std::fs::write(dir.join("materials.toml"), MATERIALS)?;
    let mut st = String::from(
        "# INVENTED benchmark stations\nr_m,chord_m,twist_deg,pitch_axis_frac,airfoil\n",
    );
    for i in 0..=9 {
        let u = i as f64 / 9.0;
        let r = HUB + (TIP - HUB) * u;
        let chord = 1.0 - 0.65 * u;
        let thick = (30.0 - 18.0 * u).round() as u32;
        let _ = writeln!(st, "{r:.4},{chord:.4},{:.2},0.30,naca44{thick:02}", 18.0 - 16.0 * u);
    }
    std::fs::write(dir.join("stations.csv"), st)?;
    let mut loads =
        String::from("# INVENTED benchmark loads\nr_m,f_flap_N_m,f_edge_N_m,m_pitch_Nm_m\n");
    for i in 0..=9 {
        let u = i as f64 / 9.0;
        let _ = writeln!(
            loads,
            "{:.4},{:.1},{:.1},{:.2}",
            HUB + (TIP - HUB) * u,
            200.0 + 1400.0 * u,
            -60.0 - 120.0 * u,
            -20.0
        );
    }
    std::fs::write(dir.join("loads.csv"), loads)?;
    // Fixed plies: the skins, the foam-cored aft panels and the two sandwich webs.
    let mut plies = String::from(
        "# INVENTED benchmark schedule: outermost ply first\nply,material,angle_deg,r_start_m,r_end_m,region,from,to\n",
    );
    let mut rows = vec![
        format!("skin-out,biax,45,{HUB},{TIP},both,0.00,1.00"),
        format!("aft-core,foam,0,{HUB},{TIP},both,0.52,0.92"),
        format!("skin-in,biax,-45,{HUB},{TIP},both,0.00,1.00"),
    ];
    for web in ["front", "rear"] {
        rows.push(format!("{web}-1,biax,45,{HUB},{TIP},web:{web},,"));
        rows.push(format!("{web}-core,foam,0,{HUB},{TIP},web:{web},,"));
        rows.push(format!("{web}-2,biax,-45,{HUB},{TIP},web:{web},,"));
    }
    // The rest: unidirectional cap plies of 1.5 m, their starts stepping along the span and
    // their edges stepping in across the chord (a staircase of ply drops), upper and lower
    // alternately, laid between the two skin plies.
    let caps = size.plies.saturating_sub(rows.len());
    let length = 1.5;
    let mut cap_rows = Vec::with_capacity(caps);
    for j in 0..caps {
        let u = (j / 2) as f64 / (caps / 2).max(1) as f64;
        let start = HUB + (TIP - HUB - length) * u;
        let inset = 0.004 * (j % 5) as f64;
        let region = if j % 2 == 0 { "upper" } else { "lower" };
        cap_rows.push(format!(
            "cap-{j},ud,0,{start:.4},{:.4},{region},{:.3},{:.3}",
            start + length,
            0.2 + inset,
            0.5 - inset
        ));
    }
    let skin_in = rows.remove(2);
    for r in rows
        .iter()
        .take(2)
        .chain(&cap_rows)
        .chain(std::iter::once(&skin_in))
        .chain(rows.iter().skip(2))
    {
        plies.push_str(r);
        plies.push('\n');
    }
    std::fs::write(dir.join("plies.csv"), plies)?;
    Ok(dir.join("blade.toml"))
}
