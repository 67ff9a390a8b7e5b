//! The kit: every region draped (in pieces where needed), each pattern with its material, mass,
//! cost and draping checks, in lay-up order, and the patterns of each material nested on its
//! roll.

use super::PlyBookError;
use super::book::{FabricKind, MaterialNesting, PatternEntry, PlyBook, PlyBookParams};
use super::nest::{NestItem, nest};
use super::pieces::{drape_ply, first_attempts};
use super::regions::{Level, PlyRegion, ply_regions};
use super::splice::{Splice, piece_name, splice_note, splices_of};
use super::warning::{PlyBookIssue, PlyBookWarning};
use crate::blade::Blade;
use crate::material::{CuttingData, LaminaKind};
use crate::project::{PlySpec, Project};

/// The pattern name of a region: the ply's id and its skin or web.
pub(super) fn region_name(p: &PlySpec, region: &PlyRegion) -> String {
    format!("{}-{}", file_safe(&p.id), file_safe(region.surface_name.trim_start_matches("web:")))
}

/// Builds the ply book of a blade: every ply region draped and flattened (in pieces where one
/// will not drape whole), checked, and the patterns of each material nested on its roll.
pub fn build_ply_book(
    blade: &Blade,
    project: &Project,
    params: &PlyBookParams,
) -> Result<PlyBook, PlyBookError> {
    let regions = ply_regions(blade, params)?;
    let mut patterns = Vec::with_capacity(regions.len());
    let mut warnings: Vec<PlyBookWarning> = Vec::new();
    let mut failed = Vec::new();
    let mut splices = Vec::new();
    let mut splice_lines: Vec<Splice> = Vec::new();
    let mut attempts = first_attempts(blade, regions).into_iter().peekable();
    while let Some(first) = attempts.next() {
        // The regions of one ply (a `both` ply's two skins) are cut in pieces side by side.
        let ply = first.0.ply;
        let mut group = vec![first];
        while let Some(next) = attempts.next_if(|(r, _)| r.ply == ply) {
            group.push(next);
        }
        for (extent, draped) in drape_ply(blade, group, params, &splice_lines) {
            let row = ply;
            let Some(draped) = draped else { continue };
            let (Some(p), Some(mat)) = (blade.ply(row), blade.ply_material(row)) else { continue };
            let cutting = project.materials.cutting(&p.material);
            let kind = match mat.kind {
                LaminaKind::Isotropic => FabricKind::Sheet,
                LaminaKind::Orthotropic if mat.e2 >= 0.8 * mat.e1 => FabricKind::Fabric,
                LaminaKind::Orthotropic => FabricKind::Unidirectional,
            };
            let name = extent.name;
            let extent = (extent.span, extent.chord, extent.surface);
            let (pieces, missed) = match draped {
                Ok(v) => v,
                Err(e) => {
                    failed.push(e);
                    continue;
                }
            };
            let count = pieces.len();
            if count > 1 {
                splices.push(splice_note(p, &name, &pieces, params.stagger));
                splice_lines.extend(splices_of(extent.0, extent.1, &pieces));
            }
            if !missed.is_empty() {
                warnings.push(PlyBookWarning {
                    row,
                    ply: p.id.clone(),
                    pattern: name.clone(),
                    web: extent.2.starts_with("web"),
                    issue: PlyBookIssue::SpliceNotStaggered {
                        stagger: params.stagger,
                        others: missed
                            .iter()
                            .filter_map(|&k| blade.ply(k).map(|q| q.id.clone()))
                            .collect(),
                    },
                });
            }
            for (n, (region, flat)) in pieces.into_iter().enumerate() {
                let name = if count > 1 { piece_name(&name, n) } else { name.clone() };
                let mass = flat.area * mat.ply_thickness * mat.density;
                let entry = PatternEntry {
                    name,
                    ply: p.id.clone(),
                    order: region.ply + 1,
                    material: p.material.clone(),
                    surface: region.surface_name.clone(),
                    angle: p.angle,
                    kind,
                    r_range: region.span,
                    chord_range: matches!(region.level, Level::Skin(_)).then_some(region.chord),
                    area_m2: flat.area,
                    thickness_m: mat.ply_thickness,
                    mass_kg: mass,
                    cost: cutting.cost_per_kg.map(|c| c * mass),
                    locking_angle: cutting.locking_angle,
                    max_shear_place: region.place(flat.max_shear_at),
                    max_deviation_place: region.place(flat.max_deviation_at),
                    pattern: flat,
                };
                warnings.extend(drape_warning(&entry, row));
                let web = region.surface_name.starts_with("web");
                if let Some(&q) = entry.pattern.cut_short.first() {
                    warnings.push(PlyBookWarning {
                        row,
                        ply: entry.ply.clone(),
                        pattern: entry.name.clone(),
                        web,
                        issue: PlyBookIssue::CutShort {
                            at: region.place(q),
                            moved: entry.pattern.cut_short.len(),
                            points: entry.pattern.outline.len(),
                            area: entry.area_m2,
                        },
                    });
                }
                if let Some(&q) = entry.pattern.extrapolated.first() {
                    warnings.push(PlyBookWarning {
                        row,
                        ply: entry.ply.clone(),
                        pattern: entry.name.clone(),
                        web,
                        issue: PlyBookIssue::Extrapolated {
                            at: region.place(q),
                            extrapolated: entry.pattern.extrapolated.len(),
                        },
                    });
                }
                patterns.push(entry);
            }
        }
    }
    let nestings = nest_materials(&patterns, project, params)?;
    Ok(PlyBook { project: project.name.clone(), patterns, nestings, warnings, failed, splices })
}

