//! The lofted blade: stations interpolated along the span, the ply schedule resolved into the
//! laminate at any point of any section, webs, and the wall layout that the section solver takes.
//!
//! Chord, twist and pitch-axis position are interpolated between stations by a monotone
//! piecewise cubic (Fritsch & Carlson 1980), so they never overshoot the given values; outlines
//! are resampled at normalised arc length with clustering at both edges and blended linearly in
//! radius between neighbouring stations (common practice for lofting blades).
//!
//! Ply coverage: the laminate at a point is the ordered stack (outermost first, as listed in
//! `plies.csv`) of the plies whose span range holds the radius (`r_start <= r < r_end`, the tip
//! included) and, for surface plies, whose chord range holds the chord fraction
//! (`from <= x < to`, the trailing edge included). A ply that ends inside the span drops off there.
//!
//! Rotor frame (used for 3D geometry): origin on the rotor axis where the pitch axis meets it,
//! `X` along the pitch axis, `Y` in the plane of rotation, `Z` along the rotor axis, downstream.
//! A section's chord frame is turned about `X` by the chord angle `phi = twist + pitch`:
//! `Y = y cos phi − z sin phi`, `Z = y sin phi + z cos phi`, so a positive chord angle moves the
//! trailing edge downstream.
//!
//! ```no_run
//! use layloft::blade::Blade;
//! use layloft::input::read_project;
//!
//! # fn main() -> Result<(), layloft::Error> {
//! let project = read_project("layups/mine-fan/blade.toml".as_ref())?;
//! let blade = Blade::from_project(&project)?;
//! let layout = blade.section_layout(0.6, 240)?;
//! assert!(layout.outer.len() >= 240);
//! # Ok(())
//! # }
//! ```

mod coverage;
mod layout;
mod loft;
mod mass;
pub(crate) use mass::SURFACE_INTERVALS;
mod surface;
mod warning;
pub(crate) use surface::{AtRadius, OuterJet, RadiusRates, smooth_step};

pub use coverage::Surface;
pub use surface::{BladeSurfaces, CORE_EDGE_TAPER, PLY_DROP_TAPER};
pub use warning::BladeWarning;

use std::sync::{Arc, OnceLock};

use crate::airfoil::{Naca4, Outline};
use crate::material::{Lamina, MaterialError};
use crate::project::{AirfoilSpec, PlySpec, Project, Rotor, WebSpec};
use crate::units::Angle;

/// The lean of the surface (its area over that of the strips a section sees) above which the
/// blade warns: 5 % of laminate mass and wall stiffness not seen by the sections (common
/// practice: a model error beyond about 5 % is worth saying).
pub const LEAN_WARNING: f64 = 1.05;

/// What can go wrong when building the blade or one of its sections. The errors name a station
/// or ply by its index in the project and a place by its radius; the command line names the
/// file and line (`Error::at_station`).
#[derive(Debug, thiserror::Error)]
pub enum BladeError {
    /// A station's airfoil that gives no outline (a NACA code the reader did not check).
    #[error("station {} (counted from the root): {message}", .station + 1)]
    Airfoil {
        /// Index of the station in the project.
        station: usize,
        /// What is wrong.
        message: String,
    },
    /// A material reference.
    #[error(transparent)]
    Material(#[from] MaterialError),
    /// A radius outside the blade.
    #[error("r = {r} m is outside the blade ({root}..{tip} m)")]
    OutsideSpan {
        /// The radius asked for.
        r: f64,
        /// Root radius.
        root: f64,
        /// Tip radius.
        tip: f64,
    },
    /// A point of the skin that no ply covers.
    #[error(
        "no ply covers the {surface} surface at x/c = {}, r = {r:.4} m: the skin has a hole there",
        crate::text::fixed(*x, 3)
    )]
    NoPlies {
        /// Which surface.
        surface: Surface,
        /// Chord fraction.
        x: f64,
        /// Radius, m.
        r: f64,
    },
    /// A web that exists at a radius but has no plies there.
    #[error(
        "web '{web}' has no plies at r = {r:.4} m (give it web:{web} plies over its whole span)"
    )]
    WebWithoutPlies {
        /// The web.
        web: String,
        /// Radius, m.
        r: f64,
    },
    /// Walls that fill the section depth where the section must be hollow.
    #[error(
        "at r = {r:.4} m (station {} from the root is the nearest), x/c = {} {}",
        .station + 1,
        crate::text::fixed(*x, 3),
        BladeError::thicker_text(*upper_mm, *lower_mm, *depth_mm)
    )]
    TooThick {
        /// Radius, m.
        r: f64,
        /// Index in the project of the station nearest `r`.
        station: usize,
        /// Chord fraction.
        x: f64,
        /// Upper wall laminate thickness, mm.
        upper_mm: f64,
        /// Lower wall laminate thickness, mm.
        lower_mm: f64,
        /// Local section depth normal to the chord, mm.
        depth_mm: f64,
    },
}

