//! White dwarfs: final mass from the initial mass, radius from the mass,
//! luminosity from the cooling age.
//!
//! # Source
//! - Initial–final mass relation: Cummings et al. 2018, ApJ 866, 21, the
//!   MIST-based three-piece fit (range verified against the abstract;
//!   coefficients from two independent code transcriptions that agree),
//!   valid for initial masses 0.83–7.20 Msun. Below 0.83 we extend the
//!   first piece (such stars have not yet left the main sequence within
//!   13.8 Gyr, so this only matters for explicit requests); from 7.20 to
//!   the carbon-ignition limit M_ec = 7.91 Msun (HPT2000) we extend the
//!   last piece (1.317 Msun at 7.91).
//! - Mass–radius: Nauenberg 1972, ApJ 175, 417:
//!   `R = 0.0112 Rsun sqrt[(M/M3)^(-2/3) − (M/M3)^(2/3)]`, M3 = 5.816/μe²
//!   = 1.454 Msun for μe = 2.
//! - Cooling: Mestel (1952) law in its textbook form
//!   `t_cool = 8.8e6 yr (A/12)^-1 (M/Msun)^(5/7) (μ/2)^(-2/7) (L/Lsun)^(-5/7)`
//!   with A = 12 (carbon), μ = 2, i.e. `L = M (8.8e6 yr / t)^1.4` (constant
//!   from memory, unverified). Checked against the Montreal DA cooling
//!   grid at log g = 8 (Bergeron group, file of 2021-01-13; Holberg &
//!   Bergeron 2006, Bédard et al. 2020): within 0.15 dex from 0.6 to 9.4 Gyr;
//!   at 66 Myr (20 000 K) Mestel is 0.17 dex too bright because it ignores
//!   neutrino losses, which dominate young hot white dwarfs.

/// Nauenberg's M3 = 5.816/μe² for μe = 2, Msun.
pub const NAUENBERG_M3_MSUN: f64 = 1.454;
/// The Chandrasekhar mass used as the upper limit of white-dwarf masses, Msun.
pub const CHANDRASEKHAR_MSUN: f64 = 1.44;
/// Youngest cooling age given to a white dwarf, Gyr (1 Myr), so that the
/// Mestel law stays finite; such a dwarf is near 10^5 K.
pub const MIN_COOLING_GYR: f64 = 1e-3;
/// Initial-mass range of the Cummings et al. 2018 MIST fit, Msun.
pub const IFMR_RANGE_MSUN: (f64, f64) = (0.83, 7.20);

/// Cummings 2018 MIST pieces: (upper initial mass, slope, intercept).
const IFMR_MIST: [(f64, f64, f64); 3] = [
    (2.85, 0.080, 0.489),
    (3.60, 0.187, 0.184),
    (f64::INFINITY, 0.107, 0.471),
];

/// Final (white-dwarf) mass, Msun, from the initial mass, Msun.
///
/// # Source
/// Cummings et al. 2018, MIST fit (module docs); "a < M ≤ b" convention.
pub fn final_mass_msun(initial_mass_msun: f64) -> f64 {
    let (_, slope, intercept) = IFMR_MIST
        .iter()
        .copied()
        .find(|&(upper, _, _)| initial_mass_msun <= upper)
        .unwrap_or(IFMR_MIST[2]);
    slope * initial_mass_msun + intercept
}

/// Initial mass, Msun, that gives this white-dwarf mass (inverse of
/// [`final_mass_msun`]), or `None` below the relation's lowest final mass
/// (0.555 Msun at 0.83 Msun; lighter dwarfs need binary evolution) or above
/// its value at the carbon-ignition limit (1.317 Msun at 7.91 Msun).
pub fn initial_mass_msun(final_mass_msun_value: f64, max_initial_msun: f64) -> Option<f64> {
    let lowest = final_mass_msun(IFMR_RANGE_MSUN.0);
    let highest = final_mass_msun(max_initial_msun);
    if !(lowest..=highest).contains(&final_mass_msun_value) {
        return None;
    }
    let mut lower_edge = f64::NEG_INFINITY;
    for &(upper, slope, intercept) in &IFMR_MIST {
        let m_i = (final_mass_msun_value - intercept) / slope;
        if m_i > lower_edge && m_i <= upper {
            return Some(m_i);
        }
        lower_edge = upper;
    }
    // The 1e-3 gap at 3.60 Msun: take the edge.
    Some(IFMR_MIST[1].0)
}

