//! Neutron stars: mass from the progenitor, a fixed radius, and a
//! schematic cooling law for the surface temperature.
//!
//! # Source
//! - Radius 12.5 km for every mass: consistent with the NICER radii of
//!   PSR J0030+0451 (Miller et al. 2019, ApJL 887, L24: 13.02 +1.24/−1.06 km;
//!   Riley et al. 2019: 12.71 km) and PSR J0740+6620 (Salmi et al. 2024:
//!   12.49 +1.28/−0.88 km); values verified against the abstracts, except
//!   Riley et al. 2019 (from memory).
//! - Mass: the remnant-mass rule of Belczynski et al. 2002 as coded in SSE
//!   (hrdiag.f, verified against the SSE Fortran): `M = 0.161767 Mc + 1.067055` for
//!   a CO core Mc < 2.5 Msun, `0.314154 Mc + 0.686088` above. The CO core
//!   mass comes from our own linear approximation `Mc = 0.25 M_i − 1.0`
//!   (not from a paper), giving 1.23 Msun at M_i = 7.91 and 1.94 Msun at
//!   20 Msun, inside the observed 1.2–2.1 Msun (range from memory).
//! - Cooling: a schematic of our own shaped on standard cooling curves
//!   (Yakovlev & Pethick 2004, ARA&A 42, 169, from memory): a
//!   neutrino-cooling plateau `T = 10^6 K (t / 10^5 yr)^(-1/12)` until
//!   10^5 yr, then photon cooling `T = 10^6 K (t / 10^5 yr)^(-0.4)`.
//!   Real curves depend on mass, envelope composition and reheating;
//!   treat these temperatures as illustrative within a factor of ~3.

use super::constants::R_SUN_KM;

/// Radius given to every neutron star, km.
pub const RADIUS_KM: f64 = 12.5;
/// Neutron-star mass range accepted for explicit requests, Msun.
pub const MASS_RANGE_MSUN: (f64, f64) = (1.1, 2.3);
/// Youngest cooling age used, Gyr (100 yr).
const MIN_COOLING_GYR: f64 = 1e-7;

/// Radius in solar radii.
pub fn radius_rsun() -> f64 {
    RADIUS_KM / R_SUN_KM
}

/// CO core mass, Msun, of a star of this initial mass (our approximation).
fn co_core_msun(initial_mass_msun: f64) -> f64 {
    (0.25 * initial_mass_msun - 1.0).max(0.5)
}

/// Neutron-star mass, Msun, left by a star of this initial mass, Msun.
pub fn mass_from_initial_msun(initial_mass_msun: f64) -> f64 {
    let core = co_core_msun(initial_mass_msun);
    if core < 2.5 {
        0.161_767 * core + 1.067_055
    } else {
        0.314_154 * core + 0.686_088
    }
}

/// Initial mass, Msun, whose remnant has this mass, clamped to the
/// progenitor range `lo..=hi` (masses outside the mapping take the edge).
pub fn initial_from_mass_msun(mass_msun: f64, lo: f64, hi: f64) -> f64 {
    let knee = 0.161_767 * 2.5 + 1.067_055;
    let core = if mass_msun < knee {
        (mass_msun - 1.067_055) / 0.161_767
    } else {
        (mass_msun - 0.686_088) / 0.314_154
    };
    ((core + 1.0) / 0.25).clamp(lo, hi)
}

/// Surface temperature, K, after cooling for `cooling_gyr` (schematic).
pub fn surface_teff_k(cooling_gyr: f64) -> f64 {
    surface_teff_and_log10(cooling_gyr).0
}

/// [`surface_teff_k`] and its log10 (which differs from `log10` of the
/// temperature by rounding only; tested).
#[inline]
pub fn surface_teff_and_log10(cooling_gyr: f64) -> (f64, f64) {
    let x = cooling_gyr.max(MIN_COOLING_GYR) / 1e-4;
    let exponent = if x <= 1.0 { -1.0 / 12.0 } else { -0.4 };
    let ln_t_over_1e6 = exponent * x.ln();
    (
        1e6 * ln_t_over_1e6.exp(),
        6.0 + ln_t_over_1e6 * std::f64::consts::LOG10_E,
    )
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn temperature_and_its_logarithm() {
        for i in 0..=300 {
            let cooling = 1e-8 * 1e10f64.powf(i as f64 / 300.0);
            let (t, log10_t) = surface_teff_and_log10(cooling);
            assert_eq!(t, surface_teff_k(cooling));
            assert!((log10_t - t.log10()).abs() < 1e-13, "{cooling}");
        }
    }

    #[test]
    fn radius_inside_nicer_intervals() {
        // NICER 68 % intervals (verified against the abstracts): J0030 (Miller et al. 2019,
        // ApJL 887, L24) 11.96–14.26 km, J0740 (Salmi et al. 2024) 11.61–13.77 km.
        assert!((11.96..=14.26).contains(&RADIUS_KM));
        assert!((11.61..=13.77).contains(&RADIUS_KM));
    }

    #[test]
    fn belczynski_rule_and_mass_range() {
        // Belczynski et al. 2002 as coded in SSE hrdiag.f (verified against the Fortran):
        // continuous at Mc = 2.5.
        let below: f64 = 0.161_767 * 2.5 + 1.067_055;
        let above = 0.314_154 * 2.5 + 0.686_088;
        assert!((below - above).abs() < 1e-4);
        // Masses for progenitors 7.91–20 Msun stay in the observed 1.2–2.1 Msun.
        let mut m = 7.91;
        while m <= 20.0 {
            let ns = mass_from_initial_msun(m);
            assert!((1.2..=2.1).contains(&ns), "{m}: {ns}");
            let back = initial_from_mass_msun(ns, 7.91, 20.0);
            assert!((back - m).abs() < 1e-9);
            m += 0.1;
        }
    }

    #[test]
    fn cooling_is_monotonic_and_plausible() {
        // Young neutron stars near 10^6 K (Yakovlev & Pethick 2004, from memory): at 10^4 yr
        // between 0.5 and 2 MK; cooling never reverses.
        let t = surface_teff_k(1e-5);
        assert!((5e5..2e6).contains(&t), "{t}");
        let mut last = f64::INFINITY;
        for i in 0..200 {
            let age = 1e-8 * 1.1f64.powi(i);
            let t = surface_teff_k(age);
            assert!(t <= last && t > 0.0);
            last = t;
        }
    }
}
