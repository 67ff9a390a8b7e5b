//! The laminates' content per unit span: mass, volume and resin mass of the ply schedule at a
//! radius, and a table of it on the span-wise integration grid computed once per blade.
//!
//! At a radius the outline is the blend of the two neighbouring stations' outlines, each
//! resampled once per blade (see `loft::ResampledOutlines`); each wall segment of the outer mould
//! line (`n` intervals a surface) counts its length times the content per unit area of the
//! laminate at its mid chord fraction, the base of a blunt trailing edge that of the upper
//! trailing-edge laminate, and each web its depth less the two skins times its own laminate's.
//! The plies that hold the radius are sorted out once per radius, so each segment only tests the
//! chord range of those.
//!
//! The table (midpoint rule, [`SPAN_INTERVALS`] intervals from root to tip, [`SURFACE_INTERVALS`]
//! intervals a surface) is what the blade's mass ([`crate::analysis::BladeModel::mass`]) and the
//! tooling's ply-schedule content both integrate: one pass over the span serves both.

use super::{Blade, BladeError, ResolvedPly};
use crate::airfoil::Outline;
use crate::material::LaminaKind;
use crate::project::{Region, WebSpec};

/// Intervals of the span-wise midpoint rule.
pub(crate) const SPAN_INTERVALS: usize = 400;
/// Intervals a surface of the outline at each integration radius.
pub(crate) const SURFACE_INTERVALS: usize = 120;

/// Tolerance on radii and chord fractions at range ends (as the coverage rules).
const EPS: f64 = 1e-9;

/// Content per unit area of one ply: thickness (m), mass (kg/m²), resin (kg/m², `None` where the
/// lamina lacks its fibre volume fraction or resin density; none in an isotropic layer).
#[derive(Debug, Clone, Copy)]
struct PlyContent {
    from: f64,
    to: f64,
    thickness: f64,
    mass: f64,
    resin: Option<f64>,
}

impl PlyContent {
    fn of(p: &ResolvedPly) -> Self {
        let m = &p.material;
        let thickness = m.ply_thickness;
        let resin = match (m.kind, m.fibre_volume_fraction, m.resin_density) {
            (LaminaKind::Isotropic, _, _) => Some(0.0),
            (_, Some(vf), Some(rho)) => Some((1.0 - vf) * rho * thickness),
            _ => None,
        };
        PlyContent {
            from: p.spec.from,
            to: p.spec.to,
            thickness,
            mass: thickness * m.density,
            resin,
        }
    }

    /// The chord rule of the coverage (`from <= x < to`, the trailing edge included).
    fn covers_chord(&self, x: f64) -> bool {
        let x = x.clamp(0.0, 1.0);
        (x >= self.from - EPS && x < self.to - EPS) || (x >= 1.0 - EPS && self.to >= 1.0 - EPS)
    }
}

/// Content per unit area of a stack of plies, summed outermost first as a laminate sums them.
#[derive(Debug, Clone, Copy)]
struct AreaContent {
    thickness: f64,
    mass: f64,
    resin: Option<f64>,
}

impl AreaContent {
    fn of<'a>(plies: impl Iterator<Item = &'a PlyContent>) -> Self {
        // `-0.0` is the start of `Iterator::sum` for floats.
        let mut c = AreaContent { thickness: -0.0, mass: -0.0, resin: Some(0.0) };
        for p in plies {
            c.thickness += p.thickness;
            c.mass += p.mass;
            c.resin = c.resin.zip(p.resin).map(|(a, b)| a + b);
        }
        c
    }
}

/// Content per unit span summed over lengths of laminate.
struct Sum {
    volume: f64,
    mass: f64,
    resin: Option<f64>,
}

impl Sum {
    fn add(&mut self, len: f64, a: AreaContent) {
        self.volume += len * a.thickness;
        self.mass += len * a.mass;
        self.resin = self.resin.zip(a.resin).map(|(x, y)| x + len * y);
    }
}

