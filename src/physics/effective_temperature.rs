//! Effective temperature from luminosity and radius (Stefan–Boltzmann law).
//!
//! # Source
//! L = 4πR²σT⁴ written in nominal solar units (IAU 2015 B3):
//! `Teff = 5772 K · L^(1/4) · R^(-1/2)`, exact because the nominal L, R and
//! Teff are mutually consistent: (L/(4πR²σ))^(1/4) = 5772.0034 K with
//! CODATA 2018 σ (derived).

use super::constants::TEFF_SUN_K;

/// Effective temperature in kelvin from luminosity (Lsun) and radius (Rsun).
///
/// # Guarantees
/// Returns 0 when there is no light or no photosphere (L ≤ 0 or R ≤ 0,
/// e.g. a black hole), never NaN for finite input.
pub fn teff_k(luminosity_lsun: f64, radius_rsun: f64) -> f64 {
    if luminosity_lsun > 0.0 && radius_rsun > 0.0 {
        TEFF_SUN_K * (luminosity_lsun.sqrt().sqrt()) / radius_rsun.sqrt()
    } else {
        0.0
    }
}

/// Radius in solar radii of a photosphere with this luminosity (Lsun) and
/// effective temperature (K); 0 when either is not positive.
pub fn radius_rsun(luminosity_lsun: f64, teff_k: f64) -> f64 {
    if luminosity_lsun > 0.0 && teff_k > 0.0 {
        let t = TEFF_SUN_K / teff_k;
        luminosity_lsun.sqrt() * t * t
    } else {
        0.0
    }
}

/// Luminosity in solar luminosities of a photosphere of this radius (Rsun)
/// and effective temperature (K).
pub fn luminosity_lsun(radius_rsun: f64, teff_k: f64) -> f64 {
    let t = teff_k / TEFF_SUN_K;
    radius_rsun * radius_rsun * t * t * t * t
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Checks Teff from (log L, R) against a tabulated Teff within `tol_k`.
    fn check(log_l: f64, r: f64, expected_k: f64, tol_k: f64) {
        let got = teff_k(10f64.powf(log_l), r);
        assert!(
            (got - expected_k).abs() <= tol_k,
            "logL {log_l} R {r}: {got} vs {expected_k}"
        );
    }

    #[test]
    fn solar_and_mamajek_rows() {
        // L = R = 1 gives 5772 K exactly: IAU 2015 B3 definition.
        assert_eq!(teff_k(1.0, 1.0), 5772.0);
        // Pecaut & Mamajek 2013 (ApJS 208, 9) / Mamajek table version 2024.05.15 rows
        // (verified against the author's public data repository):
        check(0.010, 1.012, 5770.0, 5.0); // G2V
        check(-2.520, 0.196, 3060.0, 10.0); // M5V
        check(4.820, 7.72, 33_306.0, 5.0); // O9V (table 33 300; derived from its L, R: 33 306)
    }

    #[test]
    fn inverse_relations_round_trip() {
        // Algebraic identity of the Stefan–Boltzmann law (no external value).
        let r = radius_rsun(50.0, 4700.0);
        assert!((teff_k(50.0, r) - 4700.0).abs() < 1e-9);
        assert!((luminosity_lsun(r, 4700.0) - 50.0).abs() < 1e-9);
    }

    #[test]
    fn no_light_gives_zero_not_nan() {
        assert_eq!(teff_k(0.0, 1e-5), 0.0);
        assert_eq!(teff_k(1.0, 0.0), 0.0);
        assert_eq!(radius_rsun(0.0, 5000.0), 0.0);
    }
}
