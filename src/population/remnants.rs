//! Natal kicks: which neutron stars and black holes stay in the
//! neighbourhood where they were born.
//!
//! # Model
//! Neutron-star kicks are Maxwellian with σ = 265 km/s per axis (Hobbs,
//! Lorimer, Lyne & Kramer 2005, MNRAS 360, 974). Black holes get the same
//! momentum, so their σ is scaled by 1.4 Msun / M (common practice, no
//! single source). A remnant stays if its kick is below 40 km/s, about the
//! velocity dispersion of old thin-disk stars (common practice, no
//! source): faster ones leave the local disk population. This keeps about
//! 0.1 % of neutron stars and a good share of massive black holes.

use crate::seed::StarRng;
use rand_distr::{Distribution, StandardNormal};

/// One-dimensional kick dispersion of neutron stars, km/s (Hobbs et al. 2005).
pub const NS_KICK_SIGMA_KM_S: f64 = 265.0;
/// Kicks below this keep a remnant in its birth neighbourhood, km/s.
pub const RETAIN_BELOW_KM_S: f64 = 40.0;
/// Canonical neutron-star mass for the momentum scaling, Msun.
const NS_MASS_MSUN: f64 = 1.4;

/// Draws a kick for a remnant of `mass_msun` and says whether it stays.
pub fn stays_after_kick(mass_msun: f64, rng: &mut StarRng) -> bool {
    let sigma = NS_KICK_SIGMA_KM_S * (NS_MASS_MSUN / mass_msun.max(NS_MASS_MSUN));
    let mut v2 = 0.0;
    for _ in 0..3 {
        let z: f64 = StandardNormal.sample(rng);
        v2 += (sigma * z).powi(2);
    }
    v2 < RETAIN_BELOW_KM_S * RETAIN_BELOW_KM_S
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::seed::{Stream, rng_for};

    #[test]
    fn retained_share_matches_the_maxwellian() {
        // For a Maxwellian with σ, P(v < v0) = erf(x/√2) − √(2/π)·x·e^(−x²/2),
        // x = v0/σ (textbook result). For a 10 Msun black hole σ = 37.1 km/s,
        // x = 1.078: P = 0.2401 [derived here].
        let mut rng = rng_for(9, 9, Stream::Other);
        let n = 100_000;
        let kept = (0..n).filter(|_| stays_after_kick(10.0, &mut rng)).count() as f64 / n as f64;
        let x: f64 = RETAIN_BELOW_KM_S / (NS_KICK_SIGMA_KM_S * 0.14);
        let p = crate::population::initial_mass_function::erf(x / 2f64.sqrt())
            - (2.0 / std::f64::consts::PI).sqrt() * x * (-x * x / 2.0).exp();
        // Binomial σ = 1.35e-3; 4σ.
        assert!((kept - p).abs() < 0.0054, "{kept} vs {p}");
    }
}
