//! The net grown over a prior net's nodes against the net grown afresh.

use super::*;

/// A doubly curved patch (an ellipsoid's cap, `z = √(1 − x²/4 − y²)`, radii 2 and 1 m): no
/// net on it is a plane's, so a node taken from the wrong place would show.
struct Cap;

impl DrapeSurface for Cap {
    fn point(&self, p: [f64; 2]) -> [f64; 3] {
        let z = (1.0 - 0.25 * p[0] * p[0] - p[1] * p[1]).max(0.0).sqrt();
        [p[0], p[1], z]
    }
}

fn spec(region: Prune) -> DrapeSpec {
    DrapeSpec {
        seed: [0.1, -0.05],
        // 45° to the parameter lines, as the bands that grow the most scaffolding.
        warp: [1.0, 1.0, 0.0],
        spacing: 0.02,
        bounds: [[-1.2, 1.2], [-0.7, 0.7]],
        region: Some(region),
    }
}

/// Every node of the net grown over a prior, smaller net's nodes is the node of the net grown
/// afresh, bit for bit, and the same nodes are missing: a node depends only on the nodes
/// between it and the seed (Mack & Taylor's construction closes each cell from its two inner
/// neighbours), which the prior net was grown for wherever it was grown for the node.
#[test]
fn a_net_over_a_prior_net_is_the_net_grown_afresh() {
    let band = vec![[-0.6, -0.1], [0.6, -0.1], [0.6, 0.1], [-0.6, 0.1]];
    let small = vec![[-0.3, -0.05], [0.2, -0.05], [0.2, 0.08], [-0.3, 0.08]];
    let prior = drape(&Cap, &spec(Prune::Param(small, 0.04))).expect("prior net");
    let wide = spec(Prune::Param(band, 0.1));
    let fresh = drape(&Cap, &wide).expect("fresh net");
    let over = drape_over(&Cap, &wide, Some(&prior)).expect("net over the prior");
    let reused = prior.nodes().filter(|(i, j, _)| fresh.grown(*i, *j)).count();
    assert!(reused > 200, "{reused} nodes taken from the prior net");
    assert!(fresh.nodes().count() > 2 * reused, "{}", fresh.nodes().count());
    assert_eq!(fresh.nodes().count(), over.nodes().count());
    for (i, j, a) in fresh.nodes() {
        let b = over.node(i, j).unwrap_or_else(|| panic!("node {i}, {j} missing"));
        assert_eq!(a.param.map(f64::to_bits), b.param.map(f64::to_bits), "node {i}, {j}");
        assert_eq!(a.point.map(f64::to_bits), b.point.map(f64::to_bits), "node {i}, {j}");
        assert_eq!(a.normal.map(f64::to_bits), b.normal.map(f64::to_bits), "node {i}, {j}");
    }
}
