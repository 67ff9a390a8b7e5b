//! Ply-level stress recovery along the blade: for every load case, at every analysis station,
//! wall point and ply, the ply stresses in material axes and the strength ratio by every failure
//! criterion; and for each case the lowest reserve factor with where it occurs.
//!
//! Method: the case's resultants at each station (see [`crate::loads`]) are moved from the pitch
//! axis to the elastic centre (torque to the shear centre), turned into generalised beam strains
//! by the section compliance, then into wall resultants `(N_x, N_xs)` at the midpoint of every wall
//! element by the thin-walled section theory of [`crate::section`] (closed-cell and transverse
//! shear flows), then into the full midplane deformation of each wall (hoop force free, hoop
//! curvature held, span-wise and twisting curvatures as the section solver's wall model sets
//! them: see [`crate::section::WallCurvature`]) and into ply stresses by classical laminate
//! theory, with a uniform temperature change `delta_T_K` of the case as a fixed residual part
//! (the wall free in its membrane, its curvatures held). The reserve factor is the strength ratio of the governing criterion at the
//! factored load: the factor on the case's (already factored) loads that brings the first ply to
//! failure; below 1 the ply fails under the factored load.
//!
//! ```no_run
//! use layloft::analysis::BladeModel;
//! use layloft::input::read_project;
//! use layloft::stress::analyse_cases;
//!
//! # fn main() -> Result<(), layloft::Error> {
//! let model = BladeModel::build(read_project("layups/mine-fan/blade.toml".as_ref())?)?;
//! for case in analyse_cases(&model, None)? {
//!     if let Some(c) = &case.critical {
//!         println!("{}: reserve factor {:.2} at r = {:.3} m", case.name, c.reserve_factor, c.r);
//!     }
//! }
//! # Ok(())
//! # }
//! ```

mod recover;
mod summary;
mod unit;

pub use summary::{Critical, PlyWorst};

use std::sync::Arc;

use nalgebra::Vector3;

use crate::analysis::BladeModel;
use crate::buckling::{Panel, PanelCheck, PanelSolver, check_panel, find_panels};
use crate::failure::{CriteriaRatios, Criterion, StrengthRatio};
use crate::laminate::LaminateError;
use crate::loads::{
    LoadDistribution, LoadsError, PitchReaction, Resultant, TipDeflection, span_loads,
};
use crate::project::LoadCaseSpec;
use recover::{Locator, recover_section, section_states};
use unit::{MaterialCache, UnitResponse};

/// What can go wrong in stress recovery.
#[derive(Debug, thiserror::Error)]
pub enum StressError {
    /// A laminate that cannot be loaded.
    #[error(transparent)]
    Laminate(#[from] LaminateError),
    /// Load case trouble.
    #[error(transparent)]
    Loads(#[from] LoadsError),
    /// A temperature change on plies without expansion coefficients (a project read from its
    /// files is refused before, by the reader, with the lines of the case and the record).
    #[error(
        "load case '{case}' has delta_T_K = {delta_t} but material '{material}' gives no a1_ustrain_K/a2_ustrain_K: give the CTEs or remove delta_T_K"
    )]
    NoCte {
        /// The case.
        case: String,
        /// Its temperature change, K.
        delta_t: f64,
        /// A material without CTEs.
        material: String,
    },
    /// Every wall point of every case asked for would not fit in [`POINT_DETAIL_LIMIT`].
    #[error(
        "keeping every wall point of {cases} load case(s) at {stations} stations ({points} wall \
         points with their plies) would take {gib:.1} GiB of memory, more than the {limit_gib:.0} \
         GiB allowed: expected fewer [sections] contour_points or analysis_stations, or one \
         case at a time (`layloft check` keeps only the summaries and has no such limit)",
        gib = *bytes as f64 / GIB,
        limit_gib = POINT_DETAIL_LIMIT as f64 / GIB
    )]
    TooManyPoints {
        /// The load cases asked for.
        cases: usize,
        /// The analysis stations.
        stations: usize,
        /// Wall points over all stations of one case.
        points: usize,
        /// The memory they would take, bytes.
        bytes: usize,
    },
}

