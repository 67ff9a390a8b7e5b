//! Local buckling of the compressed walls and the failure modes of sandwich walls.
//!
//! Every wall panel of a section (see [`find_panels`]: skin panels between webs, corners and the
//! edges of ply regions, spar caps, webs) is taken as a long plate, simply supported or clamped
//! along its long edges (`[buckling] edge_fixity`), under the worst membrane resultants along it
//! from the stress recovery: the most compressive `N_x` and the largest shear flow `N_xs` of
//! either sign, taken together as uniform (on the safe side where they vary across the panel,
//! as on a web in bending).
//!
//! - **Flat plate** ([`LongPlate`]): Rayleigh–Ritz across the width with a skewed wave along
//!   the span, from the wall's bending stiffness `D` with `D16` and `D26` (handled, not
//!   bounded); for an unsymmetric wall the reduced stiffness `D - B A^-1 B` (lower, so on the
//!   safe side). Checks: isotropic long plates k = 4 and 6.97 in compression, 5.35 and 8.98 in
//!   shear (Timoshenko & Gere, *Theory of Elastic Stability*, 1961), Whitney's orthotropic
//!   closed form (`tests/validation_buckling.rs`).
//! - **Curvature** ([`curvature_gain`], [`LongPlate::curved_shear`], [`cylinder_torsion`]): the
//!   gain of a curved panel over the flat one in compression, by the shallow-shell equations with
//!   the NASA SP-8007 knock-down, and in shear, by the same membrane term in the Ritz solution
//!   (simply supported edges), a closed wall also as a long tube in torsion, the gain knocked
//!   down to [`SHEAR_KNOCK_DOWN`].
//! - **Sandwich** ([`SandwichWall`]): the core's transverse shear flexibility lowers the panel
//!   load; face wrinkling, shear crimping and core shear are checked.
//! - **Interaction** of compression and shear: `R_c + R_s² = 1`, `R_c = -N_x/N_cr`,
//!   `R_s = N_xs/N_xs,cr` (the rule for flat plates under compression and shear in Bruhn,
//!   *Analysis and Design of Flight Vehicle Structures*, 1973, §C5, after Gerard & Becker,
//!   NACA TN 3781, 1957; from memory). A tensile `N_x` is given no credit.
//!
//! The buckling reserve factor of a panel is the multiplier `lambda` on its load with
//! `lambda R_c + lambda² R_s² = 1`; the panel's reserve factor is the least of that and its
//! sandwich factors.
//!
//! ```
//! use layloft::buckling::{EdgeSupport, LongPlate, ShearFlexibility};
//! use nalgebra::Matrix3;
//!
//! // Aluminium plate 2 mm thick, 100 mm wide, simply supported: k = 4.
//! let (e, nu, t, b) = (70e9, 0.3, 2e-3, 0.1);
//! let d0 = e * t * t * t / (12.0 * (1.0 - nu * nu));
//! let d = Matrix3::new(d0, nu * d0, 0.0, nu * d0, d0, 0.0, 0.0, 0.0, 0.5 * (1.0 - nu) * d0);
//! let c = LongPlate::new(EdgeSupport::SimplySupported).critical(&d, b, ShearFlexibility(f64::INFINITY));
//! let k = c.compression * b * b / (std::f64::consts::PI.powi(2) * d0);
//! assert!((k - 4.0).abs() < 1e-3);
//! ```

mod curved;
mod panels;
mod plate;
mod sandwich;

pub use curved::{
    SHEAR_KNOCK_DOWN, curvature_gain, curved_panel_compression, cylinder_classical,
    cylinder_torsion, knock_down,
};
pub use panels::{CurvatureGain, Panel, PanelPart, PanelSolver, find_panels};
pub use plate::{
    Curvature, EdgeSupport, LongPlate, PlateCritical, ShearFlexibility, orthotropic_long_plate_ss,
    reduced_bending_stiffness,
};
pub use sandwich::{SandwichFactors, SandwichWall};

/// What the analysis does not cover, one line each: printed by `check` and the reports so that
/// nothing is left out silently.
pub const NOT_COVERED: &[&str] = &[
    "fatigue: no cyclic load spectrum, S-N data or damage sum",
    "the bonded or bolted root joint and the root fitting",
    "Coriolis and gyroscopic loads, and flutter or other aeroelastic instability",
    "pressure and impact on the panels: core shear and indentation under transverse load",
    "buckling of the solid trailing-edge laminate (one free edge) and of the blade as a whole",
    "post-buckling, stress concentrations at ply drops, delamination, holes and cut-outs, manufacturing flaws",
    "temperature and moisture knock-downs of the material allowables",
];

/// Which mode governs a panel's reserve factor.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum BucklingMode {
    /// Panel buckling under compression and shear.
    Panel,
    /// Face wrinkling of a sandwich.
    Wrinkling,
    /// Shear crimping of a sandwich.
    Crimping,
    /// Core shear of a sandwich.
    CoreShear,
}

impl BucklingMode {
    /// Stable key for JSON and CSV.
    pub fn key(self) -> &'static str {
        match self {
            BucklingMode::Panel => "panel_buckling",
            BucklingMode::Wrinkling => "face_wrinkling",
            BucklingMode::Crimping => "shear_crimping",
            BucklingMode::CoreShear => "core_shear",
        }
    }

    /// Words for a reader.
    pub fn label(self) -> &'static str {
        match self {
            BucklingMode::Panel => "panel buckling",
            BucklingMode::Wrinkling => "face wrinkling",
            BucklingMode::Crimping => "shear crimping",
            BucklingMode::CoreShear => "core shear",
        }
    }
}

