//! The wall layout of one section for the section solver.

use std::collections::HashMap;

use super::coverage::Surface;
use super::{Blade, BladeError};
use crate::layout::{SectionLayout, WebLayout};
use crate::project::Region;

impl Blade {
    /// The wall layout of the section at `r` with about `contour_points` points on the outer
    /// mould line: the outline in the chord frame (m, origin on the pitch axis), the laminate of
    /// every segment, and the webs present at `r` with their laminates.
    ///
    /// Fails where the skin has a hole (no ply covers a segment), where a web present at `r` has no
    /// plies, and where the laminates fill the section depth at its thickest point or at a web
    /// (walls may merge only towards the edges: a thin trailing edge is solid laminate there).
    pub fn section_layout(
        &self,
        r: f64,
        contour_points: usize,
    ) -> Result<SectionLayout, BladeError> {
        self.section_layout_with_plies(r, contour_points).map(|(layout, _)| layout)
    }

    /// [`Blade::section_layout`] together with, for each of the layout's laminates, the indices
    /// of its plies in the schedule (outermost first), for reports that name plies
    /// ([`Blade::ply`]).
    pub fn section_layout_with_plies(
        &self,
        r: f64,
        contour_points: usize,
    ) -> Result<(SectionLayout, Vec<Vec<usize>>), BladeError> {
        let n = (contour_points / 2).max(8);
        let mut outline = self.outline(r, n)?;
        // A vertex at every ply edge, so that each segment lies under one laminate.
        let edges = |surface: Surface| -> Vec<(f64, f64)> {
            let mut e: Vec<f64> = self
                .plies
                .iter()
                .filter(|p| p.spec.r_start <= r + 1e-9 && r <= p.spec.r_end + 1e-9)
                .filter(|p| {
                    matches!(
                        (&p.spec.region, surface),
                        (Region::Both, _)
                            | (Region::Upper, Surface::Upper)
                            | (Region::Lower, Surface::Lower)
                    )
                })
                .flat_map(|p| [p.spec.from, p.spec.to])
                .filter(|&x| x > 1e-6 && x < 1.0 - 1e-6)
                .collect();
            e.sort_by(f64::total_cmp);
            // Edges closer than `EDGE_MERGE` are one vertex (the first of them): `insert_edges`
            // puts no second vertex that close, and two thickness steps on one vertex would
            // give it two ramps whose ends all but coincide. Each entry is the cluster's first
            // and last edge, so that the step is taken across all of it.
            let mut clusters: Vec<(f64, f64)> = Vec::new();
            for x in e {
                match clusters.last_mut() {
                    Some(last) if x - last.1 < EDGE_MERGE => last.1 = x,
                    _ => clusters.push((x, x)),
                }
            }
            clusters
        };
        let chord = self.chord(r);
        for (surface, points) in
            [(Surface::Upper, &mut outline.upper), (Surface::Lower, &mut outline.lower)]
        {
            let clusters = edges(surface);
            let e: Vec<f64> = clusters.iter().map(|c| c.0).collect();
            insert_edges(points, &e);
            // Where the thickness steps, the wall midline ramps from one offset to the other
            // over the two segments beside the step; their length is fixed here (see
            // `fix_ramps`) so that the stiffness converges as the outline gets more points.
            let steps: Vec<(f64, f64)> = clusters
                .iter()
                .map(|&(x, last)| {
                    let step = self.surface_thickness(r, surface, last + 1e-7)
                        - self.surface_thickness(r, surface, x - 1e-7);
                    (x, PLY_DROP_RAMP * step.abs() / chord)
                })
                .filter(|&(_, half)| half > 1e-6)
                .collect();
            fix_ramps(points, &e, &steps);
        }
        let pa = self.pitch_axis_frac(r);
        let to_frame = |p: [f64; 2]| [(p[0] - pa) * chord, p[1] * chord];

        let blunt = outline.blunt_te();
        let mut outer: Vec<[f64; 2]> = outline.upper.iter().map(|&p| to_frame(p)).collect();
        let lower_end = if blunt { outline.lower.len() - 1 } else { outline.lower.len() - 2 };
        outer.extend(outline.lower[1..=lower_end].iter().rev().map(|&p| to_frame(p)));

        // Segment i runs from outer[i] to outer[i + 1]: upper segments first, then the base of a
        // blunt trailing edge (laminate of the upper trailing edge), then the lower surface.
        let n_upper = outline.upper.len() - 1;
        let mut keys: Vec<Vec<usize>> = Vec::new();
        let mut index: HashMap<Vec<usize>, usize> = HashMap::new();
        let mut segment_laminate = Vec::with_capacity(outer.len());
        let mut intern = |plies: Vec<usize>| -> usize {
            *index.entry(plies.clone()).or_insert_with(|| {
                keys.push(plies);
                keys.len() - 1
            })
        };
        let upper_candidates = self.surface_span_plies(r, Surface::Upper);
        let lower_candidates = self.surface_span_plies(r, Surface::Lower);
        for i in 0..outer.len() {
            let (surface, x) = if i < n_upper {
                (Surface::Upper, 0.5 * (outline.upper[i][0] + outline.upper[i + 1][0]))
            } else if blunt && i == n_upper {
                (Surface::Upper, 1.0)
            } else {
                // Lower segments, from the trailing edge back to the leading edge.
                let k = outer.len() - i; // segment between lower points k and k-1 (k counted from LE)
                let (a, b) = (outline.lower[k.min(outline.lower.len() - 1)], outline.lower[k - 1]);
                (Surface::Lower, 0.5 * (a[0] + b[0]))
            };
            let candidates = match surface {
                Surface::Upper => &upper_candidates,
                Surface::Lower => &lower_candidates,
            };
            let plies = self.chord_ply_indices(candidates, x);
            if plies.is_empty() {
                return Err(BladeError::NoPlies { surface, x, r });
            }
            segment_laminate.push(intern(plies));
        }

        let mut webs = Vec::new();
        for w in self.webs.iter().filter(|w| self.web_present(w, r)) {
            let plies = self.web_ply_indices(r, &w.name);
            if plies.is_empty() {
                return Err(BladeError::WebWithoutPlies { web: w.name.clone(), r });
            }
            webs.push(WebLayout {
                name: w.name.clone(),
                y: (w.chord_frac - pa) * chord,
                laminate: intern(plies),
            });
        }

        let (x_max, _) = outline.max_depth();
        let mut check_at: Vec<f64> = vec![x_max];
        check_at.extend(self.webs.iter().filter(|w| self.web_present(w, r)).map(|w| w.chord_frac));
        for x in check_at {
            let depth = outline.depth_at(x) * chord;
            let upper = self.surface_thickness(r, Surface::Upper, x);
            let lower = self.surface_thickness(r, Surface::Lower, x);
            if upper + lower >= depth {
                return Err(BladeError::TooThick {
                    r,
                    station: self.nearest_station(r),
                    x,
                    upper_mm: upper * 1e3,
                    lower_mm: lower * 1e3,
                    depth_mm: depth * 1e3,
                });
            }
        }

        let laminates = keys.iter().map(|k| self.laminate_of(k)).collect();
        let layout = SectionLayout {
            r,
            chord,
            twist: self.twist(r),
            pitch_axis_frac: pa,
            outer,
            laminates,
            segment_laminate,
            webs,
        };
        Ok((layout, keys))
    }
}

