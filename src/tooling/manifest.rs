//! The file set of a tooling run: SHA-256 checksums, the manifest `tooling-manifest.json`, and the
//! files of an earlier run that the new set no longer holds.
//!
//! - **Checksum.** SHA-256 as FIPS PUB 180-4 (NIST, 2015) §6.2 defines it, computed here (a few
//!   dozen lines; no crate needed) while each file is written, so the manifest holds the digest
//!   of the bytes that went to disk.
//! - **Manifest.** One JSON object: the tool and its version, the STL unit, and for every file of
//!   the set its name, its size in bytes and its digest, in the order written. The manifest does
//!   not list itself.
//! - **Stale files.** Before a new set is written, the manifest already in the folder (if any)
//!   says which files the tool wrote there last time. A file it lists that the new set does not
//!   hold is removed, but only when it still has the size and digest the manifest recorded: a
//!   file the tool did not write, or one changed since, is left where it is and reported. A name
//!   that is not a plain file name (a path, `..`) is never touched. An earlier manifest that
//!   cannot be read removes nothing and is reported.

use std::io::Write;
use std::path::Path;

use serde::{Deserialize, Serialize};

/// File name of the manifest in the output folder.
pub const MANIFEST_FILE: &str = "tooling-manifest.json";

/// What the manifest's `format` key holds.
const FORMAT: &str = "layloft-tooling-manifest-1";

const K: [u32; 64] = [
    0x428a2f98, 0x71374491, 0xb5c0fbcf, 0xe9b5dba5, 0x3956c25b, 0x59f111f1, 0x923f82a4, 0xab1c5ed5,
    0xd807aa98, 0x12835b01, 0x243185be, 0x550c7dc3, 0x72be5d74, 0x80deb1fe, 0x9bdc06a7, 0xc19bf174,
    0xe49b69c1, 0xefbe4786, 0x0fc19dc6, 0x240ca1cc, 0x2de92c6f, 0x4a7484aa, 0x5cb0a9dc, 0x76f988da,
    0x983e5152, 0xa831c66d, 0xb00327c8, 0xbf597fc7, 0xc6e00bf3, 0xd5a79147, 0x06ca6351, 0x14292967,
    0x27b70a85, 0x2e1b2138, 0x4d2c6dfc, 0x53380d13, 0x650a7354, 0x766a0abb, 0x81c2c92e, 0x92722c85,
    0xa2bfe8a1, 0xa81a664b, 0xc24b8b70, 0xc76c51a3, 0xd192e819, 0xd6990624, 0xf40e3585, 0x106aa070,
    0x19a4c116, 0x1e376c08, 0x2748774c, 0x34b0bcb5, 0x391c0cb3, 0x4ed8aa4a, 0x5b9cca4f, 0x682e6ff3,
    0x748f82ee, 0x78a5636f, 0x84c87814, 0x8cc70208, 0x90befffa, 0xa4506ceb, 0xbef9a3f7, 0xc67178f2,
];

const H0: [u32; 8] = [
    0x6a09e667, 0xbb67ae85, 0x3c6ef372, 0xa54ff53a, 0x510e527f, 0x9b05688c, 0x1f83d9ab, 0x5be0cd19,
];

/// A running SHA-256 digest (FIPS PUB 180-4).
#[derive(Debug, Clone)]
pub struct Sha256 {
    state: [u32; 8],
    block: [u8; 64],
    filled: usize,
    length: u64,
}

impl Default for Sha256 {
    fn default() -> Self {
        Sha256 { state: H0, block: [0; 64], filled: 0, length: 0 }
    }
}

impl Sha256 {
    /// An empty digest.
    pub fn new() -> Self {
        Self::default()
    }

    /// Adds `bytes` to the message.
    pub fn update(&mut self, mut bytes: &[u8]) {
        self.length = self.length.wrapping_add(bytes.len() as u64);
        while !bytes.is_empty() {
            let take = (64 - self.filled).min(bytes.len());
            self.block[self.filled..self.filled + take].copy_from_slice(&bytes[..take]);
            self.filled += take;
            bytes = &bytes[take..];
            if self.filled == 64 {
                compress(&mut self.state, &self.block);
                self.filled = 0;
            }
        }
    }

    /// The digest of the message, as 64 lower-case hexadecimal digits.
    pub fn finish_hex(mut self) -> String {
        let bits = self.length.wrapping_mul(8);
        self.update(&[0x80]);
        while self.filled != 56 {
            self.update(&[0]);
        }
        self.update(&bits.to_be_bytes());
        debug_assert_eq!(self.filled, 0);
        self.state.iter().map(|w| format!("{w:08x}")).collect()
    }
}

