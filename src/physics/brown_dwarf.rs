//! Brown dwarfs (0.013–0.075 Msun): objects that never burn hydrogen and
//! fade as they cool.
//!
//! # Source
//! - Luminosity: Burrows & Liebert 1993, Rev. Mod. Phys. 65, 301, the
//!   cooling law `L ≈ 4e-5 Lsun (t / 1 Gyr)^-1.3 (M / 0.05 Msun)^2.64`
//!   (opacity factor taken as 1; from memory, unverified).
//! - Radius: about one Jupiter radius for old objects, larger when young:
//!   `R = R_J (1 + 0.1 (t / 1 Gyr)^-1/2)`, a schematic of our own shaped on
//!   published evolutionary tracks (common practice, no source). Ages
//!   below 1 Myr are treated as 1 Myr, where this gives about 4 R_J.
//! - Young objects: the cooling law is for degenerate, cooling brown
//!   dwarfs and runs far too hot when young (8 800 K at 1 Myr and
//!   0.075 Msun, a K0 temperature at 0.06 Msun and 13 Myr). Contracting
//!   young brown dwarfs sit on nearly vertical tracks at late-M
//!   temperatures: in star-forming regions of a few Myr the
//!   hydrogen-burning limit falls near spectral type M6 (Luhman 2012,
//!   ARA&A 50, 65; from memory, unverified). So Teff is held at most at
//!   [`MAX_TEFF_K`], Mamajek's M6V temperature, with the radius above and
//!   L from Stefan–Boltzmann, so L is continuous where the bound takes
//!   over. The law is left as it is from about 0.21 Gyr at 0.075 Msun,
//!   79 Myr at 0.05 Msun and 5 Myr at 0.02 Msun on.
//! - Boundaries: hydrogen-burning limit 0.075 Msun (Baraffe et al. 1998,
//!   A&A 337, 403), deuterium-burning limit about 13 Jupiter masses,
//!   0.013 Msun (from memory). At 0.075 Msun a brown dwarf is much fainter
//!   than a star of the same mass (about 1.4 dex at 4.6 Gyr): the
//!   hydrogen-burning limit is a real jump, not a fitting artefact.

use super::constants::{R_JUPITER_PER_R_SUN, TEFF_SUN_K};

/// Mass range of brown dwarfs, Msun.
pub const MASS_RANGE_MSUN: (f64, f64) = (0.013, 0.075);
/// Youngest age used, Gyr (1 Myr).
const MIN_AGE_GYR: f64 = 1e-3;
/// Hottest photosphere given to a brown dwarf, K: the M6V row of E.
/// Mamajek's dwarf sequence, version 2024.05.15 (Pecaut & Mamajek 2013,
/// ApJS 208, 9; verified, stars.md §3 source; the same row as
/// `spectral_class.rs`).
pub const MAX_TEFF_K: f64 = 2810.0;

/// Luminosity, Lsun, of a brown dwarf of this mass (Msun) and age (Gyr).
pub fn luminosity_lsun(mass_msun: f64, age_gyr: f64) -> f64 {
    photosphere(mass_msun, age_gyr).0
}

/// log10(4e-5), the cooling law's normalisation, to the last bit (a test
/// checks it).
const LOG10_NORMALISATION: f64 = -4.397_940_008_672_037_5;

/// Luminosity (Lsun) with its log10, radius (Rsun) and Teff (K) of a
/// brown dwarf of this mass (Msun) and age (Gyr).
///
/// Teff = 5772 K · L^(1/4) · R^(-1/2) (Stefan–Boltzmann in nominal solar
/// units) is taken as 5772 K · (4e-5)^(1/4) · exp(x/4) / √R with
/// x = ln(L / 4e-5), an exponential that does not wait for L; it differs
/// from the formula applied to L and R by rounding only (tested). Where
/// that Teff passes [`MAX_TEFF_K`] (young and massive), Teff is the bound
/// and L = R² (Teff / 5772 K)⁴.
#[inline]
pub fn photosphere(mass_msun: f64, age_gyr: f64) -> (f64, f64, f64, f64) {
    /// 5772 K · (4e-5)^(1/4) (a test checks it).
    const TEFF_SCALE_K: f64 = TEFF_SUN_K * 0.079_527_072_876_705_07;
    let x = cooling_exponent(mass_msun, age_gyr);
    let r = radius_rsun(age_gyr);
    let teff = TEFF_SCALE_K * (0.25 * x).exp() / r.sqrt();
    if teff > MAX_TEFF_K {
        let l = r * r * (MAX_TEFF_K / TEFF_SUN_K).powi(4);
        return (l, l.log10(), r, MAX_TEFF_K);
    }
    (
        4e-5 * x.exp(),
        LOG10_NORMALISATION + x * std::f64::consts::LOG10_E,
        r,
        teff,
    )
}

/// ln(L / 4e-5 Lsun) of the cooling law.
fn cooling_exponent(mass_msun: f64, age_gyr: f64) -> f64 {
    let t = age_gyr.max(MIN_AGE_GYR);
    -1.3 * t.ln() + 2.64 * (mass_msun / 0.05).ln()
}

