//! Tracking modes from speed to speed by the mass-weighted modal assurance criterion.
//!
//! `MAC(a, b) = (aᵀ M b)² / ((aᵀ M a)(bᵀ M b))` (Allemang & Brown, "A correlation coefficient for
//! modal vector analysis", Proc. 1st IMAC, 1982, with the mass matrix as weight): 1 for the same
//! shape, 0 for M-orthogonal shapes. The mass matrix does not depend on speed, so modes of one
//! speed are exactly M-orthogonal and a mode changes little between neighbouring speeds. Pairs are
//! matched greedily, largest MAC first; a pair needs at least [`MIN_TRACK_MAC`]. A mode with no
//! match starts a new track (a mode entering the lowest set from above, or one that changed too
//! much over the speed step, for instance in a sharp veering).

use nalgebra::DVector;

use super::band::BandMatrix;
use super::modes::Mode;

/// The least MAC for a mode to continue a track of the previous speed.
pub const MIN_TRACK_MAC: f64 = 0.5;

/// The mass-weighted modal assurance criterion of `a` and `b`.
pub fn mac(m: &BandMatrix, a: &DVector<f64>, b: &DVector<f64>) -> f64 {
    let ma = m_times(m, a);
    let mb = m_times(m, b);
    let ab = ma.dot(b);
    let (aa, bb) = (ma.dot(a), mb.dot(b));
    if aa <= 0.0 || bb <= 0.0 { 0.0 } else { ab * ab / (aa * bb) }
}

/// The mass-weighted MAC of every vector of `a` with every vector of `b` (`table[i][j]` for
/// `a[i]`, `b[j]`): the values of [`mac`] to the last bit, with one product by `M` per vector
/// instead of two per pair (pairing 8 modes with 10 took 160 band products, now 18).
pub(crate) fn mac_table(m: &BandMatrix, a: &[&DVector<f64>], b: &[&DVector<f64>]) -> Vec<Vec<f64>> {
    let mb: Vec<(f64, &DVector<f64>)> = b
        .iter()
        .map(|&y| {
            let my = m_times(m, y);
            (my.dot(y), y)
        })
        .collect();
    a.iter()
        .map(|&x| {
            let mx = m_times(m, x);
            let aa = mx.dot(x);
            mb.iter()
                .map(|&(bb, y)| {
                    let ab = mx.dot(y);
                    if aa <= 0.0 || bb <= 0.0 { 0.0 } else { ab * ab / (aa * bb) }
                })
                .collect()
        })
        .collect()
}

fn m_times(m: &BandMatrix, x: &DVector<f64>) -> DVector<f64> {
    let mut y = DVector::zeros(x.len());
    m.mul_vec(x.as_slice(), y.as_mut_slice());
    y
}

/// Gives every mode of `current` the track of its best match in `previous` (whose tracks are
/// set); unmatched modes get new tracks from `next_track`. Both sets are M-normalised (as the
/// solver returns them), so `MAC = (x_iᵀ M y_j)² / (y_jᵀ M y_j)` with one product per current
/// mode.
pub(crate) fn continue_tracks(
    m: &BandMatrix,
    previous: &[Mode],
    current: &mut [Mode],
    next_track: &mut usize,
) {
    let mut pairs = Vec::with_capacity(previous.len() * current.len());
    for (j, c) in current.iter().enumerate() {
        let my = m_times(m, &c.vector);
        let cc = my.dot(&c.vector);
        for (i, p) in previous.iter().enumerate() {
            let pc = my.dot(&p.vector);
            let value = if cc > 0.0 { pc * pc / cc } else { 0.0 };
            if value >= MIN_TRACK_MAC {
                pairs.push((value, i, j));
            }
        }
    }
    pairs.sort_by(|a, b| b.0.total_cmp(&a.0));
    let mut used_prev = vec![false; previous.len()];
    for (_, i, j) in pairs {
        if used_prev[i] || current[j].track.is_some() {
            continue;
        }
        used_prev[i] = true;
        current[j].track = previous[i].track;
    }
    for c in current.iter_mut().filter(|c| c.track.is_none()) {
        c.track = Some(*next_track);
        *next_track += 1;
    }
}

/// Starts one track per mode.
pub(crate) fn start_tracks(current: &mut [Mode], next_track: &mut usize) {
    for c in current.iter_mut() {
        c.track = Some(*next_track);
        *next_track += 1;
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The table holds exactly the values of `mac` pair by pair (a refactoring check: the dry
    /// and wet pairing must not move by a bit), zero vectors included.
    #[test]
    fn the_mac_table_repeats_mac_to_the_bit() {
        let n = 12;
        let mut m = BandMatrix::zeros(n, 2);
        for i in 0..n {
            m.add(i, i, 2.0 + 0.1 * i as f64);
            if i + 1 < n {
                m.add(i + 1, i, -0.3);
            }
            if i + 2 < n {
                m.add(i + 2, i, 0.05 * i as f64);
            }
        }
        let vector = |seed: f64| DVector::from_fn(n, |i, _| (seed * (i as f64 + 1.0)).sin());
        let a = [vector(0.7), vector(1.9), DVector::zeros(n)];
        let b = [vector(0.71), vector(2.3), vector(3.1), vector(1.9)];
        let ar: Vec<&DVector<f64>> = a.iter().collect();
        let br: Vec<&DVector<f64>> = b.iter().collect();
        let table = mac_table(&m, &ar, &br);
        assert_eq!(table.len(), a.len());
        for (i, x) in a.iter().enumerate() {
            assert_eq!(table[i].len(), b.len());
            for (j, y) in b.iter().enumerate() {
                assert_eq!(table[i][j].to_bits(), mac(&m, x, y).to_bits(), "({i}, {j})");
            }
        }
        // The same shape gives 1, a zero vector 0.
        assert!((table[1][3] - 1.0).abs() < 1e-14);
        assert_eq!(table[2][0], 0.0);
    }
}