const GIB: f64 = (1u64 << 30) as f64;

/// The most memory the wall points of [`Detail::Points`] may take over the cases asked for,
/// bytes (4 GiB: the rest of a run and the machine keep room on an ordinary machine).
pub const POINT_DETAIL_LIMIT: usize = 4 << 30;

/// The wall points one load case keeps at [`Detail::Points`] and the memory they take, bytes:
/// one point per wall element of every station, each with its plies (exact, heap included but
/// for the names of webs).
pub fn point_detail_size(model: &BladeModel) -> (usize, usize) {
    let (mut points, mut bytes) = (0, 0);
    for st in &model.stations {
        for e in st.section.elements() {
            let plies = st.layout.laminates.get(e.laminate).map_or(0, |l| l.plies().len());
            points += 1;
            bytes += std::mem::size_of::<PointStress>() + plies * std::mem::size_of::<PlyPoint>();
        }
    }
    (points, bytes)
}

/// Whether the wall points of `cases` load cases at [`Detail::Points`] fit in
/// [`POINT_DETAIL_LIMIT`]; checked before any case is recovered, so that a run too large is
/// refused with what to change instead of running out of memory.
pub fn points_fit(model: &BladeModel, cases: usize) -> Result<(), StressError> {
    points_fit_in(model, cases, POINT_DETAIL_LIMIT)
}

fn points_fit_in(model: &BladeModel, cases: usize, limit: usize) -> Result<(), StressError> {
    let (points, bytes) = point_detail_size(model);
    let bytes = bytes.saturating_mul(cases);
    if bytes > limit {
        return Err(StressError::TooManyPoints {
            cases,
            stations: model.stations.len(),
            points,
            bytes,
        });
    }
    Ok(())
}

/// Where on a section a wall point lies.
#[derive(Debug, Clone, PartialEq)]
pub enum WallLocation {
    /// On the skin.
    Surface {
        /// Upper (true) or lower surface.
        upper: bool,
        /// Chord fraction from the leading edge.
        x_c: f64,
        /// Whether this is the solid trailing-edge laminate aft of where the walls meet.
        solid: bool,
    },
    /// On a shear web.
    Web {
        /// The web's name.
        name: String,
        /// Height of the point in the chord frame, m.
        z: f64,
    },
}

impl std::fmt::Display for WallLocation {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            WallLocation::Surface { upper, x_c, solid } => write!(
                f,
                "{} surface at x/c = {}{}",
                if *upper { "upper" } else { "lower" },
                crate::text::fixed(*x_c, 3),
                if *solid { " (solid trailing edge)" } else { "" }
            ),
            WallLocation::Web { name, z } => {
                write!(f, "web '{name}' at z = {} mm", crate::text::fixed(z * 1e3, 1))
            }
        }
    }
}

/// Strength ratios of one ply at one wall point (the worse of its two faces).
#[derive(Debug, Clone, PartialEq)]
pub struct PlyPoint {
    /// Position of the ply in its laminate (0 = outermost).
    pub ply_in_laminate: usize,
    /// The ply's index in the blade's schedule, carried by the laminate's ply
    /// ([`crate::laminate::Ply::schedule_ply`]); `None` for a laminate not built from a schedule.
    pub schedule_ply: Option<usize>,
    /// Ratios by every criterion.
    pub ratios: CriteriaRatios,
    /// The governing criterion and its ratio (`ratios.governing()`, kept beside them).
    pub governing: Option<(Criterion, StrengthRatio)>,
    /// Material-axis stresses (sigma1, sigma2, tau12), Pa, at the face with the lower ratio,
    /// residual part included.
    pub stress_12: Vector3<f64>,
}

