//! Atomic file writing.

use std::io::Write;
use std::path::Path;

use crate::Error;

/// Writes `bytes` to `path` atomically: into a temporary file beside it, flushed and synced, then
/// renamed over `path`. The folder must exist.
pub fn write_atomic(path: &Path, bytes: &[u8]) -> Result<(), Error> {
    write_atomic_with(path, |w| w.write_all(bytes))
}

/// Writes to `path` atomically through a writer; `fill` writes the content. Nothing is left at
/// `path` or beside it when `fill` or the rename fails.
pub fn write_atomic_with(
    path: &Path,
    fill: impl FnOnce(&mut dyn Write) -> std::io::Result<()>,
) -> Result<(), Error> {
    let err = |source: std::io::Error| Error::Write { path: path.display().to_string(), source };
    let dir = match path.parent() {
        Some(d) if !d.as_os_str().is_empty() => d,
        _ => Path::new("."),
    };
    let mut builder = tempfile::Builder::new();
    builder.prefix(".layloft-").suffix(".tmp");
    // A temporary file is private (0600) by default; an output gets the mode `File::create`
    // would give it (0666 less the umask), so that a report can be shared like any file.
    #[cfg(unix)]
    {
        use std::os::unix::fs::PermissionsExt;
        builder.permissions(std::fs::Permissions::from_mode(0o666));
    }
    let mut tmp = builder.tempfile_in(dir).map_err(err)?;
    {
        let mut w = std::io::BufWriter::new(tmp.as_file_mut());
        fill(&mut w).map_err(err)?;
        w.flush().map_err(err)?;
    }
    tmp.as_file().sync_all().map_err(err)?;
    tmp.persist(path).map_err(|e| err(e.error))?;
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_failed_fill_leaves_the_old_file_and_no_temporary() {
        let dir = tempfile::tempdir().unwrap();
        let path = dir.path().join("out.txt");
        write_atomic(&path, b"first").unwrap();
        let failed = write_atomic_with(&path, |w| {
            w.write_all(b"half")?;
            Err(std::io::Error::other("interrupted"))
        });
        assert!(failed.is_err());
        assert_eq!(std::fs::read(&path).unwrap(), b"first");
        assert_eq!(std::fs::read_dir(dir.path()).unwrap().count(), 1);
    }

    #[cfg(unix)]
    #[test]
    fn an_output_gets_the_mode_of_an_ordinary_new_file() {
        use std::os::unix::fs::PermissionsExt;
        let dir = tempfile::tempdir().unwrap();
        let plain = dir.path().join("plain.txt");
        std::fs::File::create(&plain).unwrap();
        let atomic = dir.path().join("atomic.txt");
        write_atomic(&atomic, b"x").unwrap();
        let mode = |p: &Path| std::fs::metadata(p).unwrap().permissions().mode() & 0o777;
        assert_eq!(mode(&atomic), mode(&plain));
    }

    #[test]
    fn a_missing_folder_is_an_error_naming_the_path() {
        let e = write_atomic(Path::new("/nonexistent-layloft-dir/x.txt"), b"x").unwrap_err();
        assert!(e.to_string().contains("/nonexistent-layloft-dir/x.txt"), "{e}");
    }
}
