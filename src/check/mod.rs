//! The design check: each criterion of the project's `[criteria]` against the value the analysis
//! found, with PASS or FAIL. A criterion the project does not set is not checked; a criterion whose
//! value could not be computed fails (a check that cannot be made is not a pass).
//!
//! The check returns values: the limit, the value found and where it occurs as a [`Place`];
//! `report::check` puts them into words (demand, value with its unit, place, verdict line).

mod evaluate;
mod place;

pub use evaluate::{FAILURE_LIMIT, evaluate};
pub use place::Place;

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

/// What a criterion's limit and value measure, in SI: the report shows each in the unit a
/// reader expects.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Quantity {
    /// A dimensionless ratio (a reserve factor).
    Ratio,
    /// A fraction (a frequency margin: 0.1 for 10 %).
    Fraction,
    /// A mass, kg.
    Mass,
    /// A length, m.
    Length,
}

/// One row of the design check.
#[derive(Debug, Clone, PartialEq)]
pub struct CheckRow {
    /// Stable key for scripts (`min_reserve_factor`, `min_buckling_factor`,
    /// `frequency_margin_pct`, `max_mass_kg`, `max_tip_deflection_m`).
    pub key: &'static str,
    /// Human name.
    pub label: &'static str,
    /// The limit the project demands, SI (see `quantity`).
    pub limit: f64,
    /// How the limit bounds the value.
    pub bound: Bound,
    /// The value found, SI (see `quantity`); `None` when it could not be computed.
    pub found: Option<f64>,
    /// What `limit` and `found` measure.
    pub quantity: Quantity,
    /// Where the governing value occurs.
    pub location: Place,
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
        quantity: Quantity,
        location: Place,
    ) -> Self {
        let status = match (found, bound) {
            (Some(v), Bound::AtLeast) if v >= limit => Status::Pass,
            (Some(v), Bound::AtMost) if v <= limit => Status::Pass,
            _ => Status::Fail,
        };
        CheckRow { key, label, limit, bound, found, quantity, location, status }
    }
}

/// The whole design check.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct DesignCheck {
    /// One row per criterion set in the project.
    pub rows: Vec<CheckRow>,
}

impl DesignCheck {
    /// Whether the check checked anything: a project with neither `[criteria]` nor a load
    /// case has nothing to check.
    pub fn checked(&self) -> bool {
        !self.rows.is_empty()
    }

    /// Whether every criterion passes; false for an empty check (nothing checked is not a
    /// pass).
    pub fn passed(&self) -> bool {
        self.checked() && self.rows.iter().all(|r| r.status == Status::Pass)
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
            Quantity::Mass,
            Place::Unstated,
        );
        assert_eq!(r.status, Status::Pass);
        let r = CheckRow::new(
            "min_reserve_factor",
            "reserve factor",
            1.5,
            Bound::AtLeast,
            Some(1.49),
            Quantity::Ratio,
            Place::Unstated,
        );
        assert_eq!(r.status, Status::Fail);
        let r = CheckRow::new(
            "max_tip_deflection_m",
            "tip deflection",
            0.1,
            Bound::AtMost,
            None,
            Quantity::Length,
            Place::Unstated,
        );
        assert_eq!(r.status, Status::Fail);
        assert!(!DesignCheck { rows: vec![r] }.passed());
        // Nothing checked is not a pass.
        assert!(!DesignCheck::default().checked());
        assert!(!DesignCheck::default().passed());
    }
}