/// The laminates' content per unit span at one radius.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct SpanContentRow {
    /// Radius, m.
    pub r: f64,
    /// Mass per unit span with the webs that stand at `r` by [`Blade::web_present`], kg/m.
    pub mass: f64,
    /// Mass per unit span with every web whose span range holds `r` ends included, kg/m (the
    /// tooling's reckoning; it differs from `mass` only within `1e-9` m of a web's end).
    pub schedule_mass: f64,
    /// Laminate volume per unit span (webs as `schedule_mass`), m³/m.
    pub volume: f64,
    /// Resin mass per unit span (webs as `schedule_mass`), kg/m; `None` where a ply's lamina
    /// lacks its fibre volume fraction or resin density.
    pub resin: Option<f64>,
}

/// The laminates' content per unit span at the midpoints of [`SPAN_INTERVALS`] equal intervals
/// from root to tip.
#[derive(Debug, Clone, PartialEq)]
pub(crate) struct SpanContent {
    /// Width of an interval, m.
    pub h: f64,
    /// One row per interval, root to tip.
    pub rows: Vec<SpanContentRow>,
}

impl Blade {
    /// The laminates' content per unit span on the integration grid, computed once and kept.
    pub(crate) fn span_content(&self) -> &SpanContent {
        self.span_content.get_or_init(|| {
            let (r0, r1) = (self.root_radius(), self.tip_radius());
            let n = SPAN_INTERVALS;
            let h = (r1 - r0) / n as f64;
            let rows = (0..n)
                .map(|i| {
                    // Midpoint rule: never samples exactly at a drop-off.
                    let r = r0 + (i as f64 + 0.5) * h;
                    self.content_row(r, SURFACE_INTERVALS).unwrap_or(SpanContentRow {
                        r,
                        mass: 0.0,
                        schedule_mass: 0.0,
                        volume: 0.0,
                        resin: Some(0.0),
                    })
                })
                .collect();
            SpanContent { h, rows }
        })
    }

    /// The laminates' content per unit span at radius `r`, the outline with `n_per_surface`
    /// intervals a surface.
    pub(crate) fn content_row(
        &self,
        r: f64,
        n_per_surface: usize,
    ) -> Result<SpanContentRow, BladeError> {
        let outline = self.outline(r, n_per_surface)?;
        Ok(self.content_on(r, &outline))
    }

    fn content_on(&self, r: f64, outline: &Outline) -> SpanContentRow {
        let tip = self.tip_radius();
        let holds_r = |p: &&ResolvedPly| {
            let s = &p.spec;
            (r >= s.r_start - EPS && r < s.r_end - EPS) || (r >= tip - EPS && s.r_end >= tip - EPS)
        };
        let on = |upper: bool| -> Vec<PlyContent> {
            self.plies
                .iter()
                .filter(|p| match &p.spec.region {
                    Region::Both => true,
                    Region::Upper => upper,
                    Region::Lower => !upper,
                    Region::Web(_) => false,
                })
                .filter(holds_r)
                .map(PlyContent::of)
                .collect()
        };
        let (upper, lower) = (on(true), on(false));
        let at = |plies: &[PlyContent], x: f64| {
            AreaContent::of(plies.iter().filter(|p| p.covers_chord(x)))
        };
        let c = self.chord(r);
        let mut sum = Sum { volume: 0.0, mass: 0.0, resin: Some(0.0) };
        for (plies, pts) in [(&upper, &outline.upper), (&lower, &outline.lower)] {
            for w in pts.windows(2) {
                let x = 0.5 * (w[0][0] + w[1][0]);
                let len = c * (w[1][0] - w[0][0]).hypot(w[1][1] - w[0][1]);
                sum.add(len, at(plies, x));
            }
        }
        if outline.blunt_te() {
            let (u, l) =
                (outline.upper[outline.upper.len() - 1], outline.lower[outline.lower.len() - 1]);
            sum.add(c * (u[0] - l[0]).hypot(u[1] - l[1]), at(&upper, 1.0));
        }
        // The webs: those that stand at `r` count in the blade's mass; those whose span range
        // holds `r`, ends included, in the schedule's content.
        let mut blade_mass = sum.mass;
        for web in &self.webs {
            let stands = self.web_present(web, r);
            let in_schedule = r >= web.r_start - EPS && r <= web.r_end + EPS;
            if !stands && !in_schedule {
                continue;
            }
            let (depth, lam) = self.web_content(web, r, outline, c, &upper, &lower);
            if stands {
                blade_mass += depth * lam.mass;
            }
            if in_schedule {
                sum.add(depth, lam);
            }
        }
        SpanContentRow {
            r,
            mass: blade_mass,
            schedule_mass: sum.mass,
            volume: sum.volume,
            resin: sum.resin,
        }
    }

