//! The tooling's notes in words: how to stand the mould while the cores drain, and what the
//! cores' casting moulds leave out. The tooling keeps them as values.

use std::fmt;

use crate::tooling::{CastingNote, DrainStand};

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
            CastingNote::PrintsNotCast => write!(
                f,
                "the casting moulds cast the cores without their prints: the prints are not in \
                 them yet"
            ),
        }
    }
}
