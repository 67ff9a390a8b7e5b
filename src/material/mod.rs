//! Material records: orthotropic laminae and isotropic solids, their strengths and limits.
//!
//! A [`Lamina`] is one cured ply of a fibre-reinforced material in its material axes (1 along the
//! fibres, 2 across them in the ply plane), described by its plane-stress engineering constants
//! E1, E2, G12, nu12, its cured ply thickness, density, and the five basic strengths Xt, Xc, Yt,
//! Yc, S12 (all magnitudes). An [`Isotropic`] record is a foam, a metal or a fusible core alloy;
//! it can be used as a ply (a foam sheet, a metal doubler) through [`Isotropic::as_lamina`].
//!
//! Every value is SI: Pa, kg/m³, m, 1/K, fractions; temperatures are [`Temperature`]s. [`Lamina::validate`] checks what physics demands:
//! positive moduli and strengths, and Poisson's ratio within the thermodynamic bound
//! |nu12| < sqrt(E1/E2) (Jones, *Mechanics of Composite Materials*, 2nd ed., 1999, §2.4.2).

#[cfg(test)]
pub(crate) mod kaw;
mod library;
mod validate;

pub use library::{
    CuttingData, DEFAULT_LOCKING_ANGLE_DEG, DEFAULT_ROLL_WIDTH_MM, Material, MaterialLibrary,
};
pub use validate::{MaterialError, MaterialField};

use crate::units::Temperature;

/// The five basic strengths of a lamina in its material axes, all positive magnitudes in Pa.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Strengths {
    /// Longitudinal tensile strength Xt, Pa.
    pub xt: f64,
    /// Longitudinal compressive strength Xc (magnitude), Pa.
    pub xc: f64,
    /// Transverse tensile strength Yt, Pa.
    pub yt: f64,
    /// Transverse compressive strength Yc (magnitude), Pa.
    pub yc: f64,
    /// In-plane shear strength S12, Pa.
    pub s12: f64,
}

/// Ultimate strains of a lamina in its material axes, positive magnitudes (m/m).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct StrainLimits {
    /// Longitudinal tensile strain limit.
    pub e1t: f64,
    /// Longitudinal compressive strain limit (magnitude).
    pub e1c: f64,
    /// Transverse tensile strain limit.
    pub e2t: f64,
    /// Transverse compressive strain limit (magnitude).
    pub e2c: f64,
    /// In-plane engineering shear strain limit.
    pub g12: f64,
}

/// Whether a ply material is a true lamina or an isotropic solid used as a layer.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum LaminaKind {
    /// Fibre-reinforced ply with distinct fibre and matrix failure modes.
    Orthotropic,
    /// Isotropic layer (foam, metal): fibre and matrix modes do not apply.
    Isotropic,
}

/// One cured ply of a material, in its material axes. All values SI.
#[derive(Debug, Clone, PartialEq)]
pub struct Lamina {
    /// Name of the record, as in `materials.toml`.
    pub name: String,
    /// Whether this is a fibre ply or an isotropic layer.
    pub kind: LaminaKind,
    /// Longitudinal modulus E1, Pa.
    pub e1: f64,
    /// Transverse modulus E2, Pa.
    pub e2: f64,
    /// In-plane shear modulus G12, Pa.
    pub g12: f64,
    /// Major Poisson's ratio nu12 (strain in 2 from stress in 1).
    pub nu12: f64,
    /// Density, kg/m³.
    pub density: f64,
    /// Cured ply thickness, m.
    pub ply_thickness: f64,
    /// Strengths; `None` for an isotropic layer given without strengths (not checked for failure).
    pub strength: Option<Strengths>,
    /// Normalised Tsai–Wu interaction coefficient F12* (F12 = F12* sqrt(F11 F22)); -1/2 unless
    /// the record gives another value (Tsai & Hahn, *Introduction to Composite Materials*, 1980).
    pub f12_star: f64,
    /// Strain limits for the maximum-strain criterion; derived from strengths over moduli when
    /// not given.
    pub strain_limits: Option<StrainLimits>,
    /// Coefficients of thermal expansion (alpha1, alpha2), 1/K, where known.
    pub cte: Option<[f64; 2]>,
    /// Transverse (out-of-plane) shear strength S23 used by Hashin's matrix compression mode, Pa;
    /// when absent, Yc/2 is used, which reduces that mode to (sigma2/Yc)² + (tau12/S12)² = 1.
    pub s23: Option<f64>,
    /// Fibre volume fraction, for resin mass in tooling summaries.
    pub fibre_volume_fraction: Option<f64>,
    /// Density of the matrix resin, kg/m³, for resin mass in tooling summaries.
    pub resin_density: Option<f64>,
    /// Cost per kilogram in the user's currency, for schedule costing.
    pub cost_per_kg: Option<f64>,
}

