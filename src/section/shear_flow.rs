//! Transverse shear flow and the shear centre.
//!
//! A shear force `V` makes the bending moment vary along the beam (`dM_f/dx = V_flap`,
//! `dM_e/dx = V_edge`). The rate of change of the generalised strains is `e' = S⁻¹ (0, 0, V_f,
//! V_e)`, and with it the rate of change of the wall axial force `∂N_x/∂x` (from the same wall
//! law as the stiffness). Axial equilibrium of a wall piece, `∂N_x/∂x + ∂N_xs/∂s = 0`, gives the
//! shear flow of the section cut open (one cut per cell: at the leading edge and at the lower end
//! of every web; free ends of the trailing-edge branches carry none), and constant cell flows
//! close it with zero twist, `∮ f N_xs ds = 0` in every cell (Megson, *Aircraft Structures for
//! Engineering Students*, §16.3, the shear centre of a closed section, with `1/(G t)` replaced by
//! the wall shear compliance `f`). The shear centre is where the resultant of that flow acts.
//!
//! With the walls following the beam's curvature ([`WallCurvature::Beam`]), the part of the
//! bending moment the walls carry as their own moments `M_x` varies along the beam through the
//! walls' transverse shear, not through the shear flow: the membrane flow then carries the shear
//! force less that part (order `(t/h)²` for symmetric walls, `t/h` for unsymmetric ones); the
//! shear centre is placed by the membrane flow's own resultant.
//!
//! A wall with membrane–shear coupling (`c ≠ 0` in the mixed law of `wall.rs`: an off-axis or
//! unbalanced laminate) turns the transverse shear flow into wall axial forces and moments,
//! `(N_x, M_x, M_xs) = c N_xs` at zero beam strain. Their beam resultants
//! ([`ShearSolution::coupling`], per unit shear force) are part of what the section carries: the
//! beam strains under a shear force are those of the applied resultants less these (see
//! [`super::SolvedSection::strains_under_shear`]), so that the recovered walls hold the applied
//! moments. For a uniform round tube of a `[30]` wall under a flapwise shear force this puts the
//! edgewise curvature that cancels the coupled `N_x` (the recovered walls carried an edgewise
//! moment of `c V R` before, `c = A16/A66` of the wall).

use nalgebra::{DVector, Matrix4, Vector4};

use super::contour::{Contour, Node};
use super::outline::{cross, lerp};
use super::stiffness::{Assembly, kinematics, solve_cells};
use super::wall::{WallCurvature, WallStiffness};

/// Shear flow along an element for one unit shear force: `q(s) = q0 - n0 s - (n1 - n0) s²/(2L)`
/// with `n0`, `n1` the rates `∂N_x/∂x` at the element ends.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub(crate) struct ShearField {
    pub q0: f64,
    pub n0: f64,
    pub n1: f64,
}

impl ShearField {
    pub fn at(&self, s: f64, l: f64) -> f64 {
        if l > 0.0 {
            self.q0 - self.n0 * s - (self.n1 - self.n0) * s * s / (2.0 * l)
        } else {
            self.q0
        }
    }

    /// `∫ q ds` over the element.
    pub fn integral(&self, l: f64) -> f64 {
        self.q0 * l - self.n0 * l * l / 2.0 - (self.n1 - self.n0) * l * l / 6.0
    }
}

/// Shear flow fields of every element for a unit shear force along z (`flap`) and along y
/// (`edge`), and the shear centre they give.
#[derive(Debug, Clone)]
pub(crate) struct ShearSolution {
    pub flap: Vec<ShearField>,
    pub edge: Vec<ShearField>,
    pub centre: [f64; 2],
    /// Beam resultants `(N, T, M_f, M_e)` about the origin that the walls' membrane–shear
    /// coupling makes of the unit flap and edge fields at zero beam strain.
    pub coupling: [Vector4<f64>; 2],
}

pub(crate) fn solve_shear(
    contour: &Contour,
    walls: &[WallStiffness],
    asm: &Assembly,
    compliance: &Matrix4<f64>,
    mode: WallCurvature,
) -> Option<ShearSolution> {
    let unit = |v: Vector4<f64>| unit_field(contour, walls, asm, compliance * v, mode);
    let flap = unit(Vector4::new(0.0, 0.0, 1.0, 0.0))?;
    let edge = unit(Vector4::new(0.0, 0.0, 0.0, 1.0))?;
    let resultant = |field: &[ShearField]| {
        let (mut fy, mut fz, mut m) = (0.0, 0.0, 0.0);
        for (e, q) in contour.elements.iter().zip(field) {
            let l = e.length();
            let iq = q.integral(l);
            let t = e.tangent();
            fy += t[0] * iq;
            fz += t[1] * iq;
            // Moment about the origin: ρ = y t_z − z t_y is constant on a straight element.
            m += cross(e.start, t) * iq;
        }
        (fy, fz, m)
    };
    let (_, fz, mf) = resultant(&flap);
    let (fy, _, me) = resultant(&edge);
    let centre = [mf / fz, -me / fy];
    let coupling = [
        coupling_resultants(contour, walls, &flap, mode),
        coupling_resultants(contour, walls, &edge, mode),
    ];
    let finite = centre.iter().chain(coupling.iter().flat_map(|c| c.iter())).all(|v| v.is_finite());
    finite.then_some(ShearSolution { flap, edge, centre, coupling })
}

