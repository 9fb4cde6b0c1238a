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

/// Writes the name of system `system_key` into `out` (cleared first).
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
    for s in 0..syllables {
        let r: u32 = rng.random();
        // The first syllable starts with a vowel one time in eight.
        if !(s == 0 && r.is_multiple_of(8)) {
            out.push_str(ONSETS[(r >> 3) as usize % ONSETS.len()]);
        }
        out.push_str(VOWELS[(r >> 8) as usize % VOWELS.len()]);
        // Codas only on the last syllable or, rarely, inside.
        let coda = CODAS[(r >> 12) as usize % CODAS.len()];
        if s + 1 == syllables || (r >> 20).is_multiple_of(4) {
            out.push_str(coda);
        }
    }
    if let Some(first) = out.get_mut(..1) {
        first.make_ascii_uppercase();
    }
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
