//! Which plies cover a point: the laminate of a surface point or a web at a radius.

use std::fmt;

use super::{Blade, ResolvedPly};
use crate::laminate::{Laminate, Ply};
use crate::project::{Region, WebSpec};

/// A surface of the blade.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Surface {
    /// Upper (suction) surface, `z > 0` in the chord frame.
    Upper,
    /// Lower (pressure) surface.
    Lower,
}

impl fmt::Display for Surface {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            Surface::Upper => "upper",
            Surface::Lower => "lower",
        })
    }
}

/// Tolerance on radii and chord fractions at range ends.
const EPS: f64 = 1e-9;

fn covers_span(p: &ResolvedPly, r: f64, tip: f64) -> bool {
    let s = &p.spec;
    (r >= s.r_start - EPS && r < s.r_end - EPS) || (r >= tip - EPS && s.r_end >= tip - EPS)
}

fn covers_chord(p: &ResolvedPly, x: f64) -> bool {
    let s = &p.spec;
    // The upper surface of a cambered section reaches slightly ahead of the chord line's end.
    let x = x.clamp(0.0, 1.0);
    (x >= s.from - EPS && x < s.to - EPS) || (x >= 1.0 - EPS && s.to >= 1.0 - EPS)
}

impl Blade {
    /// Whether a web stands at radius `r`: from its start up to, not including, its end (the
    /// tip included), the same span rule as a ply's, so a web ending at any radius (a station,
    /// a ply end) is simply absent from there on.
    pub fn web_present(&self, web: &WebSpec, r: f64) -> bool {
        let tip = self.tip_radius();
        (r >= web.r_start - EPS && r < web.r_end - EPS)
            || (r >= tip - EPS && web.r_end >= tip - EPS && r >= web.r_start - EPS)
    }

    /// Indices (in `plies.csv` order, outermost first) of the plies covering a surface point.
    pub(crate) fn surface_ply_indices(&self, r: f64, surface: Surface, x: f64) -> Vec<usize> {
        self.chord_ply_indices(&self.surface_span_plies(r, surface), x)
    }

    /// Indices (in `plies.csv` order) of the plies of a surface that cover radius `r` at some
    /// chord position: the candidates of [`Blade::chord_ply_indices`], found once per station
    /// so that naming the plies of each of its wall segments does not scan the whole schedule.
    pub(crate) fn surface_span_plies(&self, r: f64, surface: Surface) -> Vec<usize> {
        let tip = self.tip_radius();
        self.plies
            .iter()
            .enumerate()
            .filter(|(_, p)| {
                let on_surface = matches!(
                    (&p.spec.region, surface),
                    (Region::Both, _)
                        | (Region::Upper, Surface::Upper)
                        | (Region::Lower, Surface::Lower)
                );
                on_surface && covers_span(p, r, tip)
            })
            .map(|(i, _)| i)
            .collect()
    }

    /// Those of `candidates` (from [`Blade::surface_span_plies`]) that cover chord fraction `x`,
    /// in the same order.
    pub(crate) fn chord_ply_indices(&self, candidates: &[usize], x: f64) -> Vec<usize> {
        candidates.iter().copied().filter(|&i| covers_chord(&self.plies[i], x)).collect()
    }

    /// Indices of the plies of a web at a radius.
    pub(crate) fn web_ply_indices(&self, r: f64, web: &str) -> Vec<usize> {
        let tip = self.tip_radius();
        self.plies
            .iter()
            .enumerate()
            .filter(|(_, p)| {
                matches!(&p.spec.region, Region::Web(w) if w == web) && covers_span(p, r, tip)
            })
            .map(|(i, _)| i)
            .collect()
    }

    /// The laminate made of the given plies, in order.
    pub(crate) fn laminate_of(&self, indices: &[usize]) -> Laminate {
        Laminate::new(
            indices
                .iter()
                .map(|&i| {
                    Ply::of_schedule(self.plies[i].material.clone(), self.plies[i].spec.angle, i)
                })
                .collect(),
        )
    }

    /// The laminate of a surface point at radius `r` and chord fraction `x` (outermost ply first).
    pub fn surface_laminate(&self, r: f64, surface: Surface, x: f64) -> Laminate {
        self.laminate_of(&self.surface_ply_indices(r, surface, x))
    }

    /// Total laminate thickness of a surface point, m.
    pub fn surface_thickness(&self, r: f64, surface: Surface, x: f64) -> f64 {
        self.surface_ply_indices(r, surface, x)
            .iter()
            .map(|&i| self.plies[i].material.ply_thickness)
            .sum()
    }

    /// The laminate of a web at radius `r`; empty where the web has no plies.
    pub fn web_laminate(&self, r: f64, web: &str) -> Laminate {
        self.laminate_of(&self.web_ply_indices(r, web))
    }

    /// Mass per unit length of the laminates by ply areas times densities at radius `r`, kg/m,
    /// integrated over the outline with `n_per_surface` intervals per surface (walls at the outer
    /// mould line, webs over the local depth): the check that the section solver's mass agrees.
    pub fn ply_mass_per_length(
        &self,
        r: f64,
        n_per_surface: usize,
    ) -> Result<f64, super::BladeError> {
        Ok(self.content_row(r, n_per_surface)?.mass)
    }
}
