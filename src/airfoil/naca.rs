//! NACA 4-digit sections from the formulas of NACA Report 824 (Abbott, von Doenhoff & Stivers,
//! 1945; Abbott & von Doenhoff, *Theory of Wing Sections*, 1959, §6.4).
//!
//! Thickness `y_t = 5 t (0.2969 √x − 0.1260 x − 0.3516 x² + 0.2843 x³ − 0.1015 x⁴)`; the last
//! coefficient −0.1036 closes the trailing edge (common practice). Mean line
//! `y_c = m/p² (2 p x − x²)` ahead of the maximum camber, `m/(1−p)² ((1 − 2p) + 2 p x − x²)` behind
//! it; the thickness is laid off normal to the mean line.

use super::AirfoilError;

/// The parameters of a NACA 4-digit section.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Naca4 {
    /// Maximum camber, fraction of chord (first digit / 100).
    pub camber: f64,
    /// Position of maximum camber, fraction of chord (second digit / 10).
    pub camber_position: f64,
    /// Maximum thickness, fraction of chord (last two digits / 100).
    pub thickness: f64,
    /// Whether the trailing edge is closed.
    pub closed_te: bool,
}

impl Naca4 {
    /// Parses four digits such as `"4412"`.
    pub fn parse(code: &str, closed_te: bool) -> Result<Self, AirfoilError> {
        let digits: Vec<u32> = code.chars().filter_map(|c| c.to_digit(10)).collect();
        if code.len() != 4 || digits.len() != 4 {
            return Err(AirfoilError::NacaCode { code: code.to_string() });
        }
        let camber = digits[0] as f64 / 100.0;
        let camber_position = digits[1] as f64 / 10.0;
        let thickness = (digits[2] * 10 + digits[3]) as f64 / 100.0;
        if thickness <= 0.0 || (camber > 0.0 && camber_position == 0.0) {
            return Err(AirfoilError::NacaCode { code: code.to_string() });
        }
        Ok(Naca4 { camber, camber_position, thickness, closed_te })
    }

    /// Half-thickness `y_t(x)` as a fraction of chord.
    pub fn half_thickness(&self, x: f64) -> f64 {
        let a4 = if self.closed_te { -0.1036 } else { -0.1015 };
        let x = x.clamp(0.0, 1.0);
        5.0 * self.thickness
            * (0.2969 * x.sqrt() - 0.1260 * x - 0.3516 * x * x
                + 0.2843 * x * x * x
                + a4 * x.powi(4))
    }

    /// Mean line height and slope at `x`.
    pub fn mean_line(&self, x: f64) -> (f64, f64) {
        let (m, p) = (self.camber, self.camber_position);
        if m == 0.0 {
            return (0.0, 0.0);
        }
        if x < p {
            (m / (p * p) * (2.0 * p * x - x * x), 2.0 * m / (p * p) * (p - x))
        } else {
            let q = (1.0 - p) * (1.0 - p);
            (m / q * ((1.0 - 2.0 * p) + 2.0 * p * x - x * x), 2.0 * m / q * (p - x))
        }
    }

    /// Upper and lower surface points, each from the leading edge to the trailing edge, at
    /// `n` cosine-spaced stations along the chord.
    pub fn surfaces(&self, n: usize) -> (Vec<[f64; 2]>, Vec<[f64; 2]>) {
        let n = n.max(3);
        let mut upper = Vec::with_capacity(n);
        let mut lower = Vec::with_capacity(n);
        for i in 0..n {
            let beta = std::f64::consts::PI * i as f64 / (n - 1) as f64;
            let x = 0.5 * (1.0 - beta.cos());
            let yt = self.half_thickness(x);
            let (yc, slope) = self.mean_line(x);
            let th = slope.atan();
            upper.push([x - yt * th.sin(), yc + yt * th.cos()]);
            lower.push([x + yt * th.sin(), yc - yt * th.cos()]);
        }
        (upper, lower)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn thickness_peaks_at_thirty_percent_chord() {
        // Report 824: the 4-digit thickness distribution has its maximum t/2 near x = 0.30.
        let s = Naca4::parse("0012", false).unwrap();
        let peak = (0..=1000)
            .map(|i| i as f64 / 1000.0)
            .max_by(|a, b| s.half_thickness(*a).total_cmp(&s.half_thickness(*b)))
            .unwrap();
        assert!((peak - 0.30).abs() < 0.01, "{peak}");
        assert!((s.half_thickness(peak) - 0.06).abs() < 1e-4);
        // Open trailing edge thickness 2 y_t(1) = 10 t (0.2969 - 0.126 - 0.3516 + 0.2843 - 0.1015).
        assert!((2.0 * s.half_thickness(1.0) - 10.0 * 0.12 * 0.0021).abs() < 1e-12);
        let closed = Naca4::parse("0012", true).unwrap();
        assert!(closed.half_thickness(1.0).abs() < 1e-4);
    }

    #[test]
    fn bad_codes_are_refused() {
        for c in ["012", "00a2", "4400", "4012"] {
            assert!(Naca4::parse(c, false).is_err(), "{c}");
        }
    }
}
