//! Seeded pseudo-random numbers for the unit tests' random cases: Marsaglia's xorshift with the
//! shift triple 13, 7, 17 (G. Marsaglia, "Xorshift RNGs", Journal of Statistical Software 8
//! (2003), from memory), the same numbers on every run, so a failing case can be found again.

/// `|| -> f64` uniform on [0, 1) from the 53 high bits of each state, starting from `seed`
/// (not zero).
pub(crate) fn uniform(mut seed: u64) -> impl FnMut() -> f64 {
    move || {
        seed ^= seed << 13;
        seed ^= seed >> 7;
        seed ^= seed << 17;
        (seed >> 11) as f64 / (1u64 << 53) as f64
    }
}
