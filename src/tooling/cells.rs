//! Cutting a contour family into cells by straight webs `y = y_web(x)` (chord frame, normal to
//! the chord): one cell per space between webs, each itself a [`SpanSurface`] whose chains are
//! the pieces of the parent's chains between its webs and whose web ends are closing segments.
//!
//! The parameter where a chain crosses a web is found at every evaluation by the Illinois
//! variant of regula falsi on `[0, 1]` (Dowell & Jarratt, BIT 11 (1971) 168–174), which needs
//! `y` to increase along each chain from front to back.

use super::surface::{ChainEnds, EndKind, SpanSurface};
use crate::mesh::MeshError;
use crate::units::Angle;

/// The chordwise position of a web's midplane at radius `x`: chord-frame `y`, m.
pub type WebPosition<'a> = &'a dyn Fn(f64) -> f64;

/// One cell between webs (or between an edge and a web) of a parent surface.
pub struct Cell<'a> {
    parent: &'a dyn SpanSurface,
    front: Option<WebPosition<'a>>,
    back: Option<WebPosition<'a>>,
}

/// Splits `surface` at `webs` (front to back) into `webs.len() + 1` cells, front first. Each web
/// must lie strictly inside the contour and behind the one before it at the radii sampled
/// (the span's ends, its middle, and the surface's stations).
pub fn split_cells<'a>(
    surface: &'a dyn SpanSurface,
    webs: &[WebPosition<'a>],
) -> Result<Vec<Cell<'a>>, MeshError> {
    let [x0, x1] = surface.span();
    let mut radii = vec![x0, 0.5 * (x0 + x1), x1];
    radii.extend(surface.sample_radii());
    for &x in &radii {
        let mut prev = f64::NEG_INFINITY;
        for (i, web) in webs.iter().enumerate() {
            let y = web(x);
            for (chain, f) in [("upper", 0), ("lower", 1)] {
                let at = |u: f64| if f == 0 { surface.upper(x, u) } else { surface.lower(x, u) }[0];
                let (front, back) = (at(0.0), at(1.0));
                if !(y > front && y < back) {
                    return Err(MeshError::Geometry(format!(
                        "web {} at x = {x:.6} m: y = {y:.6} m lies outside the {chain} chain \
                         ({front:.6} to {back:.6} m)",
                        i + 1
                    )));
                }
            }
            if y <= prev {
                return Err(MeshError::Geometry(format!(
                    "web {} at x = {x:.6} m: y = {y:.6} m is not behind web {i} ({prev:.6} m)",
                    i + 1
                )));
            }
            prev = y;
        }
    }
    let mut cells = Vec::with_capacity(webs.len() + 1);
    for i in 0..=webs.len() {
        let front = if i == 0 { None } else { Some(webs[i - 1]) };
        let back = webs.get(i).copied();
        cells.push(Cell { parent: surface, front, back });
    }
    Ok(cells)
}

/// The parameter where `chain(u)[0] == y`, for `y` between the chain's ends.
pub(crate) fn crossing(chain: impl Fn(f64) -> [f64; 2], y: f64) -> f64 {
    let f = |u: f64| chain(u)[0] - y;
    let (mut a, mut b) = (0.0, 1.0);
    let (mut fa, mut fb) = (f(a), f(b));
    if fa >= 0.0 {
        return 0.0;
    }
    if fb <= 0.0 {
        return 1.0;
    }
    let scale = fb - fa;
    let mut side = 0;
    for _ in 0..100 {
        let u = (a * fb - b * fa) / (fb - fa);
        let fu = f(u);
        if fu.abs() <= 1e-15 * scale || b - a <= 1e-15 {
            return u;
        }
        if fu < 0.0 {
            a = u;
            fa = fu;
            if side == -1 {
                fb *= 0.5;
            }
            side = -1;
        } else {
            b = u;
            fb = fu;
            if side == 1 {
                fa *= 0.5;
            }
            side = 1;
        }
    }
    0.5 * (a + b)
}

impl Cell<'_> {
    fn range(&self, x: f64, upper: bool) -> (f64, f64) {
        let chain = |u: f64| if upper { self.parent.upper(x, u) } else { self.parent.lower(x, u) };
        let lo = self.front.map_or(0.0, |w| crossing(chain, w(x)));
        let hi = self.back.map_or(1.0, |w| crossing(chain, w(x)));
        (lo, hi)
    }
}

impl SpanSurface for Cell<'_> {
    fn span(&self) -> [f64; 2] {
        self.parent.span()
    }
    fn upper(&self, x: f64, v: f64) -> [f64; 2] {
        let (a, b) = self.range(x, true);
        self.parent.upper(x, a + (b - a) * v)
    }
    fn lower(&self, x: f64, v: f64) -> [f64; 2] {
        let (a, b) = self.range(x, false);
        self.parent.lower(x, a + (b - a) * v)
    }
    fn chord_angle(&self, x: f64) -> Angle {
        self.parent.chord_angle(x)
    }
    fn ends(&self) -> ChainEnds {
        let parent = self.parent.ends();
        ChainEnds {
            front: if self.front.is_some() { EndKind::Segment } else { parent.front },
            back: if self.back.is_some() { EndKind::Segment } else { parent.back },
        }
    }
    fn sample_radii(&self) -> Vec<f64> {
        self.parent.sample_radii()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn crossing_finds_the_parameter_of_a_web() {
        // y = u² + u reaches y at u = (−1 + √(1 + 4y)) / 2 (quadratic formula).
        for y in [0.01, 0.5, 1.3, 1.99] {
            let u = crossing(|u| [u * u + u, 0.0], y);
            assert!((u - (-1.0 + (1.0 + 4.0 * y).sqrt()) / 2.0).abs() < 1e-13, "{y}");
        }
    }
}
