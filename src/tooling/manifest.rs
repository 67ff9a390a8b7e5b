//! The manifest of a tooling run, `tooling-manifest.json`: one JSON object with the tool and its
//! version, the STL unit, and for every file of the set its name, its size in bytes and its
//! SHA-256 digest ([`crate::mesh::sha256_hex`]), in the order written. The manifest does not list
//! itself. Reading an earlier manifest from a folder and judging its files stale is the output
//! edge's (`crate::output`).

use serde::{Deserialize, Serialize};

/// File name of the manifest in the output folder.
pub const MANIFEST_FILE: &str = "tooling-manifest.json";

/// What the manifest's `format` key holds.
const FORMAT: &str = "layloft-tooling-manifest-1";

/// One file of the set.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize)]
pub struct ManifestEntry {
    /// The file name, in the output folder.
    pub file: String,
    /// Its size, bytes.
    pub size_bytes: u64,
    /// Its SHA-256 digest, hexadecimal.
    pub sha256: String,
}

/// The manifest of a tooling run.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize)]
pub struct Manifest {
    /// `layloft-tooling-manifest-1`.
    pub format: String,
    /// The program and its version that wrote the set.
    pub written_by: String,
    /// Unit of the STL coordinates (`mm` or `m`).
    pub stl_unit: String,
    /// Every file of the set, in the order written.
    pub files: Vec<ManifestEntry>,
}

impl Manifest {
    /// A manifest of `files`, STL coordinates in `stl_unit`.
    pub fn new(stl_unit: &str, files: Vec<ManifestEntry>) -> Self {
        Manifest {
            format: FORMAT.into(),
            written_by: format!("layloft {}", env!("CARGO_PKG_VERSION")),
            stl_unit: stl_unit.into(),
            files,
        }
    }

    /// The manifest as pretty JSON.
    pub fn to_json(&self) -> String {
        // A struct of strings and integers always serialises.
        serde_json::to_string_pretty(self).unwrap_or_default()
    }

    /// Parses the text of a manifest; an error text when it is not a manifest of this format.
    pub fn parse(text: &str) -> Result<Manifest, String> {
        let m: Manifest =
            serde_json::from_str(text).map_err(|e| format!("not a tooling manifest ({e})"))?;
        if m.format != FORMAT {
            return Err(format!("format '{}', expected '{FORMAT}'", m.format));
        }
        Ok(m)
    }
}

/// What becomes of the files an earlier manifest lists that the new set does not hold.
#[derive(Debug, Clone, Default, PartialEq, Eq)]
pub struct StaleFiles {
    /// Files the tool wrote last time, unchanged since: removed once the new set is written.
    pub remove: Vec<String>,
    /// Files listed but changed since (or not plain file names): left in place, with why.
    pub kept: Vec<(String, String)>,
    /// Why the earlier manifest could not be used, if it could not (nothing is removed then).
    pub unreadable: Option<String>,
}

pub(crate) fn plain_file_name(name: &str) -> bool {
    !name.is_empty()
        && name != "."
        && name != ".."
        && !name.contains(['/', '\\', '\0'])
        && name != MANIFEST_FILE
}