impl Lamina {
    /// Starts a lamina record with the given name; set the rest and call
    /// [`LaminaBuilder::build`].
    pub fn builder(name: &str) -> LaminaBuilder {
        LaminaBuilder {
            lamina: Lamina {
                name: name.to_string(),
                kind: LaminaKind::Orthotropic,
                e1: f64::NAN,
                e2: f64::NAN,
                g12: f64::NAN,
                nu12: f64::NAN,
                density: 1600.0,
                ply_thickness: f64::NAN,
                strength: None,
                f12_star: -0.5,
                strain_limits: None,
                cte: None,
                s23: None,
                fibre_volume_fraction: None,
                resin_density: None,
                cost_per_kg: None,
            },
        }
    }

    /// Minor Poisson's ratio nu21 = nu12 E2 / E1.
    pub fn nu21(&self) -> f64 {
        self.nu12 * self.e2 / self.e1
    }

    /// Strain limits, given or derived from strengths over moduli (Xt/E1, Xc/E1, Yt/E2, Yc/E2,
    /// S12/G12). `None` when the lamina has no strengths.
    pub fn effective_strain_limits(&self) -> Option<StrainLimits> {
        self.strain_limits.or_else(|| {
            self.strength.map(|s| StrainLimits {
                e1t: s.xt / self.e1,
                e1c: s.xc / self.e1,
                e2t: s.yt / self.e2,
                e2c: s.yc / self.e2,
                g12: s.s12 / self.g12,
            })
        })
    }

    /// Mass per unit area of one ply, kg/m².
    pub fn areal_mass(&self) -> f64 {
        self.density * self.ply_thickness
    }

    /// Checks every value against what physics demands; see [`MaterialError`].
    pub fn validate(&self) -> Result<(), MaterialError> {
        validate::check_lamina(self)
    }
}

/// Builder for a [`Lamina`], mainly for tests and library users; files go through
/// [`crate::input`].
#[derive(Debug, Clone)]
pub struct LaminaBuilder {
    lamina: Lamina,
}

impl LaminaBuilder {
    /// Elastic constants E1, E2, G12 in Pa and nu12.
    pub fn elastic(mut self, e1: f64, e2: f64, g12: f64, nu12: f64) -> Self {
        self.lamina.e1 = e1;
        self.lamina.e2 = e2;
        self.lamina.g12 = g12;
        self.lamina.nu12 = nu12;
        self
    }

    /// Cured ply thickness, m.
    pub fn ply_thickness(mut self, t: f64) -> Self {
        self.lamina.ply_thickness = t;
        self
    }

    /// Density, kg/m³ (1600 unless set).
    pub fn density(mut self, rho: f64) -> Self {
        self.lamina.density = rho;
        self
    }

    /// Strengths Xt, Xc, Yt, Yc, S12 in Pa (compressive values as positive magnitudes).
    pub fn strengths(mut self, xt: f64, xc: f64, yt: f64, yc: f64, s12: f64) -> Self {
        self.lamina.strength = Some(Strengths { xt, xc, yt, yc, s12 });
        self
    }

    /// Normalised Tsai–Wu interaction coefficient F12*.
    pub fn f12_star(mut self, f: f64) -> Self {
        self.lamina.f12_star = f;
        self
    }

    /// Strain limits for the maximum-strain criterion.
    pub fn strain_limits(mut self, limits: StrainLimits) -> Self {
        self.lamina.strain_limits = Some(limits);
        self
    }

    /// Coefficients of thermal expansion alpha1, alpha2 in 1/K.
    pub fn cte(mut self, a1: f64, a2: f64) -> Self {
        self.lamina.cte = Some([a1, a2]);
        self
    }

    /// Transverse shear strength S23 in Pa (Hashin matrix compression).
    pub fn s23(mut self, s23: f64) -> Self {
        self.lamina.s23 = Some(s23);
        self
    }

    /// The lamina without validation, for readers that validate afterwards with their own
    /// locations.
    pub(crate) fn build_unchecked(self) -> Lamina {
        self.lamina
    }

    /// Validates and returns the lamina.
    pub fn build(self) -> Result<Lamina, MaterialError> {
        self.lamina.validate()?;
        Ok(self.lamina)
    }
}

/// An isotropic solid: foam, metal, or a fusible core alloy. All values SI.
#[derive(Debug, Clone, PartialEq)]
pub struct Isotropic {
    /// Name of the record, as in `materials.toml`.
    pub name: String,
    /// Young's modulus, Pa.
    pub e: f64,
    /// Poisson's ratio.
    pub nu: f64,
    /// Density, kg/m³.
    pub density: f64,
    /// Sheet thickness when used as a ply, m.
    pub ply_thickness: Option<f64>,
    /// Tensile strength, Pa.
    pub tensile_strength: Option<f64>,
    /// Compressive strength (magnitude), Pa; the tensile strength when absent.
    pub compressive_strength: Option<f64>,
    /// Shear strength, Pa; tensile strength / sqrt(3) (von Mises) when absent.
    pub shear_strength: Option<f64>,
    /// Coefficient of thermal expansion, 1/K.
    pub cte: Option<f64>,
    /// Melting range (solidus, liquidus), for fusible core alloys.
    pub melting_range: Option<[Temperature; 2]>,
    /// Linear casting shrinkage from the solidus to room temperature, a fraction (0.005 for
    /// 0.5 %), for fusible core alloys (read from `shrinkage_pct`).
    pub shrinkage: Option<f64>,
    /// Free-text handling note printed beside the material in reports (e.g. "contains lead").
    pub safety_note: Option<String>,
    /// Sandwich-core properties when the record is marked as a core (foam, balsa, honeycomb).
    pub core: Option<CoreProperties>,
}

