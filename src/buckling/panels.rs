//! The wall panels of one section and their critical loads.
//!
//! A panel is a run of wall elements of one part (the skin loop or one web) between supports:
//! the ends of a web, the points where a web meets the skin, the leading edge (where the skin
//! loop starts) when the nose is curved far more than the panels either side (a turn of more
//! than 30° within a tenth of the narrower panel's width either side of it, a rounded corner:
//! an airfoil's nose, taken as the support of the skins either side, as is usual for blade
//! skins; a flat or gently rounded front, a box's or a round root's, is no support and its
//! panel runs on across the leading edge), corners (a turn of more than 30° between
//! neighbouring elements, e.g. at a blunt trailing edge), and the edges of a ply region
//! (a change of laminate). A ply drop is the exception: where one laminate is the other with
//! plies left out (in order) and their flexural stiffnesses `sqrt(D11 D22)` lie within a factor
//! of 2 (the tapered edge of a spar cap), the run goes on and takes the weaker laminate (a rule of
//! this program, on the safe side: the wider panel with the weaker wall), loaded at each point by
//! the `N_x` the weaker wall would carry at that point's strain.
//! The solid trailing-edge laminate aft of where the skins meet has a free edge and is not
//! checked here.
//!
//! The width is the panel's midline length; the radius of curvature is that of the flattest of
//! its three equal thirds (length over the turn of the midline), infinite when the panel is
//! straight or turns both ways.

use std::cell::RefCell;
use std::collections::HashMap;
use std::sync::Arc;

use nalgebra::Matrix3;

use super::curved::{SHEAR_KNOCK_DOWN, curvature_gain, cylinder_torsion, knock_down};
use super::plate::{
    Curvature, EdgeSupport, LongPlate, PlateCritical, ShearFlexibility, reduced_bending_stiffness,
};
use super::sandwich::SandwichWall;
use crate::material::MaterialLibrary;
use crate::section::{SectionLayout, SolvedSection, WallElement, WallPart};

/// Turn between neighbouring elements beyond which their joint is a corner, rad (30°).
const CORNER: f64 = std::f64::consts::PI / 6.0;
/// The reach either side of the leading edge, as a fraction of the narrower panel's width,
/// within which the nose must turn by more than [`CORNER`] to support the panels either side (a
/// rule of this program: a corner rounded to a radius well below the panels' widths still holds
/// their edges).
const NOSE_REACH: f64 = 0.1;
/// Flexural stiffness ratio below which a change of laminate is not a support.
const PLY_DROP_RATIO: f64 = 2.0;

/// What a panel is part of.
#[derive(Debug, Clone, PartialEq)]
pub enum PanelPart {
    /// The skin (closed outer wall).
    Skin,
    /// A shear web.
    Web {
        /// Its name.
        name: String,
    },
}

/// One wall panel of a section with its critical loads.
#[derive(Debug, Clone, PartialEq)]
pub struct Panel {
    /// The wall elements of the panel ([`SolvedSection::elements`]), in order.
    pub elements: Vec<usize>,
    /// What the panel is part of.
    pub part: PanelPart,
    /// The laminate whose stiffness the panel takes (index into the layout's laminates).
    pub laminate: usize,
    /// Width across the panel (midline length), m.
    pub width: f64,
    /// Radius of curvature across the panel, m (infinite when flat).
    pub radius: f64,
    /// SP-8007 knock-down on the curvature gain (1 for a flat panel).
    pub knock_down: f64,
    /// Gain of the compressive critical load from the curvature, N/m.
    pub curvature_gain: f64,
    /// Gains of the critical shear flows from the curvature `[positive, negative]`, N/m (see
    /// [`PanelSolver::panel_critical`]).
    pub shear_curvature_gain: [f64; 2],
    /// Whether the panel closes on itself (a round section's whole wall).
    pub closed: bool,
    /// Critical loads, N/m: compression and shear include the curvature gains; the edge fixity
    /// and, for a sandwich, the core's shear flexibility are applied (to the flat values).
    pub critical: PlateCritical,
    /// The sandwich description when the laminate holds a core.
    pub sandwich: Option<Arc<SandwichWall>>,
    /// Per element: the panel laminate's axial wall stiffness over the element's own, which
    /// turns the element's `N_x` into the `N_x` of the panel laminate at the same strain (1 where
    /// the element has the panel's laminate).
    pub compression_scale: Vec<f64>,
    /// Per element: the sandwich description of its own laminate.
    pub element_sandwich: Vec<Option<Arc<SandwichWall>>>,
}