/// The draping check of one pattern: a fabric past its locking angle, or a unidirectional ply
/// whose fibres deviate more than 5° (common practice) from the intended direction.
fn drape_warning(e: &PatternEntry, row: usize) -> Option<PlyBookWarning> {
    let issue = match e.kind {
        FabricKind::Fabric if e.locks() => PlyBookIssue::FabricLocks {
            shear: e.pattern.max_shear.abs(),
            locking_angle: e.locking_angle,
            at: e.max_shear_place,
        },
        FabricKind::Unidirectional if e.pattern.max_deviation.to_degrees().abs() > 5.0 => {
            PlyBookIssue::FibreDeviation {
                deviation: e.pattern.max_deviation.abs(),
                limit: 5f64.to_radians(),
                at: e.max_deviation_place,
            }
        }
        _ => return None,
    };
    Some(PlyBookWarning {
        row,
        ply: e.ply.clone(),
        pattern: e.name.clone(),
        web: e.surface.starts_with("web"),
        issue,
    })
}

fn nest_materials(
    patterns: &[PatternEntry],
    project: &Project,
    params: &PlyBookParams,
) -> Result<Vec<MaterialNesting>, PlyBookError> {
    let mut materials: Vec<&str> = Vec::new();
    for p in patterns {
        if !materials.contains(&p.material.as_str()) {
            materials.push(&p.material);
        }
    }
    let mut out = Vec::new();
    for m in materials {
        let cutting: CuttingData = project.materials.cutting(m);
        let idx: Vec<usize> = (0..patterns.len()).filter(|&k| patterns[k].material == m).collect();
        let items: Vec<NestItem> = idx
            .iter()
            .map(|&k| NestItem {
                outline: patterns[k].pattern.outline.clone(),
                quarter_turns: patterns[k].kind.quarter_turns(),
            })
            .collect();
        let nesting = nest(&items, cutting.roll_width, params.gap).map_err(|e| {
            let p = &patterns[idx[e.item]];
            PlyBookError::RollTooNarrow {
                ply: p.ply.clone(),
                pattern: p.name.clone(),
                material: m.to_string(),
                least_mm: e.least_width * 1e3,
                roll_mm: cutting.roll_width * 1e3,
            }
        })?;
        let first = &patterns[idx[0]];
        let areal_mass = first.mass_kg / first.area_m2;
        let roll_area = nesting.length * nesting.width;
        let scrap_kg = (roll_area - nesting.pattern_area).max(0.0) * areal_mass;
        out.push(MaterialNesting {
            material: m.to_string(),
            roll_cost: cutting.cost_per_kg.map(|c| c * roll_area * areal_mass),
            nesting,
            patterns: idx,
            areal_mass,
            scrap_kg,
        });
    }
    Ok(out)
}

/// Letters, digits, `-` and `_`; anything else becomes `-`.
fn file_safe(s: &str) -> String {
    s.chars()
        .map(|c| if c.is_ascii_alphanumeric() || c == '-' || c == '_' { c } else { '-' })
        .collect()
}
