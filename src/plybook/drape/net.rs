//! The draped net: its nodes by warp and weft index, the shear angle and the warp direction at
//! a node.

use super::super::vec3::{add, dot, norm, scale, sub, unit};
use super::wanted::Wanted;

/// One node of the draped net.
#[derive(Debug, Clone, Copy)]
pub struct NetNode {
    /// Parameters.
    pub param: [f64; 2],
    /// Point in space, m.
    pub point: [f64; 3],
    /// Unit normal `S_a × S_b`.
    pub normal: [f64; 3],
}

/// The draped net: node `(i, j)` sits `i` links along the warp and `j` along the weft from the
/// seed; in the flat cloth it is at `(i d, j d)`.
#[derive(Debug, Clone)]
pub struct DrapedNet {
    /// Net spacing, m.
    pub spacing: f64,
    /// Half-size: indices run at most from `-half` to `half`.
    pub half: i32,
    /// The least warp and weft indices of the box the net may fill.
    pub(super) lo: [i32; 2],
    /// Nodes of the box along the warp and the weft.
    pub(super) dims: [i32; 2],
    pub(super) nodes: Vec<Option<NetNode>>,
    /// The nodes the net was grown for (every node of the box when `None`).
    pub(super) wanted: Option<Wanted>,
}

impl DrapedNet {
    fn index(&self, i: i32, j: i32) -> Option<usize> {
        let (a, b) = (i - self.lo[0], j - self.lo[1]);
        (a >= 0 && b >= 0 && a < self.dims[0] && b < self.dims[1])
            .then(|| (a * self.dims[1] + b) as usize)
    }

    /// The node `(i, j)`, when the net reached it.
    pub fn node(&self, i: i32, j: i32) -> Option<&NetNode> {
        self.index(i, j).and_then(|k| self.nodes[k].as_ref())
    }

    pub(super) fn set(&mut self, i: i32, j: i32, node: Option<NetNode>) {
        if let Some(k) = self.index(i, j) {
            self.nodes[k] = node;
        }
    }

    /// Whether the net was grown for node `(i, j)`: every node it depends on was tried, so a
    /// node that is missing there is one the cloth cannot reach however far the net is grown.
    pub fn grown(&self, i: i32, j: i32) -> bool {
        match &self.wanted {
            Some(w) => w.get(i, j),
            None => self.index(i, j).is_some(),
        }
    }

    /// Whether the net was grown for every node within `margin` links of the polygon `poly`
    /// (net coordinates: links along the warp and the weft), and for every node between those and
    /// the seed: then each such node is the one a net grown over a larger region places, to the
    /// bit, since a node depends only on the nodes between it and the seed.
    pub fn covers(&self, poly: &[[f64; 2]], margin: f64) -> bool {
        Wanted::new(poly, margin, self.half).marked().all(|(i, j)| self.grown(i, j))
    }

    /// Every node with its indices.
    pub fn nodes(&self) -> impl Iterator<Item = (i32, i32, &NetNode)> {
        let n = self.dims[1];
        self.nodes.iter().enumerate().filter_map(move |(k, v)| {
            v.as_ref().map(|v| (k as i32 / n + self.lo[0], k as i32 % n + self.lo[1], v))
        })
    }

    /// The range of warp indices `[first, last]` the net may fill.
    pub fn warp_range(&self) -> [i32; 2] {
        [self.lo[0], self.lo[0] + self.dims[0] - 1]
    }

    /// The range of weft indices `[first, last]` the net may fill.
    pub fn weft_range(&self) -> [i32; 2] {
        [self.lo[1], self.lo[1] + self.dims[1] - 1]
    }

    /// Shear angle at node `(i, j)`: 90° less the angle between the warp and the weft threads
    /// there (central differences where both neighbours exist), rad; `None` where a thread has no
    /// neighbour.
    pub fn shear(&self, i: i32, j: i32) -> Option<f64> {
        let node = self.node(i, j)?;
        let warp = self.tangent(i, j, 1, 0)?;
        let weft = self.tangent(i, j, 0, 1)?;
        let n = node.normal;
        let (warp, weft) = (sub(warp, scale(n, dot(warp, n))), sub(weft, scale(n, dot(weft, n))));
        let c = dot(warp, weft) / (norm(warp) * norm(weft));
        Some(std::f64::consts::FRAC_PI_2 - c.clamp(-1.0, 1.0).acos())
    }

    /// The thread's tangent at node `(i, j)` along index step `(di, dj)`: the derivative of the
    /// quartic through five nodes where they exist (error of order d⁴), of the parabola through
    /// three, or a one-sided difference.
    fn tangent(&self, i: i32, j: i32, di: i32, dj: i32) -> Option<[f64; 3]> {
        let p = |k: i32| self.node(i + k * di, j + k * dj).map(|n| n.point);
        match (p(-2), p(-1), p(0), p(1), p(2)) {
            (Some(a), Some(b), _, Some(c), Some(e)) => {
                Some(add(scale(sub(c, b), 8.0 / 12.0), scale(sub(a, e), 1.0 / 12.0)))
            }
            (_, Some(b), _, Some(c), _) => Some(scale(sub(c, b), 0.5)),
            (_, None, Some(o), Some(c), _) => Some(sub(c, o)),
            (_, Some(b), Some(o), None, _) => Some(sub(o, b)),
            _ => None,
        }
    }

    /// Unit warp direction at node `(i, j)` in space.
    pub fn warp_direction(&self, i: i32, j: i32) -> Option<[f64; 3]> {
        let n = self.node(i, j)?.normal;
        let t = self.tangent(i, j, 1, 0)?;
        let t = sub(t, scale(n, dot(t, n)));
        (norm(t) > 0.0).then(|| unit(t))
    }
}
