//! SHA-256 as FIPS PUB 180-4 (NIST, 2015) §6.2 defines it, computed here (a few dozen lines; no
//! crate needed), so that a file set can name the digest of the bytes that went to disk.

use std::io::Write;

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
                compress_all(&mut self.state, &self.block);
                self.filled = 0;
            }
            if self.filled == 0 && bytes.len() >= 64 {
                // Whole blocks straight from the message, without the copy.
                let whole = bytes.len() / 64 * 64;
                compress_all(&mut self.state, &bytes[..whole]);
                bytes = &bytes[whole..];
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

/// Whole 512-bit blocks (a multiple of 64 bytes) folded into `state`: on the processor's SHA
/// extensions where it has them (`sha_ni`), else by the portable rounds below.
fn compress_all(state: &mut [u32; 8], blocks: &[u8]) {
    if !super::sha_ni::compress_blocks(state, blocks, &K) {
        for block in blocks.chunks_exact(64) {
            let mut b = [0u8; 64];
            b.copy_from_slice(block);
            compress(state, &b);
        }
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

#[cfg(test)]
mod tests {
    use super::*;

    /// The digest by the portable rounds alone (FIPS PUB 180-4 §5.1.1 padding written out).
    fn portable_hex(bytes: &[u8]) -> String {
        let mut m = bytes.to_vec();
        m.push(0x80);
        while m.len() % 64 != 56 {
            m.push(0);
        }
        m.extend((bytes.len() as u64 * 8).to_be_bytes());
        let mut state = H0;
        for block in m.chunks_exact(64) {
            let mut b = [0u8; 64];
            b.copy_from_slice(block);
            compress(&mut state, &b);
        }
        state.iter().map(|w| format!("{w:08x}")).collect()
    }

    #[test]
    fn the_processor_rounds_agree_with_the_portable_rounds() {
        // Every length across the block and padding boundaries, fed whole and in uneven pieces;
        // on a processor without the SHA extensions both sides are the portable rounds.
        let mut x = 0x2545_f491_4f6c_dd1du64;
        let msg: Vec<u8> = (0..1000)
            .map(|_| {
                x ^= x << 13;
                x ^= x >> 7;
                x ^= x << 17;
                x as u8
            })
            .collect();
        for n in (0..300).chain([511, 512, 513, 999, 1000]) {
            let want = portable_hex(&msg[..n]);
            assert_eq!(sha256_hex(&msg[..n]), want, "{n} bytes");
            let mut h = Sha256::new();
            for piece in msg[..n].chunks(37) {
                h.update(piece);
            }
            assert_eq!(h.finish_hex(), want, "{n} bytes in pieces");
        }
        assert_eq!(
            portable_hex(b"abc"),
            "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad"
        );
    }

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
}
