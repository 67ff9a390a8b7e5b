//! The rows of the design check put into words.

use crate::check::{Bound, CheckRow, DesignCheck, Place, Quantity, Status};
use crate::report::{panel_place, sig4};
use crate::units::pct_of;

/// The unit a row's limit and value are shown and written in: empty for a ratio, `%` for a
/// fraction, the SI unit otherwise.
pub fn unit_symbol(row: &CheckRow) -> &'static str {
    match row.quantity {
        Quantity::Ratio => "",
        Quantity::Fraction => "%",
        Quantity::Mass => "kg",
        Quantity::Length => "m",
    }
}

/// The unit as a key suffix for data files: `pct` for percent, `ratio` for a dimensionless
/// ratio, otherwise the SI unit itself (`kg`, `m`).
pub fn unit_key(row: &CheckRow) -> &'static str {
    match row.quantity {
        Quantity::Ratio => "ratio",
        Quantity::Fraction => "pct",
        _ => unit_symbol(row),
    }
}

/// The limit in the unit of [`unit_symbol`]: a fraction as a percentage, echoed as the input
/// gave it (12 significant digits, see [`pct_of`]).
pub fn shown_limit(row: &CheckRow) -> f64 {
    match row.quantity {
        Quantity::Fraction => pct_of(row.limit),
        _ => row.limit,
    }
}

/// The value found in the unit of [`unit_symbol`] (a computed value, not rounded).
pub fn shown_found(row: &CheckRow) -> Option<f64> {
    match row.quantity {
        Quantity::Fraction => row.found.map(|v| v * 100.0),
        _ => row.found,
    }
}

/// A value already in the unit of [`unit_symbol`], for a reader (lengths below a metre in
/// millimetres).
fn show(row: &CheckRow, v: f64) -> String {
    match unit_symbol(row) {
        "" => sig4(v),
        "m" if v.abs() < 1.0 => format!("{} mm", sig4(v * 1e3)),
        unit => format!("{} {unit}", sig4(v)),
    }
}

/// The demand in words, e.g. ">= 1.5" or "<= 20.00 mm".
pub fn demand_text(row: &CheckRow) -> String {
    let op = match row.bound {
        Bound::AtLeast => ">=",
        Bound::AtMost => "<=",
    };
    format!("{op} {}", show(row, shown_limit(row)))
}

/// The value found in words with its unit: "none" when infinite (nothing can fail), "not
/// computed" when absent.
pub fn found_text(row: &CheckRow) -> String {
    match shown_found(row) {
        Some(v) if v.is_finite() => show(row, v),
        Some(_) => "none".to_string(),
        None => "not computed".to_string(),
    }
}

/// Where the governing value occurs, in words (empty when no place is stated).
pub fn place_text(place: &Place) -> String {
    match place {
        Place::Unstated => String::new(),
        Place::Named(words) => words.clone(),
        Place::Ply { case, r_m, location, ply_id } => {
            format!("case '{case}', r = {r_m:.3} m, {location}, ply {ply_id}")
        }
        Place::Panel { case, r_m, panel } => format!(
            "case '{case}', r = {r_m:.3} m, {}, {}",
            panel_place(panel),
            panel.check.mode.label()
        ),
        Place::Mode { track, frequency_hz, wet, excitation, excitation_hz, speed, rotor_speed } => {
            format!(
                "{} at {frequency_hz:.1} Hz{} against {} ({excitation_hz:.1} Hz), {speed} speed \
                 {} rpm",
                track.as_deref().unwrap_or("a mode"),
                if *wet { " (wet)" } else { "" },
                excitation.label(),
                crate::report::rpm_text(rotor_speed.rpm()),
            )
        }
        Place::Mass { laminate_kg, point_masses_kg } => {
            format!("laminates {laminate_kg:.3} kg + point masses {point_masses_kg:.3} kg")
        }
        Place::Case { name } => format!("case '{name}'"),
        Place::NoPlyCanFail => "no ply can fail".to_string(),
        Place::NoWallPanel => "no wall panel".to_string(),
        Place::NoLoadCase => "no load case".to_string(),
        Place::ModalNotRun => "modal analysis not run".to_string(),
    }
}

