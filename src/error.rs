//! The crate-level error: every module's error, wrapped so that `?` carries the reason up.

use crate::blade::BladeError;
use crate::input::InputError;
use crate::laminate::LaminateError;
use crate::loads::LoadsError;
use crate::material::MaterialError;
use crate::mesh::MeshError;
use crate::modal::ModalError;
use crate::plybook::PlyBookError;
use crate::section::SectionError;
use crate::stress::StressError;

/// Any error layloft's library can return.
#[derive(Debug, thiserror::Error)]
pub enum Error {
    /// Bad input: a file, line or key and what was wrong with it.
    #[error(transparent)]
    Input(#[from] InputError),
    /// A material record or reference.
    #[error(transparent)]
    Material(#[from] MaterialError),
    /// A laminate code or laminate.
    #[error(transparent)]
    Laminate(#[from] LaminateError),
    /// The blade geometry or ply schedule.
    #[error(transparent)]
    Blade(#[from] BladeError),
    /// Load cases.
    #[error(transparent)]
    Loads(#[from] LoadsError),
    /// A section that cannot be solved.
    #[error(transparent)]
    Section(#[from] SectionError),
    /// Stress recovery.
    #[error(transparent)]
    Stress(#[from] StressError),
    /// A tooling mesh that cannot be built or fails its checks.
    #[error(transparent)]
    Mesh(#[from] MeshError),
    /// The modal analysis: bad model data or speeds, or an eigen solution that failed.
    #[error(transparent)]
    Modal(#[from] ModalError),
    /// The ply book: a region that cannot be draped, a roll too narrow.
    #[error(transparent)]
    PlyBook(#[from] PlyBookError),
    /// Writing an output file.
    #[error("cannot write {path}: {source}")]
    Write {
        /// The file or folder.
        path: String,
        /// The reason.
        #[source]
        source: std::io::Error,
    },
}
