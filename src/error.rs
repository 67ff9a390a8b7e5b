//! The crate-level error: every module's error, wrapped so that `?` carries the reason up.

use crate::input::InputError;
use crate::laminate::LaminateError;
use crate::material::MaterialError;
use crate::modal::ModalError;

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
    /// The modal analysis: bad model data or speeds, or an eigen solution that failed.
    #[error(transparent)]
    Modal(#[from] ModalError),
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
