//! The chain every command shares: a project read and checked, its lofted blade, and the solved
//! section at every analysis station, with the blade's mass.
//!
//! The chain returns its own [`AnalysisError`], which names the radius but no file;
//! [`crate::Error::placed`] turns it into the crate's error at the station nearest that radius.
//!
//! ```no_run
//! use layloft::analysis::BladeModel;
//! use layloft::input::read_project;
//!
//! # fn main() -> Result<(), layloft::Error> {
//! let model = BladeModel::build(read_project("layups/mine-fan/blade.toml".as_ref())?)?;
//! for s in model.properties() {
//!     println!("r = {:.3} m  EI_flap = {:.3e} N·m²", s.r, s.ei_flap);
//! }
//! println!("blade mass {:.3} kg", model.mass().total_kg);
//! # Ok(())
//! # }
//! ```

mod error;

pub use error::{AnalysisError, StationError};

use std::sync::OnceLock;

use crate::blade::{Blade, BladeWarning};
use crate::input::InputWarning;
use crate::modal::{Attachments, FluidSection};
use crate::project::{Buoyancy, BuoyantSection, Project};
use crate::section::{
    SectionLayout, SectionParams, SectionProperties, SectionWarning, SolvedSection, WallCurvature,
};

/// One analysis station: its wall layout (each ply of its laminates knows its place in the
/// schedule) and the solved section.
#[derive(Debug, Clone)]
pub struct AnalysisStation {
    /// The wall layout.
    pub layout: SectionLayout,
    /// The solved section.
    pub section: SolvedSection,
}

impl AnalysisStation {
    /// The schedule indices of the plies of laminate `laminate` of the layout, outermost first
    /// (empty for an index out of range).
    pub fn schedule_plies(&self, laminate: usize) -> Vec<usize> {
        self.layout
            .laminates
            .get(laminate)
            .map(|l| l.plies().iter().filter_map(|p| p.schedule_ply).collect())
            .unwrap_or_default()
    }
}

/// Mass of the blade.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct BladeMass {
    /// Laminates (ply areas times densities) and point masses, kg.
    pub total_kg: f64,
    /// Laminates alone, kg.
    pub laminate_kg: f64,
    /// Point masses, kg.
    pub point_masses_kg: f64,
    /// Radius of the mass centre from the rotor axis, m.
    pub centre_radius_m: f64,
    /// First moment of mass about the rotor axis (the static moment that balancing works
    /// against), kg·m.
    pub static_moment_kg_m: f64,
}

/// A project with its blade and solved sections.
#[derive(Debug, Clone)]
pub struct BladeModel {
    /// The project.
    pub project: Project,
    /// The lofted blade.
    pub blade: Blade,
    /// The analysis stations, root to tip.
    pub stations: Vec<AnalysisStation>,
    /// The blade mass, integrated once, on first use (it takes tens of milliseconds).
    mass: OnceLock<BladeMass>,
}

impl BladeModel {
    /// Lofts the blade and solves every analysis station.
    pub fn build(project: Project) -> Result<Self, AnalysisError> {
        Self::build_with_progress(project, &mut |_, _| {})
    }

    /// [`BladeModel::build`], calling `progress(done, total)` after each station.
    pub fn build_with_progress(
        project: Project,
        progress: &mut dyn FnMut(usize, usize),
    ) -> Result<Self, AnalysisError> {
        let blade = Blade::from_project(&project)?;
        let radii = blade.check_radii(project.sections.analysis_stations);
        Self::solve_at(project, blade, &radii, progress)
    }

    /// Lofts the blade and solves the sections at `radii` (root to tip, m) instead of the
    /// project's analysis stations.
    pub fn build_at(project: Project, radii: &[f64]) -> Result<Self, AnalysisError> {
        let blade = Blade::from_project(&project)?;
        Self::solve_at(project, blade, radii, &mut |_, _| {})
    }