/// Inserts a point at each chord fraction in `edges` (sorted) on a surface running from the
/// leading edge to the trailing edge, on the straight segment that straddles it; a point within
/// 1e-6 chord of an existing one is taken as already there.
/// Ply edges closer than this (chord fraction) along a surface share one vertex of the outline,
/// as an edge this close to an outline point does (`insert_edges`): a micrometre on a metre of
/// chord, far below how closely cloth is cut.
const EDGE_MERGE: f64 = 1e-6;

fn insert_edges(surface: &mut Vec<[f64; 2]>, edges: &[f64]) {
    for &x in edges {
        let Some(i) = surface.windows(2).position(|w| w[0][0] <= x && x < w[1][0]) else {
            continue;
        };
        let (a, b) = (surface[i], surface[i + 1]);
        if (x - a[0]).abs() < EDGE_MERGE || (b[0] - x).abs() < EDGE_MERGE {
            continue;
        }
        let w = (x - a[0]) / (b[0] - a[0]);
        surface.insert(i + 1, [x, a[1] + w * (b[1] - a[1])]);
    }
}

/// Length of each of the two segments beside a thickness step (a ply drop or the edge of a core),
/// in multiples of the step: the wall midline passes from one offset to the other over them.
/// Left to the outline spacing, that ramp would get steeper and its elements relatively longer
/// as the points get closer, and the stiffness would drift with the number of points (by up to
/// 0.6 % per doubling on the small-wind demo, beside its 4 mm cores). One step's length on each side makes the midline ramp
/// about 1:4, as steep as a chamfered core edge; a ply drop is usually tapered more gently, which
/// changes the stiffness by a fraction of the dropped ply's share over a few thicknesses (common
/// practice).
const PLY_DROP_RAMP: f64 = 1.0;

