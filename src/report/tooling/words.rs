//! The tooling's notes in words: how to stand the mould while the cores drain, what the melting
//! and draining checks found, and what the cores' casting moulds leave out. The tooling keeps them as values.

use std::fmt;

use crate::tooling::{CastingNote, DrainStand, MeltNote, ProcessStage};

impl fmt::Display for DrainStand {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let first = if self.turned { "Then turn it over and stand" } else { "Stand" };
        let (end, other) = (self.end, self.other);
        write!(
            f,
            "{first} the mould on its {end} end, the pitch axis vertical ({end} down, {other} \
             up): the prints of {} point down and the alloy runs out through their ports.",
            self.cores.join(", ")
        )
    }
}

impl fmt::Display for CastingNote {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            CastingNote::NoMould { core, reason } => {
                write!(f, "{core}: no casting mould ({reason})")
            }
        }
    }
}

impl fmt::Display for ProcessStage {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            ProcessStage::Injection => "injection",
            ProcessStage::Gelation => "gelation",
            ProcessStage::Cure => "cure",
        })
    }
}

impl fmt::Display for MeltNote {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            MeltNote::NoAlloy => write!(f, "not checked: no core_alloy in [tooling]"),
            MeltNote::NoMeltingRange { alloy } => {
                write!(f, "not checked: '{alloy}' has no melting range (solidus_C, liquidus_C)")
            }
            MeltNote::NoTemperature { stage } => {
                write!(f, "not checked: no {stage} temperature given")
            }
            MeltNote::SolidThrough { stage, solidus, at } => write!(
                f,
                "solid through {stage}: solidus {} °C above {} °C",
                solidus.celsius(),
                at.celsius()
            ),
            MeltNote::MeltsBeforeGel { stage, solidus, at } => write!(
                f,
                "MELTS BEFORE THE RESIN GELS: solidus {} °C is not above the {stage} temperature \
                 {} °C",
                solidus.celsius(),
                at.celsius()
            ),
            MeltNote::MeltsOut { liquidus, cure } => write!(
                f,
                "melts out in the cure: liquidus {} °C below {} °C",
                liquidus.celsius(),
                cure.celsius()
            ),
            MeltNote::NeverMeltsOut { liquidus, cure } => write!(
                f,
                "NEVER MELTS OUT: liquidus {} °C is not below the cure temperature {} °C",
                liquidus.celsius(),
                cure.celsius()
            ),
            MeltNote::Drains { core, end, depth } => write!(
                f,
                "{core}: drains through its {end} print: its end surface lies at most {:.2} mm \
                 below the print's entrance (a film, within 1 mm)",
                depth * 1e3
            ),
            MeltNote::Pools { core, end, depth } => {
                let mm = depth * 1e3;
                write!(
                    f,
                    "{core}: ALLOY POOLS UP TO {mm:.1} mm DEEP: with the mould upright its {end} \
                     end surface lies up to {mm:.1} mm below the print's entrance; tilt the \
                     mould towards the lowest corner of that end while it drains, and check the \
                     shell's mass after the melt-out"
                )
            }
            MeltNote::NoSeat { core, end, section_area, centre, x_end } => write!(
                f,
                "{core}: NO SEAT IN THE MOULD YET: the mould parts are not pocketed for this \
                 print; before closing the mould, pocket the {end} end of the mould by the \
                 print's section ({:.1} cm²) on the pitch-axis line through y = {:.1} mm, z = \
                 {:.1} mm (rotor frame) to x = {:.1} mm, with a drain channel from it out of the \
                 mould",
                section_area * 1e4,
                centre[0] * 1e3,
                centre[1] * 1e3,
                x_end * 1e3
            ),
            MeltNote::PrintDropped { core, end, reason } => write!(
                f,
                "{core}: NO PRINT at the {end} end ({reason}): the core is made as with prints \
                 off, sealed in the shell; the caster must hold and drain it another way (a \
                 drain hole drilled to it, a locating pin), or widen its cell or lower \
                 core_print_fraction"
            ),
            MeltNote::NoPrint { core } => write!(
                f,
                "{core}: NO PRINT: bulkheads close both of its ends, so its alloy cannot leave the \
                 shell; run one of its webs to an end of the blade"
            ),
        }
    }
}
