//! What the loft reads: a span-wise family of closed section contours.
//!
//! A contour at radius `x` is given as two chains in the chord frame (`y` along the chord from
//! the leading edge towards the trailing edge, `z` towards the upper surface, origin on the pitch
//! axis), each parametrised by `u ∈ [0, 1]` from the front (`u = 0`) to the back (`u = 1`): the
//! upper chain and the lower chain. At each end the chains either meet in a point (a sharp
//! leading or trailing edge) or are joined by a straight closing segment (a blunt trailing edge,
//! or a web where a core cell ends). Going round, the contour runs front → upper → back → lower
//! → front, the direction of wall axis 2 in docs/conventions.md (clockwise in the `(y, z)` plane).
//!
//! The section is turned about x by the chord angle φ(x) (twist + pitch) into the rotor frame:
//! `(x, y, z)_rotor = (x, y cos φ − z sin φ, y sin φ + z cos φ)`, where the rotor frame's y lies
//! in the plane of rotation and its z along the rotor axis, so φ = 0 puts the chord in the plane of
//! rotation (docs/conventions.md measures the chord angle from it). Because this is a rotation about the
//! pitch axis through the rotor centre, `|p|` does not depend on φ.

use crate::units::Angle;

/// How the two chains of a contour are joined at one end.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum EndKind {
    /// The chains meet in one point (`upper(x, u) == lower(x, u)` there).
    Point,
    /// A straight segment joins the chains' end points.
    Segment,
}

/// How the chains are joined at the front (`u = 0`) and the back (`u = 1`).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct ChainEnds {
    /// At `u = 0` (the leading edge, or the front web of a cell).
    pub front: EndKind,
    /// At `u = 1` (the trailing edge, or the rear web of a cell).
    pub back: EndKind,
}

/// A span-wise family of closed contours: the outer mould line, an inner surface, a core cell.
///
/// Implementations must be continuous in `x` and `u`, keep the same [`ChainEnds`] over the
/// span, and have `|p|` (the distance from the rotor centre) increase along x for every
/// parameter, so that a sphere about the rotor centre cuts each line once.
pub trait SpanSurface {
    /// Radii `[x_min, x_max]` where the surface is defined, m (along the pitch axis).
    fn span(&self) -> [f64; 2];
    /// A point of the upper chain at radius `x` and parameter `u ∈ [0, 1]`, chord frame, m.
    fn upper(&self, x: f64, u: f64) -> [f64; 2];
    /// A point of the lower chain at radius `x` and parameter `u ∈ [0, 1]`, chord frame, m.
    fn lower(&self, x: f64, u: f64) -> [f64; 2];
    /// The chord angle φ (twist + pitch) at radius `x`.
    fn chord_angle(&self, x: f64) -> Angle;
    /// How the chains are joined at their ends.
    fn ends(&self) -> ChainEnds;
    /// Radii where the section shape is given (stations), sampled when the chordwise grid is
    /// chosen; by default none beyond the loft's own samples.
    fn sample_radii(&self) -> Vec<f64> {
        Vec::new()
    }
}

/// The rotor-frame point of chord-frame `c` at radius `x` turned by `phi`.
pub(crate) fn to_rotor(x: f64, c: [f64; 2], phi: Angle) -> [f64; 3] {
    let (s, co) = phi.rad().sin_cos();
    [x, c[0] * co - c[1] * s, c[0] * s + c[1] * co]
}

/// The closed contour at radius `x` as a polygon in the chord frame, m, in the order front →
/// upper → back → lower (the last point joins the first): the upper chain at the parameters `u`
/// (ascending from 0 to 1), then the lower chain at the same parameters backwards, each meeting
/// point listed once. Closing segments appear as single edges.
pub fn contour_polygon(surface: &dyn SpanSurface, x: f64, u: &[f64]) -> Vec<[f64; 2]> {
    let ends = surface.ends();
    let mut pts: Vec<[f64; 2]> = u.iter().map(|&u| surface.upper(x, u)).collect();
    let n = u.len();
    let hi = if ends.back == EndKind::Point { n.saturating_sub(1) } else { n };
    let lo = usize::from(ends.front == EndKind::Point);
    pts.extend((lo..hi).rev().map(|k| surface.lower(x, u[k])));
    pts
}

/// A [`SpanSurface`] from closures, for surfaces given by formulas (tests, examples, simple
/// parts).
pub struct FnSurface<U, L, A>
where
    U: Fn(f64, f64) -> [f64; 2],
    L: Fn(f64, f64) -> [f64; 2],
    A: Fn(f64) -> Angle,
{
    /// Radii where the surface is defined, m.
    pub span: [f64; 2],
    /// The upper chain `(x, u) -> (y, z)`.
    pub upper: U,
    /// The lower chain `(x, u) -> (y, z)`.
    pub lower: L,
    /// The chord angle at `x`.
    pub chord_angle: A,
    /// How the chains meet.
    pub ends: ChainEnds,
}

impl<U, L, A> SpanSurface for FnSurface<U, L, A>
where
    U: Fn(f64, f64) -> [f64; 2],
    L: Fn(f64, f64) -> [f64; 2],
    A: Fn(f64) -> Angle,
{
    fn span(&self) -> [f64; 2] {
        self.span
    }
    fn upper(&self, x: f64, u: f64) -> [f64; 2] {
        (self.upper)(x, u)
    }
    fn lower(&self, x: f64, u: f64) -> [f64; 2] {
        (self.lower)(x, u)
    }
    fn chord_angle(&self, x: f64) -> Angle {
        (self.chord_angle)(x)
    }
    fn ends(&self) -> ChainEnds {
        self.ends
    }
}
