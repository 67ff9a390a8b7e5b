//! Warnings in words: the typed warnings of the blade model (input, blade, sections, load
//! cases) and of the ply book, rendered as the sentences the commands print and the report
//! shows. The stages keep values with their places and numbers; only this file turns them into
//! English.

use std::fmt;

use crate::analysis::{GroupedWarning, Warning};
use crate::blade::BladeWarning;
use crate::input::InputWarning;
use crate::plybook::{PatternPlace, PlyBook, PlyBookIssue, PlyBookWarning};
use crate::section::SectionWarning;
use crate::text::fixed;
use crate::units::rpm_of;

impl fmt::Display for SectionWarning {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            SectionWarning::WallsMeet { at_y_c, converging_from_y_c, limit_ratio } => {
                write!(
                    f,
                    "the upper and lower walls meet at y/c = {}, ahead of the trailing \
                     edge: aft of it the walls are taken as solid laminate on the mean line, \
                     carrying no torsional shear flow",
                    fixed(*at_y_c, 3)
                )?;
                if let Some(y) = converging_from_y_c {
                    write!(
                        f,
                        "; the walls pass {:.0} % of the local depth from y/c = {} aft",
                        100.0 * limit_ratio,
                        fixed(*y, 3)
                    )?;
                }
                Ok(())
            }
            SectionWarning::ThickWall { ratio, at_y_c, limit_ratio } => write!(
                f,
                "wall thickness reaches {:.0} % of the local depth at y/c = {}; \
                 thin-wall theory is usually trusted below about {:.0} % (common practice), so \
                 the stiffness there is approximate",
                100.0 * ratio,
                fixed(*at_y_c, 3),
                100.0 * limit_ratio
            ),
            SectionWarning::NoMass => {
                write!(f, "the walls have no mass: the mass centre is put at the pitch axis")
            }
        }
    }
}

impl fmt::Display for BladeWarning {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            BladeWarning::CoordinateFile(note) => write!(f, "{note}"),
            BladeWarning::Leaning { r, factor } => write!(
                f,
                "the surface leans from the span direction where twist and taper turn it: at r = \
                 {r:.3} m it holds {:.1} % more area than the section's contour sweeps square to \
                 the span, so the sections' laminate mass and wall stiffness there are low by \
                 about that much (the ply book's patterns, on the surface itself, weigh more)",
                100.0 * (factor - 1.0)
            ),
            BladeWarning::Stubby { span, mean_chord } => write!(
                f,
                "the blade is short and stubby: span {span:.3} m is {:.1} mean chords; beam \
                 theory is strained below about 2 (common practice) — check stiffness and modes \
                 by test or a finer model",
                span / mean_chord
            ),
        }
    }
}

impl fmt::Display for InputWarning {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            InputWarning::FarFromHub { place, r_root, hub_radius } => write!(
                f,
                "{place}: the first station (r = {r_root} m) lies {:.3} m outboard of \
                 hub_radius_m = {hub_radius}, more than half the blade's length: a long root \
                 spindle, or a hub radius in the wrong unit?",
                r_root - hub_radius
            ),
            InputWarning::LowLoadFactor { place, case, factor } => write!(
                f,
                "{place}: load case '{case}' has a load factor of {factor} below 1: the case is \
                 checked at less than its load"
            ),
            InputWarning::HighLoadFactor { place, case, factor } => write!(
                f,
                "{place}: load case '{case}' has a load factor of {factor}, above the 1.35 to 2 \
                 of design codes"
            ),
            InputWarning::FallingTemperature { place, key, value_c, before_key, before_c } => {
                write!(
                    f,
                    "{place}: {key} = {value_c} °C lies below {before_key} = {before_c} °C: \
                     expected injection, gel and cure at rising temperatures"
                )
            }
            InputWarning::ReserveBelowOne { file, min_reserve_factor } => write!(
                f,
                "{file}: criteria.min_reserve_factor = {min_reserve_factor} accepts a failure \
                 index above 1 (a reserve factor below 1 means the factored load breaks a ply)"
            ),
            InputWarning::CompressionFromTension { place, material, tensile } => write!(
                f,
                "{place}: material '{material}' has tensile_strength_MPa = {} and no \
                 compressive_strength_MPa: its plies are checked in compression at the tensile \
                 strength, which a foam, a core or a cast resin does not reach; give the \
                 compressive strength",
                tensile / 1e6
            ),
            InputWarning::MassFarOff { place, name, offset, chord } => write!(
                f,
                "{place}: point mass '{name}' sits {offset} m from the pitch axis, more than twice \
                 the blade's largest chord ({chord} m): a balance arm, or an offset in mm?"
            ),
            InputWarning::BucklingBelowOne { file, min_buckling_factor } => write!(
                f,
                "{file}: criteria.min_buckling_factor = {min_buckling_factor} accepts a wall \
                 panel that buckles under the factored load (a buckling reserve factor below 1)"
            ),
        }
    }
}

impl fmt::Display for Warning {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            Warning::Input(w) => write!(f, "{w}"),
            Warning::Blade(w) => write!(f, "{w}"),
            Warning::Overspeed { case, omega, omega_max } => write!(
                f,
                "load case '{case}' runs at {} rpm, above rpm_max = {} rpm: an overspeed case; the \
                 frequency check covers speeds up to rpm_max only",
                rpm_of(*omega),
                rpm_of(*omega_max)
            ),
            Warning::Section(w) => write!(f, "{w}"),
            Warning::ThermalMismatch { case, delta_t, strains, r } => write!(
                f,
                "load case '{case}' (delta_T_K = {delta_t}): at r = {r:.3} m the walls would \
                 expand freely by {:.3e} to {:.3e} (axial strain); each wall is taken free to \
                 expand, so the stresses walls of different expansion put on each other are not \
                 computed: check the thermal stresses of this section by other means",
                strains[0], strains[1]
            ),
        }
    }
}