    fn solve_at(
        project: Project,
        blade: Blade,
        radii: &[f64],
        progress: &mut dyn FnMut(usize, usize),
    ) -> Result<Self, AnalysisError> {
        let params = section_params(&project);
        // The stations are independent: solved in blocks on all cores, gathered in order (the
        // first error in station order is the one reported, as on one thread).
        let at = |r: f64| move |e: StationError| AnalysisError::Station { r, source: Box::new(e) };
        let station = |r: f64| -> Result<AnalysisStation, AnalysisError> {
            let layout = blade
                .section_layout(r, project.sections.contour_points)
                .map_err(|e| at(r)(e.into()))?;
            let section = SolvedSection::solve(&layout, &params).map_err(|e| at(r)(e.into()))?;
            Ok(AnalysisStation { layout, section })
        };
        let total = radii.len();
        let blocks = crate::parallel::in_blocks(
            total,
            |range, tick| {
                let mut out = Vec::with_capacity(range.len());
                for &r in &radii[range] {
                    out.push(station(r)?);
                    tick();
                }
                Ok::<_, AnalysisError>(out)
            },
            &mut |done| progress(done, total),
        );
        let mut stations = Vec::with_capacity(total);
        for block in blocks {
            stations.extend(block?);
        }
        let mut model = BladeModel { project, blade, stations, mass: OnceLock::new() };
        model.add_buoyancy();
        Ok(model)
    }

    /// With a `[fluid]`, gives every load case with gravity the buoyancy of the displaced fluid:
    /// the area and centroid inside each analysis station's outer mould line. Every build calls
    /// it; call it again after changing the project's fluid or load cases. Load cases without
    /// gravity, or a project without a fluid, are left as they are.
    pub fn add_buoyancy(&mut self) {
        let Some(fluid) = self.project.fluid.clone() else { return };
        let sections: Vec<BuoyantSection> = self
            .stations
            .iter()
            .filter_map(|s| BuoyantSection::of_outline(s.layout.r, &s.layout.outer))
            .collect();
        for case in self.project.load_cases.iter_mut().filter(|c| c.gravity.is_some()) {
            case.buoyancy = Some(Buoyancy { density: fluid.density, sections: sections.clone() });
        }
    }

    /// What the modal model carries besides the sections: the project's point masses and, with a
    /// `[fluid]`, the ellipse of every analysis station's outer mould line for the added mass.
    pub fn modal_attachments(&self) -> Attachments {
        let p = &self.project;
        let mut a = Attachments::of_point_masses(&p.point_masses);
        if let Some(fluid) = &p.fluid {
            let sections = self
                .stations
                .iter()
                .filter_map(|s| FluidSection::of_outline(s.layout.r, &s.layout.outer))
                .collect();
            a.fluid = Some((fluid.density, sections));
        }
        a
    }

    /// The sections' properties, root to tip.
    pub fn properties(&self) -> Vec<SectionProperties> {
        self.stations.iter().map(|s| s.section.properties.clone()).collect()
    }

    /// The analysis radii, m.
    pub fn radii(&self) -> Vec<f64> {
        self.stations.iter().map(|s| s.layout.r).collect()
    }

    /// Mass of the blade: laminates by ply areas times densities on a fine spanwise grid (so that
    /// drop-offs fall where they are), plus the point masses. Computed once and kept.
    pub fn mass(&self) -> BladeMass {
        *self.mass.get_or_init(|| self.integrate_mass())
    }