/// The state at one wall point.
#[derive(Debug, Clone, PartialEq)]
pub struct PointStress {
    /// Wall element index in the solved section.
    pub element: usize,
    /// Laminate index in the layout.
    pub laminate: usize,
    /// Position (y, z) on the midline, m, chord frame.
    pub position: [f64; 2],
    /// Where that is.
    pub location: WallLocation,
    /// Wall axial force per width, N/m.
    pub n_x: f64,
    /// Wall shear flow, N/m.
    pub n_xs: f64,
    /// The wall's midplane strains `(eps_x, eps_s, gamma_xs)` and curvatures `(kappa_x, 0,
    /// kappa_xs)` in its laminate axes (1 = span, 2 = contour, 3 = outward normal), from which
    /// the ply stresses follow (hoop force free, hoop curvature held).
    pub deformation: crate::laminate::Deformation,
    /// Every ply of the wall.
    pub plies: Vec<PlyPoint>,
}

impl PointStress {
    /// The lowest strength ratio of the point over plies and criteria.
    pub fn reserve_factor(&self) -> f64 {
        self.plies
            .iter()
            .filter_map(|p| p.governing.map(|(_, r)| r.ratio))
            .fold(f64::INFINITY, f64::min)
    }
}

/// One station's points.
#[derive(Debug, Clone, PartialEq)]
pub struct StationStress {
    /// Radius, m.
    pub r: f64,
    /// Every wall point.
    pub points: Vec<PointStress>,
}

/// Stress recovery of one load case.
#[derive(Debug, Clone, PartialEq)]
pub struct CaseStress {
    /// Case name.
    pub name: String,
    /// Rotor speed, rad/s.
    pub omega: f64,
    /// Load factor applied.
    pub load_factor: f64,
    /// Root reaction (rotor frame, about the pitch axis at the root).
    pub root: Resultant,
    /// Tip deflection under the factored loads.
    pub tip_deflection: TipDeflection,
    /// Per analysis station.
    pub stations: Vec<StationStress>,
    /// The lowest reserve factor and where it occurs (`None` when no ply can fail).
    pub critical: Option<Critical>,
    /// The worst value of every schedule ply at every station.
    pub ply_worst: Vec<PlyWorst>,
    /// Root reactions across the pitch range.
    pub pitch_sweep: Vec<PitchReaction>,
    /// Resultants along the span (rotor and chord frames) at the load grid.
    pub loads: crate::loads::SpanLoads,
    /// Local buckling and sandwich checks of every wall panel, per analysis station.
    pub buckling: Vec<StationBuckling>,
}

impl CaseStress {
    /// The panel with the lowest buckling reserve factor: (station index, panel index).
    pub fn least_buckling(&self) -> Option<(usize, usize)> {
        self.buckling
            .iter()
            .enumerate()
            .flat_map(|(i, s)| s.panels.iter().enumerate().map(move |(j, p)| (i, j, p)))
            .min_by(|a, b| a.2.check.reserve_factor.total_cmp(&b.2.check.reserve_factor))
            .map(|(i, j, _)| (i, j))
    }
}

/// The buckling checks of the wall panels of one station.
#[derive(Debug, Clone, PartialEq)]
pub struct StationBuckling {
    /// Radius, m.
    pub r: f64,
    /// Every panel.
    pub panels: Vec<PanelResult>,
}

/// One wall panel with where it lies and its check under the case.
#[derive(Debug, Clone, PartialEq)]
pub struct PanelResult {
    /// The panel and its critical loads.
    pub panel: Arc<Panel>,
    /// Where its first element lies.
    pub from: WallLocation,
    /// Where its last element lies.
    pub to: WallLocation,
    /// The check under the case.
    pub check: PanelCheck,
}

