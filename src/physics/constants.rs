//! Physical constants and the IAU 2015 nominal solar and planetary values.
//!
//! # Source
//! IAU 2015 Resolution B3 (Prša et al. 2016, AJ 152, 41) for the nominal
//! solar and planetary values; CODATA 2018 for the Stefan–Boltzmann
//! constant; SI for the speed of light. All are exact by definition.

/// Nominal solar luminosity, W (IAU 2015 B3, exact).
pub const L_SUN_W: f64 = 3.828e26;
/// Nominal solar radius, m (IAU 2015 B3, exact).
pub const R_SUN_M: f64 = 6.957e8;
/// Nominal solar effective temperature, K (IAU 2015 B3, exact).
pub const TEFF_SUN_K: f64 = 5772.0;
/// Nominal solar mass parameter GM, m³ s⁻² (IAU 2015 B3, exact).
pub const GM_SUN_M3_S2: f64 = 1.327_124_4e20;
/// Nominal terrestrial equatorial radius, m (IAU 2015 B3, exact).
pub const R_EARTH_M: f64 = 6.378_1e6;
/// Nominal jovian equatorial radius, m (IAU 2015 B3, exact).
pub const R_JUPITER_M: f64 = 7.149_2e7;
/// Speed of light in vacuum, m/s (SI, exact).
pub const C_M_S: f64 = 299_792_458.0;
/// Stefan–Boltzmann constant, W m⁻² K⁻⁴ (CODATA 2018, exact).
pub const SIGMA_SB: f64 = 5.670_374_419e-8;
/// Newtonian constant of gravitation, m³ kg⁻¹ s⁻² (CODATA 2018, measured).
///
/// Used only to turn densities into kg/m³; masses stay in solar masses.
pub const G_SI: f64 = 6.674_30e-11;

/// Solar radius in kilometres.
pub const R_SUN_KM: f64 = R_SUN_M / 1000.0;
/// Nominal solar radii in one astronomical unit (≈ 215.03; IAU 2012 B2 au).
pub const R_SUN_PER_AU: f64 = crate::units::METRES_PER_AU / R_SUN_M;
/// Earth radii in one solar radius.
pub const R_EARTH_PER_R_SUN: f64 = R_SUN_M / R_EARTH_M;
/// Jupiter radii in one solar radius.
pub const R_JUPITER_PER_R_SUN: f64 = R_SUN_M / R_JUPITER_M;
/// Schwarzschild radius per solar mass, 2GM/c², metres (≈ 2953.250 m).
pub const SCHWARZSCHILD_M_PER_MSUN: f64 = 2.0 * GM_SUN_M3_S2 / (C_M_S * C_M_S);
/// Solar mass in kilograms, (GM)☉/G; carries the ~2e-5 uncertainty of G.
pub const M_SUN_KG: f64 = GM_SUN_M3_S2 / G_SI;
/// Solar surface gravity, m/s², GM/R² from nominal values (≈ 274.2).
pub const G_SURFACE_SUN_M_S2: f64 = GM_SUN_M3_S2 / (R_SUN_M * R_SUN_M);

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn nominal_sun_is_stefan_boltzmann_consistent() {
        // (L/(4πR²σ))^(1/4) = 5772.0034 K ± 0.001, derived (computed by hand) from the
        // IAU 2015 B3 values and CODATA 2018 σ.
        let teff =
            (L_SUN_W / (4.0 * std::f64::consts::PI * R_SUN_M * R_SUN_M * SIGMA_SB)).powf(0.25);
        assert!((teff - 5772.0034).abs() < 1e-3, "{teff}");
    }

    #[test]
    fn black_hole_scale_per_solar_mass() {
        // r_s = 2GM/c² = 2953.250 m per Msun from the IAU 2015 B3 nominal (GM)☉ (derived),
        // tol 1e-6 relative.
        assert!((SCHWARZSCHILD_M_PER_MSUN / 2953.250 - 1.0).abs() < 1e-6);
    }

    #[test]
    fn solar_surface_gravity() {
        // log g☉ = 4.438 (cgs), IAU 2015 B3 nominal GM and R: 274.2 m/s² (derived).
        let log_g_cgs = (G_SURFACE_SUN_M_S2 * 100.0).log10();
        assert!((log_g_cgs - 4.438).abs() < 1e-3, "{log_g_cgs}");
    }
}
