//! What the command line may ask for: the mass range of each kind and a
//! typical default age.

use super::evolution::{RemnantThresholds, Track};
use super::kinds::{KindChoice, StarKind};
use super::{black_hole, brown_dwarf, main_sequence, neutron_star, white_dwarf};
use crate::units::UNIVERSE_AGE_GYR;

/// Largest initial mass we follow, Msun (upper end of the stellar IMF used).
pub const MAX_STAR_MSUN: f64 = 150.0;

/// The (min, max) mass in Msun accepted for a kind choice.
///
/// Auto 0.013–150 (brown dwarfs to the most massive stars); main sequence
/// 0.075–150; white dwarfs 0.15 up to the Chandrasekhar mass 1.44; neutron
/// stars 1.1–2.3; black holes 3–1e11; brown dwarfs 0.013–0.075;
/// subgiants, giants, core-helium and asymptotic giants 1–10 (stars that
/// reach these stages within the age of the universe, below the
/// supergiant limit); supergiants 10–150.
pub fn allowed_mass_range(kind: KindChoice) -> (f64, f64) {
    match kind {
        KindChoice::Auto => (brown_dwarf::MASS_RANGE_MSUN.0, MAX_STAR_MSUN),
        KindChoice::Explicit(kind) => match kind {
            StarKind::MainSequence => (brown_dwarf::MASS_RANGE_MSUN.1, MAX_STAR_MSUN),
            StarKind::WhiteDwarf => (0.15, white_dwarf::CHANDRASEKHAR_MSUN),
            StarKind::NeutronStar => neutron_star::MASS_RANGE_MSUN,
            StarKind::BlackHole => black_hole::MASS_RANGE_MSUN,
            StarKind::BrownDwarf => brown_dwarf::MASS_RANGE_MSUN,
            StarKind::Subgiant
            | StarKind::Giant
            | StarKind::CoreHelium
            | StarKind::AsymptoticGiant => (1.0, 10.0),
            StarKind::Supergiant => (10.0, MAX_STAR_MSUN),
        },
    }
}

/// A typical age, Gyr, for a request that gives none.
///
/// 4.6 Gyr (the Sun's age), but at most half the main-sequence lifetime so
/// that a default star of any mass is on the main sequence. White dwarfs:
/// at least 0.5 Gyr after their progenitor's death; neutron stars, black
/// holes and brown dwarfs: 4.6 Gyr; evolved kinds: the middle of that
/// phase. Never above 13.8 Gyr.
pub fn typical_age_gyr(mass_msun: f64, kind: KindChoice) -> f64 {
    const SUN_AGE_GYR: f64 = 4.6;
    let thresholds = RemnantThresholds::default();
    let main_sequence_age = |m: f64| SUN_AGE_GYR.min(0.5 * main_sequence::t_ms_gyr(m));
    let age = match kind {
        KindChoice::Auto if mass_msun < brown_dwarf::MASS_RANGE_MSUN.1 => SUN_AGE_GYR,
        KindChoice::Auto | KindChoice::Explicit(StarKind::MainSequence) => {
            main_sequence_age(mass_msun)
        }
        KindChoice::Explicit(StarKind::WhiteDwarf) => {
            match white_dwarf::initial_mass_msun(mass_msun, thresholds.white_dwarf_max_initial_msun)
            {
                Some(m_i) => SUN_AGE_GYR.max(Track::new(m_i, &thresholds).t_end_gyr + 0.5),
                None => SUN_AGE_GYR,
            }
        }
        KindChoice::Explicit(
            StarKind::NeutronStar | StarKind::BlackHole | StarKind::BrownDwarf,
        ) => SUN_AGE_GYR,
        KindChoice::Explicit(kind) => {
            let track = Track::new(mass_msun, &thresholds);
            let (lo, hi) = track
                .phase_gyr(kind)
                .unwrap_or((track.t_hei_gyr, track.t_che_end_gyr));
            0.5 * (lo + hi)
        }
    };
    age.min(UNIVERSE_AGE_GYR)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn allowed_ranges_of_each_kind() {
        assert_eq!(allowed_mass_range(KindChoice::Auto), (0.013, 150.0));
        assert_eq!(
            allowed_mass_range(KindChoice::Explicit(StarKind::WhiteDwarf)).1,
            1.44
        );
        assert_eq!(
            allowed_mass_range(KindChoice::Explicit(StarKind::NeutronStar)),
            (1.1, 2.3)
        );
        assert_eq!(
            allowed_mass_range(KindChoice::Explicit(StarKind::BlackHole)),
            (3.0, 1e11)
        );
        assert_eq!(
            allowed_mass_range(KindChoice::Explicit(StarKind::BrownDwarf)),
            (0.013, 0.075)
        );
        assert_eq!(
            allowed_mass_range(KindChoice::Explicit(StarKind::MainSequence)),
            (0.075, 150.0)
        );
    }

    #[test]
    fn default_ages_keep_stars_on_the_main_sequence() {
        assert_eq!(typical_age_gyr(1.0, KindChoice::Auto), 4.6);
        let mut m = 0.075;
        while m <= 150.0 {
            let age = typical_age_gyr(m, KindChoice::Auto);
            assert!(age > 0.0 && age < main_sequence::t_ms_gyr(m), "{m}");
            m *= 1.1;
        }
        for kind in StarKind::ALL {
            let (lo, hi) = allowed_mass_range(KindChoice::Explicit(kind));
            for m in [lo, (lo * hi).sqrt(), hi] {
                let age = typical_age_gyr(m, KindChoice::Explicit(kind));
                assert!((0.0..=13.8).contains(&age), "{kind} {m}: {age}");
            }
        }
    }
}