/// The verdict in one line, naming every criterion that fails with its value and demand:
/// "PASS (every criterion met)", "FAIL: least reserve factor 0.84, demand >= 1.5", or
/// "NOT CHECKED (the project sets no \[criteria\] and no load case)".
pub fn verdict_line(check: &DesignCheck) -> String {
    if check.rows.is_empty() {
        return "NOT CHECKED (the project sets no [criteria] and no load case)".to_string();
    }
    if check.passed() {
        return "PASS (every criterion met)".to_string();
    }
    let failed: Vec<String> = check
        .rows
        .iter()
        .filter(|r| r.status != Status::Pass)
        .map(|r| format!("{} {}, demand {}", r.label, found_text(r), demand_text(r)))
        .collect();
    format!("FAIL: {}", failed.join("; "))
}

/// The verdict line of a design check, last on stdout: with the project's input warnings
/// repeated after it, so that a value that is legal but unusual is seen with the verdict it
/// led to. The warnings are the reader's typed ones (`input::InputWarning`, worded in
/// `report::warnings`) or sentences.
pub fn verdict_text(check: &DesignCheck, input_warnings: &[impl std::fmt::Display]) -> String {
    let line = format!("Design check: {}", verdict_line(check));
    let warnings: Vec<String> = input_warnings.iter().map(ToString::to_string).collect();
    match warnings.as_slice() {
        [] => line,
        warnings => format!(
            "{line}, with {} input warning{} (unusual values, check them):\n  ! {}",
            warnings.len(),
            if warnings.len() == 1 { "" } else { "s" },
            warnings.join("\n  ! ")
        ),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn demand_and_value_carry_the_unit() {
        let r = CheckRow::new(
            "max_mass_kg",
            "blade mass",
            2.0,
            Bound::AtMost,
            Some(1.9),
            Quantity::Mass,
            Place::Unstated,
        );
        assert_eq!(demand_text(&r), "<= 2.000 kg");
        assert_eq!(found_text(&r), "1.900 kg");
        let r = CheckRow::new(
            "max_tip_deflection_m",
            "tip deflection",
            0.02,
            Bound::AtMost,
            None,
            Quantity::Length,
            Place::Case { name: "gust".to_string() },
        );
        assert_eq!(demand_text(&r), "<= 20.00 mm");
        assert_eq!(found_text(&r), "not computed");
        assert_eq!(place_text(&r.location), "case 'gust'");
        let check = DesignCheck { rows: vec![r] };
        assert_eq!(verdict_line(&check), "FAIL: tip deflection not computed, demand <= 20.00 mm");
        assert_eq!(
            verdict_text(&check, &["a".to_string()]),
            "Design check: FAIL: tip deflection not computed, demand <= 20.00 mm, with 1 input \
             warning (unusual values, check them):\n  ! a"
        );
        assert_eq!(
            verdict_line(&DesignCheck::default()),
            "NOT CHECKED (the project sets no [criteria] and no load case)"
        );
    }

    #[test]
    fn a_fraction_is_held_as_a_fraction_and_shown_in_percent() {
        // A margin of 0.0775 against a demand of 0.08 (8 %): the row compares fractions and the
        // words show percent (1 % = 0.01, the definition of the per cent).
        let r = CheckRow::new(
            "frequency_margin_pct",
            "least frequency margin",
            0.08,
            Bound::AtLeast,
            Some(0.0775),
            Quantity::Fraction,
            Place::Unstated,
        );
        assert_eq!(r.status, Status::Fail);
        assert_eq!((unit_symbol(&r), unit_key(&r)), ("%", "pct"));
        assert_eq!(shown_limit(&r), 8.0);
        assert!((shown_found(&r).unwrap() - 7.75).abs() < 1e-12);
        assert_eq!(demand_text(&r), ">= 8.000 %");
        assert_eq!(found_text(&r), "7.750 %");
    }
}
