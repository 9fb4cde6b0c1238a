//! The main sequence: zero-age luminosity and radius, lifetimes, and the
//! slow brightening and swelling of a star while it burns core hydrogen.
//!
//! # Source
//! - ZAMS L(M), R(M): Tout, Pols, Eggleton & Han 1996, MNRAS 281, 257,
//!   eqs 1–2, Z = 0.02 coefficients (the c0 column of Tables 1 and 2;
//!   verified: several independent code transcriptions agree digit for
//!   digit). At Z = 0.02 the
//!   metallicity polynomials (eq. 3) reduce to c0, so they are folded in.
//! - Lifetimes t_BGB, t_MS: Hurley, Pols & Tout 2000, MNRAS 315, 543,
//!   eqs 4–7, Appendix A coefficients at Z = 0.02 (equation forms verified
//!   against the authors' SSE Fortran, zfuncs.f/zcnsts.f; a1–a10 from one
//!   independent code transcription of Appendix A).
//! - Evolution across the main sequence: a simpler prescription than
//!   HPT2000 §5.1 (whose coefficients a11–a49 we have not verified):
//!   `log L(τ) = log L_ZAMS + ΔlogL(M) · (a_L τ + (1 − a_L) τ²)`, the same
//!   for R with ΔlogR(M) and a_R, where τ = t / t_MS. The end points are
//!   anchored on the Sun: 2.2 Lsun at the end of core hydrogen burning
//!   (Sackmann, Boothroyd & Kraemer 1993, ApJ 418, 457, abstract) and
//!   about 1.58 Rsun there (from memory of the same paper, unverified).
//!   The shapes `a_L`, `a_R` are calibrated so that a 1 Msun star at
//!   4.6 Gyr has 1.000 Lsun and 1.000 Rsun. ΔlogL falls from 0.50 dex at
//!   1 Msun to 0.35 dex from 2 Msun up, ΔlogR rises from 0.25 dex (≤ 2
//!   Msun) to 0.40 dex at 100 Msun: values from memory of published
//!   tracks (unverified), expected error about 0.1 dex at the end of the
//!   main sequence and less earlier. The hook near 1.1 Msun is ignored.
//!
//! # Outside the fitted range
//! Tout 1996 and HPT2000 are fitted to 0.1–100 Msun. Below 0.1 Msun (down
//! to the hydrogen-burning limit 0.075) and above 100 Msun (up to 150),
//! L_ZAMS and R_ZAMS follow the log-log tangent of the Tout fit at the edge
//! (continuous in value and slope, so the jump at 0.1 and 100 is zero).
//! Lifetimes use the HPT2000 formula unchanged, which is smooth there.

/// Tout 1996 luminosity coefficients α, β, γ, δ, ε, ζ, η at Z = 0.02.
const TOUT_L: [f64; 7] = [
    0.397_041_70,
    8.527_626_00,
    0.000_255_46,
    5.432_889_00,
    5.563_579_00,
    0.788_660_60,
    0.005_866_85,
];
/// Tout 1996 radius coefficients θ, ι, κ, λ, μ, ν, ξ, ο, π at Z = 0.02.
const TOUT_R: [f64; 9] = [
    1.715_359_00,
    6.597_788_00,
    10.088_550_00,
    1.012_495_00,
    0.074_901_66,
    0.010_774_22,
    3.082_234_00,
    17.847_780_00,
    0.000_225_82,
];
/// HPT2000 a1–a10 at Z = 0.02 (c0 of Appendix A).
const HPT_A: [f64; 10] = [
    1.593_890e3,
    2.706_708e3,
    1.466_143e2,
    4.141_960e-2,
    3.426_349e-1,
    1.949_814e1,
    4.903_830,
    5.212_154e-2,
    1.312_179,
    8.073_972e-1,
];