/// The gains of a panel's critical loads from its curvature across its width, N/m (zero for a
/// flat panel; see [`PanelSolver::panel_critical`]).
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct CurvatureGain {
    /// Compression, with the SP-8007 knock-down.
    pub compression: f64,
    /// Positive shear flow, with [`SHEAR_KNOCK_DOWN`].
    pub shear_positive: f64,
    /// Negative shear flow (magnitude), with [`SHEAR_KNOCK_DOWN`].
    pub shear_negative: f64,
}

/// What the panel finder needs besides the section. It keeps the critical loads of every
/// bending stiffness it has met at unit width (a flat plate's loads scale as `1/b²`), so the
/// same laminate at many stations costs one solution.
#[derive(Debug, Clone)]
pub struct PanelSolver {
    simply_supported: LongPlate,
    clamped: LongPlate,
    edge_fixity: f64,
    unit: RefCell<HashMap<(bool, [u64; 9]), PlateCritical>>,
}

/// Whether a bending stiffness has no bending–twisting terms.
fn specially_orthotropic(d: &Matrix3<f64>) -> bool {
    let tol = 1e-12 * (d[(0, 0)] + d[(1, 1)]);
    d[(0, 2)].abs() <= tol && d[(1, 2)].abs() <= tol
}

/// Compression of a long simply supported specially orthotropic plate with transverse shear
/// stiffness `s`: the sine mode is exact, `1/N = 1/N_b + 1/N_s` with
/// `N_b = (D11 a⁴ + 2 (D12 + 2 D66) a² k² + D22 k⁴)/a²`, `N_s = S (a² + k²)/a²`, `k = pi/b`,
/// least over the half-wavelength (Allen 1969, ch. 4, written for orthotropic bending).
fn sandwich_ss_compression(d: &Matrix3<f64>, b: f64, s: f64) -> f64 {
    let k2 = (std::f64::consts::PI / b).powi(2);
    let base = b * (d[(0, 0)] / d[(1, 1)]).powf(0.25);
    super::plate::minimise(|l| {
        let a2 = (std::f64::consts::PI / (base * l)).powi(2);
        let n_b = (d[(0, 0)] * a2 * a2
            + 2.0 * (d[(0, 1)] + 2.0 * d[(2, 2)]) * a2 * k2
            + d[(1, 1)] * k2 * k2)
            / a2;
        let n_s = s * (a2 + k2) / a2;
        1.0 / (1.0 / n_b + 1.0 / n_s)
    })
}

impl PanelSolver {
    /// A solver for edge fixity `edge_fixity` (0 simply supported, 1 clamped, a linear blend of
    /// the two critical loads between).
    pub fn new(edge_fixity: f64) -> Self {
        PanelSolver {
            simply_supported: LongPlate::new(EdgeSupport::SimplySupported),
            clamped: LongPlate::new(EdgeSupport::Clamped),
            edge_fixity: edge_fixity.clamp(0.0, 1.0),
            unit: RefCell::new(HashMap::new()),
        }
    }

