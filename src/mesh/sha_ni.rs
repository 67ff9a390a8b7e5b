//! The SHA-256 block function on the processor's SHA extensions (x86-64 `sha`, with SSSE3 and
//! SSE4.1), used by [`super::digest`] when the processor has them: the same FIPS PUB 180-4
//! §6.2.2 compression, four rounds' message schedule per `sha256msg1`/`sha256msg2` pair and two
//! rounds per `sha256rnds2` (Intel, *Intel SHA Extensions*, Gulley et al., 2013), about six
//! times the speed of the portable rounds. The state is kept in the instructions' order, the
//! words `ABEF` and `CDGH`, for the whole run of blocks.

#[cfg(target_arch = "x86_64")]
use std::arch::x86_64::*;

/// Whether [`compress_blocks`] may run on this processor (detected once by the standard
/// library and cached).
#[cfg(target_arch = "x86_64")]
pub(super) fn available() -> bool {
    std::arch::is_x86_feature_detected!("sha")
        && std::arch::is_x86_feature_detected!("ssse3")
        && std::arch::is_x86_feature_detected!("sse4.1")
}

#[cfg(not(target_arch = "x86_64"))]
pub(super) fn available() -> bool {
    false
}

/// The blocks of `blocks` (a whole number of 64-byte blocks) folded into `state`, when
/// [`available`]; `false` (nothing done) otherwise.
pub(super) fn compress_blocks(state: &mut [u32; 8], blocks: &[u8], k: &[u32; 64]) -> bool {
    #[cfg(target_arch = "x86_64")]
    if available() {
        debug_assert_eq!(blocks.len() % 64, 0);
        // SAFETY: the processor has the features the function is compiled for (checked just
        // above), and it reads only whole 16-byte groups inside `state`, `blocks` and `k`.
        unsafe { rounds(state, blocks, k) };
        return true;
    }
    let _ = (state, blocks, k);
    false
}

#[cfg(target_arch = "x86_64")]
#[target_feature(enable = "sha,sse2,ssse3,sse4.1")]
unsafe fn rounds(state: &mut [u32; 8], blocks: &[u8], k: &[u32; 64]) {
    // Each message word big-endian (FIPS 180-4 §3.1).
    let swap = _mm_set_epi64x(0x0c0d_0e0f_0809_0a0b, 0x0405_0607_0001_0203);
    // SAFETY (every load and store below): unaligned 16-byte accesses at offsets 0, 16, 32, 48
    // of a 64-byte block, 0 and 16 of the 32-byte state, and 16·i (i < 16) of the 256-byte
    // constant table, all inside their slices.
    let dcba = unsafe { _mm_loadu_si128(state.as_ptr().cast()) };
    let hgfe = unsafe { _mm_loadu_si128(state.as_ptr().add(4).cast()) };
    let cdab = _mm_shuffle_epi32(dcba, 0xB1);
    let efgh = _mm_shuffle_epi32(hgfe, 0x1B);
    let mut abef = _mm_alignr_epi8(cdab, efgh, 8);
    let mut cdgh = _mm_blend_epi16(efgh, cdab, 0xF0);
    for block in blocks.chunks_exact(64) {
        let (abef0, cdgh0) = (abef, cdgh);
        let p = block.as_ptr();
        let mut w = [
            _mm_shuffle_epi8(unsafe { _mm_loadu_si128(p.cast()) }, swap),
            _mm_shuffle_epi8(unsafe { _mm_loadu_si128(p.add(16).cast()) }, swap),
            _mm_shuffle_epi8(unsafe { _mm_loadu_si128(p.add(32).cast()) }, swap),
            _mm_shuffle_epi8(unsafe { _mm_loadu_si128(p.add(48).cast()) }, swap),
        ];
        for i in 0..16 {
            // Rounds 4i .. 4i + 3 with the words W[4i ..] held in w[i % 4].
            let kw = unsafe { _mm_loadu_si128(k.as_ptr().add(4 * i).cast()) };
            let msg = _mm_add_epi32(w[i % 4], kw);
            // Two rounds make the old A, B, E, F the new C, D, G, H: the halves trade places
            // twice, so `abef` and `cdgh` hold their names again after each four rounds.
            cdgh = _mm_sha256rnds2_epu32(cdgh, abef, msg);
            abef = _mm_sha256rnds2_epu32(abef, cdgh, _mm_shuffle_epi32(msg, 0x0E));
            if i < 12 {
                // W[t] = σ1(W[t−2]) + W[t−7] + σ0(W[t−15]) + W[t−16] for t = 4(i+4) ..:
                // W[t−16] and σ0 from msg1, W[t−7] from the words two and three groups on.
                let s0 = _mm_sha256msg1_epu32(w[i % 4], w[(i + 1) % 4]);
                let w7 = _mm_alignr_epi8(w[(i + 3) % 4], w[(i + 2) % 4], 4);
                w[i % 4] = _mm_sha256msg2_epu32(_mm_add_epi32(s0, w7), w[(i + 3) % 4]);
            }
        }
        abef = _mm_add_epi32(abef, abef0);
        cdgh = _mm_add_epi32(cdgh, cdgh0);
    }
    let feba = _mm_shuffle_epi32(abef, 0x1B);
    let dchg = _mm_shuffle_epi32(cdgh, 0xB1);
    let dcba = _mm_blend_epi16(feba, dchg, 0xF0);
    let hgfe = _mm_alignr_epi8(dchg, feba, 8);
    unsafe {
        _mm_storeu_si128(state.as_mut_ptr().cast(), dcba);
        _mm_storeu_si128(state.as_mut_ptr().add(4).cast(), hgfe);
    }
}
