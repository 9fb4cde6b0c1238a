//! Habitable-zone edges around a star after Kopparapu et al. (2013, 2014).
//!
//! Each edge is an effective stellar flux S_eff (in units of the solar
//! constant at Earth) that depends on the star's temperature,
//! `S_eff = S_eff☉ + a·T⋆ + b·T⋆² + c·T⋆³ + d·T⋆⁴` with `T⋆ = Teff − 5780 K`,
//! and sits at distance `d = √(L / S_eff)` au.
//!
//! Edges reported in [`HabitableZone`] (one consistent coefficient set, the
//! updated Kopparapu et al. 2013 Table 3 values):
//! - `inner_au`: **moist greenhouse** (conservative inner edge; 0.99 au for
//!   the Sun, the published K13 Solar System value);
//! - `outer_au`: maximum greenhouse (conservative outer edge);
//! - `optimistic_inner_au`: recent Venus; `optimistic_outer_au`: early Mars.
//!
//! The runaway-greenhouse limits of Kopparapu et al. 2014 for planets of
//! 0.1, 1 and 5 Earth masses are available from [`runaway_greenhouse_au`].
//!
//! The fits hold for 2600–7200 K; outside, Teff is clamped into that range
//! and `teff_in_range` is false. These are simplified climate models, fit for
//! fiction and games, not a statement about real habitability.

use super::kinds::HabitableZone;

/// Lower end of the temperature range of the fits, kelvin (Kopparapu et al.
/// 2014, ApJL 787, L29, abstract).
pub const HZ_TEFF_MIN_K: f64 = 2600.0;
/// Upper end of the temperature range of the fits, kelvin (same source).
pub const HZ_TEFF_MAX_K: f64 = 7200.0;
/// Reference temperature of the polynomials, kelvin (T⋆ = Teff − 5780 K).
pub const HZ_TEFF_REFERENCE_K: f64 = 5780.0;

/// Coefficients of one edge: S_eff☉, a, b, c, d.
type Coefficients = [f64; 5];

// Kopparapu et al. 2013, ApJ 765, 131, Table 3, updated coefficients
// (erratum / authors' website); verified: identical digits in six or more
// independent public implementations (the erratum itself not read).
const K13_RECENT_VENUS: Coefficients = [1.7753, 1.4316e-4, 2.9875e-9, -7.5702e-12, -1.1635e-15];
const K13_MOIST_GREENHOUSE: Coefficients = [1.0140, 8.1774e-5, 1.7063e-9, -4.3241e-12, -6.6462e-16];
const K13_MAXIMUM_GREENHOUSE: Coefficients =
    [0.3438, 5.8942e-5, 1.6558e-9, -3.0045e-12, -5.2983e-16];
const K13_EARLY_MARS: Coefficients = [0.3179, 5.4513e-5, 1.5313e-9, -2.7786e-12, -4.8997e-16];

// Kopparapu et al. 2014, ApJL 787, L29, runaway greenhouse by planet mass, as
// in the authors' code (R. K. Kopparapu 2014, Python translation by
// J. Armstrong; verified against that code).
const K14_RUNAWAY_0_1_EARTH: Coefficients = [0.99, 1.209e-4, 1.404e-8, -7.418e-12, -1.713e-15];
const K14_RUNAWAY_1_EARTH: Coefficients = [1.107, 1.332e-4, 1.580e-8, -8.308e-12, -1.931e-15];
const K14_RUNAWAY_5_EARTH: Coefficients = [1.188, 1.433e-4, 1.707e-8, -8.968e-12, -2.084e-15];

/// Planet masses for which Kopparapu et al. 2014 give a runaway-greenhouse
/// limit.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum PlanetMass {
    /// 0.1 Earth masses.
    TenthEarth,
    /// 1 Earth mass.
    Earth,
    /// 5 Earth masses.
    FiveEarths,
}

/// Effective flux S_eff of one edge at `teff_k` (already in range).
///
/// The quartic is evaluated as (s + a·T) + T²·((b + c·T) + d·T²) rather
/// than by Horner's rule: the same polynomial, equal to rounding (tested
/// within 1e-15 relative), with a shorter chain of dependent operations.
#[inline]
fn effective_flux(coefficients: &Coefficients, teff_k: f64) -> f64 {
    let t = teff_k - HZ_TEFF_REFERENCE_K;
    let t2 = t * t;
    let [s, a, b, c, d] = *coefficients;
    (s + a * t) + t2 * ((b + c * t) + d * t2)
}

fn edge_au(coefficients: &Coefficients, teff_k: f64, luminosity_lsun: f64) -> f64 {
    (luminosity_lsun / effective_flux(coefficients, teff_k)).sqrt()
}

/// Clamps Teff into the range of the fits; NaN goes to the reference
/// temperature. Returns (clamped Teff, whether the input was in range).
fn clamp_teff(teff_k: f64) -> (f64, bool) {
    if teff_k.is_nan() {
        return (HZ_TEFF_REFERENCE_K, false);
    }
    let in_range = (HZ_TEFF_MIN_K..=HZ_TEFF_MAX_K).contains(&teff_k);
    (teff_k.clamp(HZ_TEFF_MIN_K, HZ_TEFF_MAX_K), in_range)
}