impl BladeError {
    /// The words of [`BladeError::TooThick`] after its place.
    pub fn thicker_text(upper_mm: f64, lower_mm: f64, depth_mm: f64) -> String {
        format!(
            "the laminates are thicker than the section: upper {upper_mm:.2} mm + lower \
             {lower_mm:.2} mm against a depth of {depth_mm:.2} mm"
        )
    }
}

/// One station with its outline resolved.
#[derive(Debug, Clone)]
pub(crate) struct ResolvedStation {
    pub(crate) r: f64,
    pub(crate) outline: Outline,
}

/// A ply of the schedule with its material resolved.
#[derive(Debug, Clone)]
pub(crate) struct ResolvedPly {
    pub(crate) spec: PlySpec,
    pub(crate) material: Arc<Lamina>,
}

/// The lofted blade of a project.
#[derive(Debug, Clone)]
pub struct Blade {
    name: String,
    rotor: Rotor,
    stations: Vec<ResolvedStation>,
    loft: loft::SpanInterpolation,
    plies: Vec<ResolvedPly>,
    webs: Vec<WebSpec>,
    /// What was changed to read the coordinate files (points reversed, repeats removed).
    notes: Vec<String>,
    /// The stations' outlines resampled once per count of intervals.
    resampled: loft::ResampledOutlines,
    /// The laminates' content per unit span on the integration grid, computed on first use.
    span_content: OnceLock<mass::SpanContent>,
    /// The stations' outlines as splines in arc length, for [`Blade::surfaces`], made on first
    /// use and shared by every surfaces value of the blade.
    station_curves: OnceLock<Arc<[surface::StationCurve]>>,
    /// Where the outer mould line leans most from the span direction and its area ratio there
    /// (see `BladeSurfaces::greatest_lean`), worked out on first use: every list of the blade's
    /// warnings holds it.
    greatest_lean: OnceLock<Option<(f64, f64)>>,
}

/// The inboard side of a ply or web edge is checked this fraction of the span inboard of it
/// ([`Blade::check_radii`]): 0.1 mm on a 1 m span, where the moment differs from the edge's by
/// about that fraction, and far from round-off.
pub const EDGE_SIDE: f64 = 1e-4;

impl Blade {
    /// Resolves the project's airfoils and materials into a blade.
    pub fn from_project(project: &Project) -> Result<Blade, BladeError> {
        let mut stations = Vec::with_capacity(project.stations.len());
        let mut notes = Vec::new();
        for (index, s) in project.stations.iter().enumerate() {
            let outline = match &s.airfoil {
                AirfoilSpec::Naca4 { code, closed_te } => {
                    let naca = Naca4::parse(code, *closed_te).map_err(|e| BladeError::Airfoil {
                        station: index,
                        message: e.to_string(),
                    })?;
                    Outline::from_naca(&naca, 801)
                }
                AirfoilSpec::File { outline, notes: file_notes, .. } => {
                    for note in file_notes {
                        if !notes.contains(note) {
                            notes.push(note.clone());
                        }
                    }
                    outline.clone()
                }
                AirfoilSpec::Shape(shape) => shape.outline(801),
            };
            stations.push(ResolvedStation { r: s.r, outline });
        }
        let mut plies = Vec::with_capacity(project.plies.len());
        for p in &project.plies {
            plies.push(ResolvedPly {
                spec: p.clone(),
                material: Arc::new(project.materials.ply_material(&p.material)?),
            });
        }
        Ok(Blade {
            name: project.name.clone(),
            rotor: project.rotor.clone(),
            loft: loft::SpanInterpolation::new(&project.stations),
            stations,
            plies,
            webs: project.webs.clone(),
            notes,
            resampled: loft::ResampledOutlines::default(),
            span_content: OnceLock::new(),
            station_curves: OnceLock::new(),
            greatest_lean: OnceLock::new(),
        })
    }

