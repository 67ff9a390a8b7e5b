//! The physical checks on material records and the error they give.

use super::{Isotropic, Lamina};
use crate::units::Temperature;

/// A material value that can be wrong, named as in `materials.toml` so that the input reader can
/// point at the offending line.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum MaterialField {
    /// E1 (or E for isotropic records).
    E1,
    /// E2.
    E2,
    /// G12.
    G12,
    /// nu12 (or nu).
    Nu12,
    /// Density.
    Density,
    /// Ply thickness.
    PlyThickness,
    /// Xt.
    Xt,
    /// Xc.
    Xc,
    /// Yt.
    Yt,
    /// Yc.
    Yc,
    /// S12.
    S12,
    /// S23.
    S23,
    /// F12*.
    F12Star,
    /// One of the strain limits.
    StrainLimit,
    /// A CTE.
    Cte,
    /// Fibre volume fraction.
    FibreVolumeFraction,
    /// Resin density.
    ResinDensity,
    /// Melting range.
    MeltingRange,
    /// A strength of an isotropic record.
    IsotropicStrength,
    /// The transverse shear modulus of a core.
    CoreShearModulus,
    /// The transverse shear strength of a core.
    CoreShearStrength,
    /// The through-thickness modulus of a core.
    CoreCompressionModulus,
}

impl MaterialField {
    /// The key in `materials.toml` that carries this value (first of several for a group).
    pub fn key(self, isotropic: bool) -> &'static str {
        use MaterialField::*;
        match (self, isotropic) {
            (E1, false) => "E1_GPa",
            (E1, true) => "E_GPa",
            (E2, _) => "E2_GPa",
            (G12, _) => "G12_GPa",
            (Nu12, false) => "nu12",
            (Nu12, true) => "nu",
            (Density, _) => "density_kg_m3",
            (PlyThickness, _) => "ply_thickness_mm",
            (Xt, _) => "Xt_MPa",
            (Xc, _) => "Xc_MPa",
            (Yt, _) => "Yt_MPa",
            (Yc, _) => "Yc_MPa",
            (S12, _) => "S12_MPa",
            (S23, _) => "S23_MPa",
            (F12Star, _) => "F12_star",
            (StrainLimit, _) => "eps1t_ustrain",
            (Cte, false) => "a1_ustrain_K",
            (Cte, true) => "cte_ustrain_K",
            (FibreVolumeFraction, _) => "fibre_volume_fraction",
            (ResinDensity, _) => "resin_density_kg_m3",
            (MeltingRange, _) => "solidus_C",
            (IsotropicStrength, _) => "tensile_strength_MPa",
            (CoreShearModulus, _) => "core_shear_modulus_MPa",
            (CoreShearStrength, _) => "core_shear_strength_MPa",
            (CoreCompressionModulus, _) => "core_compression_modulus_MPa",
        }
    }
}

/// What can be wrong with a material record or a reference to one.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum MaterialError {
    /// A value outside what physics allows.
    #[error("material '{name}': {what} must be {expected}, found {found}")]
    Invalid {
        /// The record.
        name: String,
        /// Which value.
        field: MaterialField,
        /// Human name of the value with its unit, e.g. "E1 (GPa)".
        what: String,
        /// What was expected, e.g. "positive".
        expected: String,
        /// The value found, in the unit of `what`.
        found: String,
        /// Whether the record is isotropic (decides the key name).
        isotropic: bool,
    },
    /// A name that no record carries.
    #[error("no material named '{name}'{}", hint.as_ref().map(|h| format!("; did you mean '{h}'?")).unwrap_or_default())]
    Unknown {
        /// The name asked for.
        name: String,
        /// The closest known name, if any is close.
        hint: Option<String>,
    },
    /// An isotropic record used as a ply without a sheet thickness.
    #[error("material '{name}' is isotropic and has no ply_thickness_mm, so it cannot be a ply")]
    NotAPly {
        /// The record.
        name: String,
    },
}

fn invalid(
    name: &str,
    field: MaterialField,
    what: &str,
    expected: &str,
    found: f64,
    isotropic: bool,
) -> MaterialError {
    MaterialError::Invalid {
        name: name.to_string(),
        field,
        what: what.to_string(),
        expected: expected.to_string(),
        found: format!("{found}"),
        isotropic,
    }
}

fn positive(
    name: &str,
    field: MaterialField,
    what: &str,
    value: f64,
    scale: f64,
    iso: bool,
) -> Result<(), MaterialError> {
    if value.is_finite() && value > 0.0 {
        Ok(())
    } else {
        Err(invalid(name, field, what, "a positive number", value / scale, iso))
    }
}