/// What a sandwich wall needs of its core, beyond the record's in-plane values. All SI.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct CoreProperties {
    /// Transverse shear modulus of the core (the plane through the thickness along the load;
    /// for a honeycomb the lower of its two values), Pa.
    pub shear_modulus: f64,
    /// Transverse shear strength of the core, Pa.
    pub shear_strength: f64,
    /// Through-thickness (compression) modulus of the core, Pa; the record's E unless given.
    pub compression_modulus: f64,
}

impl Isotropic {
    /// Shear modulus G = E / (2 (1 + nu)), Pa.
    pub fn shear_modulus(&self) -> f64 {
        self.e / (2.0 * (1.0 + self.nu))
    }

    /// The record as a ply material: E1 = E2 = E, G12 = G, strengths from the tensile,
    /// compressive and shear strengths where given. Fails when no sheet thickness is given.
    pub fn as_lamina(&self) -> Result<Lamina, MaterialError> {
        let ply_thickness =
            self.ply_thickness.ok_or_else(|| MaterialError::NotAPly { name: self.name.clone() })?;
        let strength = self.tensile_strength.map(|t| {
            let c = self.compressive_strength.unwrap_or(t);
            let s = self.shear_strength.unwrap_or(t / 3f64.sqrt());
            Strengths { xt: t, xc: c, yt: t, yc: c, s12: s }
        });
        let lamina = Lamina {
            name: self.name.clone(),
            kind: LaminaKind::Isotropic,
            e1: self.e,
            e2: self.e,
            g12: self.shear_modulus(),
            nu12: self.nu,
            density: self.density,
            ply_thickness,
            strength,
            f12_star: -0.5,
            strain_limits: None,
            cte: self.cte.map(|a| [a, a]),
            s23: None,
            fibre_volume_fraction: None,
            resin_density: None,
            cost_per_kg: None,
        };
        lamina.validate()?;
        Ok(lamina)
    }

    /// Checks every value against what physics demands.
    pub fn validate(&self) -> Result<(), MaterialError> {
        validate::check_isotropic(self)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn t300() -> LaminaBuilder {
        // Kaw, Mechanics of Composite Materials, 2nd ed., 2006, Table 2.1 (T300/5208).
        Lamina::builder("T300/5208")
            .elastic(181e9, 10.3e9, 7.17e9, 0.28)
            .ply_thickness(0.125e-3)
            .strengths(1500e6, 1500e6, 40e6, 246e6, 68e6)
    }

    #[test]
    fn minor_poisson_ratio_follows_reciprocity() {
        // Reciprocity nu12/E1 = nu21/E2 (Kaw Eq. 2.108): nu21 = 0.28 * 10.3 / 181 = 0.01593.
        let l = t300().build().unwrap();
        assert!((l.nu21() - 0.015934).abs() < 1e-6);
    }

    #[test]
    fn poisson_ratio_beyond_thermodynamic_bound_is_rejected() {
        // |nu12| < sqrt(E1/E2) = sqrt(181/10.3) = 4.19 (Jones 1999, §2.4.2).
        let err = t300().elastic(181e9, 10.3e9, 7.17e9, 4.3).build().unwrap_err();
        assert!(err.to_string().contains("nu12"), "{err}");
        assert!(t300().elastic(181e9, 10.3e9, 7.17e9, 4.1).build().is_ok());
    }

    #[test]
    fn derived_strain_limits_are_strength_over_modulus() {
        let l = t300().build().unwrap();
        let e = l.effective_strain_limits().unwrap();
        assert!((e.e1t - 1500e6 / 181e9).abs() < 1e-15);
        assert!((e.g12 - 68e6 / 7.17e9).abs() < 1e-15);
    }

    #[test]
    fn isotropic_layer_has_von_mises_shear_strength_by_default() {
        let al = Isotropic {
            name: "al".into(),
            e: 70e9,
            nu: 0.33,
            density: 2700.0,
            ply_thickness: Some(1e-3),
            tensile_strength: Some(300e6),
            compressive_strength: None,
            shear_strength: None,
            cte: Some(23e-6),
            melting_range: None,
            shrinkage: None,
            safety_note: None,
            core: None,
        };
        let l = al.as_lamina().unwrap();
        assert_eq!(l.kind, LaminaKind::Isotropic);
        assert!((l.g12 - 70e9 / 2.66).abs() < 1.0);
        assert!((l.strength.unwrap().s12 - 300e6 / 3f64.sqrt()).abs() < 1.0);
    }
}
