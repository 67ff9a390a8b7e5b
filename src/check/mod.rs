//! The design check: each criterion of the project's `[criteria]` against the value the analysis
//! found, with PASS or FAIL. A criterion the project does not set is not checked; a criterion whose
//! value could not be computed fails (a check that cannot be made is not a pass).

mod evaluate;

pub use evaluate::evaluate;

/// What the analysis does not cover, one line each (see [`crate::buckling::NOT_COVERED`]).
pub use crate::buckling::NOT_COVERED;

use std::fmt;

/// Outcome of one criterion.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Status {
    /// The value meets the demand.
    Pass,
    /// The value does not meet the demand, or could not be computed.
    Fail,
}

impl fmt::Display for Status {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            Status::Pass => "PASS",
            Status::Fail => "FAIL",
        })
    }
}

/// Which way a criterion's limit bounds the value.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Bound {
    /// The value must be at least the limit.
    AtLeast,
    /// The value must be at most the limit.
    AtMost,
}

/// One row of the design check.
#[derive(Debug, Clone, PartialEq)]
pub struct CheckRow {
    /// Stable key for scripts (`min_reserve_factor`, `min_buckling_factor`,
    /// `frequency_margin_pct`, `max_mass_kg`, `max_tip_deflection_m`).
    pub key: &'static str,
    /// Human name.
    pub label: &'static str,
    /// The limit the project demands, in `unit`.
    pub limit: f64,
    /// How the limit bounds the value.
    pub bound: Bound,
    /// The value found, in `unit`; `None` when it could not be computed.
    pub found: Option<f64>,
    /// Unit of `limit` and `found` (empty for ratios).
    pub unit: &'static str,
    /// Where the governing value occurs, in words.
    pub location: String,
    /// The outcome.
    pub status: Status,
}

impl CheckRow {
    /// A row, with the status decided from the value and the limit.
    pub fn new(
        key: &'static str,
        label: &'static str,
        limit: f64,
        bound: Bound,
        found: Option<f64>,
        unit: &'static str,
        location: String,
    ) -> Self {
        let status = match (found, bound) {
            (Some(v), Bound::AtLeast) if v >= limit => Status::Pass,
            (Some(v), Bound::AtMost) if v <= limit => Status::Pass,
            _ => Status::Fail,
        };
        CheckRow { key, label, limit, bound, found, unit, location, status }
    }

    /// The demand in words, e.g. ">= 1.5" or "<= 20.00 mm".
    pub fn demand(&self) -> String {
        let op = match self.bound {
            Bound::AtLeast => ">=",
            Bound::AtMost => "<=",
        };
        format!("{op} {}", self.show(self.limit))
    }

    /// The value found in words with its unit: "none" when infinite (nothing can fail), "not
    /// computed" when absent.
    pub fn found_text(&self) -> String {
        match self.found {
            Some(v) if v.is_finite() => self.show(v),
            Some(_) => "none".to_string(),
            None => "not computed".to_string(),
        }
    }

    /// The unit as a key suffix for data files: `pct` for percent, `ratio` for a dimensionless
    /// ratio, otherwise the SI unit itself (`kg`, `m`).
    pub fn unit_key(&self) -> &'static str {
        match self.unit {
            "" => "ratio",
            "%" => "pct",
            unit => unit,
        }
    }

    /// A value in the unit a reader expects (lengths below a metre in millimetres).
    fn show(&self, v: f64) -> String {
        let sig4 = crate::report::sig4;
        match self.unit {
            "" => sig4(v),
            "m" if v.abs() < 1.0 => format!("{} mm", sig4(v * 1e3)),
            unit => format!("{} {unit}", sig4(v)),
        }
    }
}

/// The whole design check.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct DesignCheck {
    /// One row per criterion set in the project.
    pub rows: Vec<CheckRow>,
}

impl DesignCheck {
    /// Whether every criterion passes (true for an empty check: nothing was demanded).
    pub fn passed(&self) -> bool {
        self.rows.iter().all(|r| r.status == Status::Pass)
    }

    /// The verdict in one line, naming every criterion that fails with its value and demand:
    /// "PASS (every criterion met)", "FAIL: least reserve factor 0.84, demand >= 1.5", or
    /// "NOT CHECKED (the project sets no \[criteria\])".
    pub fn verdict_line(&self) -> String {
        if self.rows.is_empty() {
            return "NOT CHECKED (the project sets no [criteria])".to_string();
        }
        if self.passed() {
            return "PASS (every criterion met)".to_string();
        }
        let failed: Vec<String> = self
            .rows
            .iter()
            .filter(|r| r.status != Status::Pass)
            .map(|r| format!("{} {}, demand {}", r.label, r.found_text(), r.demand()))
            .collect();
        format!("FAIL: {}", failed.join("; "))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn status_follows_the_bound_and_missing_values_fail() {
        let r = CheckRow::new(
            "max_mass_kg",
            "blade mass",
            2.0,
            Bound::AtMost,
            Some(1.9),
            "kg",
            String::new(),
        );
        assert_eq!(r.status, Status::Pass);
        assert_eq!(r.demand(), "<= 2.000 kg");
        assert_eq!(r.found_text(), "1.900 kg");
        let r = CheckRow::new(
            "min_reserve_factor",
            "reserve factor",
            1.5,
            Bound::AtLeast,
            Some(1.49),
            "",
            String::new(),
        );
        assert_eq!(r.status, Status::Fail);
        let r = CheckRow::new(
            "max_tip_deflection_m",
            "tip deflection",
            0.1,
            Bound::AtMost,
            None,
            "m",
            String::new(),
        );
        assert_eq!(r.status, Status::Fail);
        assert!(!DesignCheck { rows: vec![r] }.passed());
        assert!(DesignCheck::default().passed());
    }
}