    /// The depth of a web between the skins (m) and its laminate's content per unit area.
    fn web_content(
        &self,
        web: &WebSpec,
        r: f64,
        outline: &Outline,
        c: f64,
        upper: &[PlyContent],
        lower: &[PlyContent],
    ) -> (f64, AreaContent) {
        let tip = self.tip_radius();
        let depth = outline.depth_at(web.chord_frac) * c;
        let skin = |plies: &[PlyContent]| {
            AreaContent::of(plies.iter().filter(|p| p.covers_chord(web.chord_frac))).thickness
        };
        let walls = skin(upper) + skin(lower);
        let plies: Vec<PlyContent> = self
            .plies
            .iter()
            .filter(|p| {
                let s = &p.spec;
                matches!(&s.region, Region::Web(w) if *w == web.name)
                    && ((r >= s.r_start - EPS && r < s.r_end - EPS)
                        || (r >= tip - EPS && s.r_end >= tip - EPS))
            })
            .map(PlyContent::of)
            .collect();
        ((depth - walls).max(0.0), AreaContent::of(plies.iter()))
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::blade::Surface;
    use crate::input::read_project;

    /// The content at `r` summed laminate by laminate, as the blade's mass and the tooling's
    /// schedule content were summed before the table: the laminate of each segment built and
    /// weighed.
    fn by_laminates(b: &Blade, r: f64) -> (f64, f64) {
        let outline = b.outline(r, SURFACE_INTERVALS).unwrap();
        let c = b.chord(r);
        let (mut m, mut v) = (0.0, 0.0);
        for (surface, pts) in [(Surface::Upper, &outline.upper), (Surface::Lower, &outline.lower)] {
            for w in pts.windows(2) {
                let x = 0.5 * (w[0][0] + w[1][0]);
                let len = c * (w[1][0] - w[0][0]).hypot(w[1][1] - w[0][1]);
                let lam = b.surface_laminate(r, surface, x);
                m += len * lam.areal_mass();
                v += len * lam.thickness();
            }
        }
        if outline.blunt_te() {
            let (u, l) =
                (outline.upper[outline.upper.len() - 1], outline.lower[outline.lower.len() - 1]);
            let lam = b.surface_laminate(r, Surface::Upper, 1.0);
            let len = c * (u[0] - l[0]).hypot(u[1] - l[1]);
            m += len * lam.areal_mass();
            v += len * lam.thickness();
        }
        for web in b.webs.iter().filter(|w| b.web_present(w, r)) {
            let depth = outline.depth_at(web.chord_frac) * c;
            let lam = b.web_laminate(r, &web.name);
            let walls = b.surface_thickness(r, Surface::Upper, web.chord_frac)
                + b.surface_thickness(r, Surface::Lower, web.chord_frac);
            m += (depth - walls).max(0.0) * lam.areal_mass();
            v += (depth - walls).max(0.0) * lam.thickness();
        }
        (m, v)
    }

    #[test]
    fn the_table_sums_what_the_laminates_sum_bit_for_bit() {
        // The demos (a blunt trailing edge, drop-offs, webs ending inside the span): the table's
        // rows equal the laminate-by-laminate sums exactly, so the blade mass and the schedule
        // content did not change by the last digit.
        let root = env!("CARGO_MANIFEST_DIR");
        for demo in ["layups/mine-fan/blade.toml", "layups/small-wind/blade.toml"] {
            let p = read_project(format!("{root}/{demo}").as_ref()).unwrap();
            let b = Blade::from_project(&p).unwrap();
            let table = b.span_content();
            assert_eq!(table.rows.len(), SPAN_INTERVALS);
            for row in table.rows.iter().step_by(7) {
                let (m, v) = by_laminates(&b, row.r);
                assert_eq!(row.mass.to_bits(), m.to_bits(), "{demo}: r = {}", row.r);
                assert_eq!(row.schedule_mass.to_bits(), m.to_bits(), "{demo}: r = {}", row.r);
                assert_eq!(row.volume.to_bits(), v.to_bits(), "{demo}: r = {}", row.r);
            }
        }
    }
}
