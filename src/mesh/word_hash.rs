//! A hasher for the mesh kit's tables, keyed by vertex indices, cell indices and the bits of
//! coordinates: a multiply and a rotate per 64-bit word (the scheme of the Firefox and rustc
//! hashers), where the standard library's SipHash spends tens of cycles on every key to resist
//! chosen-key flooding that a mesh the program built itself cannot mount. Its order is fixed
//! from run to run; no result of the crate depends on the order of a table.

use std::collections::{HashMap, HashSet};
use std::hash::{BuildHasherDefault, Hasher};

/// Odd multiplier with well-spread bits (the 64-bit golden ratio's, as in Knuth's
/// multiplicative hashing).
const K: u64 = 0x9e37_79b9_7f4a_7c15;

/// See the module docs.
#[derive(Debug, Default, Clone, Copy)]
pub(crate) struct WordHasher(u64);

impl WordHasher {
    #[inline]
    fn add(&mut self, word: u64) {
        self.0 = (self.0.rotate_left(5) ^ word).wrapping_mul(K);
    }
}

impl Hasher for WordHasher {
    #[inline]
    fn write(&mut self, bytes: &[u8]) {
        let mut chunks = bytes.chunks_exact(8);
        for c in &mut chunks {
            let mut w = [0u8; 8];
            w.copy_from_slice(c);
            self.add(u64::from_le_bytes(w));
        }
        let rest = chunks.remainder();
        if !rest.is_empty() {
            let mut w = [0u8; 8];
            w[..rest.len()].copy_from_slice(rest);
            self.add(u64::from_le_bytes(w) ^ ((rest.len() as u64) << 59));
        }
    }
    #[inline]
    fn write_u8(&mut self, i: u8) {
        self.add(u64::from(i));
    }
    #[inline]
    fn write_u16(&mut self, i: u16) {
        self.add(u64::from(i));
    }
    #[inline]
    fn write_u32(&mut self, i: u32) {
        self.add(u64::from(i));
    }
    #[inline]
    fn write_u64(&mut self, i: u64) {
        self.add(i);
    }
    #[inline]
    fn write_usize(&mut self, i: usize) {
        self.add(i as u64);
    }
    /// The product's high bits are its best mixed; the table takes its slot from the low bits,
    /// so they are rotated down.
    #[inline]
    fn finish(&self) -> u64 {
        self.0.rotate_left(26)
    }
}

/// A hash map with [`WordHasher`].
pub(crate) type WordMap<K, V> = HashMap<K, V, BuildHasherDefault<WordHasher>>;

/// A hash set with [`WordHasher`].
pub(crate) type WordSet<K> = HashSet<K, BuildHasherDefault<WordHasher>>;

#[cfg(test)]
mod tests {
    use super::*;
    use std::hash::{BuildHasher, Hash};

    fn hash<T: Hash>(t: &T) -> u64 {
        BuildHasherDefault::<WordHasher>::default().hash_one(t)
    }

    #[test]
    fn keys_of_a_mesh_spread_over_the_slots() {
        // Vertex-index triples, grid cells and coordinate bits of a fine lattice: their low 16
        // bits (the slot of a table of 65,536) must fill the slots about as a random draw would
        // (a draw of n keys into m slots leaves about m e^(-n/m) empty: the Poisson law).
        let m = 1usize << 16;
        let n = 3 * m;
        let expected_empty = m as f64 * (-(n as f64) / m as f64).exp();
        let mut sets: Vec<Vec<u64>> = vec![Vec::new(); 3];
        for i in 0..n as u32 {
            sets[0].push(hash(&[i, i + 1, i + 2]));
            let c = [i % 97, (i / 97) % 89, i / (97 * 89)];
            sets[1].push(hash(&[i64::from(c[0]), i64::from(c[1]), i64::from(c[2])]));
            let p = [1e-3 * f64::from(i % 300), 0.25 + 1e-4 * f64::from(i / 300), 0.05];
            sets[2].push(hash(&p.map(f64::to_bits)));
        }
        for (k, hashes) in sets.iter().enumerate() {
            let mut hit = vec![false; m];
            for h in hashes {
                hit[(h & (m as u64 - 1)) as usize] = true;
            }
            let empty = hit.iter().filter(|&&x| !x).count() as f64;
            assert!(
                empty < 1.5 * expected_empty + 50.0,
                "key set {k}: {empty} empty slots against {expected_empty:.0} for a random draw"
            );
        }
        // And a table behaves as a table.
        let mut map: WordMap<[u32; 3], usize> = WordMap::default();
        for i in 0..1000u32 {
            map.insert([i, 2 * i, 3 * i], i as usize);
        }
        assert_eq!(map.len(), 1000);
        assert_eq!(map.get(&[10, 20, 30]), Some(&10));
        assert_eq!(map.get(&[10, 20, 31]), None);
    }
}
