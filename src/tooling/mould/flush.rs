//! Locating keys across the flush face where two span-wise modules meet.
//!
//! **Shape.** The key is the wedge of [`super::keys`] stood on the flush face `x = x_f` (normal
//! to the pitch axis, parallel to every pull): its base a trapezoid on the block's top face (the
//! upper halves) or bottom face (the lower halves), of width `w = m/4` along the face's outer
//! edge (the margin `m`) and depth `δ = 0.4 w` along +X into the tip-side module, flanks
//! leaning 10° inward; its apex `F` on the flush face `L = 1.5 w` into the block from the
//! edge. It stands on the root-side module's half; the tip-side module's half of the same side
//! has the socket, the key scaled about the middle `M` of its base edge so that the nearest of
//! its outer face and flanks moves out by the clearance `c` (the others by more). Every face
//! of the key but the open base faces +X, so the tip-side module slides off along the span.
//!
//! **Placement.** `M` stands on the edge at 25 % of the block's width from its `Y_a` corner on
//! the upper halves and at 60 % on the lower ones. A mirror across the middle of the width puts
//! them at 75 % and 40 %, a half turn about the pitch axis the upper key at 75 % of the lower
//! edge and the lower at 40 % of the upper: each at least 15 % of the width (more than
//! `0.3 m`, the block being `2 m` wider than the chord) from its socket, more than a key's
//! width, so a module placed any of those ways meets solid block.

use super::keys::grown;
use crate::mesh::vec3::{self, P3};

/// Where along the edge each half's key stands, from the `Y_a` corner: upper, lower.
pub(crate) const FLUSH_KEY_AT: [f64; 2] = [0.25, 0.60];

/// A key (or its socket) across the flush face where a module meets its neighbour, as built
/// into one half of the module.
#[derive(Debug, Clone, PartialEq)]
pub struct ModuleKey {
    /// On the upper half (its base on the block's top face) or the lower one.
    pub upper: bool,
    /// The socket (the half of the module on the tip side of the face) or the key.
    pub socket: bool,
    /// The wedge's corners, rotor frame, m: `P_a, Q_a, Q_b, P_b` on the top (bottom) face,
    /// `F` on the flush face (see the module docs).
    pub corners: [P3; 5],
}

/// A wedge key (or its socket) across a flush face, mould frame, m.
#[derive(Debug, Clone, PartialEq)]
pub(crate) struct FlushKey {
    /// `P_a, Q_a, Q_b, P_b` on the top (bottom) face, `P_a` at the lesser Y; `F` on the flush
    /// face. The socket's corners when `socket`.
    pub shape: [P3; 5],
    /// Whether this is the socket (the tip-side module) rather than the key.
    pub socket: bool,
}

/// The key of the flush face `x_f` (see the module docs) on the edge `z = z_f` from `y_a` to
/// `y_b`, on an upper half (`upper`: the block lies below `z_f`) or a lower one; `socket` for
/// the tip-side module's half. `None` when the clearance leaves no finite socket.
pub(crate) fn flush_key(
    x_f: f64,
    [y_a, y_b]: [f64; 2],
    z_f: f64,
    upper: bool,
    margin: f64,
    clearance: f64,
    socket: bool,
) -> Option<FlushKey> {
    let at = FLUSH_KEY_AT[usize::from(!upper)];
    let w = 0.25 * margin;
    let (depth, reach) = (0.4 * w, 1.5 * w);
    let flank = depth * 10f64.to_radians().tan();
    let down = if upper { -1.0 } else { 1.0 };
    let centre = [x_f, y_a + at * (y_b - y_a), z_f];
    let p = |dy: f64, dx: f64, dz: f64| vec3::add(centre, [dx, dy, dz]);
    let key = [
        p(-0.5 * w, 0.0, 0.0),
        p(-0.5 * w + flank, depth, 0.0),
        p(0.5 * w - flank, depth, 0.0),
        p(0.5 * w, 0.0, 0.0),
        p(0.0, 0.0, down * reach),
    ];
    let shape = if socket {
        let scale = grown(&key, centre, clearance)?;
        key.map(|q| vec3::add(centre, vec3::scale(vec3::sub(q, centre), scale)))
    } else {
        key
    };
    Some(FlushKey { shape, socket })
}
