//! Loads per unit length along the span for one load case: centrifugal, gravity (less the
//! buoyancy of the displaced fluid when the case carries one) and external distributed loads,
//! and the concentrated loads of point masses (their own displaced volume is not known and is
//! neglected).

use super::LoadsError;
use crate::project::{DistributedLoadRow, LoadCaseSpec, PointMass};
use crate::section::SectionProperties;
use crate::units::Angle;

/// The load state per unit length at one radius, rotor frame.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub(super) struct LineLoad {
    /// Force per length (X, Y, Z), N/m.
    pub(super) f: [f64; 3],
    /// Where the force acts: (Y, Z) of its line of action, m.
    pub(super) at: [f64; 2],
    /// Moment per length about the pitch axis (X) not carried by `f`'s lever arm, N·m/m.
    pub(super) mx: f64,
}

/// A concentrated load (from a point mass) at a radius, rotor frame.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(super) struct PointLoad {
    pub(super) r: f64,
    pub(super) f: [f64; 3],
    pub(super) at: [f64; 2],
}

/// Mass properties of a section interpolated linearly in radius.
#[derive(Debug, Clone, Copy)]
struct MassState {
    m: f64,
    y: f64,
    z: f64,
    i_yy: f64,
    i_zz: f64,
    i_yz: f64,
    twist: f64,
}

fn mass_at(sections: &[SectionProperties], r: f64) -> MassState {
    let n = sections.len();
    let i = sections.partition_point(|s| s.r <= r).clamp(1, n - 1);
    let (a, b) = (&sections[i - 1], &sections[i]);
    let w = ((r - a.r) / (b.r - a.r)).clamp(0.0, 1.0);
    let lerp = |p: f64, q: f64| p + w * (q - p);
    MassState {
        m: lerp(a.mass_per_length, b.mass_per_length),
        y: lerp(a.mass_centre[0], b.mass_centre[0]),
        z: lerp(a.mass_centre[1], b.mass_centre[1]),
        i_yy: lerp(a.inertia.edge, b.inertia.edge),
        i_zz: lerp(a.inertia.flap, b.inertia.flap),
        i_yz: lerp(a.inertia.product, b.inertia.product),
        twist: lerp(a.twist.rad(), b.twist.rad()),
    }
}

/// Displaced area and its centroid at `r`, interpolated linearly (held beyond the ends).
fn buoyant_at(sections: &[crate::project::BuoyantSection], r: f64) -> (f64, [f64; 2]) {
    match sections {
        [] => (0.0, [0.0, 0.0]),
        [one] => (one.area, one.centroid),
        _ => {
            let i = sections.partition_point(|s| s.r <= r).clamp(1, sections.len() - 1);
            let (a, b) = (&sections[i - 1], &sections[i]);
            let w = ((r - a.r) / (b.r - a.r)).clamp(0.0, 1.0);
            let lerp = |p: f64, q: f64| p + w * (q - p);
            (
                lerp(a.area, b.area),
                [lerp(a.centroid[0], b.centroid[0]), lerp(a.centroid[1], b.centroid[1])],
            )
        }
    }
}

fn external_at(rows: &[DistributedLoadRow], r: f64, within: [f64; 2]) -> (f64, f64, f64) {
    // The table's ends are points of the integration grid, so an interval lies wholly inside
    // the table or wholly outside it; the load on an interval outside is zero up to its end,
    // where the table's first or last row would otherwise count (a step at a table's end gave
    // a spurious force of the step times a twenty-fourth of the interval).
    let (first, last) = match rows {
        [first, .., last] => (first.r, last.r),
        _ => return (0.0, 0.0, 0.0),
    };
    if within[0] < first - 1e-12 || within[1] > last + 1e-12 {
        return (0.0, 0.0, 0.0);
    }
    let i = rows.partition_point(|row| row.r <= r).clamp(1, rows.len() - 1);
    let (a, b) = (&rows[i - 1], &rows[i]);
    let w = ((r - a.r) / (b.r - a.r)).clamp(0.0, 1.0);
    let lerp = |p: f64, q: f64| p + w * (q - p);
    (lerp(a.f_flap, b.f_flap), lerp(a.f_edge, b.f_edge), lerp(a.m_pitch, b.m_pitch))
}

/// The loads of one case along the span: line loads evaluable at any radius and point loads.
#[derive(Debug, Clone)]
pub struct LoadDistribution<'a> {
    sections: &'a [SectionProperties],
    case: &'a LoadCaseSpec,
    omega: f64,
    pitch: Angle,
    pub(super) points: Vec<PointLoad>,
    pub(super) grid: Vec<f64>,
}

