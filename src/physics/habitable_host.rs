//! The "habitable host" flag: a fiction-grade rule, not science.
//!
//! A star counts as a likely host for life-bearing worlds when it is on the
//! main sequence, has 0.5–1.4 Msun (long-lived, not too flare-prone, with
//! a habitable zone outside tidal locking; common practice, no source) and
//! is at least 1 Gyr old (time for life to get going; our choice). Starloom
//! is a fiction tool: this is a storytelling shortcut.

use super::kinds::StarKind;

/// Mass range of habitable hosts, Msun.
pub const MASS_RANGE_MSUN: (f64, f64) = (0.5, 1.4);
/// Minimum age of a habitable host, Gyr.
pub const MIN_AGE_GYR: f64 = 1.0;

/// True for a main-sequence star of 0.5–1.4 Msun at least 1 Gyr old.
pub fn is_habitable_host(kind: StarKind, mass_msun: f64, age_gyr: f64) -> bool {
    kind == StarKind::MainSequence
        && (MASS_RANGE_MSUN.0..=MASS_RANGE_MSUN.1).contains(&mass_msun)
        && age_gyr >= MIN_AGE_GYR
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn rule() {
        assert!(is_habitable_host(StarKind::MainSequence, 1.0, 4.6));
        assert!(!is_habitable_host(StarKind::MainSequence, 1.0, 0.5));
        assert!(!is_habitable_host(StarKind::MainSequence, 0.3, 4.6));
        assert!(!is_habitable_host(StarKind::Giant, 1.0, 12.0));
    }
}
