//! A set of output files written as a whole: either the previous set stays untouched or the new
//! set is complete, also when the run is killed part-way.
//!
//! The files go into a staging folder beside the target (`.layloft-set-*`, in the target's parent
//! folder, so on the same file system); files in the target that the tool did not write are
//! hard-linked into the staging folder (copied where links are refused), so they survive; then the
//! two folders are exchanged in one step (`renameat2` with `RENAME_EXCHANGE` on Linux; elsewhere
//! two renames with a short window) and the old folder, now at the staging path, is removed.
//! Which files the tool wrote is read from the set's own list, `.layloft-set`, one relative path a
//! line; a file the previous run wrote and this one does not is removed with the old folder and
//! reported as stale. A staging folder that a killed run left behind is removed by the next run
//! into the same parent folder once it is a minute old (see [`super::remove_leftovers`]); it
//! never holds the only copy of a file.
//!
//! Before anything is written the target is checked ([`FileSet::check_target`]): a link to a
//! folder is followed (the link stays; the files go where it points), the new folder takes the
//! old one's permissions and, where the system lets it, its owner and group; a folder without
//! write permission, the working folder and a mount point are refused, the first because its
//! owner protected it, the other two because a folder cannot be exchanged there.

use std::collections::BTreeSet;
use std::path::{Component, Path, PathBuf};

use crate::Error;

/// The list of the files of a set, kept in the set's folder.
pub const SET_LIST: &str = ".layloft-set";

/// Files to be written together into one folder.
#[derive(Debug, Default)]
pub struct FileSet {
    files: Vec<(PathBuf, Vec<u8>)>,
    /// Files of the previous folder to drop whatever its list says.
    drop_old: BTreeSet<PathBuf>,
    /// Files of the previous folder to carry over whatever its list says.
    keep_old: BTreeSet<PathBuf>,
}

/// What committing a set did.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct SetOutcome {
    /// The files written, as paths inside the target.
    pub written: Vec<PathBuf>,
    /// Files an earlier run of the tool wrote that are not in the new set, removed.
    pub removed: Vec<PathBuf>,
    /// Files in the folder that the tool did not write, kept.
    pub kept: Vec<PathBuf>,
}

impl FileSet {
    /// An empty set.
    pub fn new() -> Self {
        FileSet::default()
    }

    /// Adds a file at `relative` (a plain relative path, sub-folders allowed); a second file at
    /// the same path replaces the first.
    pub fn add(&mut self, relative: impl Into<PathBuf>, bytes: impl Into<Vec<u8>>) {
        let relative = relative.into();
        let bytes = bytes.into();
        match self.files.iter_mut().find(|(p, _)| *p == relative) {
            Some(slot) => slot.1 = bytes,
            None => self.files.push((relative, bytes)),
        }
    }

    /// Decides for a file of the previous folder that is not in the new set: `keep` carries it
    /// into the new folder, otherwise it goes with the old folder; this overrides the set's own
    /// list (for a caller that keeps a list of its own, such as the tooling manifest).
    pub fn decide_old(&mut self, relative: impl Into<PathBuf>, keep: bool) {
        let relative = relative.into();
        if keep {
            self.drop_old.remove(&relative);
            self.keep_old.insert(relative);
        } else {
            self.keep_old.remove(&relative);
            self.drop_old.insert(relative);
        }
    }

    /// The relative paths added so far, in order.
    pub fn paths(&self) -> impl Iterator<Item = &Path> {
        self.files.iter().map(|(p, _)| p.as_path())
    }