/// The wall panels of every analysis station of the model with their critical loads (they do
/// not depend on the load case).
pub fn model_panels(model: &BladeModel) -> Vec<Vec<Arc<Panel>>> {
    let solver = PanelSolver::new(model.project.buckling.edge_fixity);
    model
        .stations
        .iter()
        .map(|st| {
            find_panels(&st.layout, &st.section, &model.project.materials, &solver)
                .into_iter()
                .map(Arc::new)
                .collect()
        })
        .collect()
}

/// Wall resultants below this fraction of the station's largest (`N_x` or `N_xs`, N/m) are the
/// section solve's round-off (a tube in pure tension carries some 1e-17 of its tension as shear
/// flow) and are taken as zero by the panel checks: a reserve factor against them would be a
/// number like 2e9 that measures the round-off, at a place it picks.
const RESULTANT_ROUND_OFF: f64 = 1e-9;

/// The panel checks of one station from the wall resultants `(N_x, N_xs)` of each element
/// (indexed by element; an element without a point reads as unloaded; resultants within
/// [`RESULTANT_ROUND_OFF`] of the station's largest read as zero).
fn check_station(
    st: &crate::analysis::AnalysisStation,
    panels: &[Arc<Panel>],
    by_element: &[Option<(f64, f64)>],
) -> StationBuckling {
    let elements = st.section.elements();
    let locator = Locator::new(&st.layout);
    let largest =
        by_element.iter().flatten().fold(0.0_f64, |m, &(nx, nxs)| m.max(nx.abs()).max(nxs.abs()));
    let floor = RESULTANT_ROUND_OFF * largest;
    let clean = |v: f64| if v.abs() <= floor { 0.0 } else { v };
    let mut res: Vec<(f64, f64)> = Vec::new();
    let results = panels
        .iter()
        .map(|panel| {
            res.clear();
            res.extend(
                panel
                    .elements
                    .iter()
                    .map(|&k| by_element.get(k).copied().flatten().unwrap_or((0.0, 0.0)))
                    .map(|(nx, nxs)| (clean(nx), clean(nxs))),
            );
            let at = |k: usize| {
                let e = &elements[k];
                locator.locate(&e.part, e.midpoint())
            };
            PanelResult {
                panel: panel.clone(),
                from: at(panel.elements[0]),
                to: at(*panel.elements.last().unwrap_or(&panel.elements[0])),
                check: check_panel(panel, &res),
            }
        })
        .collect();
    StationBuckling { r: st.layout.r, panels: results }
}

fn check_cte(model: &BladeModel, case: &LoadCaseSpec) -> Result<(), StressError> {
    if case.delta_t == 0.0 {
        return Ok(());
    }
    for st in &model.stations {
        for lam in &st.layout.laminates {
            if let Some(p) = lam.plies().iter().find(|p| p.material.cte.is_none()) {
                return Err(StressError::NoCte {
                    case: case.name.clone(),
                    delta_t: case.delta_t,
                    material: p.material.name.clone(),
                });
            }
        }
    }
    Ok(())
}

/// What a case's stress recovery keeps.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Detail {
    /// Every wall point with its plies ([`StationStress::points`]), besides the summaries.
    Points,
    /// The summaries only (critical point, worst value of every ply at every station, panel
    /// checks, loads, deflection): [`StationStress::points`] stays empty, and the memory does
    /// not grow with the number of wall points. What `check` needs.
    Summary,
}

/// Stress recovery of one load case of the model.
pub fn analyse_case(model: &BladeModel, case: &LoadCaseSpec) -> Result<CaseStress, StressError> {
    analyse_case_with(model, case, &model_panels(model))
}

/// Stress recovery of one load case with the model's panels already found
/// ([`model_panels`]).
pub fn analyse_case_with(
    model: &BladeModel,
    case: &LoadCaseSpec,
    panels: &[Vec<Arc<Panel>>],
) -> Result<CaseStress, StressError> {
    analyse_case_detail(model, case, panels, Detail::Points)
}