/// Radius, Rsun, of a white dwarf of this mass, Msun (Nauenberg 1972).
///
/// # Guarantees
/// Positive and finite for masses up to [`CHANDRASEKHAR_MSUN`]; masses at or
/// above M3 get a floor of 1e-4 of the prefactor instead of zero.
pub fn radius_rsun(mass_msun: f64) -> f64 {
    let x = (mass_msun / NAUENBERG_M3_MSUN).cbrt();
    let x2 = x * x;
    0.0112 * (1.0 / x2 - x2).max(1e-8).sqrt()
}

/// Radius, Rsun, by the textbook rule R ≈ 1 Earth radius × M^(-1/3)
/// (common practice, no source; no Chandrasekhar limit).
pub fn radius_rules_rsun(mass_msun: f64) -> f64 {
    mass_msun.cbrt().recip() / super::constants::R_EARTH_PER_R_SUN
}

/// Luminosity, Lsun, after cooling for `cooling_gyr` (Mestel law, module docs).
pub fn cooling_luminosity_lsun(mass_msun: f64, cooling_gyr: f64) -> f64 {
    let ratio = mestel_time_ratio(cooling_gyr);
    mestel_luminosity_lsun(mass_msun, ratio, ratio.ln())
}

/// 8.8e6 yr / t of the Mestel law, t the cooling time (at least
/// [`MIN_COOLING_GYR`]).
#[inline]
fn mestel_time_ratio(cooling_gyr: f64) -> f64 {
    8.8e6 / (cooling_gyr.max(MIN_COOLING_GYR) * 1e9)
}

/// L = M · ratio^1.4 (Lsun) from the time ratio and its logarithm.
#[inline]
fn mestel_luminosity_lsun(mass_msun: f64, ratio: f64, ln_ratio: f64) -> f64 {
    // ratio^1.4 = ratio · ratio^0.4.
    mass_msun * ratio * (0.4 * ln_ratio).exp()
}

