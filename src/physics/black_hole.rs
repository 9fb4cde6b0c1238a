//! Black holes: mass from the progenitor and the length scales of a
//! non-rotating (Schwarzschild) hole.
//!
//! # Source
//! - r_s = 2GM/c² from the IAU 2015 B3 nominal (GM)☉: 2953.250 m per Msun
//!   (derived: computed from 2GM/c²). Photon sphere 1.5 r_s;
//!   innermost stable circular orbit 3 r_s = 6GM/c². These hold for a
//!   non-rotating hole; the ISCO, not the photon sphere, bounds stable orbits.
//! - Mass from the initial mass: an illustrative mapping of our own,
//!   `M_BH = 3 + 0.25 (M_i − 20)` Msun capped at 20 Msun, because strong
//!   winds at solar metallicity limit stellar black holes to about 20 Msun
//!   (Belczynski et al. 2010, ApJ 714, 1217, from memory). Common practice,
//!   no single source.

use super::constants::{R_SUN_M, SCHWARZSCHILD_M_PER_MSUN};

/// Black-hole mass range accepted for explicit requests, Msun (3 up to the
/// most massive known black holes).
pub const MASS_RANGE_MSUN: (f64, f64) = (3.0, 1e11);
/// The cap of stellar black-hole masses in our mapping, Msun.
pub const STELLAR_CAP_MSUN: f64 = 20.0;

/// Schwarzschild radius, km, of a hole of this mass.
pub fn schwarzschild_km(mass_msun: f64) -> f64 {
    mass_msun * SCHWARZSCHILD_M_PER_MSUN / 1000.0
}

/// Photon-sphere radius, km (1.5 r_s, non-rotating).
pub fn photon_sphere_km(mass_msun: f64) -> f64 {
    1.5 * schwarzschild_km(mass_msun)
}

/// Innermost stable circular orbit, km (3 r_s, non-rotating).
pub fn isco_km(mass_msun: f64) -> f64 {
    3.0 * schwarzschild_km(mass_msun)
}

/// Event-horizon radius in solar radii.
pub fn horizon_rsun(mass_msun: f64) -> f64 {
    mass_msun * SCHWARZSCHILD_M_PER_MSUN / R_SUN_M
}

/// Black-hole mass, Msun, left by a star of this initial mass, Msun.
pub fn mass_from_initial_msun(initial_mass_msun: f64, min_initial_msun: f64) -> f64 {
    (3.0 + 0.25 * (initial_mass_msun - min_initial_msun)).clamp(3.0, STELLAR_CAP_MSUN)
}

/// Initial mass, Msun, of a star that leaves this hole, or `None` above the
/// stellar cap (no single-star progenitor: a merger product or a
/// supermassive hole).
pub fn initial_from_mass_msun(mass_msun: f64, min_initial_msun: f64) -> Option<f64> {
    (mass_msun < STELLAR_CAP_MSUN).then(|| min_initial_msun + (mass_msun - 3.0).max(0.0) / 0.25)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn rel(a: f64, b: f64) -> f64 {
        (a / b - 1.0).abs()
    }

    #[test]
    fn length_scales() {
        // Derived (computed by hand) from the IAU 2015 B3 (GM)☉, tol 1e-6: r_s 2953.250 m/Msun,
        // photon sphere 4429.88 m, ISCO 8859.75 m per Msun; M = 10 → 29.5325 km;
        // M = 4.3e6 → 1.2699e10 m = 0.0849 au. (Table values rounded to 6 digits: 2e-6.)
        assert!(rel(schwarzschild_km(1.0), 2.953_250) < 1e-6);
        assert!(rel(photon_sphere_km(1.0), 4.429_88) < 2e-6);
        assert!(rel(isco_km(1.0), 8.859_75) < 2e-6);
        assert!(rel(schwarzschild_km(10.0), 29.5325) < 1e-6);
        assert!(rel(schwarzschild_km(4.3e6) * 1000.0, 1.2699e10) < 1e-4);
        assert!(rel(schwarzschild_km(4.3e6) * 1000.0 / 149_597_870_700.0, 0.0849) < 1e-3);
    }

    #[test]
    fn mass_mapping() {
        assert_eq!(mass_from_initial_msun(20.0, 20.0), 3.0);
        assert_eq!(mass_from_initial_msun(150.0, 20.0), STELLAR_CAP_MSUN);
        let back = initial_from_mass_msun(mass_from_initial_msun(40.0, 20.0), 20.0).unwrap();
        assert!((back - 40.0).abs() < 1e-9);
        assert_eq!(initial_from_mass_msun(4e6, 20.0), None);
    }
}
