//! The tooling manifest at the output edge: the earlier manifest read back from the folder, and
//! the files of an earlier run that the new set no longer holds.
//!
//! Before a new set is written, the manifest already in the folder (if any) says which files the
//! tool wrote there last time. A file it lists that the new set does not hold is removed, but
//! only when it still has the size and digest the manifest recorded: a file the tool did not
//! write, or one changed since, is left where it is and reported. A name that is not a plain file
//! name (a path, `..`) is never touched. An earlier manifest that cannot be read removes nothing
//! and is reported.

use std::path::Path;

use crate::Error;
use crate::mesh::sha256_hex;
use crate::tooling::{MANIFEST_FILE, Manifest, StaleFiles, plain_file_name};

/// Reads the manifest in `dir`: `Ok(None)` when there is none, an error text naming the file
/// when it cannot be read or is not a manifest.
pub fn read_manifest(dir: &Path) -> Result<Option<Manifest>, String> {
    let path = dir.join(MANIFEST_FILE);
    let text = match std::fs::read_to_string(&path) {
        Ok(t) => t,
        Err(e) if e.kind() == std::io::ErrorKind::NotFound => return Ok(None),
        Err(e) => return Err(format!("{}: {e}", path.display())),
    };
    Manifest::parse(&text).map(Some).map_err(|why| format!("{}: {why}", path.display()))
}

/// Compares the manifest in `dir` (if any) with the names of the new set.
pub fn stale_files(dir: &Path, new_set: &[String]) -> StaleFiles {
    let old = match read_manifest(dir) {
        Ok(Some(m)) => m,
        Ok(None) => return StaleFiles::default(),
        Err(why) => return StaleFiles { unreadable: Some(why), ..StaleFiles::default() },
    };
    let mut out = StaleFiles::default();
    for entry in old.files.iter().filter(|e| !new_set.contains(&e.file)) {
        if !plain_file_name(&entry.file) {
            out.kept.push((entry.file.clone(), "not a plain file name".into()));
            continue;
        }
        let path = dir.join(&entry.file);
        match std::fs::read(&path) {
            Err(e) if e.kind() == std::io::ErrorKind::NotFound => {}
            Err(e) => out.kept.push((entry.file.clone(), format!("cannot be read: {e}"))),
            Ok(bytes) => {
                if bytes.len() as u64 == entry.size_bytes && sha256_hex(&bytes) == entry.sha256 {
                    out.remove.push(entry.file.clone());
                } else {
                    out.kept.push((
                        entry.file.clone(),
                        "changed since the earlier run wrote it".into(),
                    ));
                }
            }
        }
    }
    out
}

/// Removes `stale.remove` from `dir`; the names of the files removed, or the first failure.
pub fn remove_stale(dir: &Path, stale: &StaleFiles) -> Result<Vec<String>, Error> {
    let mut removed = Vec::with_capacity(stale.remove.len());
    for name in &stale.remove {
        let path = dir.join(name);
        match std::fs::remove_file(&path) {
            Ok(()) => removed.push(name.clone()),
            Err(e) if e.kind() == std::io::ErrorKind::NotFound => {}
            Err(source) => {
                return Err(Error::Write { path: path.display().to_string(), source });
            }
        }
    }
    Ok(removed)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::tooling::ManifestEntry;

    #[test]
    fn only_unchanged_files_of_the_earlier_set_are_removed() {
        let dir = tempfile::tempdir().unwrap();
        let d = dir.path();
        let entry = |file: &str, bytes: &[u8]| ManifestEntry {
            file: file.into(),
            size_bytes: bytes.len() as u64,
            sha256: sha256_hex(bytes),
        };
        std::fs::write(d.join("a.stl"), b"aa").unwrap();
        std::fs::write(d.join("b.stl"), b"bb").unwrap();
        std::fs::write(d.join("c.stl"), b"changed").unwrap();
        std::fs::write(d.join("mine.txt"), b"user").unwrap();
        let old = Manifest::new(
            "mm",
            vec![
                entry("a.stl", b"aa"),
                entry("b.stl", b"bb"),
                entry("c.stl", b"cc"),
                entry("../x.stl", b"x"),
                entry("gone.stl", b"g"),
            ],
        );
        std::fs::write(d.join(MANIFEST_FILE), old.to_json()).unwrap();
        let stale = stale_files(d, &["a.stl".to_string()]);
        assert_eq!(stale.remove, ["b.stl"]);
        let kept: Vec<&str> = stale.kept.iter().map(|(f, _)| f.as_str()).collect();
        assert_eq!(kept, ["c.stl", "../x.stl"]);
        assert_eq!(remove_stale(d, &stale).unwrap(), ["b.stl"]);
        for f in ["a.stl", "c.stl", "mine.txt"] {
            assert!(d.join(f).exists(), "{f}");
        }
        assert!(!d.join("b.stl").exists());
    }

    #[test]
    fn an_unreadable_manifest_removes_nothing() {
        let dir = tempfile::tempdir().unwrap();
        std::fs::write(dir.path().join(MANIFEST_FILE), "{ not json").unwrap();
        let stale = stale_files(dir.path(), &[]);
        assert!(stale.remove.is_empty());
        assert!(stale.unreadable.unwrap().contains(MANIFEST_FILE));
    }
}
