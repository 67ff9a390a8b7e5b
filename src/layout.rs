//! The wall layout of one thin-walled section: its outer mould line, the laminate of every
//! segment and the shear webs. The blade builds it from its ply schedule
//! ([`crate::blade::Blade::section_layout`]); the section solver takes it
//! ([`crate::section::solve_section`]); tests build it by hand for sections with closed forms.
//! It sits between the two in the module flow so that neither depends on the other's types.
//!
//! Frame: the chord frame of docs/conventions.md. `y` along the chord from the leading edge
//! towards the trailing edge, `z` normal to the chord towards the upper surface, origin on the
//! pitch axis, metres.

use crate::laminate::Laminate;
use crate::units::Angle;

/// The wall layout of one section, as the blade builds it for the section solver.
#[derive(Debug, Clone)]
pub struct SectionLayout {
    /// Radius of the section, m.
    pub r: f64,
    /// Chord, m.
    pub chord: f64,
    /// Station twist (chord angle before the pitch setting).
    pub twist: Angle,
    /// Pitch axis as a fraction of chord from the leading edge.
    pub pitch_axis_frac: f64,
    /// Outer mould line, chord frame, m; a closed polygon (the last point joins the first)
    /// starting at the leading edge, running over the upper surface to the trailing edge and
    /// back along the lower surface (the direction of wall axis 2 = n × x). A blunt trailing
    /// edge appears as a straight base segment.
    pub outer: Vec<[f64; 2]>,
    /// Distinct laminates of this section; walls and webs refer to them by index.
    pub laminates: Vec<Laminate>,
    /// Laminate of each outer segment `i` (from point `i` to point `i + 1`, the last closing the
    /// loop), an index into `laminates`. Plies are listed from the outer mould line inward.
    pub segment_laminate: Vec<usize>,
    /// Shear webs, leading edge first.
    pub webs: Vec<WebLayout>,
}

/// One shear web in a [`SectionLayout`].
#[derive(Debug, Clone)]
pub struct WebLayout {
    /// The web's name.
    pub name: String,
    /// Chordwise position of the web's midplane, chord frame y, m.
    pub y: f64,
    /// Index into [`SectionLayout::laminates`]; the web laminate's first ply faces the leading
    /// edge side.
    pub laminate: usize,
}