    /// The project's name.
    pub fn name(&self) -> &str {
        &self.name
    }

    /// The rotor.
    pub fn rotor(&self) -> &Rotor {
        &self.rotor
    }

    /// Radius of the first station (the structural root), m.
    pub fn root_radius(&self) -> f64 {
        self.stations[0].r
    }

    /// Radius of the last station, m.
    pub fn tip_radius(&self) -> f64 {
        self.stations[self.stations.len() - 1].r
    }

    /// Radii of the project's stations, m.
    pub fn station_radii(&self) -> Vec<f64> {
        self.stations.iter().map(|s| s.r).collect()
    }

    /// `n` radii evenly spaced from root to tip, or the station radii when `n` is 0 (the model
    /// adds the edges of the schedule: [`Blade::check_radii`]).
    pub fn analysis_radii(&self, n: usize) -> Vec<f64> {
        if n < 2 {
            return self.station_radii();
        }
        let (a, b) = (self.root_radius(), self.tip_radius());
        (0..n).map(|i| a + (b - a) * i as f64 / (n - 1) as f64).collect()
    }

    /// The radii the model is solved and checked at: [`Blade::analysis_radii`] with the thinner
    /// side of every step of the schedule inside the span. A ply covers its span from its start
    /// up to, not including, its end, so the section at a ply's end `e` is the one without it,
    /// and the one without a ply that starts at `e` stands at `e - δ` (`δ` = [`EDGE_SIDE`] of
    /// the span): a ply dropped between two evenly spaced stations left that side unchecked,
    /// where the remaining plies carry the most strain (an invented tube with three plies ending
    /// between stations passed at a reserve factor of 4.78 that is 4.07 just outboard of the
    /// drop). A web's edge changes the cells, not only the walls: both sides of it.
    pub fn check_radii(&self, n: usize) -> Vec<f64> {
        let mut radii = self.analysis_radii(n);
        let (root, tip) = (self.root_radius(), self.tip_radius());
        let delta = EDGE_SIDE * (tip - root);
        let inside = |e: &f64| *e > root && *e < tip;
        let starts = self.plies.iter().map(|p| p.spec.r_start).filter(inside).map(|e| e - delta);
        let ends = self.plies.iter().map(|p| p.spec.r_end).filter(inside);
        let webs = self.webs.iter().flat_map(|w| [w.r_start, w.r_end]).filter(inside);
        let mut sides: Vec<f64> = starts
            .chain(ends)
            .chain(webs.flat_map(|e| [e - delta, e]))
            .filter(|&x| x > root)
            .collect();
        sides.sort_by(f64::total_cmp);
        // A side within round-off of a radius already held is that radius (the analysis radii,
        // the root and the tip among them, stay as they are).
        let tol = 1e-9 * (tip - root);
        let held = radii.len();
        for x in sides {
            let k = radii[..held].partition_point(|&y| y < x - tol);
            let near_held = radii[..held].get(k).is_some_and(|&y| (y - x).abs() <= tol);
            let near_side = radii[held..].last().is_some_and(|&y| (x - y).abs() <= tol);
            if !near_held && !near_side {
                radii.push(x);
            }
        }
        radii.sort_by(f64::total_cmp);
        radii
    }