    /// Critical loads at unit width without core shear, kept per bending stiffness.
    fn unit_critical(&self, clamped: bool, d: &Matrix3<f64>) -> PlateCritical {
        let key = (clamped, [0, 1, 2, 3, 4, 5, 6, 7, 8].map(|i| d[i].to_bits()));
        if let Some(c) = self.unit.borrow().get(&key) {
            return *c;
        }
        let plate = if clamped { &self.clamped } else { &self.simply_supported };
        let rigid = ShearFlexibility(f64::INFINITY);
        // Simply supported without D16, D26 the sine mode is exact: Whitney's closed form.
        let compression = if !clamped && specially_orthotropic(d) {
            super::plate::orthotropic_long_plate_ss(d, 1.0)
        } else {
            plate.compression(d, 1.0, rigid)
        };
        let [shear_positive, shear_negative] = plate.shear(d, 1.0, rigid);
        let c = PlateCritical { compression, shear_positive, shear_negative };
        self.unit.borrow_mut().insert(key, c);
        c
    }

    /// Critical loads of one edge support at width `b` with core shear stiffness `s`. Shear
    /// takes the core as `1/N = 1/N_b + 1/S` (see [`LongPlate`]); compression takes it through
    /// the mode (closed form for a simply supported specially orthotropic plate, the Ritz
    /// solution otherwise).
    fn support_critical(
        &self,
        clamped: bool,
        d: &Matrix3<f64>,
        b: f64,
        s: ShearFlexibility,
    ) -> PlateCritical {
        let u = self.unit_critical(clamped, d);
        let k = 1.0 / (b * b);
        let mut c = PlateCritical {
            compression: u.compression * k,
            shear_positive: u.shear_positive * k,
            shear_negative: u.shear_negative * k,
        };
        if s.0.is_finite() {
            let series = |n: f64| 1.0 / (1.0 / n + 1.0 / s.0);
            c.shear_positive = series(c.shear_positive);
            c.shear_negative = series(c.shear_negative);
            c.compression = if !clamped && specially_orthotropic(d) {
                sandwich_ss_compression(d, b, s.0)
            } else {
                let plate = if clamped { &self.clamped } else { &self.simply_supported };
                plate.compression(d, b, s)
            };
        }
        c
    }

    /// Critical loads of a flat long plate with this solver's edge fixity.
    pub fn flat_critical(&self, d: &Matrix3<f64>, b: f64, s: ShearFlexibility) -> PlateCritical {
        let ss = self.support_critical(false, d, b, s);
        let f = self.edge_fixity;
        if f == 0.0 {
            return ss;
        }
        let cl = self.support_critical(true, d, b, s);
        let blend = |a: f64, c: f64| a + f * (c - a);
        PlateCritical {
            compression: blend(ss.compression, cl.compression),
            shear_positive: blend(ss.shear_positive, cl.shear_positive),
            shear_negative: blend(ss.shear_negative, cl.shear_negative),
        }
    }

    /// Critical loads of a panel of laminate stiffness `abd`, width `b` and radius `r` (m),
    /// with the sandwich description where there is one; `closed` for a panel that closes on
    /// itself (the whole wall of a round section). Returns the loads, the compressive
    /// knock-down and the curvature gains.
    ///
    /// The gain in shear is [`SHEAR_KNOCK_DOWN`] times the simply supported curved panel's
    /// classical shear load less the flat one's (solid wall), the curved value of a closed
    /// panel being the lower of the panel's and the long closed tube's in torsion
    /// ([`cylinder_torsion`]): a closed wall has no edges to hold it, and the panel's edges at
    /// the leading edge would stiffen the helical buckles of a tube.
    pub fn panel_critical(
        &self,
        abd: &crate::laminate::Abd,
        b: f64,
        r: f64,
        closed: bool,
        sandwich: Option<&SandwichWall>,
    ) -> (PlateCritical, f64, CurvatureGain) {
        let d = reduced_bending_stiffness(abd).unwrap_or(abd.d);
        let s = ShearFlexibility(sandwich.map_or(f64::INFINITY, |w| w.shear_stiffness));
        let mut c = self.flat_critical(&d, b, s);
        let mut gain = CurvatureGain::default();
        let gamma = match abd.a.try_inverse() {
            Some(compliance) if r.is_finite() => {
                let gamma = knock_down(r, &abd.a, &d);
                gain.compression = curvature_gain(&d, &compliance, b, r, gamma);
                let curvature = Curvature { radius: r, compliance };
                if let Some(mut curved) = self.simply_supported.curved_shear(&d, b, &curvature) {
                    if closed {
                        let tube = cylinder_torsion(&d, &compliance, r);
                        curved = curved.map(|v| v.min(tube));
                    }
                    let flat = self.support_critical(false, &d, b, ShearFlexibility(f64::INFINITY));
                    let over = |curved: f64, flat: f64| {
                        let g = SHEAR_KNOCK_DOWN * (curved - flat);
                        if g.is_finite() && g > 0.0 { g } else { 0.0 }
                    };
                    gain.shear_positive = over(curved[0], flat.shear_positive);
                    gain.shear_negative = over(curved[1], flat.shear_negative);
                }
                gamma
            }
            _ => 1.0,
        };
        c.compression += gain.compression;
        c.shear_positive += gain.shear_positive;
        c.shear_negative += gain.shear_negative;
        (c, gamma, gain)
    }
}

