//! The ply book's types: settings, the patterns with their kit data, the nestings.

use super::PlyBookError;
use super::nest::Nesting;
use super::pattern::FlatPattern;
use super::warning::PlyBookWarning;
use crate::units::Angle;

/// Settings of the ply book.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PlyBookParams {
    /// Net links along the longer side of a region (the net spacing is that side over this,
    /// and at most a sixth of the shorter side).
    pub links: usize,
    /// Least net spacing, m.
    pub min_spacing: f64,
    /// Gap kept between nested patterns, m.
    pub gap: f64,
    /// Largest net spacing on a skin as a fraction of the least chord the ply covers.
    pub chord_spacing: f64,
    /// Least distance between a splice of a ply cut in pieces and a parallel splice of a ply
    /// laid before it on the same skin or web, m (25 mm by default, common practice).
    pub stagger: f64,
}

/// Butt splices of successive plies are staggered by at least 25 mm (common practice), so that
/// no two plies of a laminate are cut along one line.
pub const SPLICE_STAGGER: f64 = 0.025;

impl Default for PlyBookParams {
    fn default() -> Self {
        PlyBookParams {
            links: 60,
            min_spacing: 0.002,
            gap: 0.01,
            chord_spacing: 0.08,
            stagger: SPLICE_STAGGER,
        }
    }
}

/// How a ply material drapes.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum FabricKind {
    /// Unidirectional: the fibre path deviation is reported.
    Unidirectional,
    /// Woven or stitched, balanced (`E2 ≥ 0.8 E1`): checked against the locking angle.
    Fabric,
    /// An isotropic sheet (foam, metal): flattened, not checked.
    Sheet,
}

impl FabricKind {
    /// Key for JSON and CSV.
    pub fn key(self) -> &'static str {
        match self {
            FabricKind::Unidirectional => "unidirectional",
            FabricKind::Fabric => "fabric",
            FabricKind::Sheet => "sheet",
        }
    }

    /// Whether the fibres allow a quarter turn on the roll.
    pub fn quarter_turns(self) -> bool {
        !matches!(self, FabricKind::Unidirectional)
    }
}

/// A place on the blade: radius and chord fraction on a skin, or radius and height fraction on
/// a web (0 at the lower skin).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PatternPlace {
    /// Radius, m.
    pub r: f64,
    /// Chord fraction (skin) or height fraction (web).
    pub along: f64,
}

/// One pattern of the ply book.
#[derive(Debug, Clone)]
pub struct PatternEntry {
    /// File-safe name: the ply id and its surface (`skin-1-upper`, `web-1-spar`).
    pub name: String,
    /// The ply's id.
    pub ply: String,
    /// Lay-up order: the ply's position in the schedule, 1 = laid first (outer mould line).
    pub order: usize,
    /// Material name.
    pub material: String,
    /// `upper`, `lower` or `web:NAME`.
    pub surface: String,
    /// Fibre angle.
    pub angle: Angle,
    /// How the material drapes.
    pub kind: FabricKind,
    /// Span range, m.
    pub r_range: [f64; 2],
    /// Chord-fraction range on a skin; `None` on a web.
    pub chord_range: Option<[f64; 2]>,
    /// The flat pattern.
    pub pattern: FlatPattern,
    /// Area of the flat pattern, m².
    pub area_m2: f64,
    /// Ply thickness, m.
    pub thickness_m: f64,
    /// Mass of the cut pattern, kg.
    pub mass_kg: f64,
    /// Cost, where the material has `cost_per_kg`.
    pub cost: Option<f64>,
    /// Locking angle of the material, rad.
    pub locking_angle: f64,
    /// Where the greatest shear is.
    pub max_shear_place: PatternPlace,
    /// Where the greatest fibre deviation is.
    pub max_deviation_place: PatternPlace,
}

impl PatternEntry {
    /// Whether a fabric shears past its locking angle somewhere.
    pub fn locks(&self) -> bool {
        self.kind == FabricKind::Fabric && self.pattern.max_shear.abs() > self.locking_angle
    }
}

/// The nesting of one material.
#[derive(Debug, Clone)]
pub struct MaterialNesting {
    /// Material name.
    pub material: String,
    /// The nesting; `placements[k].item` indexes `patterns`.
    pub nesting: Nesting,
    /// Indices into [`PlyBook::patterns`] of the patterns nested, in item order.
    pub patterns: Vec<usize>,
    /// Areal mass of the cloth, kg/m².
    pub areal_mass: f64,
    /// Mass of the roll used less the patterns, kg.
    pub scrap_kg: f64,
    /// Cost of the roll used, where the material has `cost_per_kg`.
    pub roll_cost: Option<f64>,
}

/// The ply book of a blade.
#[derive(Debug, Clone)]
pub struct PlyBook {
    /// Project name.
    pub project: String,
    /// Patterns in lay-up order.
    pub patterns: Vec<PatternEntry>,
    /// One nesting per material, in order of first use.
    pub nestings: Vec<MaterialNesting>,
    /// Draping warnings (locked fabric, large fibre deviation) with their place.
    pub warnings: Vec<PlyBookWarning>,
    /// Regions that could not be draped, with the reason: left out of the book.
    pub failed: Vec<PlyBookError>,
    /// Ply regions cut in pieces because one piece would not drape: the pieces and their joins.
    pub splices: Vec<String>,
}

impl PlyBook {
    /// Total mass of the patterns, kg.
    pub fn pattern_mass_kg(&self) -> f64 {
        self.patterns.iter().map(|p| p.mass_kg).sum()
    }

    /// Total cost of the patterns, when every material has a cost.
    pub fn pattern_cost(&self) -> Option<f64> {
        self.patterns.iter().map(|p| p.cost).sum()
    }
}