impl fmt::Display for GroupedWarning {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self.radii.as_slice() {
            [] => write!(f, "{}", self.first),
            [r] => write!(f, "r = {r:.3} m: {}", self.first),
            [r, .., last] => write!(
                f,
                "r = {r:.3} m: {} (and alike at {} more stations up to r = {last:.3} m)",
                self.first,
                self.radii.len() - 1
            ),
        }
    }
}

/// A place on a pattern as the ply-book warnings give it: radius and chord fraction on a skin,
/// radius and height fraction on a web.
fn pattern_place(at: &PatternPlace, web: bool) -> String {
    if web {
        format!("r = {:.3} m, height {}", at.r, fixed(at.along, 2))
    } else {
        format!("r = {:.3} m, x/c = {}", at.r, fixed(at.along, 3))
    }
}

impl fmt::Display for PlyBookWarning {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let (ply, pattern, web) = (&self.ply, &self.pattern, self.web);
        match &self.issue {
            PlyBookIssue::SpliceNotStaggered { stagger, others } => {
                let ids: Vec<String> = others.iter().map(|q| format!("'{q}'")).collect();
                write!(
                    f,
                    "ply '{ply}' ({pattern}): a splice could not be kept {:.0} mm from the splices \
                     of ply {} on the same {} (the region is too small to move it): stagger them \
                     by hand or cut the ply elsewhere",
                    stagger * 1e3,
                    ids.join(", "),
                    if web { "web" } else { "skin" }
                )
            }
            PlyBookIssue::FabricLocks { shear, locking_angle, at } => write!(
                f,
                "ply '{ply}' ({pattern}): the fabric shears {:.1}° at {}, past its locking angle \
                 of {:.1}°: it will wrinkle there; split the ply or add darts",
                shear.to_degrees(),
                pattern_place(at, web),
                locking_angle.to_degrees()
            ),
            PlyBookIssue::FibreDeviation { deviation, limit, at } => write!(
                f,
                "ply '{ply}' ({pattern}): the fibres deviate {:.1}° from the intended direction \
                 at {} (more than {:.0}°, common practice)",
                deviation.to_degrees(),
                pattern_place(at, web),
                limit.to_degrees()
            ),
            PlyBookIssue::CutShort { at, moved, points, area } => write!(
                f,
                "ply '{ply}' ({pattern}): the draped net cannot be carried to r = {:.3} m, {} = \
                 {:.3} (a cell of the cloth would fold), not even in pieces: the pattern ends \
                 short of the ply's region there ({moved} of {points} outline points moved in, \
                 pattern area {area:.4} m²); add a dart, and check by a trial lay-up",
                at.r,
                along_name(web),
                at.along
            ),
            PlyBookIssue::Extrapolated { at, extrapolated } => write!(
                f,
                "ply '{ply}' ({pattern}): the draped net stops short of the region near r = \
                 {:.3} m, {} = {:.3} ({extrapolated} outline points extrapolated): the cloth \
                 will not follow the surface there without a dart or a split; check by a trial \
                 lay-up",
                at.r,
                along_name(web),
                at.along
            ),
        }
    }
}

fn along_name(web: bool) -> &'static str {
    if web { "height" } else { "x/c" }
}

/// The ply book's draping warnings in words, in the book's order (the regions left out are
/// errors of their own, `PlyBook::failed`).
pub fn plybook_warnings(book: &PlyBook) -> Vec<String> {
    book.warnings.iter().map(ToString::to_string).collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    fn warning(web: bool, issue: PlyBookIssue) -> PlyBookWarning {
        PlyBookWarning { row: 2, ply: "p3".into(), pattern: "p3-upper".into(), web, issue }
    }

    #[test]
    fn ply_book_warnings_show_degrees_millimetres_and_the_place() {
        // Radians shown in degrees (π rad = 180°, the definition of the degree), the stagger in
        // millimetres, a skin place by chord fraction and a web place by height fraction.
        let at = PatternPlace { r: 0.5, along: 0.25 };
        let shear = std::f64::consts::PI / 4.0;
        let w = warning(
            false,
            PlyBookIssue::FabricLocks { shear, locking_angle: 40f64.to_radians(), at },
        );
        assert_eq!(
            w.to_string(),
            "ply 'p3' (p3-upper): the fabric shears 45.0° at r = 0.500 m, x/c = 0.250, past its \
             locking angle of 40.0°: it will wrinkle there; split the ply or add darts"
        );
        let w = warning(
            true,
            PlyBookIssue::FibreDeviation { deviation: 0.1, limit: 5f64.to_radians(), at },
        );
        assert!(w.to_string().contains(
            "deviate 5.7° from the intended direction at r = 0.500 m, height 0.25 (more than 5°"
        ));
        let w = warning(
            true,
            PlyBookIssue::SpliceNotStaggered {
                stagger: 0.025,
                others: vec!["a".into(), "b".into()],
            },
        );
        assert!(
            w.to_string().contains("kept 25 mm from the splices of ply 'a', 'b' on the same web")
        );
    }
}
