//! Atomic file writing, output folders, and the removal of temporary files a killed run left.

use std::io::Write;
use std::path::Path;
use std::time::{Duration, SystemTime};

use crate::Error;

/// Temporary files of the tool's own naming older than this are taken as left by a killed run
/// and removed by the next write into the same folder. A write takes well under a second, so a
/// minute leaves any run still writing alone.
const LEFTOVER_AGE: Duration = Duration::from_secs(60);

/// Makes sure `dir` is a folder, creating it and its parents when missing. A path that is a file,
/// or whose parent is a file, is an error that says so in words.
pub fn ensure_folder(dir: &Path) -> Result<(), Error> {
    let fail = |why: String| Error::Write {
        path: dir.display().to_string(),
        source: std::io::Error::other(why),
    };
    if dir.is_dir() {
        return Ok(());
    }
    if dir.exists() {
        return Err(fail("it is a file, not a folder; name a folder".into()));
    }
    for parent in dir.ancestors().skip(1) {
        if parent.as_os_str().is_empty() {
            break;
        }
        if parent.exists() && !parent.is_dir() {
            return Err(fail(format!("{} is a file, not a folder", parent.display())));
        }
        if parent.is_dir() {
            break;
        }
    }
    std::fs::create_dir_all(dir)
        .map_err(|e| fail(format!("cannot create the folder: {}", plain(&e))))
}

/// An I/O error in words without the path of the temporary file it may carry: the reader knows
/// only the output's own name, which the caller gives.
fn plain(e: &std::io::Error) -> std::io::Error {
    match e.raw_os_error() {
        Some(code) => std::io::Error::from_raw_os_error(code),
        None => std::io::Error::new(e.kind(), e.kind().to_string()),
    }
}

/// Removes the tool's own temporary files (`.layloft-*.tmp`, and `.layloft-demo-*` scratch and
/// `.layloft-set-*` staging folders) older than a minute from `dir`: what a killed run left
/// behind. Failures are ignored; nothing else is touched.
pub fn remove_leftovers(dir: &Path) {
    let Ok(entries) = std::fs::read_dir(dir) else { return };
    let now = SystemTime::now();
    for entry in entries.flatten() {
        let name = entry.file_name();
        let name = name.to_string_lossy();
        let tmp_file = name.starts_with(".layloft-") && name.ends_with(".tmp");
        let scratch = name.starts_with(".layloft-demo-") || name.starts_with(".layloft-set-");
        if !tmp_file && !scratch {
            continue;
        }
        let Ok(meta) = entry.metadata() else { continue };
        let old = meta
            .modified()
            .ok()
            .and_then(|m| now.duration_since(m).ok())
            .is_some_and(|age| age > LEFTOVER_AGE);
        if !old {
            continue;
        }
        let path = entry.path();
        let _ = if meta.is_dir() && scratch {
            std::fs::remove_dir_all(&path)
        } else if meta.is_file() {
            std::fs::remove_file(&path)
        } else {
            Ok(())
        };
    }
}

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
    let err = |source: std::io::Error| Error::Write {
        path: path.display().to_string(),
        source: plain(&source),
    };
    let dir = match path.parent() {
        Some(d) if !d.as_os_str().is_empty() => d,
        _ => Path::new("."),
    };
    if path.is_dir() {
        // Not through `plain`, which keeps only an OS error's code and would leave "other error".
        return Err(Error::Write {
            path: path.display().to_string(),
            source: std::io::Error::other("it is a folder; name a file"),
        });
    }
    if dir.exists() && !dir.is_dir() {
        return Err(Error::Write {
            path: path.display().to_string(),
            source: std::io::Error::other(format!("{} is a file, not a folder", dir.display())),
        });
    }
    if !dir.exists() {
        return Err(Error::Write {
            path: path.display().to_string(),
            source: std::io::Error::other(format!(
                "the folder {} does not exist; expected an existing folder (create it first)",
                dir.display()
            )),
        });
    }
    remove_leftovers(dir);
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

    #[test]
    fn a_file_in_a_missing_folder_is_refused_with_the_folder_named() {
        // Common practice: say which folder is missing, not the system's "entity not found".
        let dir = tempfile::tempdir().unwrap();
        let path = dir.path().join("nodir").join("c.svg");
        let text = write_atomic(&path, b"x").unwrap_err().to_string();
        assert!(text.contains("nodir does not exist") && text.contains("c.svg"), "{text}");
        assert!(!dir.path().join("nodir").exists());
    }

    #[test]
    fn a_folder_named_as_the_output_file_is_refused_in_words() {
        // Common practice: say what is wrong ("other error" was all it said).
        let dir = tempfile::tempdir().unwrap();
        let text = write_atomic(dir.path(), b"x").unwrap_err().to_string();
        assert!(text.contains("it is a folder; name a file"), "{text}");
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
    fn an_error_names_the_output_and_never_the_temporary_file() {
        let dir = tempfile::tempdir().unwrap();
        let file = dir.path().join("plain");
        std::fs::write(&file, b"x").unwrap();
        // The folder is a file: the message says so and names no temporary file.
        let e = write_atomic(&file.join("out.svg"), b"x").unwrap_err().to_string();
        assert!(e.contains("is a file, not a folder"), "{e}");
        assert!(!e.contains(".layloft-"), "{e}");
        let e = ensure_folder(&file).unwrap_err().to_string();
        assert!(e.contains("is a file, not a folder"), "{e}");
        let e = ensure_folder(&file.join("sub")).unwrap_err().to_string();
        assert!(e.contains("is a file, not a folder"), "{e}");
    }

    #[test]
    fn old_temporary_files_of_our_naming_are_removed_and_others_kept() {
        let dir = tempfile::tempdir().unwrap();
        let old = dir.path().join(".layloft-abc.tmp");
        let fresh = dir.path().join(".layloft-def.tmp");
        let foreign = dir.path().join("notes.tmp");
        for p in [&old, &fresh, &foreign] {
            std::fs::write(p, b"x").unwrap();
        }
        let past = SystemTime::now() - Duration::from_secs(3600);
        for p in [&old, &foreign] {
            std::fs::File::options().write(true).open(p).unwrap().set_modified(past).unwrap();
        }
        write_atomic(&dir.path().join("report.html"), b"x").unwrap();
        assert!(!old.exists(), "a killed run's temporary file is removed");
        assert!(fresh.exists(), "a temporary file of a run still writing is kept");
        assert!(foreign.exists(), "a file of another naming is never touched");
    }

    #[test]
    fn a_missing_folder_is_an_error_naming_the_path() {
        let e = write_atomic(Path::new("/nonexistent-layloft-dir/x.txt"), b"x").unwrap_err();
        assert!(e.to_string().contains("/nonexistent-layloft-dir/x.txt"), "{e}");
    }
}