fn usable_luminosity(luminosity_lsun: f64) -> bool {
    luminosity_lsun.is_finite() && luminosity_lsun > 0.0
}

const NO_ZONE: HabitableZone = HabitableZone {
    inner_au: 0.0,
    outer_au: 0.0,
    optimistic_inner_au: 0.0,
    optimistic_outer_au: 0.0,
    teff_in_range: false,
};

/// Habitable-zone edges of a star with `teff_k` and `luminosity_lsun`.
///
/// Conservative: moist greenhouse (inner) to maximum greenhouse (outer);
/// optimistic: recent Venus to early Mars. A luminosity that is zero,
/// negative or not finite (black holes, bad data) gives all edges 0 and
/// `teff_in_range = false`.
///
/// # Units
/// Edges in astronomical units.
///
/// # Allocations
/// None.
///
/// # Source
/// Kopparapu et al. 2013, ApJ 765, 131, eq. 2 and Table 3 (updated
/// coefficients).
pub fn habitable_zone(teff_k: f64, luminosity_lsun: f64) -> HabitableZone {
    if !usable_luminosity(luminosity_lsun) {
        return NO_ZONE;
    }
    let (t, teff_in_range) = clamp_teff(teff_k);
    HabitableZone {
        inner_au: edge_au(&K13_MOIST_GREENHOUSE, t, luminosity_lsun),
        outer_au: edge_au(&K13_MAXIMUM_GREENHOUSE, t, luminosity_lsun),
        optimistic_inner_au: edge_au(&K13_RECENT_VENUS, t, luminosity_lsun),
        optimistic_outer_au: edge_au(&K13_EARLY_MARS, t, luminosity_lsun),
        teff_in_range,
    }
}

/// The runaway-greenhouse inner edge for a planet of the given mass, au,
/// with whether Teff was in the 2600–7200 K range of the fit. Zero for a
/// luminosity that is not positive and finite.
///
/// # Source
/// Kopparapu et al. 2014, ApJL 787, L29 (coefficients from the authors'
/// code).
pub fn runaway_greenhouse_au(teff_k: f64, luminosity_lsun: f64, planet: PlanetMass) -> (f64, bool) {
    if !usable_luminosity(luminosity_lsun) {
        return (0.0, false);
    }
    let (t, in_range) = clamp_teff(teff_k);
    let coefficients = match planet {
        PlanetMass::TenthEarth => &K14_RUNAWAY_0_1_EARTH,
        PlanetMass::Earth => &K14_RUNAWAY_1_EARTH,
        PlanetMass::FiveEarths => &K14_RUNAWAY_5_EARTH,
    };
    (edge_au(coefficients, t, luminosity_lsun), in_range)
}

