//! Warnings in words: the typed warnings of the blade model (input, blade, sections, load
//! cases) rendered as the sentences the commands print and the report shows. The stages keep
//! values with their places and numbers; only this file turns them into English.

use std::fmt;

use crate::analysis::{GroupedWarning, Warning};
use crate::blade::BladeWarning;
use crate::input::InputWarning;
use crate::section::SectionWarning;
use crate::units::rpm_of;

impl fmt::Display for SectionWarning {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            SectionWarning::WallsMeet { at_y_c, converging_from_y_c, limit_ratio } => {
                write!(
                    f,
                    "the upper and lower walls meet at y/c = {at_y_c:.3}, ahead of the trailing \
                     edge: aft of it the walls are taken as solid laminate on the mean line, \
                     carrying no torsional shear flow"
                )?;
                if let Some(y) = converging_from_y_c {
                    write!(
                        f,
                        "; the walls pass {:.0} % of the local depth from y/c = {y:.3} aft",
                        100.0 * limit_ratio
                    )?;
                }
                Ok(())
            }
            SectionWarning::ThickWall { ratio, at_y_c, limit_ratio } => write!(
                f,
                "wall thickness reaches {:.0} % of the local depth at y/c = {at_y_c:.3}; \
                 thin-wall theory is usually trusted below about {:.0} % (common practice), so \
                 the stiffness there is approximate",
                100.0 * ratio,
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