/// `Σ ∫ Gᵀ c q ds` over the elements: the beam resultants about the origin of the wall forces
/// `(N_x, M_x, M_xs) = c q` that a shear flow field `q` makes through the coupling `c` of each
/// wall, at zero beam strain (by virtual work, as the stiffness in `stiffness.rs`). Simpson's
/// rule is exact: `q` is quadratic along an element and `G` linear.
fn coupling_resultants(
    contour: &Contour,
    walls: &[WallStiffness],
    field: &[ShearField],
    mode: WallCurvature,
) -> Vector4<f64> {
    let mut r = Vector4::zeros();
    for (e, q) in contour.elements.iter().zip(field) {
        let c = walls[e.laminate].mixed_coupling();
        let l = e.length();
        for (fraction, weight) in [(0.0, 1.0), (0.5, 4.0), (1.0, 1.0)] {
            let g = kinematics(lerp(e.start, e.end, fraction), e.normal(), mode);
            r += g.transpose() * c * (q.at(fraction * l, l) * weight * l / 6.0);
        }
    }
    r
}

/// The zero-twist shear flow for the strain rate `rate` (about the pitch axis).
fn unit_field(
    contour: &Contour,
    walls: &[WallStiffness],
    asm: &Assembly,
    rate: Vector4<f64>,
    mode: WallCurvature,
) -> Option<Vec<ShearField>> {
    let closed_rate = &asm.cell_flow * nalgebra::DVector::from_column_slice(rate.as_slice());
    let mut fields: Vec<ShearField> = contour
        .elements
        .iter()
        .map(|e| {
            let w = &walls[e.laminate];
            let q: f64 = e.cells().map(|(j, s)| s * closed_rate[j]).sum();
            let a = w.mixed_stiffness().row(0);
            let nx = |p| (a * kinematics(p, e.normal(), mode) * rate)[0] + w.coupling() * q;
            ShearField { q0: 0.0, n0: nx(e.start), n1: nx(e.end) }
        })
        .collect();
    let dn = |k: usize, f: &[ShearField]| 0.5 * (f[k].n0 + f[k].n1) * contour.elements[k].length();
    // Webs: cut at the lower end, flow upward.
    let mut web_top = Vec::with_capacity(contour.webs.len());
    for range in &contour.webs {
        let mut q = 0.0;
        for k in range.clone() {
            fields[k].q0 = q;
            q -= dn(k, &fields);
        }
        web_top.push(q);
    }
    // Trailing-edge branches: free at the trailing-edge point.
    let mut q = 0.0;
    for k in contour.tail_upper.clone().rev() {
        q += dn(k, &fields);
        fields[k].q0 = q;
    }
    let upper_leaving = if contour.tail_upper.is_empty() { 0.0 } else { q };
    let mut q = 0.0;
    for k in contour.tail_lower.clone() {
        fields[k].q0 = q;
        q -= dn(k, &fields);
    }
    let lower_arriving = q;
    // The loop, cut at the leading edge.
    let mut q = 0.0;
    for k in 0..contour.loop_len {
        match contour.loop_nodes[k] {
            Node::WebTop(w) => q += web_top[w],
            Node::Merge => q += lower_arriving - upper_leaving,
            Node::Plain | Node::WebBottom(_) | Node::TrailingEdge => {}
        }
        fields[k].q0 = q;
        q -= dn(k, &fields);
    }
    // Close every cell with zero twist.
    let nc = contour.cell_areas.len();
    let mut rhs = DVector::zeros(nc);
    for (e, fl) in contour.elements.iter().zip(&fields) {
        let f = walls[e.laminate].shear_compliance();
        let iq = fl.integral(e.length());
        for (j, s) in e.cells() {
            rhs[j] -= s * f * iq;
        }
    }
    let closing = solve_cells(&asm.flexibility, &rhs)?;
    for (e, fl) in contour.elements.iter().zip(fields.iter_mut()) {
        fl.q0 += e.cells().map(|(j, s)| s * closing[j]).sum::<f64>();
    }
    Some(fields)
}
