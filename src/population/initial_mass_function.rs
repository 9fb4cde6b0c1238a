//! Initial mass functions and their exact samplers.
//!
//! # Source
//! - Kirkpatrick et al. 2024, ApJS 271, 55 (20 pc census): dN/dM ∝ M^-α with
//!   α = 0.6 (0.01–0.05), 0.25 (0.05–0.22), 1.3 (0.22–0.55), 2.3 (above 0.55 Msun;
//!   the paper fits up to 8 Msun, we extend the slope to the upper limit).
//! - Kroupa 2001, MNRAS 322, 231: α = 0.3 (0.01–0.08), 1.3 (0.08–0.5), 2.3 (above 0.5).
//! - Chabrier 2003, PASP 115, 763, eq. 17 (single objects): lognormal in log m
//!   below 1 Msun (m_c = 0.079, σ = 0.69), dN/dm ∝ m^-2.3 above, continuous at 1 Msun.
//!
//! (All as transcribed in shared/science stars.md §4 (verified).)
//!
//! Power laws are sampled by the exact inverse CDF (stars.md §4e); the
//! Chabrier lognormal branch by rejection from a normal deviate.

use crate::seed::StarRng;
use crate::spec::ImfChoice;
use rand::RngExt;
use rand_distr::{Distribution, StandardNormal};

/// Lowest object mass drawn, solar masses (the lower limit of the
/// Kirkpatrick et al. 2024 fit).
pub const MIN_MASS_MSUN: f64 = 0.01;
/// Highest initial mass drawn, solar masses.
pub const MAX_MASS_MSUN: f64 = 150.0;

/// One power-law piece, dN/dm = k·m^-α on [lo, hi).
#[derive(Debug, Clone, Copy)]
struct Piece {
    lo: f64,
    hi: f64,
    alpha: f64,
    k: f64,
    /// Number of objects in the piece (for the normalisation k).
    n: f64,
    /// `lo^(1 − alpha)` and `1 / (1 − alpha)`, the inverse CDF's constant
    /// parts, computed once (the same values `quantile` would compute).
    lo_pow_s: f64,
    inv_s: f64,
}

impl Piece {
    fn new(lo: f64, hi: f64, alpha: f64, k: f64, n: f64) -> Piece {
        let s = 1.0 - alpha;
        Piece {
            lo,
            hi,
            alpha,
            k,
            n,
            lo_pow_s: lo.powf(s),
            inv_s: 1.0 / s,
        }
    }
}

fn piece_integral(k: f64, alpha: f64, a: f64, b: f64) -> f64 {
    if (alpha - 1.0).abs() < 1e-12 {
        k * (b / a).ln()
    } else {
        k * (b.powf(1.0 - alpha) - a.powf(1.0 - alpha)) / (1.0 - alpha)
    }
}

/// A normalised initial mass function over [m_min, m_max].
#[derive(Debug, Clone)]
pub struct Imf {
    pieces: Vec<Piece>,
    total: f64,
    /// Chabrier lognormal branch: (probability of the branch, log10 m_c,
    /// σ, log10 m_min, log10 upper end of the branch).
    lognormal: Option<(f64, f64, f64, f64, f64)>,
}

impl Imf {
    /// The chosen IMF over [`MIN_MASS_MSUN`, `MAX_MASS_MSUN`].
    pub fn new(choice: ImfChoice) -> Imf {
        Imf::with_range(choice, MIN_MASS_MSUN, MAX_MASS_MSUN)
    }

    /// The chosen IMF over [m_min, m_max], solar masses.
    pub fn with_range(choice: ImfChoice, m_min: f64, m_max: f64) -> Imf {
        match choice {
            ImfChoice::Kirkpatrick => {
                Imf::power_law(&[0.05, 0.22, 0.55], &[0.6, 0.25, 1.3, 2.3], m_min, m_max)
            }
            ImfChoice::Kroupa => Imf::power_law(&[0.08, 0.5], &[0.3, 1.3, 2.3], m_min, m_max),
            ImfChoice::Chabrier => Imf::chabrier(m_min, m_max),
        }
    }