/// Lower edge of the Tout/HPT fits, Msun.
pub const FIT_MIN_MSUN: f64 = 0.1;
/// Upper edge of the Tout/HPT fits, Msun.
pub const FIT_MAX_MSUN: f64 = 100.0;
/// Tout L and d ln L / d ln M at 0.1 Msun (evaluated from eq. 1; a test checks them).
const L_AT_MIN: (f64, f64) = (9.582_465_516_220_19e-4, 3.000_587_804);
/// Tout L and slope at 100 Msun.
const L_AT_MAX: (f64, f64) = (1.270_665_040_059_539_7e6, 1.697_001_180);
/// Tout R and slope at 0.1 Msun.
const R_AT_MIN: (f64, f64) = (0.130_455_994_116_468_9, 1.019_562_748);
/// Tout R and slope at 100 Msun.
const R_AT_MAX: (f64, f64) = (17.226_115_851_833_896, 0.690_522_892);

/// Shape of the luminosity rise across the main sequence (calibrated on the Sun).
const A_L: f64 = 0.5698;
/// Shape of the radius growth across the main sequence (calibrated on the Sun).
const A_R: f64 = 0.1275;

/// Powers of M built from one square root (no `powf` in the hot path).
#[derive(Clone, Copy)]
struct Powers {
    m: f64,
    sqrt: f64,
    m2: f64,
    m4: f64,
    m5: f64,
    m7: f64,
    m8: f64,
}

impl Powers {
    fn new(m: f64) -> Powers {
        let m2 = m * m;
        let m4 = m2 * m2;
        Powers {
            m,
            sqrt: m.sqrt(),
            m2,
            m4,
            m5: m4 * m,
            m7: m4 * m2 * m,
            m8: m4 * m4,
        }
    }
}

/// Tout 1996 eq. 1 as printed (no range handling).
fn tout_luminosity(p: &Powers) -> f64 {
    let [alpha, beta, gamma, delta, epsilon, zeta, eta] = TOUT_L;
    let m5_5 = p.m5 * p.sqrt;
    let m11 = m5_5 * m5_5;
    let m3 = p.m2 * p.m;
    let m9_5 = p.m8 * p.m * p.sqrt;
    (alpha * m5_5 + beta * m11)
        / (gamma + m3 + delta * p.m5 + epsilon * p.m7 + zeta * p.m8 + eta * m9_5)
}

/// Tout 1996 eq. 2 as printed (no range handling).
fn tout_radius(p: &Powers) -> f64 {
    let [theta, iota, kappa, lambda, mu, nu, xi, omicron, pi] = TOUT_R;
    let m2_5 = p.m2 * p.sqrt;
    let m6_5 = p.m5 * p.m * p.sqrt;
    let m11 = p.m8 * p.m2 * p.m;
    let m19 = m11 * p.m8;
    let m19_5 = m19 * p.sqrt;
    let m18_5 = m19 / p.sqrt;
    let m8_5 = p.m8 * p.sqrt;
    (theta * m2_5 + iota * m6_5 + kappa * m11 + lambda * m19 + mu * m19_5)
        / (nu + xi * p.m2 + omicron * m8_5 + m18_5 + pi * m19_5)
}

/// Value × (m / edge)^slope: the log-log tangent beyond a fit edge.
fn tangent(edge_value_slope: (f64, f64), edge_msun: f64, m: f64) -> f64 {
    edge_value_slope.0 * (m / edge_msun).powf(edge_value_slope.1)
}

/// Zero-age main-sequence luminosity, Lsun, at Z = 0.02.
///
/// # Source
/// Tout et al. 1996 eq. 1 on 0.1–100 Msun; log-log tangent outside (see module docs).
pub fn zams_luminosity_lsun(mass_msun: f64) -> f64 {
    if mass_msun < FIT_MIN_MSUN {
        tangent(L_AT_MIN, FIT_MIN_MSUN, mass_msun)
    } else if mass_msun > FIT_MAX_MSUN {
        tangent(L_AT_MAX, FIT_MAX_MSUN, mass_msun)
    } else {
        tout_luminosity(&Powers::new(mass_msun))
    }
}