impl<'a> LoadDistribution<'a> {
    /// The distribution of `case` on a blade with these sections (root to tip; radii from the
    /// rotor axis), point masses and pitch setting.
    pub fn new(
        sections: &'a [SectionProperties],
        point_masses: &[PointMass],
        case: &'a LoadCaseSpec,
        pitch: Angle,
    ) -> Result<Self, LoadsError> {
        if sections.len() < 2 {
            return Err(LoadsError::TooFewSections(sections.len()));
        }
        for w in sections.windows(2) {
            if w[1].r <= w[0].r {
                return Err(LoadsError::Unordered { r: w[1].r, previous: w[0].r });
            }
        }
        let omega = case.omega;
        let mut d =
            LoadDistribution { sections, case, omega, pitch, points: Vec::new(), grid: Vec::new() };
        let k = case.load_factor;
        d.points = point_masses
            .iter()
            .map(|pm| {
                let phi = d.chord_angle(pm.r);
                let (s, c) = phi.sin_cos();
                let (y, z) = (pm.y * c - pm.z * s, pm.y * s + pm.z * c);
                let g = case.gravity.unwrap_or([0.0; 3]);
                let w2 = omega * omega;
                PointLoad {
                    r: pm.r,
                    f: [
                        k * pm.mass * (w2 * pm.r + g[0]),
                        k * pm.mass * (w2 * y + g[1]),
                        k * pm.mass * g[2],
                    ],
                    at: [y, z],
                }
            })
            .collect();
        let mut grid: Vec<f64> = sections.iter().map(|s| s.r).collect();
        let (r0, r1) = (grid[0], grid[grid.len() - 1]);
        grid.extend(case.distributed.iter().map(|row| row.r).filter(|&r| r > r0 && r < r1));
        grid.extend(d.points.iter().map(|p| p.r).filter(|&r| r > r0 && r < r1));
        grid.sort_by(f64::total_cmp);
        grid.dedup_by(|a, b| (*a - *b).abs() < 1e-12);
        d.grid = grid;
        Ok(d)
    }

    /// The same distribution with every grid interval split into `k` equal parts (for
    /// deflections and plots).
    pub fn refine(mut self, k: usize) -> Self {
        let k = k.max(1);
        let mut fine = Vec::with_capacity(self.grid.len() * k);
        for w in self.grid.windows(2) {
            for j in 0..k {
                fine.push(w[0] + (w[1] - w[0]) * j as f64 / k as f64);
            }
        }
        fine.extend(self.grid.last().copied());
        self.grid = fine;
        self
    }

    /// Rotor speed, rad/s.
    pub fn omega(&self) -> f64 {
        self.omega
    }

    /// The pitch setting of the case.
    pub fn pitch(&self) -> Angle {
        self.pitch
    }

    /// The case.
    pub fn case(&self) -> &LoadCaseSpec {
        self.case
    }

    /// Radii at which resultants are computed (sections, load rows, point masses), m.
    pub fn grid(&self) -> &[f64] {
        &self.grid
    }

    /// Chord angle (twist + pitch) at `r`, rad.
    pub fn chord_angle(&self, r: f64) -> f64 {
        mass_at(self.sections, r).twist + self.pitch.rad()
    }

    /// The factored line load at `r` on the grid interval `within` (its limit from inside the
    /// interval where the load file starts or ends with a step): centrifugal and gravity on the
    /// section's mass centre, the centrifugal twisting moment of its mass distribution, and the
    /// external loads on the pitch axis.
    pub(super) fn line_load(&self, r: f64, within: [f64; 2]) -> LineLoad {
        let s = mass_at(self.sections, r);
        let phi = s.twist + self.pitch.rad();
        let (sn, cs) = phi.sin_cos();
        let (ym, zm) = (s.y * cs - s.z * sn, s.y * sn + s.z * cs);
        let w2 = self.omega * self.omega;
        let g = self.case.gravity.unwrap_or([0.0; 3]);
        // Inertial loads on the mass centre.
        let fi = [s.m * (w2 * r + g[0]), s.m * (w2 * ym + g[1]), s.m * g[2]];
        // Product of inertia about the mass centre in the rotor frame.
        let (s2, c2) = (2.0 * phi).sin_cos();
        let i_yz_rotor = 0.5 * (s.i_yy - s.i_zz) * s2 + s.i_yz * c2;
        let ctm = -w2 * i_yz_rotor;
        let (flap, edge, m_pitch) = external_at(&self.case.distributed, r, within);
        // The inertial force acts on the mass centre and the external force on the pitch axis.
        // Both are carried as one force on the mass-centre line; since the external force has no
        // X part, that changes only the torque about X, which `mx` corrects by the external
        // force's lever arm: (0 f_Z - 0 f_Y) - (Y_m f_Z - Z_m f_Y) for the external part.
        let k = self.case.load_factor;
        // Buoyancy: the weight of the displaced fluid against gravity, at the centroid of the
        // displaced area; carried on the mass-centre line with the torque of the lever change.
        let (fb, mb) = match (&self.case.buoyancy, self.case.gravity) {
            (Some(b), Some(g)) => {
                let (area, [cy, cz]) = buoyant_at(&b.sections, r);
                let (yb, zb) = (cy * cs - cz * sn, cy * sn + cz * cs);
                let f =
                    [-b.density * area * g[0], -b.density * area * g[1], -b.density * area * g[2]];
                (f, (yb - ym) * f[2] - (zb - zm) * f[1])
            }
            _ => ([0.0; 3], 0.0),
        };
        LineLoad {
            f: [k * (fi[0] + fb[0]), k * (fi[1] + edge + fb[1]), k * (fi[2] + flap + fb[2])],
            at: [ym, zm],
            mx: k * (ctm + m_pitch - ym * flap + zm * edge + mb),
        }
    }
}