/// One 512-bit block (FIPS PUB 180-4 §6.2.2).
fn compress(state: &mut [u32; 8], block: &[u8; 64]) {
    let mut w = [0u32; 64];
    for (t, word) in block.chunks_exact(4).enumerate() {
        w[t] = u32::from_be_bytes([word[0], word[1], word[2], word[3]]);
    }
    for t in 16..64 {
        let s0 = w[t - 15].rotate_right(7) ^ w[t - 15].rotate_right(18) ^ (w[t - 15] >> 3);
        let s1 = w[t - 2].rotate_right(17) ^ w[t - 2].rotate_right(19) ^ (w[t - 2] >> 10);
        w[t] = w[t - 16].wrapping_add(s0).wrapping_add(w[t - 7]).wrapping_add(s1);
    }
    let [mut a, mut b, mut c, mut d, mut e, mut f, mut g, mut h] = *state;
    for t in 0..64 {
        let s1 = e.rotate_right(6) ^ e.rotate_right(11) ^ e.rotate_right(25);
        let ch = (e & f) ^ (!e & g);
        let t1 = h.wrapping_add(s1).wrapping_add(ch).wrapping_add(K[t]).wrapping_add(w[t]);
        let s0 = a.rotate_right(2) ^ a.rotate_right(13) ^ a.rotate_right(22);
        let maj = (a & b) ^ (a & c) ^ (b & c);
        let t2 = s0.wrapping_add(maj);
        h = g;
        g = f;
        f = e;
        e = d.wrapping_add(t1);
        d = c;
        c = b;
        b = a;
        a = t1.wrapping_add(t2);
    }
    for (s, v) in state.iter_mut().zip([a, b, c, d, e, f, g, h]) {
        *s = s.wrapping_add(v);
    }
}

/// The SHA-256 digest of `bytes`, hexadecimal.
pub fn sha256_hex(bytes: &[u8]) -> String {
    let mut h = Sha256::new();
    h.update(bytes);
    h.finish_hex()
}

/// A writer that digests and counts what passes through it.
pub(crate) struct DigestWriter<'a> {
    pub(crate) inner: &'a mut dyn Write,
    pub(crate) digest: Sha256,
    pub(crate) bytes: u64,
}

impl Write for DigestWriter<'_> {
    fn write(&mut self, buf: &[u8]) -> std::io::Result<usize> {
        let n = self.inner.write(buf)?;
        self.digest.update(&buf[..n]);
        self.bytes += n as u64;
        Ok(n)
    }

    fn flush(&mut self) -> std::io::Result<()> {
        self.inner.flush()
    }
}

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

    /// Reads the manifest in `dir`: `Ok(None)` when there is none, an error text naming the file
    /// when it cannot be read or is not a manifest.
    pub fn read(dir: &Path) -> Result<Option<Manifest>, String> {
        let path = dir.join(MANIFEST_FILE);
        let text = match std::fs::read_to_string(&path) {
            Ok(t) => t,
            Err(e) if e.kind() == std::io::ErrorKind::NotFound => return Ok(None),
            Err(e) => return Err(format!("{}: {e}", path.display())),
        };
        let m: Manifest = serde_json::from_str(&text)
            .map_err(|e| format!("{}: not a tooling manifest ({e})", path.display()))?;
        if m.format != FORMAT {
            return Err(format!("{}: format '{}', expected '{FORMAT}'", path.display(), m.format));
        }
        Ok(Some(m))
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

fn plain_file_name(name: &str) -> bool {
    !name.is_empty()
        && name != "."
        && name != ".."
        && !name.contains(['/', '\\', '\0'])
        && name != MANIFEST_FILE
}

/// Compares the manifest in `dir` (if any) with the names of the new set.
pub fn stale_files(dir: &Path, new_set: &[String]) -> StaleFiles {
    let old = match Manifest::read(dir) {
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
pub fn remove_stale(dir: &Path, stale: &StaleFiles) -> Result<Vec<String>, crate::Error> {
    let mut removed = Vec::with_capacity(stale.remove.len());
    for name in &stale.remove {
        let path = dir.join(name);
        match std::fs::remove_file(&path) {
            Ok(()) => removed.push(name.clone()),
            Err(e) if e.kind() == std::io::ErrorKind::NotFound => {}
            Err(source) => {
                return Err(crate::Error::Write { path: path.display().to_string(), source });
            }
        }
    }
    Ok(removed)
}

#[cfg(test)]
mod tests {
    use super::*;

    // FIPS PUB 180-4 examples as published in NIST's "Example Algorithms" (SHA256.pdf, 2015):
    // one-block and two-block messages; the empty message and the million 'a' from the NIST
    // test vectors (SHAVS, Gallagher & Wright 2012, and FIPS 180-2 Appendix B.3).
    #[test]
    fn digests_match_the_published_examples() {
        assert_eq!(
            sha256_hex(b"abc"),
            "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad"
        );
        assert_eq!(
            sha256_hex(b"abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq"),
            "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1"
        );
        assert_eq!(
            sha256_hex(b""),
            "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855"
        );
        let mut h = Sha256::new();
        for _ in 0..1000 {
            h.update(&[b'a'; 1000]);
        }
        assert_eq!(
            h.finish_hex(),
            "cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0"
        );
    }

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
