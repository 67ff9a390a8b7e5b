//! The length unit of output files: the mesh is in metres, files in the unit the project names.

use std::str::FromStr;

use super::error::MeshError;

/// The length unit of output files.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum LengthUnit {
    /// Millimetres (the default).
    #[default]
    Millimetre,
    /// Metres.
    Metre,
}

impl LengthUnit {
    /// Output units in one metre.
    pub fn per_metre(self) -> f64 {
        match self {
            LengthUnit::Millimetre => 1e3,
            LengthUnit::Metre => 1.0,
        }
    }

    /// The unit's symbol, as the project file spells it.
    pub fn symbol(self) -> &'static str {
        match self {
            LengthUnit::Millimetre => "mm",
            LengthUnit::Metre => "m",
        }
    }

    /// Decimals that show a micrometre.
    pub(crate) fn decimals(self) -> usize {
        match self {
            LengthUnit::Millimetre => 3,
            LengthUnit::Metre => 6,
        }
    }
}

impl FromStr for LengthUnit {
    type Err = MeshError;
    fn from_str(s: &str) -> Result<Self, MeshError> {
        match s.trim() {
            "mm" => Ok(LengthUnit::Millimetre),
            "m" => Ok(LengthUnit::Metre),
            other => Err(MeshError::Unit(other.to_string())),
        }
    }
}