    /// Checks that a set can be put in place at `target` before anything is written, and gives
    /// the folder it goes to: `target` itself, or the folder a link at `target` points to.
    /// Refused with the reason: a file in the way, a link to nothing, a folder without write
    /// permission (its owner protected it: the exchange would replace it all the same), the
    /// working folder (the shell in it would be left in the old, removed folder) and a mount
    /// point (a folder there cannot be exchanged). A missing target is fine: it is made.
    pub fn check_target(target: &Path) -> Result<PathBuf, Error> {
        let fail = |why: &str| Error::Write {
            path: target.display().to_string(),
            source: std::io::Error::other(why.to_string()),
        };
        let link = match std::fs::symlink_metadata(target) {
            Ok(m) => m.file_type().is_symlink(),
            Err(e) if e.kind() == std::io::ErrorKind::NotFound => {
                return Ok(target.to_path_buf());
            }
            Err(e) => {
                // A file on the way (`FILE/out`) is named as the file in the way.
                if let Some(file) = target.ancestors().skip(1).find(|a| a.is_file()) {
                    return Err(Error::Write {
                        path: file.display().to_string(),
                        source: std::io::Error::other("it is a file, not a folder; name a folder"),
                    });
                }
                return Err(fail(&format!("cannot read it: {}", e.kind())));
            }
        };
        let resolved = if link {
            std::fs::canonicalize(target).map_err(|_| {
                fail("it is a link to nothing; name a folder, or make the one it points to")
            })?
        } else {
            target.to_path_buf()
        };
        let meta = std::fs::metadata(&resolved)
            .map_err(|e| fail(&format!("cannot read it: {}", e.kind())))?;
        if !meta.is_dir() {
            return Err(fail("it is a file, not a folder; name a folder"));
        }
        if meta.permissions().readonly() || !writable(&resolved) {
            return Err(fail(
                "the folder is read-only: expected a folder you may write in (make it \
                 writable, or name another folder)",
            ));
        }
        let real = std::fs::canonicalize(&resolved)
            .map_err(|e| fail(&format!("cannot read it: {}", e.kind())))?;
        let here = std::env::current_dir().and_then(std::fs::canonicalize);
        if here.is_ok_and(|h| h == real) {
            return Err(fail(
                "it is the working folder: the new files are put in place by exchanging the \
                 folder for a new one, which would leave the shell in the old one; name a \
                 folder inside it",
            ));
        }
        if mount_point(&real, &meta) {
            return Err(fail(
                "it is a mount point: the new files are put in place by exchanging the folder \
                 for a new one, which a mount point does not allow; name a folder inside it",
            ));
        }
        Ok(resolved)
    }