pub(super) fn check_lamina(l: &Lamina) -> Result<(), MaterialError> {
    use MaterialField::*;
    let n = &l.name;
    let iso = l.kind == super::LaminaKind::Isotropic;
    positive(n, E1, "E1 (GPa)", l.e1, 1e9, iso)?;
    positive(n, E2, "E2 (GPa)", l.e2, 1e9, iso)?;
    positive(n, G12, "G12 (GPa)", l.g12, 1e9, iso)?;
    positive(n, Density, "density (kg/m3)", l.density, 1.0, iso)?;
    positive(n, PlyThickness, "ply thickness (mm)", l.ply_thickness, 1e-3, iso)?;
    // Positive definite compliance in plane stress: 1 - nu12 nu21 > 0, i.e.
    // |nu12| < sqrt(E1/E2) (Jones 1999, §2.4.2); for isotropic layers -1 < nu < 1/2.
    let bound = (l.e1 / l.e2).sqrt();
    if iso {
        if !(l.nu12 > -1.0 && l.nu12 < 0.5) {
            return Err(invalid(n, Nu12, "nu", "between -1 and 0.5", l.nu12, iso));
        }
    } else if !(l.nu12.is_finite() && l.nu12.abs() < bound) {
        let expected = format!("within the thermodynamic bound |nu12| < sqrt(E1/E2) = {bound:.3}");
        return Err(invalid(n, Nu12, "nu12", &expected, l.nu12, iso));
    }
    if let Some(s) = &l.strength {
        positive(n, Xt, "Xt (MPa)", s.xt, 1e6, iso)?;
        positive(n, Xc, "Xc (MPa, a magnitude)", s.xc, 1e6, iso)?;
        positive(n, Yt, "Yt (MPa)", s.yt, 1e6, iso)?;
        positive(n, Yc, "Yc (MPa, a magnitude)", s.yc, 1e6, iso)?;
        positive(n, S12, "S12 (MPa)", s.s12, 1e6, iso)?;
    }
    if let Some(s23) = l.s23 {
        positive(n, S23, "S23 (MPa)", s23, 1e6, iso)?;
    }
    // Tsai-Wu is a closed surface only when F11 F22 > F12², i.e. |F12*| < 1 (Tsai & Wu 1971).
    if !(l.f12_star.is_finite() && l.f12_star.abs() < 1.0) {
        return Err(invalid(n, F12Star, "F12_star", "strictly between -1 and 1", l.f12_star, iso));
    }
    if let Some(e) = &l.strain_limits {
        for v in [e.e1t, e.e1c, e.e2t, e.e2c, e.g12] {
            positive(n, StrainLimit, "every strain limit (microstrain)", v, 1e-6, iso)?;
        }
    }
    if let Some(a) = &l.cte {
        for v in a {
            if !(v.is_finite() && v.abs() < 1e-3) {
                let what = "a CTE (microstrain/K)";
                return Err(invalid(n, Cte, what, "finite and below 1000", v * 1e6, iso));
            }
        }
    }
    if let Some(vf) = l.fibre_volume_fraction {
        if !(vf > 0.0 && vf < 1.0) {
            let what = "fibre volume fraction";
            return Err(invalid(n, FibreVolumeFraction, what, "between 0 and 1", vf, iso));
        }
    }
    if let Some(rho) = l.resin_density {
        positive(n, ResinDensity, "resin density (kg/m3)", rho, 1.0, iso)?;
    }
    Ok(())
}

pub(super) fn check_isotropic(m: &Isotropic) -> Result<(), MaterialError> {
    use MaterialField::*;
    let n = &m.name;
    positive(n, E1, "E (GPa)", m.e, 1e9, true)?;
    positive(n, Density, "density (kg/m3)", m.density, 1.0, true)?;
    if !(m.nu > -1.0 && m.nu < 0.5) {
        return Err(invalid(n, Nu12, "nu", "between -1 and 0.5", m.nu, true));
    }
    if let Some(t) = m.ply_thickness {
        positive(n, PlyThickness, "ply thickness (mm)", t, 1e-3, true)?;
    }
    for s in [m.tensile_strength, m.compressive_strength, m.shear_strength].into_iter().flatten() {
        positive(n, IsotropicStrength, "a strength (MPa)", s, 1e6, true)?;
    }
    if let Some(c) = &m.core {
        let what = "core shear modulus (MPa)";
        positive(n, CoreShearModulus, what, c.shear_modulus, 1e6, true)?;
        let what = "core shear strength (MPa)";
        positive(n, CoreShearStrength, what, c.shear_strength, 1e6, true)?;
        let what = "core compression modulus (MPa)";
        positive(n, CoreCompressionModulus, what, c.compression_modulus, 1e6, true)?;
    }
    if let Some([solidus, liquidus]) = m.melting_range.map(|r| r.map(Temperature::celsius)) {
        if !(solidus.is_finite() && liquidus.is_finite() && solidus <= liquidus) {
            let what = "melting range solidus_C..liquidus_C";
            return Err(invalid(
                n,
                MeltingRange,
                what,
                "solidus at or below liquidus",
                solidus,
                true,
            ));
        }
    }
    Ok(())
}
