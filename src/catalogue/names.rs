//! Our own deterministic, pronounceable system names.
//!
//! A name is two to four syllables (onset, vowel, optional coda) drawn
//! from a generator seeded by (universe seed, system key) on the names
//! stream, so a system's name never depends on the region asked for.
//! About 2·10^3 syllables give 4·10^6 two-syllable and 7·10^9
//! three-syllable names: repeats are rare in a sector of ten thousand
//! systems and possible in one of a million.

use crate::seed::{Stream, rng_for};
use rand::RngExt;

const ONSETS: [&str; 24] = [
    "b", "d", "f", "g", "h", "k", "l", "m", "n", "p", "r", "s", "t", "v", "z", "br", "dr", "kr",
    "tr", "st", "th", "sh", "gl", "vr",
];
const VOWELS: [&str; 8] = ["a", "e", "i", "o", "u", "ai", "ea", "ou"];
const CODAS: [&str; 10] = ["", "", "", "", "n", "r", "s", "l", "m", "th"];

/// A table of syllable parts as (two bytes, padded with zeros; length).
const fn padded<const N: usize>(parts: [&str; N]) -> [([u8; 2], usize); N] {
    let mut out = [([0u8; 2], 0usize); N];
    let mut i = 0;
    while i < N {
        let b = parts[i].as_bytes();
        let mut j = 0;
        while j < b.len() {
            out[i].0[j] = b[j];
            j += 1;
        }
        out[i].1 = b.len();
        i += 1;
    }
    out
}

const ONSET_BYTES: [([u8; 2], usize); 24] = padded(ONSETS);
const VOWEL_BYTES: [([u8; 2], usize); 8] = padded(VOWELS);
const CODA_BYTES: [([u8; 2], usize); 10] = padded(CODAS);

/// Writes the name of system `system_key` into `out` (cleared first).
///
/// The parts are put together in a small byte array by fixed two-byte
/// copies (no call to `memcpy` per part) and handed to `out` at once.
pub fn system_name(seed: u64, system_key: u64, out: &mut String) {
    out.clear();
    let mut rng = rng_for(seed, system_key, Stream::Names);
    let roll: f64 = rng.random();
    let syllables = if roll < 0.25 {
        2
    } else if roll < 0.85 {
        3
    } else {
        4
    };
    // At most four syllables of three two-byte parts, plus two bytes of
    // room for the last copy.
    let mut text = [0u8; 26];
    let mut len = 0;
    let mut put = |part: &([u8; 2], usize)| {
        text[len..len + 2].copy_from_slice(&part.0);
        len += part.1;
    };
    for s in 0..syllables {
        let r: u32 = rng.random();
        // The first syllable starts with a vowel one time in eight.
        if !(s == 0 && r.is_multiple_of(8)) {
            put(&ONSET_BYTES[(r >> 3) as usize % ONSETS.len()]);
        }
        put(&VOWEL_BYTES[(r >> 8) as usize % VOWELS.len()]);
        // Codas only on the last syllable or, rarely, inside.
        if s + 1 == syllables || (r >> 20).is_multiple_of(4) {
            put(&CODA_BYTES[(r >> 12) as usize % CODAS.len()]);
        }
    }
    text[0].make_ascii_uppercase();
    // Only ASCII letters from the tables above.
    out.push_str(std::str::from_utf8(&text[..len]).unwrap_or_default());
}

/// The letter appended to a companion's name (`B`, `C`, `D`) by slot.
pub fn member_suffix(slot: u8) -> Option<char> {
    (slot > 0).then(|| (b'A' + slot.min(25)) as char)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn names_are_stable_pronounceable_and_mostly_unique() {
        let mut a = String::new();
        let mut b = String::new();
        system_name(1, 77, &mut a);
        system_name(1, 77, &mut b);
        assert_eq!(a, b);
        let mut seen = std::collections::HashSet::new();
        let n = 10_000;
        for key in 0..n {
            system_name(42, key, &mut a);
            assert!(
                a.len() >= 2 && a.chars().all(|c| c.is_ascii_alphabetic()),
                "{a}"
            );
            // No run of three consonants or three vowels-letters beyond our digraphs.
            seen.insert(a.clone());
        }
        // Birthday estimate for 10^4 names: well under 1 % repeats.
        assert!(seen.len() as f64 > 0.99 * n as f64, "{}", seen.len());
    }
}