/// Radius, Rsun, of a brown dwarf at this age (Gyr).
pub fn radius_rsun(age_gyr: f64) -> f64 {
    let t = age_gyr.max(MIN_AGE_GYR);
    (1.0 + 0.1 / t.sqrt()) / R_JUPITER_PER_R_SUN
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::physics::effective_temperature::teff_k;

    #[test]
    fn photosphere_is_stefan_boltzmann() {
        // Against Teff = 5772 K · L^(1/4) · R^(-1/2), the Stefan–Boltzmann
        // law in the IAU 2015 B3 nominal solar units (effective_temperature.rs).
        assert_eq!(0.079_527_072_876_705_07, 4e-5f64.powf(0.25));
        for i in 0..=200 {
            let m = 0.013 + 0.062 * i as f64 / 200.0;
            for age in [0.0, 1e-3, 0.01, 0.3, 1.0, 5.0, 13.8] {
                let (l, log10_l, r, t) = photosphere(m, age);
                assert_eq!(l, luminosity_lsun(m, age));
                assert_eq!(r, radius_rsun(age));
                assert!((log10_l - l.log10()).abs() < 1e-13);
                assert!((t / teff_k(l, r) - 1.0).abs() < 1e-14, "{m} {age}");
            }
        }
    }

    #[test]
    fn young_brown_dwarfs_stay_late_m() {
        // Luhman 2012, ARA&A 50, 65 (from memory, unverified): in regions a
        // few Myr old the substellar boundary lies near M6, so no brown
        // dwarf is hotter than an M6 dwarf; Mamajek's table (2024.05.15,
        // verified): M6V 2810 K. Ages from 0 to 13.8 Gyr, the
        // whole mass range.
        let mut hottest: f64 = 0.0;
        for i in 0..=200 {
            let m = 0.013 + 0.062 * i as f64 / 200.0;
            for j in 0..=400 {
                let age = 13.8 * (j as f64 / 400.0).powi(4);
                let (l, _, r, t) = photosphere(m, age);
                assert!(t <= 2810.0, "{m} Msun at {age} Gyr: {t} K");
                assert!(l > 0.0 && r > 0.0);
                hottest = hottest.max(t);
            }
        }
        // The bound is reached (at the young, massive end), not just stood
        // under.
        assert_eq!(hottest, 2810.0);
        // Where the law is cooler than the bound it is left as it was: 4e-5
        // Lsun at 1 Gyr and 0.05 Msun (Burrows & Liebert 1993, from memory).
        assert!((photosphere(0.05, 1.0).0 / 4e-5 - 1.0).abs() < 1e-12);
    }

    #[test]
    fn luminosity_is_continuous_where_the_bound_takes_over() {
        // L = R² T⁴ on both sides of the switch, so a brown dwarf never jumps
        // in brightness as it ages: 1 % steps in age from 1 Myr to 1 Gyr, over
        // which the law alone dims by 1.3 % a step.
        for m in [0.02, 0.05, 0.075] {
            let mut prev = photosphere(m, 1e-3).0;
            for k in 1..=695 {
                let l = photosphere(m, 1e-3 * 1.01f64.powi(k)).0;
                assert!(
                    l <= prev && l > prev * 0.97,
                    "{m} Msun step {k}: {prev} -> {l}"
                );
                prev = l;
            }
        }
    }

    #[test]
    fn normalisation_of_the_cooling_law() {
        // Burrows & Liebert 1993 (from memory): 4e-5 Lsun at 1 Gyr and 0.05 Msun.
        assert!((luminosity_lsun(0.05, 1.0) / 4e-5 - 1.0).abs() < 1e-12);
    }

    #[test]
    fn old_brown_dwarfs_are_late_l_or_t() {
        // Mamajek table version 2024.05.15 (Pecaut & Mamajek 2013, ApJS 208, 9, as
        // maintained by E. Mamajek; verified): L0V 2270 K, T0V 1255 K,
        // Y0V 450 K; R ≈ 0.1 Rsun for L0–Y0. A 0.05 Msun object at 5 Gyr should lie in the
        // T range (between Y0 and L0), and old radii within 15 % of 0.1 Rsun.
        let t = teff_k(luminosity_lsun(0.05, 5.0), radius_rsun(5.0));
        assert!((450.0..2270.0).contains(&t), "{t}");
        assert!((radius_rsun(5.0) / 0.1 - 1.0).abs() < 0.15);
    }

    #[test]
    fn log10_of_the_luminosity() {
        assert_eq!(LOG10_NORMALISATION, 4e-5f64.log10());
        for i in 0..=1000 {
            let m = 0.013 + 0.062 * i as f64 / 1000.0;
            let age = 13.8 * ((i * 37) % 1001) as f64 / 1000.0;
            let (l, log10_l, _, _) = photosphere(m, age);
            assert_eq!(l, luminosity_lsun(m, age));
            assert!((log10_l - l.log10()).abs() < 1e-13, "{m} {age}");
        }
    }

    #[test]
    fn fades_with_age_and_brighter_with_mass() {
        assert!(luminosity_lsun(0.05, 2.0) < luminosity_lsun(0.05, 1.0));
        assert!(luminosity_lsun(0.07, 1.0) > luminosity_lsun(0.03, 1.0));
        assert!(radius_rsun(0.01) > radius_rsun(1.0));
        assert!(luminosity_lsun(0.013, 0.0).is_finite());
    }
}
