//! Quantities derived from a profile: sizes in other units, surface area,
//! volume, density, surface gravity and the black-hole length scales.
//!
//! # Units
//! Solar-relative values use the IAU 2015 B3 nominal radius and mass
//! parameter; absolute densities use CODATA 2018 G (uncertain to ~2e-5).

use super::black_hole;
use super::constants::{G_SURFACE_SUN_M_S2, M_SUN_KG, R_EARTH_PER_R_SUN, R_SUN_KM, R_SUN_M};
use super::kinds::StarProfile;

impl StarProfile {
    /// Radius in kilometres.
    pub fn radius_km(&self) -> f64 {
        self.radius_rsun * R_SUN_KM
    }

    /// Radius in nominal Earth equatorial radii.
    pub fn radius_earth(&self) -> f64 {
        self.radius_rsun * R_EARTH_PER_R_SUN
    }

    /// Equatorial circumference, km (2πR).
    pub fn circumference_km(&self) -> f64 {
        std::f64::consts::TAU * self.radius_km()
    }

    /// Surface area relative to the Sun's (R²).
    pub fn surface_area_sun(&self) -> f64 {
        self.radius_rsun * self.radius_rsun
    }

    /// Surface area, km² (4πR²).
    pub fn surface_area_km2(&self) -> f64 {
        let r = self.radius_km();
        4.0 * std::f64::consts::PI * r * r
    }

    /// Volume relative to the Sun's (R³).
    pub fn volume_sun(&self) -> f64 {
        self.radius_rsun * self.radius_rsun * self.radius_rsun
    }

    /// Volume, km³ (4/3 πR³).
    pub fn volume_km3(&self) -> f64 {
        let r = self.radius_km();
        4.0 / 3.0 * std::f64::consts::PI * r * r * r
    }

    /// Mean density relative to the Sun's (M / R³); 0 for a zero radius.
    pub fn mean_density_sun(&self) -> f64 {
        let v = self.volume_sun();
        if v > 0.0 { self.mass_msun / v } else { 0.0 }
    }

    /// Mean density, kg/m³ (the Sun: about 1408).
    pub fn mean_density_kg_m3(&self) -> f64 {
        let r = R_SUN_M;
        self.mean_density_sun() * M_SUN_KG / (4.0 / 3.0 * std::f64::consts::PI * r * r * r)
    }

    /// Surface gravity relative to the Sun's (M / R²); 0 for a zero radius.
    pub fn surface_gravity_sun(&self) -> f64 {
        let a = self.surface_area_sun();
        if a > 0.0 { self.mass_msun / a } else { 0.0 }
    }

    /// Surface gravity, m/s² (the Sun: about 274).
    pub fn surface_gravity_m_s2(&self) -> f64 {
        self.surface_gravity_sun() * G_SURFACE_SUN_M_S2
    }

    /// Schwarzschild radius 2GM/c² of this mass, km.
    pub fn schwarzschild_km(&self) -> f64 {
        black_hole::schwarzschild_km(self.mass_msun)
    }

    /// Photon-sphere radius (1.5 r_s) of a non-rotating hole of this mass, km.
    pub fn photon_sphere_km(&self) -> f64 {
        black_hole::photon_sphere_km(self.mass_msun)
    }

    /// Innermost stable circular orbit (3 r_s) of a non-rotating hole of this mass, km.
    pub fn isco_km(&self) -> f64 {
        black_hole::isco_km(self.mass_msun)
    }
}
