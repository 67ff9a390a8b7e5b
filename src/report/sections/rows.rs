//! The sections report as CSV: one row per station, SI units in every column name.

use std::io::Write;

use super::{SCALAR_KEYS, SectionsReport, scalar_values};

pub(super) fn write(report: &SectionsReport<'_>, w: &mut dyn Write) -> std::io::Result<()> {
    let mut out = ::csv::Writer::from_writer(w);
    out.write_record(SCALAR_KEYS)?;
    for st in &report.model.stations {
        let row = scalar_values(&st.section.properties, st.layout.pitch_axis_frac);
        // A value that is not finite would be a solver bug (it refuses such sections); an empty
        // cell says so rather than a NaN.
        out.write_record(row.iter().map(|&v| cell(v)))?;
    }
    out.flush()
}

/// A value as the shortest text that reads back to it: plain for ordinary magnitudes, with an
/// exponent for very small or large ones.
fn cell(v: f64) -> String {
    let a = v.abs();
    if !v.is_finite() {
        String::new()
    } else if v == 0.0 {
        "0".into()
    } else if (1e-4..1e15).contains(&a) {
        format!("{v}")
    } else {
        format!("{v:e}")
    }
}

#[cfg(test)]
mod tests {
    use super::cell;

    #[test]
    fn cells_read_back_and_stay_short() {
        for v in [0.5, 48051870.20955813, -7.153127650600916e-11, 1e-300, 2.5e20, 0.0] {
            assert_eq!(cell(v).parse::<f64>().unwrap(), v);
            assert!(cell(v).len() <= 24, "{}", cell(v));
        }
        assert_eq!(cell(f64::NAN), "");
        assert_eq!(cell(-0.0), "0");
    }
}
