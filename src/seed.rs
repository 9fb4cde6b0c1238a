//! The only place a seed becomes a random-number generator.
//!
//! Every stream is a PCG-64 (MCG variant) seeded from a 64-bit hash of
//! (universe seed, key, stream), so the same inputs always give the same
//! numbers, on any thread, in any order.

use rand::SeedableRng;
use rand_pcg::Pcg64Mcg;

/// The generator type used throughout starloom.
pub type StarRng = Pcg64Mcg;

/// Purposes a generator can be drawn for; each gets an independent stream.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
#[repr(u64)]
pub enum Stream {
    /// Star counts and positions within a cell.
    CellContents = 1,
    /// Population synthesis for one system (masses, ages, companions).
    System = 2,
    /// Names of systems.
    Names = 3,
    /// Anything else keyed by the caller.
    Other = 4,
}

/// SplitMix64 finaliser: a bijective 64-bit mixer (Steele, Lea & Flood 2014,
/// "Fast splittable pseudorandom number generators", OOPSLA).
pub fn mix64(mut z: u64) -> u64 {
    z = z.wrapping_add(0x9E37_79B9_7F4A_7C15);
    z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
    z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
    z ^ (z >> 31)
}

/// A 64-bit key derived from the universe seed, a caller's key and a stream.
pub fn derive_key(seed: u64, key: u64, stream: Stream) -> u64 {
    mix64(mix64(mix64(seed) ^ key) ^ (stream as u64).wrapping_mul(0xD6E8_FEB8_6659_FD93))
}

/// A generator for (seed, key, stream).
pub fn rng_for(seed: u64, key: u64, stream: Stream) -> StarRng {
    StarRng::seed_from_u64(derive_key(seed, key, stream))
}

#[cfg(test)]
mod tests {
    use super::*;
    use rand::RngExt;

    #[test]
    fn same_inputs_same_numbers_different_streams_differ() {
        let a: u64 = rng_for(7, 42, Stream::System).random();
        let b: u64 = rng_for(7, 42, Stream::System).random();
        let c: u64 = rng_for(7, 42, Stream::Names).random();
        let d: u64 = rng_for(8, 42, Stream::System).random();
        assert_eq!(a, b);
        assert_ne!(a, c);
        assert_ne!(a, d);
    }
}