/// Zero-age main-sequence radius, Rsun, at Z = 0.02.
///
/// # Source
/// Tout et al. 1996 eq. 2 on 0.1–100 Msun; log-log tangent outside (see module docs).
pub fn zams_radius_rsun(mass_msun: f64) -> f64 {
    if mass_msun < FIT_MIN_MSUN {
        tangent(R_AT_MIN, FIT_MIN_MSUN, mass_msun)
    } else if mass_msun > FIT_MAX_MSUN {
        tangent(R_AT_MAX, FIT_MAX_MSUN, mass_msun)
    } else {
        tout_radius(&Powers::new(mass_msun))
    }
}

/// Time to the base of the giant branch, Gyr (HPT2000 eq. 4, Z = 0.02).
pub fn t_bgb_gyr(mass_msun: f64) -> f64 {
    let p = Powers::new(mass_msun);
    t_bgb_myr(&p) * 1e-3
}

fn t_bgb_myr(p: &Powers) -> f64 {
    let a = &HPT_A;
    let m5_5 = p.m5 * p.sqrt;
    (a[0] + a[1] * p.m4 + a[2] * m5_5 + p.m7) / (a[3] * p.m2 + a[4] * p.m7)
}

/// The factor t_MS / t_BGB, max(μ, x) of HPT2000 eqs 5–7 at Z = 0.02 (x = 0.95).
fn ms_fraction(m: f64) -> f64 {
    let a = &HPT_A;
    let ln_m = m.ln();
    let first = a[5] * (-a[6] * ln_m).exp();
    let second = a[7] + a[8] * (-a[9] * ln_m).exp();
    let mu = (1.0 - 0.01 * first.max(second)).max(0.5);
    mu.max(0.95)
}

/// Main-sequence lifetime t_MS, Gyr (HPT2000 eqs 4–7, Z = 0.02).
pub fn t_ms_gyr(mass_msun: f64) -> f64 {
    t_bgb_gyr(mass_msun) * ms_fraction(mass_msun)
}

/// Both lifetimes at once, (t_MS, t_BGB) in Gyr.
pub fn lifetimes_gyr(mass_msun: f64) -> (f64, f64) {
    let t_bgb = t_bgb_gyr(mass_msun);
    (t_bgb * ms_fraction(mass_msun), t_bgb)
}

/// log10(L_TMS / L_ZAMS), dex (our prescription, see module docs).
pub fn delta_log_l_tms(mass_msun: f64) -> f64 {
    const AT_1: f64 = 0.4987; // log10(2.2 / 0.69772): Sackmann 1993 end-of-MS Sun over Tout ZAMS.
    const FROM_2: f64 = 0.35;
    if mass_msun <= 1.0 {
        AT_1
    } else if mass_msun >= 2.0 {
        FROM_2
    } else {
        AT_1 + (FROM_2 - AT_1) * mass_msun.log10() / std::f64::consts::LOG10_2
    }
}

/// log10(R_TMS / R_ZAMS), dex (our prescription, see module docs).
pub fn delta_log_r_tms(mass_msun: f64) -> f64 {
    if mass_msun <= 2.0 {
        0.25
    } else if mass_msun >= 100.0 {
        0.40
    } else {
        0.25 + 0.15 * (mass_msun.log10() - std::f64::consts::LOG10_2)
            / (2.0 - std::f64::consts::LOG10_2)
    }
}

/// Luminosity at the end of the main sequence, Lsun.
pub fn tams_luminosity_lsun(mass_msun: f64) -> f64 {
    zams_luminosity_lsun(mass_msun) * 10f64.powf(delta_log_l_tms(mass_msun))
}

/// Radius at the end of the main sequence, Rsun.
pub fn tams_radius_rsun(mass_msun: f64) -> f64 {
    zams_radius_rsun(mass_msun) * 10f64.powf(delta_log_r_tms(mass_msun))
}

