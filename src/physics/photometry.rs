//! TEMPORARY placeholder for photometry (owned by the "light" engineer,
//! replaced at merge): bolometric magnitude with a zero correction.

use super::kinds::StarKind;

/// Bolometric absolute magnitude of the Sun (IAU 2015 B2).
pub const M_BOL_SUN: f64 = 4.74;

/// Bolometric absolute magnitude; 99 for no light.
pub fn abs_mag_bol(luminosity_lsun: f64) -> f64 {
    if luminosity_lsun > 0.0 {
        M_BOL_SUN - 2.5 * luminosity_lsun.log10()
    } else {
        99.0
    }
}

/// Placeholder visual magnitude: bolometric, no correction.
pub fn abs_mag_v(_kind: StarKind, _teff_k: f64, luminosity_lsun: f64) -> f64 {
    abs_mag_bol(luminosity_lsun)
}