    fn integrate_mass(&self) -> BladeMass {
        // The laminates' mass per unit span at the midpoints of equal intervals, shared with the
        // tooling's schedule content. The table counts each wall's laminate along the outer
        // mould line, where a ply lies inside it along a shorter line (a tube of wall t and
        // outer radius R holds 2πRt in the table against π(2R − t)t): at each analysis station
        // the section's own mass per length, which keeps every ply at its depth, over the
        // table's at that radius gives a factor, interpolated along the span, that brings the
        // table to the sections while it keeps the drop-offs where they are. The factor is taken
        // at the project's own analysis radii, whatever radii this model was solved at, so that
        // the blade's mass does not depend on them (`sections --at`); a station of the model at
        // such a radius is used as it is, any other is solved here.
        let table = self.blade.span_content();
        let params = section_params(&self.project);
        let contour_points = self.project.sections.contour_points;
        let section_mass = |r: f64| -> Option<f64> {
            match self.stations.iter().find(|st| st.layout.r.to_bits() == r.to_bits()) {
                Some(st) => Some(st.section.properties.mass_per_length),
                None => {
                    let layout = self.blade.section_layout(r, contour_points).ok()?;
                    let section = SolvedSection::solve(&layout, &params).ok()?;
                    Some(section.properties.mass_per_length)
                }
            }
        };
        let factors: Vec<(f64, f64)> = self
            .blade
            .check_radii(self.project.sections.analysis_stations)
            .into_iter()
            .filter_map(|r| {
                let row = self.blade.content_row(r, crate::blade::SURFACE_INTERVALS).ok()?;
                let section = section_mass(r)?;
                (row.mass > 0.0 && section.is_finite()).then(|| (r, section / row.mass))
            })
            .collect();
        let factor = |r: f64| -> f64 {
            match factors.iter().position(|&(x, _)| x > r) {
                None => factors.last().map_or(1.0, |f| f.1),
                Some(0) => factors[0].1,
                Some(k) => {
                    let ((a, fa), (b, fb)) = (factors[k - 1], factors[k]);
                    fa + (fb - fa) * (r - a) / (b - a)
                }
            }
        };
        let (mut m, mut s) = (0.0, 0.0);
        for row in &table.rows {
            let w = factor(row.r) * row.mass * table.h;
            m += w;
            s += w * row.r;
        }
        let pm: f64 = self.project.point_masses.iter().map(|p| p.mass).sum();
        let pm_moment: f64 = self.project.point_masses.iter().map(|p| p.mass * p.r).sum();
        let total = m + pm;
        BladeMass {
            total_kg: total,
            laminate_kg: m,
            point_masses_kg: pm,
            centre_radius_m: if total > 0.0 { (s + pm_moment) / total } else { 0.0 },
            static_moment_kg_m: s + pm_moment,
        }
    }

    /// Warnings of the blade and its sections, alike ones grouped: each with the radii where it
    /// occurs. The report turns them into words (`report::warnings`). The input's own warnings
    /// are kept by the reader ([`crate::input::Sources`]): [`BladeModel::warnings_with`] puts
    /// them first.
    pub fn warnings(&self) -> Vec<GroupedWarning> {
        self.warnings_with(&[])
    }

    /// The warnings the verdict repeats besides the input's: what the analysis leaves out that
    /// may make its strength verdict unsafe (a temperature change on walls of different
    /// expansion, [`Warning::ThermalMismatch`]).
    pub fn verdict_warnings(&self) -> Vec<Warning> {
        self.project
            .load_cases
            .iter()
            .filter(|c| c.delta_t != 0.0)
            .filter_map(|case| {
                let (strains, r) = self.thermal_mismatch(case.delta_t)?;
                Some(Warning::ThermalMismatch {
                    case: case.name.clone(),
                    delta_t: case.delta_t,
                    strains,
                    r,
                })
            })
            .collect()
    }

    /// The input's warnings and then the model's (see [`BladeModel::verdict_warnings`]), worded,
    /// for the verdict.
    pub fn verdict_warning_texts(&self, input: &[InputWarning]) -> Vec<String> {
        input
            .iter()
            .map(ToString::to_string)
            .chain(self.verdict_warnings().iter().map(ToString::to_string))
            .collect()
    }