    fn power_law(breaks: &[f64], alphas: &[f64], m_min: f64, m_max: f64) -> Imf {
        let mut edges = vec![0.0];
        edges.extend_from_slice(breaks);
        edges.push(f64::INFINITY);
        let mut pieces = Vec::new();
        let mut k = 1.0;
        for i in 0..alphas.len() {
            if i > 0 {
                // Continuity at the break: k_i b^-α_i = k_{i-1} b^-α_{i-1}.
                k *= edges[i].powf(alphas[i] - alphas[i - 1]);
            }
            let lo = edges[i].max(m_min);
            let hi = edges[i + 1].min(m_max);
            if hi > lo {
                let n = piece_integral(k, alphas[i], lo, hi);
                pieces.push(Piece::new(lo, hi, alphas[i], k, n));
            }
        }
        let total = pieces.iter().map(|p| p.n).sum();
        Imf {
            pieces,
            total,
            lognormal: None,
        }
    }

    fn chabrier(m_min: f64, m_max: f64) -> Imf {
        let (a, mc, sigma) = (0.158, 0.079f64.log10(), 0.69);
        let lo = m_min.log10();
        let top = m_max.min(1.0).log10();
        let phi = |x: f64| 0.5 * (1.0 + erf(x / std::f64::consts::SQRT_2));
        // ∫ ξ dlog m over the lognormal branch.
        let n_ln = a
            * sigma
            * (2.0 * std::f64::consts::PI).sqrt()
            * (phi((top - mc) / sigma) - phi((lo - mc) / sigma));
        // Tail: ξ = A_h m^-1.3 per dex, A_h from continuity at 1 Msun.
        let a_h = a * (-(mc * mc) / (2.0 * sigma * sigma)).exp();
        let mut pieces = Vec::new();
        let tail_lo = m_min.max(1.0);
        if m_max > tail_lo {
            // Per unit mass: dN/dm = ξ / (m ln 10) = (A_h / ln 10) m^-2.3.
            let k = a_h / std::f64::consts::LN_10;
            pieces.push(Piece::new(
                tail_lo,
                m_max,
                2.3,
                k,
                piece_integral(k, 2.3, tail_lo, m_max),
            ));
        }
        let n_tail: f64 = pieces.iter().map(|p| p.n).sum();
        let total = n_ln + n_tail;
        Imf {
            pieces,
            total,
            lognormal: (top > lo).then_some((n_ln / total, mc, sigma, lo, top)),
        }
    }

    /// Inverse CDF of the power-law part (the whole IMF for Kroupa and
    /// Kirkpatrick): the mass below which a fraction `u` of objects lie.
    pub fn quantile(&self, u: f64) -> f64 {
        let mut target = u.clamp(0.0, 1.0) * self.total;
        for p in &self.pieces {
            if target <= p.n {
                let m = if (p.alpha - 1.0).abs() < 1e-12 {
                    p.lo * (target / p.k).exp()
                } else {
                    let s = 1.0 - p.alpha;
                    (p.lo_pow_s + target * s / p.k).powf(p.inv_s)
                };
                return m.clamp(p.lo, p.hi);
            }
            target -= p.n;
        }
        self.pieces.last().map(|p| p.hi).unwrap_or(MIN_MASS_MSUN)
    }

    /// Draws one initial mass, solar masses.
    pub fn sample(&self, rng: &mut StarRng) -> f64 {
        let u: f64 = rng.random();
        if let Some((p_ln, mc, sigma, lo, top)) = self.lognormal {
            if u < p_ln {
                loop {
                    let z: f64 = StandardNormal.sample(rng);
                    let x = mc + sigma * z;
                    if x >= lo && x <= top {
                        return 10f64.powf(x);
                    }
                }
            }
            let v = (u - p_ln) / (1.0 - p_ln);
            let tail_total: f64 = self.pieces.iter().map(|p| p.n).sum();
            return self.quantile(v * tail_total / self.total);
        }
        self.quantile(u)
    }
}

