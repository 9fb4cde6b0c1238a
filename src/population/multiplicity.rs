//! How many companions a primary has, their mass ratios and orbits.
//!
//! # Source
//! Companion-number distributions by primary mass (shared/science stars.md §6):
//! - below 0.1 Msun: multiplicity fraction 22 % (Duchêne & Kraus 2013,
//!   ARA&A 51, 269, Table 1 [from memory in the sheet]); γ = 4.2;
//! - 0.1–0.6 Msun: multiplicity 26.8 %, companion rate 32.4 % (Winters et
//!   al. 2019, AJ 157, 216 [verified: abstract]), so 21.2 % doubles and
//!   5.6 % triples; γ = 0.4 (Duchêne & Kraus 2013, 0.1–0.5 Msun);
//! - 0.6–1.5 Msun: single/double/triple/higher 56/33/8/3 % (Raghavan et
//!   al. 2010, ApJS 190, 1 (verified)); γ = 0.3 (Duchêne & Kraus 2013);
//! - 1.5–16 Msun: multiplicity ≥ 50–60 %, companion fraction 100 %
//!   (Duchêne & Kraus 2013): we use 40/30/20/10 % (MF 60 %, CF 1.0); γ = −0.5;
//! - above 16 Msun: MF ≥ 80 %, CF 130 %: 20/40/30/10 % (MF 80 %, CF 1.3).
//!
//! Mass ratios q = m₂/m₁ follow dN/dq ∝ q^γ between 0.01 Msun/m₁ and 1.
//!
//! Periods: log10(P/days) ~ N(5.03, 2.28) for primaries of 0.6 Msun and
//! more (Raghavan et al. 2010 [verified: code transcriptions], stars.md §6;
//! log10, not ln). For lighter primaries the separations are drawn as
//! log10(a/au) ~ N(0.95, 1.0): centred on the 4–20 au peak of Winters et
//! al. 2019 (geometric mean 8.9 au); the width of 1 dex is our choice
//! (common practice, no source). Semi-major axes follow from Kepler's third
//! law, a³ = P² (m₁ + m₂) in au, years and solar masses.

use crate::seed::StarRng;
use rand::RngExt;
use rand_distr::{Distribution, StandardNormal};

/// Most companions a primary can have.
pub const MAX_COMPANIONS: usize = 3;

/// Days in a Julian year.
pub(crate) const DAYS_PER_YEAR: f64 = 365.25;

/// Period, days, of an orbit of semi-major axis `separation_au` about a
/// total mass `total_msun`: Kepler's third law in au, years and solar
/// masses, P² = a³ / M (textbook).
pub fn kepler_period_days(separation_au: f64, total_msun: f64) -> f64 {
    (separation_au.powi(3) / total_msun).sqrt() * DAYS_PER_YEAR
}

/// Probabilities of 0, 1, 2 and 3 companions for a primary of `m1` Msun.
pub fn companion_probabilities(m1_msun: f64) -> [f64; 4] {
    if m1_msun < 0.1 {
        [0.78, 0.22, 0.0, 0.0]
    } else if m1_msun < 0.6 {
        [0.732, 0.212, 0.056, 0.0]
    } else if m1_msun < 1.5 {
        [0.56, 0.33, 0.08, 0.03]
    } else if m1_msun < 16.0 {
        [0.4, 0.3, 0.2, 0.1]
    } else {
        [0.2, 0.4, 0.3, 0.1]
    }
}

/// The exponent γ of dN/dq ∝ q^γ for a primary of `m1` Msun.
pub fn mass_ratio_exponent(m1_msun: f64) -> f64 {
    if m1_msun < 0.1 {
        4.2
    } else if m1_msun < 0.6 {
        0.4
    } else if m1_msun < 1.5 {
        0.3
    } else {
        -0.5
    }
}

