//! Ages: constant star formation over the disk's life, weighted for the
//! thicker layer that old stars are spread over.
//!
//! # Model
//! Star formation is constant over [t_min, t_max] (Binney, Dehnen &
//! Bertelli 2000, MNRAS 318, 658: the local disk is 11.2 ± 0.75 Gyr old and
//! its SFR very nearly constant; shared/science stars.md §9 (verified)).
//! Disk heating makes the vertical velocity dispersion grow with age,
//! σ_W ∝ (t + t₁)^β with β = 0.375 and t₁ = 0.5 Gyr (Just & Jahreiß 2010,
//! MNRAS 402, 461 [from memory: unverified]), and an age cohort with
//! dispersion σ_W fills a layer of thickness ∝ σ_W near the mid-plane
//! (harmonic vertical potential; common practice, no source). So the
//! cohort's density at the mid-plane, which is what a sector samples, is
//! ∝ SFR / σ_W ∝ (t + t₁)^-β. Ages are drawn from that density by its exact
//! inverse CDF. The weight makes 10 Gyr old stars about 0.32 times as
//! common locally as new-born ones.

use crate::seed::StarRng;
use rand::RngExt;

/// Exponent β of the age–velocity-dispersion relation.
pub const AVR_EXPONENT: f64 = 0.375;
/// Offset t₁ of the age–velocity-dispersion relation, gigayears.
pub const AVR_OFFSET_GYR: f64 = 0.5;

/// The age distribution over a range, gigayears.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct AgeModel {
    lo: f64,
    span: f64,
}

impl AgeModel {
    /// Ages between `min_gyr` and `max_gyr`.
    pub fn new(min_gyr: f64, max_gyr: f64) -> AgeModel {
        let s = 1.0 - AVR_EXPONENT;
        let lo = (min_gyr + AVR_OFFSET_GYR).powf(s);
        let hi = (max_gyr + AVR_OFFSET_GYR).powf(s);
        AgeModel { lo, span: hi - lo }
    }

    /// The age with a fraction `u` of stars younger.
    pub fn quantile(&self, u: f64) -> f64 {
        let s = 1.0 - AVR_EXPONENT;
        ((self.lo + u * self.span).powf(1.0 / s) - AVR_OFFSET_GYR).max(0.0)
    }

    /// Draws one age, gigayears.
    pub fn sample(&self, rng: &mut StarRng) -> f64 {
        self.quantile(rng.random())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn quantiles_span_the_range_and_favour_the_young() {
        let m = AgeModel::new(0.0, 11.2);
        assert!(m.quantile(0.0).abs() < 1e-12);
        assert!((m.quantile(1.0) - 11.2).abs() < 1e-9);
        // Without weighting the median would be 5.6 Gyr; with the
        // (t + 0.5)^-0.375 density it is lower. Closed form check:
        // ((0.5^0.625 + 11.7^0.625)/2)^(1/0.625) - 0.5 [derived here].
        let s: f64 = 0.625;
        let expect = ((0.5f64.powf(s) + 11.7f64.powf(s)) / 2.0).powf(1.0 / s) - 0.5;
        assert!((m.quantile(0.5) - expect).abs() < 1e-12);
        assert!(expect < 5.6);
    }
}
