//! A named collection of material records, as read from one `materials.toml`.

use super::{Isotropic, Lamina, MaterialError};
use crate::text::closest;

/// One record of a materials file.
#[derive(Debug, Clone, PartialEq)]
pub enum Material {
    /// A fibre ply.
    Lamina(Lamina),
    /// A foam, metal or core alloy.
    Isotropic(Isotropic),
}

impl Material {
    /// The record's name.
    pub fn name(&self) -> &str {
        match self {
            Material::Lamina(l) => &l.name,
            Material::Isotropic(i) => &i.name,
        }
    }

    /// The record's density, kg/m³.
    pub fn density(&self) -> f64 {
        match self {
            Material::Lamina(l) => l.density,
            Material::Isotropic(i) => i.density,
        }
    }
}

/// What the cutting table needs of a material beyond its mechanics: how far the cloth shears
/// before it locks, how wide the roll is, and its price.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct CuttingData {
    /// Shear angle at which a woven or stitched fabric locks (wrinkles beyond it), rad.
    pub locking_angle: f64,
    /// Width of the roll (or sheet) the plies are cut from, m.
    pub roll_width: f64,
    /// Cost per kilogram in the user's currency, when given.
    pub cost_per_kg: Option<f64>,
}

/// Default locking angle: 40°, within the 30–50° usually quoted for woven glass and carbon
/// fabrics (common practice; a tested value of the fabric should be given).
pub const DEFAULT_LOCKING_ANGLE_DEG: f64 = 40.0;

/// Default roll width: 1270 mm (50 in), a common roll width of reinforcement fabrics (common
/// practice).
pub const DEFAULT_ROLL_WIDTH_MM: f64 = 1270.0;

impl Default for CuttingData {
    fn default() -> Self {
        CuttingData {
            locking_angle: DEFAULT_LOCKING_ANGLE_DEG.to_radians(),
            roll_width: DEFAULT_ROLL_WIDTH_MM * 1e-3,
            cost_per_kg: None,
        }
    }
}

/// Material records in file order, looked up by name.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct MaterialLibrary {
    records: Vec<Material>,
    cutting: Vec<(String, CuttingData)>,
}

impl MaterialLibrary {
    /// An empty library.
    pub fn new() -> Self {
        Self::default()
    }

    /// Adds a record after validating it; a record of the same name is replaced.
    pub fn insert(&mut self, material: Material) -> Result<(), MaterialError> {
        match &material {
            Material::Lamina(l) => l.validate()?,
            Material::Isotropic(i) => i.validate()?,
        }
        if let Some(slot) = self.records.iter_mut().find(|m| m.name() == material.name()) {
            *slot = material;
        } else {
            self.records.push(material);
        }
        Ok(())
    }

    /// All records in file order.
    pub fn iter(&self) -> impl Iterator<Item = &Material> {
        self.records.iter()
    }

    /// Number of records.
    pub fn len(&self) -> usize {
        self.records.len()
    }

    /// Whether the library holds no record.
    pub fn is_empty(&self) -> bool {
        self.records.is_empty()
    }

    /// The record of that name, or an error with the closest name as a hint.
    pub fn get(&self, name: &str) -> Result<&Material, MaterialError> {
        self.records.iter().find(|m| m.name() == name).ok_or_else(|| MaterialError::Unknown {
            name: name.to_string(),
            hint: closest(name, self.records.iter().map(Material::name)),
        })
    }

    /// Sets the cutting data of the record `name` (replacing what was set).
    pub fn set_cutting(&mut self, name: &str, data: CuttingData) {
        if let Some(slot) = self.cutting.iter_mut().find(|(n, _)| n == name) {
            slot.1 = data;
        } else {
            self.cutting.push((name.to_string(), data));
        }
    }

    /// The cutting data of the record `name`: as set, or the defaults.
    pub fn cutting(&self, name: &str) -> CuttingData {
        self.cutting.iter().find(|(n, _)| n == name).map(|(_, d)| *d).unwrap_or_default()
    }

    /// The record of that name as a ply material: laminae as they are, isotropic records through
    /// [`Isotropic::as_lamina`].
    pub fn ply_material(&self, name: &str) -> Result<Lamina, MaterialError> {
        match self.get(name)? {
            Material::Lamina(l) => Ok(l.clone()),
            Material::Isotropic(i) => i.as_lamina(),
        }
    }

    /// The isotropic record of that name (core alloys, metals).
    pub fn isotropic(&self, name: &str) -> Result<&Isotropic, MaterialError> {
        match self.get(name)? {
            Material::Isotropic(i) => Ok(i),
            Material::Lamina(_) => Err(MaterialError::Unknown {
                name: name.to_string(),
                hint: closest(
                    name,
                    self.records.iter().filter_map(|m| match m {
                        Material::Isotropic(i) => Some(i.name.as_str()),
                        Material::Lamina(_) => None,
                    }),
                ),
            }),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn unknown_name_suggests_the_closest() {
        let mut lib = MaterialLibrary::new();
        let tape = Lamina::builder("carbon-ud")
            .elastic(135e9, 9e9, 5e9, 0.3)
            .ply_thickness(0.2e-3)
            .strengths(2000e6, 1200e6, 50e6, 200e6, 80e6)
            .build()
            .unwrap();
        lib.insert(Material::Lamina(tape)).unwrap();
        let err = lib.get("carbon_ud").unwrap_err();
        assert_eq!(err.to_string(), "no material named 'carbon_ud'; did you mean 'carbon-ud'?");
        let err = lib.get("zzz").unwrap_err();
        assert_eq!(err.to_string(), "no material named 'zzz'");
    }
}