/// Draws the number of companions.
pub fn draw_companion_count(m1_msun: f64, rng: &mut StarRng) -> usize {
    let p = companion_probabilities(m1_msun);
    let mut u: f64 = rng.random();
    for (n, pn) in p.iter().enumerate() {
        if u < *pn {
            return n;
        }
        u -= pn;
    }
    MAX_COMPANIONS
}

/// Draws a mass ratio q in [q_min, 1] from dN/dq ∝ q^γ (exact inverse CDF).
pub fn draw_mass_ratio(m1_msun: f64, min_mass_msun: f64, rng: &mut StarRng) -> f64 {
    let q_min = (min_mass_msun / m1_msun).min(1.0);
    let g1 = mass_ratio_exponent(m1_msun) + 1.0;
    let u: f64 = rng.random();
    let lo = q_min.powf(g1);
    (lo + u * (1.0 - lo)).powf(1.0 / g1).clamp(q_min, 1.0)
}

/// Draws log10(P / days) from the Raghavan et al. (2010) log-normal.
pub fn draw_log10_period_days(rng: &mut StarRng) -> f64 {
    let z: f64 = StandardNormal.sample(rng);
    5.03 + 2.28 * z
}

/// Orbital period (days) and semi-major axis (au) of a companion.
pub fn draw_orbit(m1_msun: f64, m2_msun: f64, rng: &mut StarRng) -> (f64, f64) {
    let total = m1_msun + m2_msun;
    if m1_msun >= 0.6 {
        // Contact-binary floor: periods below 0.2 d are raised to it.
        let log_p = draw_log10_period_days(rng).max(-0.7);
        let p_days = 10f64.powf(log_p);
        let p_years = p_days / DAYS_PER_YEAR;
        (p_days, (p_years * p_years * total).cbrt())
    } else {
        let z: f64 = StandardNormal.sample(rng);
        let a_au = 10f64.powf((0.95 + 1.0 * z).max(-2.0));
        (kepler_period_days(a_au, total), a_au)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::seed::{Stream, rng_for};

    #[test]
    fn period_law_is_in_log10_days() {
        // Raghavan et al. 2010: mean log10 P = 5.03, σ = 2.28; test from
        // shared/science stars.md §6 (1e5 draws, ±0.02).
        let mut rng = rng_for(3, 4, Stream::Other);
        let n = 100_000;
        let xs: Vec<f64> = (0..n).map(|_| draw_log10_period_days(&mut rng)).collect();
        let mean = xs.iter().sum::<f64>() / n as f64;
        let sd = (xs.iter().map(|x| (x - mean).powi(2)).sum::<f64>() / n as f64).sqrt();
        assert!((mean - 5.03).abs() < 0.02, "{mean}");
        assert!((sd - 2.28).abs() < 0.02, "{sd}");
    }

    #[test]
    fn kepler_third_law_peak_orbit() {
        // 1 + 1 Msun at P = 10^5.03 d (293 yr) → a = 55.6 au
        // (shared/science stars.md §6 [derived]).
        let p_years = 10f64.powf(5.03) / DAYS_PER_YEAR;
        let a = (p_years * p_years * 2.0).cbrt();
        assert!((a - 55.6).abs() < 0.1, "{a}");
    }

    #[test]
    fn solar_type_multiplicity_matches_raghavan() {
        // Raghavan et al. 2010: 44 ± 2 % of solar-type primaries are multiple.
        let mut rng = rng_for(5, 6, Stream::Other);
        let n = 100_000;
        let multiple = (0..n)
            .filter(|_| draw_companion_count(1.0, &mut rng) > 0)
            .count() as f64
            / n as f64;
        // Binomial σ = 1.6e-3; 4σ.
        assert!((multiple - 0.44).abs() < 0.0064, "{multiple}");
        for m in [0.05, 0.3, 1.0, 3.0, 20.0] {
            let s: f64 = companion_probabilities(m).iter().sum();
            assert!((s - 1.0).abs() < 1e-12);
        }
    }
}