fn flexural(abd: &crate::laminate::Abd) -> f64 {
    let d = reduced_bending_stiffness(abd).unwrap_or(abd.d);
    (d[(0, 0)] * d[(1, 1)]).max(0.0).sqrt()
}

/// Whether the shorter laminate's plies appear, in order, within the longer one's: one is the
/// other with plies dropped.
fn is_drop(a: &crate::laminate::Laminate, b: &crate::laminate::Laminate) -> bool {
    let (short, long) = if a.plies().len() <= b.plies().len() {
        (a.plies(), b.plies())
    } else {
        (b.plies(), a.plies())
    };
    let same = |p: &crate::laminate::Ply, q: &crate::laminate::Ply| {
        p.material.name == q.material.name
            && (p.angle.rad() - q.angle.rad()).abs() < 1e-9
            && (p.thickness - q.thickness).abs() <= 1e-9 * q.thickness.max(1e-12)
    };
    let mut it = long.iter();
    short.iter().all(|p| it.any(|q| same(p, q)))
}

/// The turn of the skin at the leading edge, rad: the leading edge's own joint (between the
/// `before` run's last element and the `after` run's first, in loop order) and the joints of
/// either run at most `reach` (m) along the midline from it.
fn nose_turn(elements: &[WallElement], before: &[usize], after: &[usize], reach: f64) -> f64 {
    let (Some(&end), Some(&start)) = (before.last(), after.first()) else {
        return 0.0;
    };
    let mut total = turn(elements[end].tangent(), elements[start].tangent());
    let mut along = 0.0;
    for w in after.windows(2) {
        along += elements[w[0]].length();
        if along > reach {
            break;
        }
        total += turn(elements[w[0]].tangent(), elements[w[1]].tangent());
    }
    along = 0.0;
    for w in before.windows(2).rev() {
        along += elements[w[1]].length();
        if along > reach {
            break;
        }
        total += turn(elements[w[0]].tangent(), elements[w[1]].tangent());
    }
    total
}

fn close(a: [f64; 2], b: [f64; 2], tol: f64) -> bool {
    ((a[0] - b[0]).powi(2) + (a[1] - b[1]).powi(2)).sqrt() <= tol
}

fn turn(t0: [f64; 2], t1: [f64; 2]) -> f64 {
    let cross = t0[0] * t1[1] - t0[1] * t1[0];
    let dot = t0[0] * t1[0] + t0[1] * t1[1];
    cross.atan2(dot)
}

#[derive(Debug, Clone, PartialEq)]
enum Kind {
    Skin,
    Web(usize),
    Other,
}

fn kind(part: &WallPart) -> Kind {
    match part {
        WallPart::Skin { .. } => Kind::Skin,
        WallPart::Web { web } => Kind::Web(*web),
        WallPart::TrailingEdge { .. } => Kind::Other,
    }
}

