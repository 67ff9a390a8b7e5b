//! The tooling summary: each part's file, triangle count, volume, surface area, mass and
//! bounding box; the end spheres; where the core ends at the thin trailing edge; the core
//! alloy's melting check with its handling note; each mould half's pull, least draft and
//! undercut regions; the allowances. As a terminal summary ([`ToolingReport::to_text`]) or one
//! JSON object ([`ToolingReport::to_json`], SI units in every key; a value not computed is
//! `null` with the reason beside it).
//!
//! Volumes and masses are those of the nominal parts; the files hold the parts with the
//! allowance factors applied (cores by the shrink factor, the mould cavity by the expansion
//! factor, both about the rotor centre). Places are rotor-frame points (origin on the rotor
//! axis, x along the pitch axis) in the output unit.

mod block;
mod exploded;
mod json;
mod moulds_text;
mod tables;
mod text;
mod words;

use crate::mesh::{LengthUnit, WrittenPart};
use crate::report::table::{fixed, sig4};
use crate::tooling::{BladeTooling, StaleFiles, ToolingSummary};

/// What `layloft tooling` reports.
#[derive(Debug, Clone, Copy)]
pub struct ToolingReport<'a> {
    /// The project's name.
    pub name: &'a str,
    /// The parts and what their construction found.
    pub tooling: &'a BladeTooling,
    /// The files written, one per part in the order of `tooling.parts`, then one per machined
    /// part in the order of `tooling.machining`.
    pub written: &'a [WrittenPart],
    /// Masses and the melting check.
    pub summary: &'a ToolingSummary,
    /// STL format and unit, in words ("binary STL in mm").
    pub format: &'a str,
    /// Files of an earlier run that the new set does not hold: removed or left in place.
    pub stale: &'a StaleFiles,
}

/// The caution on melting the cores out, beside the drain plan.
const DRAIN_CAUTION: &str = "Melting out: low-melting core alloys give off metal fumes above \
     their melting range; alloys with bismuth, lead or cadmium are toxic: melt out in a \
     ventilated place or under extraction, wear gloves and eye protection, keep food away, \
     catch and weigh every drop, and keep the alloy for recasting or hazardous-waste disposal.";

/// The caution on casting the cores, beside the casting moulds.
const CASTING_CAUTION: &str = "Casting the cores: molten low-melting alloys burn and give off \
     metal fumes; alloys with bismuth, lead or cadmium are toxic: pour in a ventilated place or \
     under extraction, dry and warm the mould first (moisture under molten metal flashes to \
     steam), wear a face shield, gloves and closed clothing, keep food away, and keep the \
     sprue, the vent and the spills for recasting or hazardous-waste disposal.";

/// `text` wrapped at 96 columns, the first line after `first`, the others after `rest`.
fn wrap(text: &str, first: &str, rest: &str) -> String {
    let mut out = String::new();
    let mut line = first.to_string();
    let mut empty = true;
    for word in text.split_whitespace() {
        if !empty && line.chars().count() + 1 + word.chars().count() > 96 {
            out.push_str(&line);
            out.push('\n');
            line = rest.to_string();
            empty = true;
        }
        if !empty {
            line.push(' ');
        }
        line.push_str(word);
        empty = false;
    }
    out.push_str(&line);
    out.push('\n');
    out
}

impl ToolingReport<'_> {
    pub(super) fn unit(&self) -> LengthUnit {
        self.tooling.params.unit
    }

    /// A length in the output unit with micrometre decimals.
    pub(super) fn len(&self, v: f64) -> String {
        let u = self.unit();
        fixed(v * u.per_metre(), u.decimals().saturating_sub(2))
    }

    /// A small length (a tolerance, a laminate thickness) in the output unit, four digits.
    pub(super) fn small(&self, v: f64) -> String {
        sig4(v * self.unit().per_metre())
    }
}