    /// Writes the set into the folder `target` (created with its parents when missing), as the
    /// module documentation describes.
    pub fn commit(self, target: &Path) -> Result<SetOutcome, Error> {
        let fail = |why: String| Error::Write {
            path: target.display().to_string(),
            source: std::io::Error::other(why),
        };
        for (rel, _) in &self.files {
            let plain = rel.components().all(|c| matches!(c, Component::Normal(_)));
            if !plain || rel.as_os_str().is_empty() || rel == Path::new(SET_LIST) {
                return Err(fail(format!(
                    "'{}' is not a file name inside the folder",
                    rel.display()
                )));
            }
        }
        let resolved = Self::check_target(target)?;
        let target = resolved.as_path();
        let parent = match target.parent() {
            Some(p) if !p.as_os_str().is_empty() => p.to_path_buf(),
            _ => PathBuf::from("."),
        };
        super::ensure_folder(&parent)?;
        super::remove_leftovers(&parent);
        let io = |what: &str, p: &Path, e: std::io::Error| {
            fail(format!("{what} {}: {e}", p.strip_prefix(&parent).unwrap_or(p).display()))
        };
        let staging =
            tempfile::Builder::new().prefix(".layloft-set-").tempdir_in(&parent).map_err(|e| {
                fail(format!(
                    "cannot make a staging folder beside it in {}: {} (the new files are written \
                     beside the folder and exchanged for it in one step, so the folder it is in \
                     must be writable too)",
                    parent.display(),
                    e.kind()
                ))
            })?;
        let stage = staging.path();
        // The new folder as the old one: its owner and group where the system lets them be
        // given (a set-group folder's group also goes to the files made in it), and its
        // permissions, with the owner's own kept open until the files are in.
        let old_mode = take_ownership(target, stage);

        let mut outcome = SetOutcome::default();
        let mut list = String::new();
        // Every file written first, on all cores (copying a large set into the page cache is
        // work of its own), then all synced, several at once: the file system takes the set in
        // a few flushes instead of one flush a file. The first failure in the files' order is
        // reported.
        for (rel, _) in &self.files {
            if let Some(dir) = stage.join(rel).parent() {
                std::fs::create_dir_all(dir).map_err(|e| io("cannot create", dir, e))?;
            }
        }
        let written = crate::mesh::each_part(
            self.files.len(),
            |i| write_file(&stage.join(&self.files[i].0), &self.files[i].1),
            &mut |_, _| {},
        );
        for ((rel, _), result) in self.files.iter().zip(written) {
            match result {
                Some(Ok(())) => {}
                Some(Err(e)) => return Err(io("cannot write", rel, e)),
                // Left unwritten only after an earlier file failed, which is reported first.
                None => return Err(io("cannot write", rel, std::io::Error::other("not written"))),
            }
            outcome.written.push(rel.clone());
            list.push_str(&rel.to_string_lossy());
            list.push('\n');
        }
        write_file(&stage.join(SET_LIST), list.as_bytes())
            .map_err(|e| io("cannot write", Path::new(SET_LIST), e))?;
        let all: Vec<&Path> =
            self.files.iter().map(|(rel, _)| rel.as_path()).chain([Path::new(SET_LIST)]).collect();
        let synced: Vec<std::io::Result<()>> = std::thread::scope(|scope| {
            let shares: Vec<_> = all
                .chunks(all.len().div_ceil(SYNC_THREADS).max(1))
                .map(|share| {
                    scope.spawn(move || {
                        share.iter().map(|rel| sync_file(&stage.join(rel))).collect::<Vec<_>>()
                    })
                })
                .collect();
            shares
                .into_iter()
                .flat_map(|h| h.join().unwrap_or_else(|e| std::panic::resume_unwind(e)))
                .collect()
        });
        for (rel, r) in all.iter().zip(synced) {
            r.map_err(|e| io("cannot write", rel, e))?;
        }

        if target.is_dir() {
            let new: BTreeSet<&Path> = self.files.iter().map(|(p, _)| p.as_path()).collect();
            let old: BTreeSet<PathBuf> = std::fs::read_to_string(target.join(SET_LIST))
                .map(|t| t.lines().filter(|l| !l.is_empty()).map(PathBuf::from).collect())
                .unwrap_or_default();
            for rel in files_below(target).map_err(|e| io("cannot read", target, e))? {
                if new.contains(rel.as_path()) || rel == Path::new(SET_LIST) {
                    continue;
                }
                let listed = old.contains(&rel) || self.drop_old.contains(&rel);
                if listed && !self.keep_old.contains(&rel) {
                    outcome.removed.push(rel);
                    continue;
                }
                // Not the tool's: carried into the new folder, the original left in place.
                let (from, to) = (target.join(&rel), stage.join(&rel));
                if let Some(dir) = to.parent() {
                    std::fs::create_dir_all(dir).map_err(|e| io("cannot create", dir, e))?;
                }
                if std::fs::hard_link(&from, &to).is_err() {
                    std::fs::copy(&from, &to).map_err(|e| io("cannot keep", &rel, e))?;
                }
                outcome.kept.push(rel);
            }
            if let Some(mode) = old_mode {
                set_mode(stage, mode);
            }
            exchange(stage, target)
                .map_err(|e| fail(format!("cannot put the new files in place: {e}")))?;
            // The staging path now holds the previous folder; dropping `staging` removes it.
        } else {
            let stage = staging.keep();
            std::fs::rename(&stage, target).map_err(|e| {
                let _ = std::fs::remove_dir_all(&stage);
                fail(format!("cannot put the new files in place: {e}"))
            })?;
        }
        Ok(outcome)
    }
}

/// Whether the user may write in the folder `dir` (the system's own answer, which knows the
/// owner, the groups and the access lists).
#[cfg(unix)]
fn writable(dir: &Path) -> bool {
    rustix::fs::access(dir, rustix::fs::Access::WRITE_OK).is_ok()
}

#[cfg(not(unix))]
fn writable(_dir: &Path) -> bool {
    true
}

/// Whether the folder `real` (a canonical path, `meta` its metadata) is a mount point or the
/// root: its parent lies on another device, or it has none.
#[cfg(unix)]
fn mount_point(real: &Path, meta: &std::fs::Metadata) -> bool {
    use std::os::unix::fs::MetadataExt;
    match real.parent() {
        None => true,
        Some(parent) => std::fs::metadata(parent).is_ok_and(|p| p.dev() != meta.dev()),
    }
}

#[cfg(not(unix))]
fn mount_point(real: &Path, _meta: &std::fs::Metadata) -> bool {
    real.parent().is_none()
}