/// Luminosity (Lsun) and radius (Rsun) at fraction `tau` = t / t_MS of the
/// main sequence (clamped to 0–1).
pub fn main_sequence_l_r(mass_msun: f64, tau: f64) -> (f64, f64) {
    let (shape_l, shape_r) = shapes(tau);
    let d_log = delta_log_l_tms(mass_msun) * shape_l;
    let d_log_r = delta_log_r_tms(mass_msun) * shape_r;
    (
        zams_luminosity_lsun(mass_msun) * (d_log * std::f64::consts::LN_10).exp(),
        zams_radius_rsun(mass_msun) * (d_log_r * std::f64::consts::LN_10).exp(),
    )
}

/// The fractions (0–1) of ΔlogL and ΔlogR reached at `tau` = t / t_MS (clamped to 0–1).
pub fn shapes(tau: f64) -> (f64, f64) {
    let tau = tau.clamp(0.0, 1.0);
    let tau2 = tau * tau;
    (
        A_L * tau + (1.0 - A_L) * tau2,
        A_R * tau + (1.0 - A_R) * tau2,
    )
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::physics::effective_temperature::teff_k;

    fn rel(a: f64, b: f64) -> f64 {
        (a / b - 1.0).abs()
    }

    /// One row: (M, expected, rel tol) against f.
    fn check_table(f: fn(f64) -> f64, rows: &[(f64, f64, f64)]) {
        for &(m, expected, tol) in rows {
            let got = f(m);
            assert!(
                rel(got, expected) <= tol,
                "M = {m}: got {got}, expected {expected}"
            );
        }
    }

    #[test]
    fn tout_zams_check_values() {
        // Tout et al. 1996 eqs 1–2, Z = 0.02; check values computed from these equations
        // (derived), rel tol 1e-4.
        check_table(
            zams_luminosity_lsun,
            &[
                (0.1, 9.5825e-4, 1e-4),
                (0.5, 0.037874, 1e-4),
                (1.0, 0.69772, 1e-4),
                (2.0, 15.891, 1e-4),
                (10.0, 5551.9, 1e-4),
                (100.0, 1.2707e6, 1e-4),
            ],
        );
        check_table(
            zams_radius_rsun,
            &[
                (0.1, 0.13046, 1e-4),
                (0.5, 0.45876, 1e-4),
                (1.0, 0.88825, 1e-4),
                (2.0, 1.6102, 1e-4),
                (10.0, 3.9419, 1e-4),
                (100.0, 17.226, 1e-4),
            ],
        );
        // Teff column of the same table (K, ±1 K rounding).
        for (m, t) in [
            (0.1, 2812.0),
            (0.5, 3759.0),
            (1.0, 5597.0),
            (2.0, 9082.0),
            (10.0, 25_095.0),
            (100.0, 46_692.0),
        ] {
            let got = teff_k(zams_luminosity_lsun(m), zams_radius_rsun(m));
            assert!((got - t).abs() < 1.5, "M {m}: {got}");
        }
    }

    #[test]
    fn zams_sun_matches_sackmann() {
        // ZAMS Sun ≈ 0.7 Lsun: Sackmann et al. 1993, ApJ 418, 457 (verified: abstract), tol 5 %.
        assert!(rel(zams_luminosity_lsun(1.0), 0.7) < 0.05);
    }

    #[test]
    fn hpt_lifetime_check_values() {
        // HPT2000 eqs 4–7 at Z = 0.02; check values computed from these equations (derived),
        // rel tol 1e-4
        // (table values are rounded to 4 digits, hence the looser tolerance on some rows).
        check_table(
            t_bgb_gyr,
            &[
                (0.5, 135.5, 1e-3),
                (1.0, 11.582, 1e-4),
                (2.0, 1.1736, 1e-4),
                (5.0, 0.1044, 5e-4),
                (10.0, 0.02435, 5e-4),
                (100.0, 0.003354, 5e-4),
            ],
        );
        check_table(
            t_ms_gyr,
            &[
                (0.5, 128.8, 1e-3),
                (1.0, 11.003, 1e-4),
                (2.0, 1.1642, 1e-4),
                (5.0, 0.1040, 5e-4),
                (10.0, 0.02429, 5e-4),
                (100.0, 0.003352, 5e-4),
            ],
        );
    }

    #[test]
    fn fit_edge_constants_match_the_fit() {
        // The tangent constants must equal Tout eqs 1–2 and their log slope at the edges.
        for (edge, l, r) in [
            (FIT_MIN_MSUN, L_AT_MIN, R_AT_MIN),
            (FIT_MAX_MSUN, L_AT_MAX, R_AT_MAX),
        ] {
            let p = Powers::new(edge);
            assert!(rel(tout_luminosity(&p), l.0) < 1e-12);
            assert!(rel(tout_radius(&p), r.0) < 1e-12);
            let h = 1e-5;
            let (lo, hi) = (Powers::new(edge * (1.0 - h)), Powers::new(edge * (1.0 + h)));
            let dln = ((1.0 + h) / (1.0 - h)).ln();
            let slope_l = (tout_luminosity(&hi) / tout_luminosity(&lo)).ln() / dln;
            let slope_r = (tout_radius(&hi) / tout_radius(&lo)).ln() / dln;
            assert!((slope_l - l.1).abs() < 1e-6, "{slope_l}");
            assert!((slope_r - r.1).abs() < 1e-6, "{slope_r}");
        }
    }

    #[test]
    fn extrapolation_is_continuous_and_sane() {
        // Jump at the fit edges: zero by construction, checked to 1e-9 relative.
        for edge in [FIT_MIN_MSUN, FIT_MAX_MSUN] {
            for f in [zams_luminosity_lsun as fn(f64) -> f64, zams_radius_rsun] {
                let below = f(edge * (1.0 - 1e-12));
                let above = f(edge * (1.0 + 1e-12));
                assert!(rel(below, above) < 1e-9, "edge {edge}");
            }
        }
        // M9V (0.079 Msun): log L = −3.52, R = 0.102 (Mamajek table version 2024.05.15,
        // verified against the author's public data repository). Old field star vs our ZAMS
        // extrapolation: within 0.25 dex in L and 10 % in R (our own tolerance for an
        // extrapolation).
        let l = zams_luminosity_lsun(0.079).log10();
        assert!((l + 3.52).abs() < 0.25, "{l}");
        assert!(rel(zams_radius_rsun(0.079), 0.102) < 0.10);
    }

    #[test]
    fn sun_today_and_at_the_end_of_the_main_sequence() {
        // Sun at 4.6 Gyr ≈ 1 Lsun, 1 Rsun, 5772 K (IAU 2015 B3 nominal); this is the
        // calibration point of A_L and A_R, so the test guards the transcription (1 %).
        let tau = 4.6 / t_ms_gyr(1.0);
        let (l, r) = main_sequence_l_r(1.0, tau);
        assert!(rel(l, 1.0) < 0.01 && rel(r, 1.0) < 0.01, "{l} {r}");
        assert!((teff_k(l, r) - 5772.0).abs() < 0.01 * 5772.0);
        // End of core hydrogen burning: 2.2 Lsun (Sackmann et al. 1993, verified: abstract), 3 %.
        let (l_end, _) = main_sequence_l_r(1.0, 1.0);
        assert!(rel(l_end, 2.2) < 0.03, "{l_end}");
    }

    #[test]
    fn luminosity_rises_with_mass_and_age() {
        // Property: on the main sequence L rises with mass (at fixed τ) and with τ.
        for tau in [0.0, 0.3, 0.7, 1.0] {
            let mut last = 0.0;
            let mut m = 0.075;
            while m <= 150.0 {
                let (l, r) = main_sequence_l_r(m, tau);
                assert!(
                    l > last && l.is_finite() && r.is_finite() && r > 0.0,
                    "M {m} τ {tau}"
                );
                last = l;
                m *= 1.01;
            }
        }
        let mut last = 0.0;
        for i in 0..=100 {
            let (l, _) = main_sequence_l_r(1.3, i as f64 / 100.0);
            assert!(l >= last);
            last = l;
        }
    }
}