/// Habitable zone by the textbook rule of thumb (common practice, no
/// source): inner √(L/1.1), outer √(L/0.53) au. The optimistic edges use the
/// solar-temperature fluxes of Kopparapu et al. 2013 (recent Venus 1.7753,
/// early Mars 0.3179) with no temperature dependence. `teff_in_range` is
/// true, since the rule has no temperature range; a luminosity that is not
/// positive and finite gives zeros and false.
///
/// # Units
/// Edges in astronomical units.
pub fn habitable_zone_rules(luminosity_lsun: f64) -> HabitableZone {
    if !usable_luminosity(luminosity_lsun) {
        return NO_ZONE;
    }
    HabitableZone {
        inner_au: (luminosity_lsun / 1.1).sqrt(),
        outer_au: (luminosity_lsun / 0.53).sqrt(),
        optimistic_inner_au: (luminosity_lsun / K13_RECENT_VENUS[0]).sqrt(),
        optimistic_outer_au: (luminosity_lsun / K13_EARLY_MARS[0]).sqrt(),
        teff_in_range: true,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn close(got: f64, want: f64, tol: f64) -> bool {
        (got - want).abs() <= tol
    }

    #[test]
    fn effective_flux_is_the_published_quartic() {
        // Kopparapu et al. 2013 eq. 2 by Horner's rule, against the
        // reordered evaluation, across the fitted range, every edge.
        for coefficients in [
            &K13_RECENT_VENUS,
            &K13_MOIST_GREENHOUSE,
            &K13_MAXIMUM_GREENHOUSE,
            &K13_EARLY_MARS,
            &K14_RUNAWAY_0_1_EARTH,
            &K14_RUNAWAY_1_EARTH,
            &K14_RUNAWAY_5_EARTH,
        ] {
            for i in 0..=4600 {
                let teff = HZ_TEFF_MIN_K + i as f64;
                let t = teff - HZ_TEFF_REFERENCE_K;
                let [s, a, b, c, d] = *coefficients;
                let horner = s + t * (a + t * (b + t * (c + t * d)));
                let got = effective_flux(coefficients, teff);
                assert!(
                    (got / horner - 1.0).abs() < 1e-15,
                    "{teff}: {got} vs {horner}"
                );
            }
        }
    }

    #[test]
    fn kopparapu_check_table() {
        // Check values computed from the K13/K14 coefficients above (derived),
        // 4 decimals: tolerance 6e-5 au.
        // (Teff, L, K13 RV, MoistGH, MaxGH, EM, K14 RG 1 M⊕)
        let rows = [
            (5780.0, 1.0, 0.7505, 0.9931, 1.7055, 1.7736, 0.9504),
            (5772.0, 1.0, 0.7508, 0.9934, 1.7067, 1.7748, 0.9509),
            (4500.0, 0.2, 0.3525, 0.4664, 0.8513, 0.8854, 0.4530),
            (3700.0, 0.04, 0.1613, 0.2135, 0.4037, 0.4198, 0.2066),
            (2600.0, 0.001, 0.0260, 0.0345, 0.0681, 0.0708, 0.0331),
            (7200.0, 5.0, 1.5979, 2.1143, 3.4500, 3.5877, 1.9639),
        ];
        for (teff, lum, rv, moist, max_gh, em, rg1) in rows {
            let hz = habitable_zone(teff, lum);
            assert!(
                close(hz.optimistic_inner_au, rv, 6e-5),
                "{teff} RV {}",
                hz.optimistic_inner_au
            );
            assert!(
                close(hz.inner_au, moist, 6e-5),
                "{teff} moist {}",
                hz.inner_au
            );
            assert!(
                close(hz.outer_au, max_gh, 6e-5),
                "{teff} maxGH {}",
                hz.outer_au
            );
            assert!(
                close(hz.optimistic_outer_au, em, 6e-5),
                "{teff} EM {}",
                hz.optimistic_outer_au
            );
            assert!(hz.teff_in_range);
            let (rg, in_range) = runaway_greenhouse_au(teff, lum, PlanetMass::Earth);
            assert!(close(rg, rg1, 6e-5) && in_range, "{teff} RG {rg}");
        }
    }

    #[test]
    fn published_solar_system_anchors() {
        // K13 Solar System conservative HZ 0.99–1.70 au (Kopparapu et al.
        // 2013, ApJ 765, 131, abstract; verified).
        let hz = habitable_zone(5780.0, 1.0);
        assert!(close(hz.inner_au, 0.99, 0.005) && close(hz.outer_au, 1.70, 0.01));
        // K14: 5 M⊕ inner edge at ~7 % higher flux, 0.1 M⊕ at ~10 % lower
        // (Kopparapu et al. 2014 abstract, verified); 1/√S gives 0.918 and 1.005 au
        // (derived).
        let (five, _) = runaway_greenhouse_au(5780.0, 1.0, PlanetMass::FiveEarths);
        let (tenth, _) = runaway_greenhouse_au(5780.0, 1.0, PlanetMass::TenthEarth);
        // Three decimals: tolerance 6e-4.
        assert!(close(five, 0.918, 6e-4) && close(tenth, 1.005, 6e-4));
    }

    #[test]
    fn out_of_range_temperatures_clamp_and_flag() {
        let cool = habitable_zone(2000.0, 0.001);
        let edge = habitable_zone(2600.0, 0.001);
        assert!(!cool.teff_in_range);
        assert_eq!(cool.inner_au, edge.inner_au);
        let hot = habitable_zone(9000.0, 20.0);
        assert!(!hot.teff_in_range);
        assert_eq!(hot.outer_au, habitable_zone(7200.0, 20.0).outer_au);
        assert!(!habitable_zone(f64::NAN, 1.0).teff_in_range);
    }

    #[test]
    fn no_light_no_zone() {
        for lum in [0.0, -1.0, f64::NAN, f64::INFINITY] {
            let hz = habitable_zone(5000.0, lum);
            assert_eq!(hz.inner_au, 0.0);
            assert_eq!(hz.optimistic_outer_au, 0.0);
            assert_eq!(habitable_zone_rules(lum).outer_au, 0.0);
        }
    }

    #[test]
    fn rule_of_thumb() {
        // √(L/1.1), √(L/0.53): 0.953 / 1.374 au for the Sun, the Kasting,
        // Whitmire & Reynolds 1993 (Icarus 101, 108) standard-model HZ of
        // 0.95–1.37 au (verified: Kasting et al. 1993, Table 5 as reproduced in PMC5008114).
        let hz = habitable_zone_rules(1.0);
        assert!(close(hz.inner_au, 0.953, 5e-4) && close(hz.outer_au, 1.374, 5e-4));
        assert!(close(hz.inner_au, 0.95, 0.005) && close(hz.outer_au, 1.37, 0.005));
    }

    #[test]
    fn edges_are_ordered_everywhere() {
        // Property over the whole domain: RV < moist < max GH < early Mars.
        let mut teff = 1000.0;
        while teff < 20_000.0 {
            for lum in [1e-5, 0.01, 1.0, 1e4] {
                let hz = habitable_zone(teff, lum);
                assert!(hz.optimistic_inner_au < hz.inner_au, "{teff}");
                assert!(hz.inner_au < hz.outer_au, "{teff}");
                assert!(hz.outer_au < hz.optimistic_outer_au, "{teff}");
                assert!(hz.optimistic_outer_au.is_finite());
            }
            teff += 37.0;
        }
    }
}
