//! The wall layout of one section for the section solver.

use std::collections::HashMap;

use super::coverage::Surface;
use super::{Blade, BladeError};
use crate::input::Region;
use crate::section::{SectionLayout, WebLayout};

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
        let edges = |surface: Surface| -> Vec<f64> {
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
            e.dedup_by(|a, b| (*a - *b).abs() < 1e-9);
            e
        };
        insert_edges(&mut outline.upper, &edges(Surface::Upper));
        insert_edges(&mut outline.lower, &edges(Surface::Lower));
        let chord = self.chord(r);
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
            let plies = self.surface_ply_indices(r, surface, x);
            if plies.is_empty() {
                return Err(BladeError::NoPlies { file: self.plies_file.clone(), surface, x, r });
            }
            segment_laminate.push(intern(plies));
        }

        let mut webs = Vec::new();
        for w in self.webs.iter().filter(|w| r >= w.r_start - 1e-9 && r <= w.r_end + 1e-9) {
            let plies = self.web_ply_indices(r, &w.name);
            if plies.is_empty() {
                return Err(BladeError::WebWithoutPlies {
                    file: self.plies_file.clone(),
                    web: w.name.clone(),
                    r,
                });
            }
            webs.push(WebLayout {
                name: w.name.clone(),
                y: (w.chord_frac - pa) * chord,
                laminate: intern(plies),
            });
        }

        let (x_max, _) = outline.max_depth();
        let mut check_at: Vec<f64> = vec![x_max];
        check_at.extend(
            self.webs
                .iter()
                .filter(|w| r >= w.r_start - 1e-9 && r <= w.r_end + 1e-9)
                .map(|w| w.chord_frac),
        );
        for x in check_at {
            let depth = outline.depth_at(x) * chord;
            let upper = self.surface_thickness(r, Surface::Upper, x);
            let lower = self.surface_thickness(r, Surface::Lower, x);
            if upper + lower >= depth {
                return Err(BladeError::TooThick {
                    file: self.plies_file.clone(),
                    r,
                    line: self.nearest_station_line(r),
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
fn insert_edges(surface: &mut Vec<[f64; 2]>, edges: &[f64]) {
    for &x in edges {
        let Some(i) = surface.windows(2).position(|w| w[0][0] <= x && x < w[1][0]) else {
            continue;
        };
        let (a, b) = (surface[i], surface[i + 1]);
        if (x - a[0]).abs() < 1e-6 || (b[0] - x).abs() < 1e-6 {
            continue;
        }
        let w = (x - a[0]) / (b[0] - a[0]);
        surface.insert(i + 1, [x, a[1] + w * (b[1] - a[1])]);
    }
}