/// Stress recovery of one load case with the model's panels already found, keeping `detail`.
///
/// One pass over stations, wall points and plies: each ply face is evaluated once, the
/// governing ratio kept beside the ratios, and the summaries (lowest reserve factor, worst value
/// of every ply, the panels' resultants) folded in as the points are made, so that the cost is
/// linear in stations, points and plies.
pub fn analyse_case_detail(
    model: &BladeModel,
    case: &LoadCaseSpec,
    panels: &[Vec<Arc<Panel>>],
    detail: Detail,
) -> Result<CaseStress, StressError> {
    check_cte(model, case)?;
    let props = model.properties();
    let pitch = case.pitch.unwrap_or(model.project.rotor.pitch);
    let dist = LoadDistribution::new(&props, &model.project.point_masses, case, pitch)?;
    let loads = span_loads(&dist);
    let fine = span_loads(&dist.clone().refine(8));
    let carried: Vec<_> = model.stations.iter().map(|st| st.section.shear_carried()).collect();
    let tip_deflection = crate::loads::tip_deflection_carrying(&props, &carried, &fine)?;
    // The stations are independent: recovered in blocks on all cores, each block folding its
    // own summary; the blocks' results are joined in station order, which gives the same
    // summary, to the bit, as one pass (see [`summary::Summary::join`]).
    let blocks = crate::parallel::in_blocks(
        model.stations.len(),
        |range, _tick| -> Result<_, StressError> {
            let mut stations = Vec::with_capacity(range.len());
            let mut buckling = Vec::with_capacity(range.len());
            let mut summary = summary::Summary::new(model);
            let mut scratch: Vec<PlyPoint> = Vec::new();
            let mut by_element: Vec<Option<(f64, f64)>> = Vec::new();
            let mut strength = MaterialCache::default();
            for si in range {
                let st = &model.stations[si];
                let units = st
                    .layout
                    .laminates
                    .iter()
                    .map(|l| UnitResponse::with_cache(l, case.delta_t, &mut strength))
                    .collect::<Result<Vec<_>, _>>()?;
                let elements = st.section.elements();
                let locator = Locator::new(&st.layout);
                let states = section_states(&st.section, &loads.chord_at(st.layout.r));
                by_element.clear();
                by_element.resize(elements.len(), None);
                let mut points =
                    Vec::with_capacity(if detail == Detail::Points { states.len() } else { 0 });
                for (pi, state) in states.into_iter().enumerate() {
                    let e = &elements[state.element];
                    let laminate = &st.layout.laminates[e.laminate];
                    units[e.laminate].ratios_into(laminate, &state.deformation, &mut scratch);
                    summary.add(si, pi, state.element, &scratch);
                    if let Some(slot) = by_element.get_mut(state.element) {
                        *slot = Some((state.n_x, state.n_xs));
                    }
                    if detail == Detail::Points {
                        points.push(PointStress {
                            element: state.element,
                            laminate: e.laminate,
                            position: state.position,
                            location: locator.locate(&e.part, e.midpoint()),
                            n_x: state.n_x,
                            n_xs: state.n_xs,
                            deformation: state.deformation,
                            plies: scratch.clone(),
                        });
                    }
                }
                summary.end_station(model, si, st.layout.r);
                // As many stations checked as there are panel lists (every station, from
                // `model_panels`).
                if let Some(p) = panels.get(si) {
                    buckling.push(check_station(st, p, &by_element));
                }
                stations.push(StationStress { r: st.layout.r, points });
            }
            Ok((stations, buckling, summary))
        },
        &mut |_| {},
    );
    let mut stations = Vec::with_capacity(model.stations.len());
    let mut buckling = Vec::with_capacity(model.stations.len());
    let mut summary = summary::Summary::new(model);
    for block in blocks {
        let (s, b, part) = block?;
        stations.extend(s);
        buckling.extend(b);
        summary.join(part);
    }
    let radii: Vec<f64> = stations.iter().map(|s| s.r).collect();
    let (critical, ply_worst) = summary.finish(model, &radii);
    let pitch_sweep = crate::loads::root_reactions_over_pitch(
        &props,
        &model.project.rotor,
        &model.project.point_masses,
        case,
        11,
    )?;
    Ok(CaseStress {
        name: case.name.clone(),
        omega: case.omega,
        load_factor: case.load_factor,
        root: loads.root(),
        tip_deflection,
        stations,
        critical,
        ply_worst,
        pitch_sweep,
        loads,
        buckling,
    })
}

