//! The sections report as a terminal summary.

use std::fmt::Write as _;

use super::SectionsReport;
use crate::report::table::wrap;
use crate::report::{Align, Table, fixed, sig4};

pub(super) fn report(r: &SectionsReport<'_>) -> String {
    let model = r.model;
    let mut out = String::new();
    let _ = writeln!(out, "Sections of {}", model.project.name);
    let n = model.stations.len();
    wrap(
        &mut out,
        "  ",
        "    ",
        &format!(
            "{n} station{}, {} outline points each; chord frame: y from the leading edge towards \
             the trailing edge, z towards the upper surface, origin on the pitch axis",
            if n == 1 { "" } else { "s" },
            model.project.sections.contour_points
        ),
        96,
    );
    out.push('\n');
    out.push_str(&crate::report::cautions_text());

    let m = &r.mass;
    let _ = writeln!(out, "\nBlade");
    let _ = writeln!(
        out,
        "  mass {} kg (laminates {} kg, point masses {} kg), mass centre at r = {} m",
        sig4(m.total_kg),
        sig4(m.laminate_kg),
        sig4(m.point_masses_kg),
        fixed(m.centre_radius_m, 4)
    );

    let _ = writeln!(out, "\nStations");
    let mut table = Table::new(&[
        ("r m", Align::Right),
        ("chord m", Align::Right),
        ("twist°", Align::Right),
        ("EA MN", Align::Right),
        ("EI flap kN·m²", Align::Right),
        ("EI edge kN·m²", Align::Right),
        ("GJ kN·m²", Align::Right),
        ("m kg/m", Align::Right),
        ("EC y/c", Align::Right),
        ("SC y/c", Align::Right),
        ("", Align::Left),
    ]);
    for st in &model.stations {
        let p = &st.section.properties;
        let yc = |y: f64| fixed(y / p.chord + st.layout.pitch_axis_frac, 3);
        table.row(vec![
            // Five decimals: the inboard side of a ply or web edge stands 1e-4 of the span
            // inboard of it (`Blade::check_radii`), 0.05 mm on a 0.5 m span.
            fixed(p.r, 5),
            fixed(p.chord, 4),
            fixed(p.twist.deg(), 2),
            sig4(p.ea / 1e6),
            sig4(p.ei_flap / 1e3),
            sig4(p.ei_edge / 1e3),
            sig4(p.gj / 1e3),
            sig4(p.mass_per_length),
            yc(p.elastic_centre[0]),
            yc(p.shear_centre[0]),
            if p.warnings.is_empty() { String::new() } else { "!".to_string() },
        ]);
    }
    out.push_str(&table.render(2));
    wrap(
        &mut out,
        "  ",
        "    ",
        "EC, SC: elastic and shear centre as chord fractions from the leading edge; EA, EI and GJ \
         about the elastic centre; ! a station with a warning below. --json gives the couplings, \
         the 4x4 stiffness, principal axes, mass centre and inertias.",
        96,
    );

    if !r.warnings.is_empty() {
        let _ = writeln!(out, "\nWarnings");
        for w in &r.warnings {
            wrap(&mut out, "  !", "    ", &w.to_string(), 96);
        }
    }
    out
}