/// Luminosity (Lsun, [`cooling_luminosity_lsun`]) with its log10, and
/// Teff (K) of a white dwarf of this mass (Msun) and radius (Rsun) after
/// cooling for `cooling_gyr`.
///
/// Teff = 5772 K · L^(1/4) · R^(-1/2) is taken as
/// 5772 K · M^(1/4) · (8.8e6 yr / t)^0.35 / √R, from the same logarithm as
/// L and without waiting for it; log10 L = log10 M + 1.4 log10(8.8e6 yr / t).
/// Both differ from the formulas applied to L by rounding only (tested).
#[inline]
pub fn cooling_photosphere(mass_msun: f64, radius_rsun: f64, cooling_gyr: f64) -> (f64, f64, f64) {
    use std::f64::consts::LOG10_E;
    let ratio = mestel_time_ratio(cooling_gyr);
    let ln_ratio = ratio.ln();
    let l = mestel_luminosity_lsun(mass_msun, ratio, ln_ratio);
    let log10_l = (mass_msun.ln() + 1.4 * ln_ratio) * LOG10_E;
    let teff = super::constants::TEFF_SUN_K * mass_msun.sqrt().sqrt() * (0.35 * ln_ratio).exp()
        / radius_rsun.sqrt();
    (l, log10_l, teff)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::physics::effective_temperature::teff_k;

    fn rel(a: f64, b: f64) -> f64 {
        (a / b - 1.0).abs()
    }

    #[test]
    fn cooling_photosphere_is_stefan_boltzmann() {
        // Against the Mestel law above and Teff = 5772 K · L^(1/4) · R^(-1/2),
        // the Stefan–Boltzmann law in the IAU 2015 B3 nominal solar units.
        for i in 0..=100 {
            let m = 0.17 + 1.2 * i as f64 / 100.0;
            let r = radius_rsun(m);
            for j in 0..=100 {
                let cooling = 1e-4 * 2e5f64.powf(j as f64 / 100.0);
                let (l, log10_l, t) = cooling_photosphere(m, r, cooling);
                assert_eq!(l, cooling_luminosity_lsun(m, cooling));
                assert!((log10_l - l.log10()).abs() < 1e-13, "{m} {cooling}");
                assert!((t / teff_k(l, r) - 1.0).abs() < 1e-14, "{m} {cooling}");
            }
        }
    }

    #[test]
    fn ifmr_check_values() {
        // Cummings et al. 2018 MIST fit; check values computed from it (derived), 1e-4 absolute.
        for (m_i, m_f) in [(1.0, 0.569), (2.85, 0.717), (3.6, 0.8572), (7.2, 1.2414)] {
            assert!((final_mass_msun(m_i) - m_f).abs() < 1e-4, "{m_i}");
        }
        // Worked example: 1.5 Msun → about 0.6 Msun (0.609 by the fit).
        assert!((final_mass_msun(1.5) - 0.609).abs() < 1e-9);
        // Break-point jumps: 0 at 2.85, 1e-3 at 3.60 (derived from the fit).
        let jump = |m: f64| final_mass_msun(m * (1.0 + 1e-12)) - final_mass_msun(m);
        assert!(jump(2.85).abs() < 1e-4);
        assert!((jump(3.6).abs() - 1.0e-3).abs() < 1e-4);
    }

    #[test]
    fn inverse_ifmr_round_trips() {
        for m_i in [0.9, 1.5, 2.5, 3.0, 3.5, 5.0, 7.5] {
            let back = initial_mass_msun(final_mass_msun(m_i), 7.91).unwrap();
            assert!(rel(back, m_i) < 1e-9, "{m_i} → {back}");
        }
        assert_eq!(initial_mass_msun(0.3, 7.91), None);
        assert_eq!(initial_mass_msun(1.40, 7.91), None);
    }

    #[test]
    fn nauenberg_radius_check_values() {
        // Nauenberg 1972 with M3 = 1.454; values computed from the formula (derived), within
        // half a unit of the table's last digit (5e-6 Rsun).
        for (m, r) in [
            (0.2, 0.02091),
            (0.6, 0.01252),
            (1.0, 0.00795),
            (1.2, 0.00567),
            (1.35, 0.00352),
        ] {
            assert!(
                (radius_rsun(m) - r).abs() <= 5e-6,
                "{m}: {}",
                radius_rsun(m)
            );
        }
        // 0.6 Msun ≈ 8711 km (same table).
        assert!((radius_rsun(0.6) * 695_700.0 - 8711.0).abs() < 10.0);
        // Sirius B, 1.018 Msun, 0.0081 Rsun (Bond et al. 2017, from memory): Nauenberg gives
        // a zero-temperature radius 4 % smaller; allow 6 %.
        assert!(rel(radius_rsun(1.018), 0.0081) < 0.06);
    }

    #[test]
    fn heavier_white_dwarfs_are_smaller() {
        let mut last = f64::INFINITY;
        let mut m = 0.15;
        while m <= CHANDRASEKHAR_MSUN {
            let r = radius_rsun(m);
            assert!(r < last && r > 0.0 && r.is_finite(), "{m}");
            last = r;
            m += 0.005;
        }
    }

    #[test]
    fn mestel_cooling_against_the_montreal_grid() {
        // Montreal DA grid, log g = 8.0 (≈ 0.60 Msun), file 2021-01-13 (Bergeron group;
        // Holberg & Bergeron 2006, Bédard et al. 2020 sequences), verified against the grid
        // file; log L = (4.74 − Mbol)/2.5. (cooling age Gyr, log L, tol dex.)
        let rows = [
            (0.0659, -1.612, 0.20), // 20 000 K: neutrino era, Mestel 0.17 dex bright (module docs).
            (0.633, -2.833, 0.15),  // 10 000 K
            (1.114, -3.224, 0.15),  // 8 000 K
            (2.333, -3.729, 0.15),  // 6 000 K
            (5.956, -4.052, 0.15),  // 5 000 K
            (9.411, -4.442, 0.15),  // 4 000 K
        ];
        for (t, log_l, tol) in rows {
            let got = cooling_luminosity_lsun(0.6, t).log10();
            assert!((got - log_l).abs() < tol, "t {t}: {got} vs {log_l}");
        }
        // Same law computed by hand from the textbook Mestel form above (M = 0.6, A = 12;
        // derived): −2.822 to the three decimals given, so within 1e-3 dex.
        assert!((cooling_luminosity_lsun(0.6, 0.633).log10() + 2.822).abs() < 1e-3);
    }

    #[test]
    fn cooling_temperatures_follow() {
        // The Teff implied by Mestel + Nauenberg at 0.633 Gyr should be near the grid's
        // 10 000 K (Montreal DA grid, log g = 8); 0.15 dex in L is ≤ 9 % in Teff (L^(1/4)),
        // allow 10 %.
        let t = teff_k(cooling_luminosity_lsun(0.6, 0.633), radius_rsun(0.6));
        assert!(rel(t, 10_000.0) < 0.10, "{t}");
    }

    #[test]
    fn rules_radius() {
        // Rule of thumb (common practice, no source): 1 Earth radius at 1 Msun (IAU 2015 B3
        // nominal radii), M^(-1/3).
        assert!(rel(radius_rules_rsun(1.0), 6.3781e6 / 6.957e8) < 1e-12);
    }
}