/// Radius of curvature of a run: that of the flattest third.
fn run_radius(section: &SolvedSection, run: &[usize]) -> f64 {
    let e = section.elements();
    let total: f64 = run.iter().map(|&k| e[k].length()).sum();
    if total <= 0.0 {
        return f64::INFINITY;
    }
    let mut turns = [0.0f64; 3];
    let mut s = 0.0;
    for w in run.windows(2) {
        s += e[w[0]].length();
        let third = ((3.0 * s / total) as usize).min(2);
        turns[third] += turn(e[w[0]].tangent(), e[w[1]].tangent());
    }
    turns
        .iter()
        .map(|t| if t.abs() > 1e-9 { total / 3.0 / t.abs() } else { f64::INFINITY })
        .fold(0.0, f64::max)
}

/// The panels of one solved section with their critical loads.
pub fn find_panels(
    layout: &SectionLayout,
    section: &SolvedSection,
    library: &MaterialLibrary,
    solver: &PanelSolver,
) -> Vec<Panel> {
    let elements = section.elements();
    if elements.is_empty() {
        return Vec::new();
    }
    let abd: Vec<_> = layout.laminates.iter().map(|l| l.abd()).collect();
    let flex: Vec<f64> = abd.iter().map(flexural).collect();
    // Axial wall stiffness with the hoop force free, 1/(A^-1)_11, N/m.
    let axial: Vec<f64> = abd
        .iter()
        .map(|m| {
            m.a.try_inverse().map_or(0.0, |c| if c[(0, 0)] > 0.0 { 1.0 / c[(0, 0)] } else { 0.0 })
        })
        .collect();
    let lams = &layout.laminates;
    // Whether one laminate is the other with plies dropped, asked only of neighbouring elements
    // of different laminates and kept per pair (a section with many ply regions would otherwise
    // compare every pair of laminates ply by ply).
    let drops: RefCell<HashMap<(usize, usize), bool>> = RefCell::new(HashMap::new());
    let is_drop_pair = |a: usize, b: usize| -> bool {
        *drops.borrow_mut().entry((a, b)).or_insert_with(|| is_drop(&lams[a], &lams[b]))
    };
    let scale = layout.chord.max(1e-9);
    let tol = 1e-6 * scale;
    // Where webs meet the skin: the skin element boundary nearest each web end is a support.
    let mut web_ends: Vec<[f64; 2]> = Vec::new();
    for (w, _) in layout.webs.iter().enumerate() {
        let on: Vec<usize> =
            (0..elements.len()).filter(|&k| kind(&elements[k].part) == Kind::Web(w)).collect();
        if let (Some(&a), Some(&b)) = (on.first(), on.last()) {
            web_ends.push(elements[a].start);
            web_ends.push(elements[b].end);
        }
    }
    let skin: Vec<usize> =
        (0..elements.len()).filter(|&k| kind(&elements[k].part) == Kind::Skin).collect();
    let mut support_at = vec![false; elements.len()];
    for p in &web_ends {
        let nearest = skin.iter().min_by(|&&a, &&b| {
            let da = (elements[a].start[0] - p[0]).hypot(elements[a].start[1] - p[1]);
            let db = (elements[b].start[0] - p[0]).hypot(elements[b].start[1] - p[1]);
            da.total_cmp(&db)
        });
        if let Some(&k) = nearest {
            support_at[k] = true;
        }
    }
    // Runs in element order.
    let mut runs: Vec<(Vec<usize>, usize)> = Vec::new();
    let mut current: Vec<usize> = Vec::new();
    let (mut lo, mut hi, mut weakest) = (f64::INFINITY, 0.0f64, 0usize);
    let breaks = |prev: usize, next: usize, lo: f64, hi: f64| -> bool {
        let (a, b) = (&elements[prev], &elements[next]);
        let f = flex[b.laminate];
        kind(&a.part) != kind(&b.part)
            || !close(a.end, b.start, tol)
            || turn(a.tangent(), b.tangent()).abs() > CORNER
            || (kind(&b.part) == Kind::Skin && support_at[next])
            || (a.laminate != b.laminate
                && (!is_drop_pair(a.laminate, b.laminate)
                    || hi.max(f) > PLY_DROP_RATIO * lo.min(f)
                    || lo.min(f) <= 0.0))
    };
    for k in 0..elements.len() {
        if let Some(&prev) = current.last() {
            if breaks(prev, k, lo, hi) {
                runs.push((std::mem::take(&mut current), weakest));
                (lo, hi) = (f64::INFINITY, 0.0);
            }
        }
        let f = flex[elements[k].laminate];
        if current.is_empty() || f < lo {
            weakest = elements[k].laminate;
        }
        lo = lo.min(f);
        hi = hi.max(f);
        current.push(k);
    }
    if !current.is_empty() {
        runs.push((current, weakest));
    }
    // The skin loop's first and last runs meet at the leading edge: one panel across it, unless
    // the nose supports them or the joint breaks a run by the rules above.
    if let (Some(&first), Some(&last)) = (skin.first(), skin.last()) {
        let head = runs.iter().position(|(r, _)| r.first() == Some(&first));
        let tail = runs.iter().position(|(r, _)| r.last() == Some(&last));
        if let (Some(i), Some(j)) = (head, tail)
            && i < j
        {
            let range = |run: &[usize]| {
                run.iter()
                    .map(|&k| flex[elements[k].laminate])
                    .fold((f64::INFINITY, 0.0f64), |(lo, hi), f| (lo.min(f), hi.max(f)))
            };
            let ((lo_i, hi_i), (lo_j, hi_j)) = (range(&runs[i].0), range(&runs[j].0));
            let (lo, hi) = (lo_i.min(lo_j), hi_i.max(hi_j));
            let width = |run: &[usize]| run.iter().map(|&k| elements[k].length()).sum::<f64>();
            let reach = NOSE_REACH * width(&runs[i].0).min(width(&runs[j].0));
            let same_laminates = hi <= lo || (lo > 0.0 && hi <= PLY_DROP_RATIO * lo);
            if same_laminates
                && !breaks(last, first, lo, hi)
                && nose_turn(elements, &runs[j].0, &runs[i].0, reach).abs() <= CORNER
            {
                let (mut merged, tail_weakest) = runs.remove(j);
                let (run, weakest) = &mut runs[i];
                merged.append(run);
                *run = merged;
                if flex[tail_weakest] < flex[*weakest] {
                    *weakest = tail_weakest;
                }
            }
        }
    }
    let sandwiches: Vec<Option<Arc<SandwichWall>>> =
        layout.laminates.iter().map(|l| SandwichWall::of(l, library).map(Arc::new)).collect();
    runs.into_iter()
        .filter_map(|(run, laminate)| {
            let part = match kind(&elements[run[0]].part) {
                Kind::Skin => PanelPart::Skin,
                Kind::Web(w) => PanelPart::Web { name: layout.webs.get(w)?.name.clone() },
                Kind::Other => return None,
            };
            let width: f64 = run.iter().map(|&k| elements[k].length()).sum();
            if width <= 0.0 {
                return None;
            }
            let radius = run_radius(section, &run);
            // A run that closes on itself: the whole skin in one panel, its two ends one point.
            let closed = matches!(part, PanelPart::Skin)
                && run.len() == skin.len()
                && close(elements[run[0]].start, elements[run[run.len() - 1]].end, tol);
            let compression_scale = run
                .iter()
                .map(|&k| {
                    let own = elements[k].laminate;
                    if own == laminate { 1.0 } else { axial[laminate] / axial[own] }
                })
                .collect();
            let element_sandwich =
                run.iter().map(|&k| sandwiches[elements[k].laminate].clone()).collect();
            let sandwich = sandwiches[laminate].clone();
            let (critical, knock_down, gain) =
                solver.panel_critical(&abd[laminate], width, radius, closed, sandwich.as_deref());
            Some(Panel {
                elements: run,
                part,
                laminate,
                width,
                radius,
                knock_down,
                curvature_gain: gain.compression,
                shear_curvature_gain: [gain.shear_positive, gain.shear_negative],
                closed,
                critical,
                sandwich,
                compression_scale,
                element_sandwich,
            })
        })
        .collect()
}