/// Ply strength ratios at the midpoint of every wall element of one section under beam
/// resultants about the pitch axis in its chord frame (see [`crate::loads::BeamResultants`]),
/// with a uniform temperature change `delta_t` (K) as a fixed residual part.
pub fn recover_at(
    layout: &crate::section::SectionLayout,
    section: &crate::section::SolvedSection,
    resultants: &crate::loads::BeamResultants,
    delta_t: f64,
) -> Result<Vec<PointStress>, StressError> {
    let units = layout
        .laminates
        .iter()
        .map(|l| UnitResponse::new(l, delta_t))
        .collect::<Result<Vec<_>, _>>()?;
    Ok(recover_section(layout, section, &units, resultants))
}

/// Stress recovery of the named case, or of every case of the project when `only` is `None`.
pub fn analyse_cases(
    model: &BladeModel,
    only: Option<&str>,
) -> Result<Vec<CaseStress>, StressError> {
    analyse_cases_detail(model, only, Detail::Points)
}

/// As [`analyse_cases`], keeping `detail` ([`Detail::Summary`] for a design check).
pub fn analyse_cases_detail(
    model: &BladeModel,
    only: Option<&str>,
    detail: Detail,
) -> Result<Vec<CaseStress>, StressError> {
    if detail == Detail::Points {
        points_fit(model, if only.is_some() { 1 } else { model.project.load_cases.len() })?;
    }
    let panels = model_panels(model);
    match only {
        Some(name) => Ok(vec![analyse_case_detail(
            model,
            crate::loads::find_case(&model.project, name)?,
            &panels,
            detail,
        )?]),
        None => model
            .project
            .load_cases
            .iter()
            .map(|c| analyse_case_detail(model, c, &panels, detail))
            .collect(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_memory_of_the_wall_points_is_known_before_they_are_made() {
        // The size is counted from the solved sections before any case is recovered; it must
        // be the points the recovery keeps, each with its plies, to the byte (a count, so
        // exact), or the guard against running out of memory guards nothing.
        let root = env!("CARGO_MANIFEST_DIR");
        let project =
            crate::input::read_project(format!("{root}/layups/mine-fan/blade.toml").as_ref())
                .expect("demo reads");
        let model = BladeModel::build(project).expect("demo builds");
        let cases = analyse_cases(&model, None).expect("demo recovers");
        let (points, bytes) = point_detail_size(&model);
        for case in &cases {
            let kept: usize = case.stations.iter().map(|s| s.points.len()).sum();
            let kept_bytes: usize = case
                .stations
                .iter()
                .flat_map(|s| &s.points)
                .map(|p| size_of::<PointStress>() + p.plies.len() * size_of::<PlyPoint>())
                .sum();
            assert_eq!((kept, kept_bytes), (points, bytes), "case {}", case.name);
        }
        // The guard refuses one byte over its limit, with the numbers, and passes at it.
        let n = cases.len();
        assert!(points_fit_in(&model, n, n * bytes).is_ok());
        match points_fit_in(&model, n, n * bytes - 1) {
            Err(StressError::TooManyPoints { cases, stations, points: p, bytes: b }) => {
                assert_eq!((cases, stations, p, b), (n, model.stations.len(), points, n * bytes));
            }
            other => panic!("expected a refusal, got {other:?}"),
        }
    }
}