/// The load multiplier `lambda` with `lambda R_c + lambda² R_s² = 1` (infinite when neither
/// ratio is positive). The positive root is taken as `2 / (R_c + sqrt(R_c² + 4 R_s²))`, the
/// form without cancellation: the textbook `(-R_c + sqrt(R_c² + 4 R_s²)) / (2 R_s²)` loses every
/// digit when `R_s²` is below round-off of `R_c²`, and gave 0 for a compressed panel with a
/// trace of shear.
pub fn interaction_factor(r_c: f64, r_s: f64) -> f64 {
    let r_c = r_c.max(0.0);
    let r_s = r_s.abs();
    if r_c == 0.0 && r_s == 0.0 {
        return f64::INFINITY;
    }
    2.0 / (r_c + (r_c * r_c + 4.0 * r_s * r_s).sqrt())
}

/// A panel's check under one load case.
#[derive(Debug, Clone, PartialEq)]
pub struct PanelCheck {
    /// Most compressive `N_x` along the panel, N/m (negative is compression), as carried by the
    /// panel's laminate (see [`Panel::compression_scale`]).
    pub n_x: f64,
    /// Shear flow `N_xs` of the governing sign along the panel, N/m.
    pub n_xs: f64,
    /// Compression ratio `R_c = -N_x / N_cr` (0 in tension).
    pub r_c: f64,
    /// Shear ratio `R_s`.
    pub r_s: f64,
    /// Panel buckling reserve factor by the interaction rule.
    pub buckling: f64,
    /// Sandwich factors (the least over the panel's points), when a sandwich.
    pub sandwich: Option<SandwichFactors>,
    /// The least of all.
    pub reserve_factor: f64,
    /// Which mode gives it.
    pub mode: BucklingMode,
}

/// Checks a panel against the wall resultants `(N_x, N_xs)` (N/m) at each of its elements (in
/// the order of [`Panel::elements`]).
pub fn check_panel(panel: &Panel, resultants: &[(f64, f64)]) -> PanelCheck {
    let scale = |i: usize| panel.compression_scale.get(i).copied().unwrap_or(1.0);
    let n_x = resultants
        .iter()
        .enumerate()
        .map(|(i, r)| r.0 * scale(i))
        .fold(f64::INFINITY, f64::min)
        .min(0.0);
    let pos = resultants.iter().map(|r| r.1).fold(0.0, f64::max);
    let neg = resultants.iter().map(|r| -r.1).fold(0.0, f64::max);
    let c = &panel.critical;
    let r_c = if n_x < 0.0 { -n_x / c.compression } else { 0.0 };
    let (rp, rn) = (pos / c.shear_positive, neg / c.shear_negative);
    let (r_s, n_xs) = if rp >= rn { (rp, pos) } else { (rn, -neg) };
    let buckling = interaction_factor(r_c, r_s);
    let mut sandwich: Option<SandwichFactors> = None;
    for (i, &(nx, nxs)) in resultants.iter().enumerate() {
        let Some(Some(w)) = panel.element_sandwich.get(i) else { continue };
        let f = w.factors(nx, nxs);
        sandwich = Some(match sandwich {
            None => f,
            Some(acc) => SandwichFactors {
                wrinkling: acc.wrinkling.min(f.wrinkling),
                crimping: acc.crimping.min(f.crimping),
                core_shear: acc.core_shear.min(f.core_shear),
            },
        });
    }
    let mut reserve_factor = buckling;
    let mut mode = BucklingMode::Panel;
    if let Some(s) = &sandwich {
        for (v, m) in [
            (s.wrinkling, BucklingMode::Wrinkling),
            (s.crimping, BucklingMode::Crimping),
            (s.core_shear, BucklingMode::CoreShear),
        ] {
            if v < reserve_factor {
                reserve_factor = v;
                mode = m;
            }
        }
    }
    PanelCheck { n_x, n_xs, r_c, r_s, buckling, sandwich, reserve_factor, mode }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn interaction_meets_both_ends_and_the_rule() {
        assert!((interaction_factor(0.5, 0.0) - 2.0).abs() < 1e-12);
        assert!((interaction_factor(0.0, 0.5) - 2.0).abs() < 1e-12);
        assert_eq!(interaction_factor(0.0, 0.0), f64::INFINITY);
        let (rc, rs) = (0.4, 0.7);
        let l = interaction_factor(rc, rs);
        assert!((l * rc + (l * rs).powi(2) - 1.0).abs() < 1e-12);
    }

    /// A compressed panel with a trace of shear (R_s² below round-off of R_c²) buckles at the
    /// compression alone, 1/R_c; the textbook root gave 0 there.
    #[test]
    fn a_trace_of_shear_leaves_the_compression_factor() {
        for (rc, rs) in [(5.66, 1e-14), (0.3, 1e-9), (2.0, 1e-6)] {
            let l = interaction_factor(rc, rs);
            assert!((l * rc - 1.0).abs() < 1e-11, "{rc} {rs}: {l}");
            assert!((l * rc + (l * rs).powi(2) - 1.0).abs() < 1e-12);
        }
        // Shear alone: 1/R_s, however small.
        assert!((interaction_factor(0.0, 1e-12) * 1e-12 - 1.0).abs() < 1e-12);
    }
}