/// The longest ramp beside a thickness step, as a fraction of chord: a thick core edge on a small
/// chord keeps the outline's shape (the segments beside the step are chords of the surface).
const MAX_RAMP: f64 = 0.02;

/// Gives the two segments beside each thickness step `(x, half)` (chord fraction of the step,
/// ramp length along the surface as a fraction of chord) the length `half`: a vertex is put
/// `half` before and after the step, or the ramp ends at a ply edge within 1.5 `half`; the
/// outline's vertices inside the ramp are taken out, and so is a vertex just outside a ramp end
/// that would leave a short segment there (its offset could fold the midline back). Ply edges
/// (`edges`) and the surface's end points stay.
fn fix_ramps(surface: &mut Vec<[f64; 2]>, edges: &[f64], steps: &[(f64, f64)]) {
    let mut s = vec![0.0; surface.len()];
    for i in 1..surface.len() {
        let (a, b) = (surface[i - 1], surface[i]);
        s[i] = s[i - 1] + (b[0] - a[0]).hypot(b[1] - a[1]);
    }
    let total = s[s.len() - 1];
    let index_of = |x: f64| surface.iter().position(|p| (p[0] - x).abs() < EDGE_MERGE);
    let edge_s: Vec<f64> = edges.iter().filter_map(|&e| index_of(e)).map(|i| s[i]).collect();
    // Arc positions of new ramp ends, and open arc intervals to clear of outline vertices.
    let (mut ends, mut clear) = (Vec::new(), Vec::new());
    for &(x, half) in steps {
        let Some(k) = index_of(x) else { continue };
        let half = half.min(MAX_RAMP);
        for side in [-1.0, 1.0] {
            let reach = s[k] + side * 1.5 * half;
            let blocking = edge_s
                .iter()
                .copied()
                .filter(|&e| (e - s[k]) * side > 1e-9 && (reach - e) * side > 0.0)
                .min_by(|a, b| (a - s[k]).abs().total_cmp(&(b - s[k]).abs()));
            let end = match blocking {
                Some(e) => e,
                None => {
                    let end = (s[k] + side * half).clamp(0.0, total);
                    ends.push(end);
                    end
                }
            };
            clear.push((s[k].min(end), s[k].max(end)));
        }
    }
    ends.sort_by(f64::total_cmp);
    // (point, arc position, stays, is a ramp end)
    let mut pts: Vec<([f64; 2], f64, bool, bool)> = Vec::with_capacity(surface.len() + ends.len());
    let mut next = 0;
    for i in 0..surface.len() {
        while i > 0 && next < ends.len() && ends[next] <= s[i] {
            let e = ends[next];
            next += 1;
            if e - s[i - 1] < 1e-9 || s[i] - e < 1e-9 {
                continue;
            }
            let w = (e - s[i - 1]) / (s[i] - s[i - 1]);
            let (a, b) = (surface[i - 1], surface[i]);
            pts.push(([a[0] + w * (b[0] - a[0]), a[1] + w * (b[1] - a[1])], e, true, true));
        }
        let stays = i == 0
            || i + 1 == surface.len()
            || edge_s.iter().chain(&ends).any(|&e| (e - s[i]).abs() < 1e-9);
        let inside = clear.iter().any(|&(lo, hi)| s[i] > lo + 1e-9 && s[i] < hi - 1e-9);
        if stays || !inside {
            pts.push((surface[i], s[i], stays, false));
        }
    }
    // A vertex just outside a ramp end, closer to it than half the next segment's length.
    let mut drop = vec![false; pts.len()];
    for j in 0..pts.len() {
        if !pts[j].3 {
            continue;
        }
        for (q, r) in [(j + 1, j + 2), (j.wrapping_sub(1), j.wrapping_sub(2))] {
            if let (Some(pq), Some(pr)) = (pts.get(q), pts.get(r)) {
                if !pq.2 && (pq.1 - pts[j].1).abs() < 0.5 * (pr.1 - pq.1).abs() {
                    drop[q] = true;
                }
            }
        }
    }
    *surface = pts.iter().zip(&drop).filter(|(_, d)| !**d).map(|(p, _)| p.0).collect();
}