    /// Chord at `r`, m.
    pub fn chord(&self, r: f64) -> f64 {
        self.loft.chord(r)
    }

    /// Station twist at `r` (before the pitch setting).
    pub fn twist(&self, r: f64) -> Angle {
        self.loft.twist(r)
    }

    /// Pitch axis at `r`, fraction of chord from the leading edge.
    pub fn pitch_axis_frac(&self, r: f64) -> f64 {
        self.loft.pitch_axis_frac(r)
    }

    /// The rates along the span of chord (m/m), twist (rad/m) and pitch axis (chord fraction per
    /// m) at `r`: the derivatives of the interpolants of [`Blade::chord`], [`Blade::twist`] and
    /// [`Blade::pitch_axis_frac`].
    pub(crate) fn span_rates(&self, r: f64) -> [f64; 3] {
        self.loft.rates(r)
    }

    /// The ply of the schedule with that index (as in `plies.csv`, outermost first).
    pub fn ply(&self, index: usize) -> Option<&PlySpec> {
        self.plies.get(index).map(|p| &p.spec)
    }

    /// The material of the ply with that index (as in `plies.csv`, outermost first).
    pub fn ply_material(&self, index: usize) -> Option<&Lamina> {
        self.plies.get(index).map(|p| p.material.as_ref())
    }

    /// Number of plies in the schedule.
    pub fn ply_count(&self) -> usize {
        self.plies.len()
    }

    /// Webs, leading edge first.
    pub fn webs(&self) -> &[WebSpec] {
        &self.webs
    }

    /// The outline at `r` in chord fractions, resampled with `n_per_surface` intervals per
    /// surface and blended between the neighbouring stations.
    pub fn outline(&self, r: f64, n_per_surface: usize) -> Result<Outline, BladeError> {
        self.check_span(r)?;
        Ok(self.loft.outline(&self.resampled.get(&self.stations, n_per_surface), r))
    }

    /// A chord-frame point `(y, z)` of the section at `r` in the rotor frame at pitch setting
    /// `pitch`, m.
    pub fn to_rotor_frame(&self, r: f64, yz: [f64; 2], pitch: Angle) -> [f64; 3] {
        let phi = (self.twist(r) + pitch).rad();
        let (s, c) = phi.sin_cos();
        [r, yz[0] * c - yz[1] * s, yz[0] * s + yz[1] * c]
    }

    /// Warnings about the blade as a whole: the notes of its coordinate files, and where beam
    /// theory is strained.
    pub fn warnings(&self) -> Vec<BladeWarning> {
        let span = self.tip_radius() - self.root_radius();
        let radii = self.analysis_radii(21);
        let mean_chord = radii.iter().map(|&r| self.chord(r)).sum::<f64>() / radii.len() as f64;
        let mut w: Vec<BladeWarning> =
            self.notes.iter().cloned().map(BladeWarning::CoordinateFile).collect();
        // Beam theory is strained below about two mean chords of span (common practice).
        if span < 2.0 * mean_chord {
            w.push(BladeWarning::Stubby { span, mean_chord });
        }
        if let Some((r, factor)) =
            *self.greatest_lean.get_or_init(|| self.surfaces().greatest_lean())
            && factor > LEAN_WARNING
        {
            w.push(BladeWarning::Leaning { r, factor });
        }
        w
    }

    fn check_span(&self, r: f64) -> Result<(), BladeError> {
        let (root, tip) = (self.root_radius(), self.tip_radius());
        if r < root - 1e-9 || r > tip + 1e-9 || !r.is_finite() {
            return Err(BladeError::OutsideSpan { r, root, tip });
        }
        Ok(())
    }

    /// Index of the station nearest `r`.
    fn nearest_station(&self, r: f64) -> usize {
        self.stations
            .iter()
            .enumerate()
            .min_by(|(_, a), (_, b)| (a.r - r).abs().total_cmp(&(b.r - r).abs()))
            .map(|(i, _)| i)
            .unwrap_or(0)
    }
}