/// Gives the staging folder `stage` the owner and group of the folder `target` (where the
/// system allows; each on its own, failures ignored) and its permissions with the owner's read,
/// write and search added; returns the target's permission bits to put back at the end.
#[cfg(unix)]
fn take_ownership(target: &Path, stage: &Path) -> Option<u32> {
    use std::os::unix::fs::MetadataExt;
    let meta = std::fs::metadata(target).ok().filter(|m| m.is_dir())?;
    let _ = rustix::fs::chown(stage, None, Some(rustix::fs::Gid::from_raw(meta.gid())));
    let _ = rustix::fs::chown(stage, Some(rustix::fs::Uid::from_raw(meta.uid())), None);
    let mode = meta.mode() & 0o7777;
    set_mode(stage, mode | 0o700);
    Some(mode)
}

#[cfg(not(unix))]
fn take_ownership(_target: &Path, _stage: &Path) -> Option<u32> {
    None
}

#[cfg(unix)]
fn set_mode(dir: &Path, mode: u32) {
    use std::os::unix::fs::PermissionsExt;
    let _ = std::fs::set_permissions(dir, std::fs::Permissions::from_mode(mode));
}

#[cfg(not(unix))]
fn set_mode(_dir: &Path, _mode: u32) {}

fn write_file(path: &Path, bytes: &[u8]) -> std::io::Result<()> {
    use std::io::Write;
    std::fs::File::create(path)?.write_all(bytes)
}

/// Files are synced on this many threads at once: each waits on the disk, and the file system
/// takes the waiting ones in fewer flushes.
const SYNC_THREADS: usize = 8;

/// Makes the contents of the file at `path` durable (written to the disk, with its size).
fn sync_file(path: &Path) -> std::io::Result<()> {
    std::fs::OpenOptions::new().write(true).open(path)?.sync_all()
}

/// Every file below `dir`, as paths relative to it, sorted.
fn files_below(dir: &Path) -> std::io::Result<Vec<PathBuf>> {
    let mut out = Vec::new();
    let mut stack = vec![PathBuf::new()];
    while let Some(rel) = stack.pop() {
        for entry in std::fs::read_dir(dir.join(&rel))? {
            let entry = entry?;
            let path = rel.join(entry.file_name());
            if entry.file_type()?.is_dir() {
                stack.push(path);
            } else {
                out.push(path);
            }
        }
    }
    out.sort();
    Ok(out)
}

/// Exchanges the folders `a` and `b` in one step where the system can.
#[cfg(target_os = "linux")]
fn exchange(a: &Path, b: &Path) -> std::io::Result<()> {
    use rustix::fs::{CWD, RenameFlags, renameat_with};
    match renameat_with(CWD, a, CWD, b, RenameFlags::EXCHANGE) {
        Ok(()) => Ok(()),
        // A file system without the exchange: two renames.
        Err(e) if e == rustix::io::Errno::INVAL || e == rustix::io::Errno::NOSYS => {
            exchange_by_renames(a, b)
        }
        Err(e) => Err(e.into()),
    }
}

#[cfg(not(target_os = "linux"))]
fn exchange(a: &Path, b: &Path) -> std::io::Result<()> {
    exchange_by_renames(a, b)
}