    /// The least and greatest free axial thermal strain of the walls of one station under a
    /// temperature change `delta_t` (each wall's laminate free of load, its curvatures free),
    /// at the station where they differ most, with its radius; `None` when no station's walls
    /// differ by more than [`THERMAL_MISMATCH`].
    fn thermal_mismatch(&self, delta_t: f64) -> Option<([f64; 2], f64)> {
        let mut worst: Option<([f64; 2], f64)> = None;
        for st in &self.stations {
            let free = st.layout.laminates.iter().filter_map(|l| {
                let (n, m) = l.thermal_resultants(delta_t);
                let c = l.abd().compliance()?;
                let e = c * nalgebra::Vector6::new(n[0], n[1], n[2], m[0], m[1], m[2]);
                e[0].is_finite().then_some(e[0])
            });
            let (lo, hi) =
                free.fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), e| (a.min(e), b.max(e)));
            let spread = |w: &([f64; 2], f64)| w.0[1] - w.0[0];
            if hi - lo > THERMAL_MISMATCH && worst.as_ref().is_none_or(|w| hi - lo > spread(w)) {
                worst = Some(([lo, hi], st.layout.r));
            }
        }
        worst
    }

    /// The input's warnings, then the warnings of the blade and its sections
    /// ([`BladeModel::warnings`]).
    pub fn warnings_with(&self, input: &[InputWarning]) -> Vec<GroupedWarning> {
        let mut groups: Vec<GroupedWarning> = input
            .iter()
            .cloned()
            .map(Warning::Input)
            .chain(self.blade.warnings().into_iter().map(Warning::Blade))
            .map(|w| GroupedWarning { first: w, radii: vec![] })
            .collect();
        let rotor = &self.project.rotor;
        for case in self.project.load_cases.iter().filter(|c| c.omega > rotor.omega_max) {
            groups.push(GroupedWarning {
                first: Warning::Overspeed {
                    case: case.name.clone(),
                    omega: case.omega,
                    omega_max: rotor.omega_max,
                },
                radii: vec![],
            });
        }
        groups.extend(
            self.verdict_warnings().into_iter().map(|w| GroupedWarning { first: w, radii: vec![] }),
        );
        for st in &self.stations {
            for w in &st.section.properties.warnings {
                let alike = |g: &GroupedWarning| match &g.first {
                    Warning::Section(first) => !g.radii.is_empty() && first.same_kind(w),
                    _ => false,
                };
                match groups.iter_mut().find(|g| alike(g)) {
                    Some(g) => g.radii.push(st.layout.r),
                    None => groups.push(GroupedWarning {
                        first: Warning::Section(w.clone()),
                        radii: vec![st.layout.r],
                    }),
                }
            }
        }
        groups
    }
}

/// The section solver's settings for a project: the defaults, with the wall curvature model of
/// `[sections] wall_bending`.
pub fn section_params(project: &Project) -> SectionParams {
    let wall_curvature =
        if project.sections.wall_bending { WallCurvature::Beam } else { WallCurvature::Held };
    SectionParams { wall_curvature, ..SectionParams::default() }
}

/// A warning of a blade model: a value with its places and numbers.
#[derive(Debug, Clone, PartialEq)]
pub enum Warning {
    /// A value of the input that is legal but unusual, with where it was given.
    Input(InputWarning),
    /// About the blade as a whole.
    Blade(BladeWarning),
    /// A load case above the rotor's greatest speed: the frequency check does not cover it.
    Overspeed {
        /// The load case.
        case: String,
        /// Its speed, rad/s.
        omega: f64,
        /// The rotor's greatest speed, rad/s.
        omega_max: f64,
    },
    /// About one section (the station's radius is kept by the [`GroupedWarning`]).
    Section(SectionWarning),
    /// A load case with a temperature change on a section whose walls would expand by different
    /// amounts: each wall is taken free to expand, so the stresses the walls put on each other
    /// (a glass cap on a carbon skin) are not computed.
    ThermalMismatch {
        /// The load case.
        case: String,
        /// Its temperature change, K.
        delta_t: f64,
        /// The least and greatest free axial thermal strain of the walls there.
        strains: [f64; 2],
        /// The radius of the station where they differ most, m.
        r: f64,
    },
}

/// The spread of the walls' free axial thermal strains beyond which a temperature change is
/// warned of (about 1.4 MPa in a carbon ply held against it; a rule of this program).
pub const THERMAL_MISMATCH: f64 = 1e-5;

/// A warning and the radii where it (or one of its kind with other numbers) occurs; no radii for
/// a warning about the whole blade.
#[derive(Debug, Clone, PartialEq)]
pub struct GroupedWarning {
    /// The first occurrence.
    pub first: Warning,
    /// Radii where it occurs, m.
    pub radii: Vec<f64>,
}