/// The error function, Abramowitz & Stegun 1964, eq. 7.1.26 (|error| < 1.5e-7).
pub fn erf(x: f64) -> f64 {
    let sign = if x < 0.0 { -1.0 } else { 1.0 };
    let x = x.abs();
    let t = 1.0 / (1.0 + 0.327_591_1 * x);
    let y = 1.0
        - (((((1.061_405_429 * t - 1.453_152_027) * t) + 1.421_413_741) * t - 0.284_496_736) * t
            + 0.254_829_592)
            * t
            * (-x * x).exp();
    sign * y
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::seed::{Stream, rng_for};

    #[test]
    fn kroupa_quantiles_match_the_reference_sheet() {
        // Kroupa 2001 over 0.08–150 Msun; check values from shared/science
        // stars.md §4e [derived], exact inverse CDF.
        let imf = Imf::with_range(ImfChoice::Kroupa, 0.08, 150.0);
        let table = [
            (0.0, 0.08),
            (0.25, 0.13175),
            (0.5, 0.23694),
            (0.75, 0.4833),
            (0.9, 0.97787),
            (0.99, 5.6913),
            (0.999, 30.494),
            (1.0, 150.0),
        ];
        for (u, m) in table {
            let got = imf.quantile(u);
            assert!((got / m - 1.0).abs() < 5e-4, "u={u}: {got} vs {m}");
        }
    }

    fn sample_stats(imf: &Imf, n: usize, split: f64) -> (f64, f64) {
        let mut rng = rng_for(1, 2, Stream::Other);
        let (mut below, mut sum) = (0usize, 0.0);
        for _ in 0..n {
            let m = imf.sample(&mut rng);
            sum += m;
            if m < split {
                below += 1;
            }
        }
        (below as f64 / n as f64, sum / n as f64)
    }

    #[test]
    fn kirkpatrick_star_to_brown_dwarf_ratio_and_mean_mass() {
        // Kirkpatrick et al. 2024 IMF over 0.01–150 Msun: initial star:BD
        // ratio 3.63 (0.08 split) and mean mass 0.578 Msun, shared/science
        // stars.md §4e [derived]. 2e5 draws: σ(fraction) ≈ 9e-4.
        let imf = Imf::new(ImfChoice::Kirkpatrick);
        let (f_bd, mean) = sample_stats(&imf, 200_000, 0.08);
        let ratio = (1.0 - f_bd) / f_bd;
        assert!((ratio / 3.63 - 1.0).abs() < 0.03, "ratio {ratio}");
        // The mean of a heavy-tailed IMF converges slowly; 5 % covers it.
        assert!((mean / 0.578 - 1.0).abs() < 0.05, "mean {mean}");
    }

    #[test]
    fn chabrier_brown_dwarf_fraction() {
        // Chabrier 2003 single-object IMF over 0.01–100: fraction below 0.08
        // is 0.4506, mean mass 0.3491 (shared/science stars.md §4e [derived]).
        // 2e5 draws: σ = sqrt(p(1-p)/N) ≈ 1.1e-3; 5σ tolerance as advised there.
        let imf = Imf::with_range(ImfChoice::Chabrier, 0.01, 100.0);
        let (f_bd, mean) = sample_stats(&imf, 200_000, 0.08);
        assert!((f_bd - 0.4506).abs() < 5.5e-3, "fraction {f_bd}");
        assert!((mean / 0.3491 - 1.0).abs() < 0.05, "mean {mean}");
    }

    #[test]
    fn erf_check_values() {
        // erf(0.5) = 0.520 499 877 8, erf(1) = 0.842 700 792 9
        // (Abramowitz & Stegun 1964, Table 7.1).
        assert!((erf(0.5) - 0.520_499_877_8).abs() < 2e-7);
        assert!((erf(1.0) - 0.842_700_792_9).abs() < 2e-7);
        assert!((erf(-1.0) + 0.842_700_792_9).abs() < 2e-7);
    }
}