/// `b` to a spare name beside it, `a` to `b`, the spare to `a`.
fn exchange_by_renames(a: &Path, b: &Path) -> std::io::Result<()> {
    let mut spare = a.as_os_str().to_owned();
    spare.push("-old");
    let spare = PathBuf::from(spare);
    std::fs::rename(b, &spare)?;
    if let Err(e) = std::fs::rename(a, b) {
        let _ = std::fs::rename(&spare, b);
        return Err(e);
    }
    std::fs::rename(&spare, a)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn set(files: &[(&str, &str)]) -> FileSet {
        let mut s = FileSet::new();
        for (p, t) in files {
            s.add(*p, t.as_bytes());
        }
        s
    }

    #[test]
    fn a_new_set_replaces_the_old_keeping_foreign_files_and_dropping_stale_ones() {
        let tmp = tempfile::tempdir().unwrap();
        let target = tmp.path().join("out");
        let first = set(&[("a.txt", "1"), ("sub/b.txt", "1"), ("c.txt", "1")]).commit(&target);
        assert_eq!(first.unwrap().written.len(), 3);
        std::fs::write(target.join("notes.md"), "mine").unwrap();
        std::fs::write(target.join("sub/mine.txt"), "mine").unwrap();
        let second = set(&[("a.txt", "2"), ("sub/b.txt", "2")]).commit(&target).unwrap();
        assert_eq!(second.removed, vec![PathBuf::from("c.txt")]);
        assert_eq!(second.kept, vec![PathBuf::from("notes.md"), PathBuf::from("sub/mine.txt")]);
        assert_eq!(std::fs::read_to_string(target.join("a.txt")).unwrap(), "2");
        assert_eq!(std::fs::read_to_string(target.join("sub/b.txt")).unwrap(), "2");
        assert!(!target.join("c.txt").exists());
        assert_eq!(std::fs::read_to_string(target.join("notes.md")).unwrap(), "mine");
        assert_eq!(std::fs::read_to_string(target.join("sub/mine.txt")).unwrap(), "mine");
        // Nothing is left beside the target.
        let beside: Vec<_> = std::fs::read_dir(tmp.path()).unwrap().collect();
        assert_eq!(beside.len(), 1);
    }

    #[cfg(unix)]
    #[test]
    fn a_link_to_a_folder_is_followed_and_stays_a_link() {
        // A shop links its output to a shared folder; the link was replaced by a new folder
        // and the shared one never got the files.
        let tmp = tempfile::tempdir().unwrap();
        let real = tmp.path().join("share");
        std::fs::create_dir(&real).unwrap();
        let link = tmp.path().join("out");
        std::os::unix::fs::symlink(&real, &link).unwrap();
        set(&[("a.txt", "1")]).commit(&link).unwrap();
        set(&[("a.txt", "2")]).commit(&link).unwrap();
        assert!(std::fs::symlink_metadata(&link).unwrap().file_type().is_symlink());
        assert_eq!(std::fs::read_to_string(real.join("a.txt")).unwrap(), "2");
    }

    #[cfg(unix)]
    #[test]
    fn a_read_only_folder_is_refused_and_left_as_it_was() {
        // A folder its owner made read-only (a released tool set) was exchanged for a new,
        // writable one all the same: the rename needs only the parent's permission.
        use std::os::unix::fs::PermissionsExt;
        let tmp = tempfile::tempdir().unwrap();
        let target = tmp.path().join("out");
        set(&[("a.txt", "1")]).commit(&target).unwrap();
        std::fs::set_permissions(&target, std::fs::Permissions::from_mode(0o555)).unwrap();
        let e = set(&[("a.txt", "2")]).commit(&target).unwrap_err().to_string();
        std::fs::set_permissions(&target, std::fs::Permissions::from_mode(0o755)).unwrap();
        assert!(e.contains("the folder is read-only"), "{e}");
        assert_eq!(std::fs::read_to_string(target.join("a.txt")).unwrap(), "1");
        assert_eq!(std::fs::read_dir(tmp.path()).unwrap().count(), 1, "nothing left beside it");
    }

    #[cfg(unix)]
    #[test]
    fn the_new_folder_keeps_the_old_ones_permissions() {
        // A folder shared with a group (group-writable, set-group so new files join the
        // group) came back as a private 0755 folder of the user who ran the tool.
        use std::os::unix::fs::{MetadataExt, PermissionsExt};
        let tmp = tempfile::tempdir().unwrap();
        let target = tmp.path().join("out");
        std::fs::create_dir(&target).unwrap();
        std::fs::set_permissions(&target, std::fs::Permissions::from_mode(0o2770)).unwrap();
        set(&[("a.txt", "1")]).commit(&target).unwrap();
        let meta = std::fs::metadata(&target).unwrap();
        assert_eq!(meta.mode() & 0o7777, 0o2770);
        let file = std::fs::metadata(target.join("a.txt")).unwrap();
        assert_eq!(file.gid(), meta.gid(), "files made in a set-group folder take its group");
    }

    #[test]
    fn a_bad_name_or_a_file_in_the_way_leaves_everything_untouched() {
        let tmp = tempfile::tempdir().unwrap();
        let target = tmp.path().join("out");
        set(&[("a.txt", "1")]).commit(&target).unwrap();
        assert!(set(&[("../x", "2")]).commit(&target).is_err());
        assert!(set(&[("/abs", "2")]).commit(&target).is_err());
        assert_eq!(std::fs::read_to_string(target.join("a.txt")).unwrap(), "1");
        let file = tmp.path().join("file");
        std::fs::write(&file, "x").unwrap();
        let e = set(&[("a.txt", "1")]).commit(&file).unwrap_err().to_string();
        assert!(e.contains("is a file, not a folder"), "{e}");
        assert_eq!(std::fs::read_dir(tmp.path()).unwrap().count(), 2);
    }
}
