//! The design check of a blade model from its stress and modal results.

use super::{Bound, CheckRow, DesignCheck, Place, Quantity};

/// The reserve factor at which a ply fails or a wall panel buckles: what strength and buckling
/// demand at least when the project sets no limit of its own.
pub const FAILURE_LIMIT: f64 = 1.0;

/// The design check of a model against its project's `[criteria]`, from the stress results of
/// every load case and the modal analysis (either may be absent when its criterion is not set).
/// The buckling criterion demands `min_buckling_factor`, or `min_reserve_factor` when that is
/// not given. When the project has load cases, strength and buckling are always checked: a
/// criterion the project leaves out demands a reserve factor of 1 ([`FAILURE_LIMIT`]), for a
/// ply that fails or a wall that buckles under a load case is never a pass.
pub fn evaluate(
    model: &crate::analysis::BladeModel,
    stress: &[crate::stress::CaseStress],
    modal: Option<&crate::modal::ModalAnalysis>,
) -> DesignCheck {
    let c = &model.project.criteria;
    let loaded = !model.project.load_cases.is_empty();
    let strength = c.min_reserve_factor.or(loaded.then_some(FAILURE_LIMIT));
    let mut rows = Vec::new();
    if let Some(limit) = strength {
        let worst = stress
            .iter()
            .filter_map(|s| s.critical.as_ref().map(|k| (s, k)))
            .min_by(|a, b| a.1.reserve_factor.total_cmp(&b.1.reserve_factor));
        let (found, location) = match worst {
            Some((s, k)) => (
                Some(k.reserve_factor),
                Place::Ply {
                    case: s.name.clone(),
                    r_m: k.r,
                    location: k.location.clone(),
                    ply_id: k.ply_id.clone(),
                },
            ),
            None if !stress.is_empty() => (Some(f64::INFINITY), Place::NoPlyCanFail),
            None => (None, Place::NoLoadCase),
        };
        rows.push(CheckRow::new(
            "min_reserve_factor",
            "least reserve factor",
            limit,
            Bound::AtLeast,
            found,
            Quantity::Ratio,
            location,
        ));
    }
    if let Some(limit) = c.min_buckling_factor.or(strength) {
        let worst = stress
            .iter()
            .filter_map(|s| s.least_buckling().map(|(i, j)| (s, i, j)))
            .min_by(|a, b| {
                let rf = |x: &(&crate::stress::CaseStress, usize, usize)| {
                    x.0.buckling[x.1].panels[x.2].check.reserve_factor
                };
                rf(a).total_cmp(&rf(b))
            });
        let (found, location) = match worst {
            Some((s, i, j)) => {
                let p = &s.buckling[i].panels[j];
                (
                    Some(p.check.reserve_factor),
                    Place::Panel {
                        case: s.name.clone(),
                        r_m: s.buckling[i].r,
                        panel: Box::new(p.clone()),
                    },
                )
            }
            None if !stress.is_empty() => (Some(f64::INFINITY), Place::NoWallPanel),
            None => (None, Place::NoLoadCase),
        };
        rows.push(CheckRow::new(
            "min_buckling_factor",
            "least buckling reserve factor",
            limit,
            Bound::AtLeast,
            found,
            Quantity::Ratio,
            location,
        ));
    }
    if let Some(limit) = c.frequency_margin {
        let least = modal.and_then(|m| {
            m.margins
                .iter()
                .flat_map(|check| check.modes.iter().map(move |mm| (check, mm)))
                .min_by(|a, b| a.1.margin.total_cmp(&b.1.margin))
        });
        let (found, location) = match (modal, least) {
            (Some(m), Some((check, mm))) => {
                let track =
                    m.campbell.tracks.iter().find(|t| t.id == mm.track).map(|t| t.label.clone());
                (
                    Some(mm.margin),
                    Place::Mode {
                        track,
                        frequency_hz: mm.frequency_hz,
                        wet: !m.dry.is_empty(),
                        excitation: mm.excitation.clone(),
                        excitation_hz: mm.excitation_hz,
                        speed: check.name.clone(),
                        rotor_speed: check.speed,
                    },
                )
            }
            _ => (None, Place::ModalNotRun),
        };
        rows.push(CheckRow::new(
            "frequency_margin_pct",
            "least frequency margin",
            limit,
            Bound::AtLeast,
            found,
            Quantity::Fraction,
            location,
        ));
    }
    if let Some(limit) = c.max_mass_kg {
        let m = model.mass();
        rows.push(CheckRow::new(
            "max_mass_kg",
            "blade mass",
            limit,
            Bound::AtMost,
            Some(m.total_kg),
            Quantity::Mass,
            Place::Mass { laminate_kg: m.laminate_kg, point_masses_kg: m.point_masses_kg },
        ));
    }
    if let Some(limit) = c.max_tip_deflection_m {
        let worst =
            stress.iter().max_by(|a, b| a.tip_deflection.total.total_cmp(&b.tip_deflection.total));
        let (found, location) = match worst {
            Some(s) => (Some(s.tip_deflection.total), Place::Case { name: s.name.clone() }),
            None => (None, Place::NoLoadCase),
        };
        rows.push(CheckRow::new(
            "max_tip_deflection_m",
            "tip deflection",
            limit,
            Bound::AtMost,
            found,
            Quantity::Length,
            location,
        ));
    }
    DesignCheck { rows }
}
