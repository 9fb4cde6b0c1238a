//! Star density through space: uniform, or the Galactic disk.
//!
//! # Source
//! Jurić et al. 2008, ApJ 673, 864 (shared/science light-and-maps.md §5.1):
//! n/n0 = exp(−(R−R⊙)/L1 − |Z|/H1) + f·exp(−(R−R⊙)/L2 − |Z|/H2)
//!        + f_H·[R⊙² / (R² + (Z/q_H)²)]^(n_H/2),
//! H1 = 300 pc, L1 = 2600 pc, H2 = 900 pc, L2 = 3600 pc, f = thick share
//! (0.12 in Jurić), f_H = 0.0051, q_H = 0.64, n_H = 2.77, R⊙ = 8 kpc.
//! The home point (origin) sits Z⊙ = 20.8 pc above the plane (Bennett &
//! Bovy 2019, MNRAS 482, 1417). The density is normalised to the
//! requested value at the home point.

use crate::spec::{DensityModel, SectorSpec};
use crate::units::LY_PER_PC;

const R_SUN_PC: f64 = 8000.0;
const Z_SUN_PC: f64 = 20.8;

/// Jurić et al. (2008) density relative to the thin-disk mid-plane value
/// at R⊙, at galactic position `p_ly` (heliocentric light years).
pub fn juric_relative(p_ly: [f64; 3], thick_share: f64) -> f64 {
    let x = p_ly[0] / LY_PER_PC;
    let y = p_ly[1] / LY_PER_PC;
    let z = p_ly[2] / LY_PER_PC + Z_SUN_PC;
    let r = ((R_SUN_PC - x).powi(2) + y * y).sqrt();
    let thin = (-(r - R_SUN_PC) / 2600.0 - z.abs() / 300.0).exp();
    let thick = thick_share * (-(r - R_SUN_PC) / 3600.0 - z.abs() / 900.0).exp();
    let halo = 0.0051 * (R_SUN_PC * R_SUN_PC / (r * r + (z / 0.64).powi(2))).powf(2.77 / 2.0);
    thin + thick + halo
}

/// Density model resolved for one spec.
#[derive(Debug, Clone, Copy)]
pub struct Density {
    per_ly3: f64,
    model: DensityModel,
    home_relative: f64,
}

impl Density {
    /// The density of `spec`.
    pub fn new(spec: &SectorSpec) -> Density {
        let home_relative = match spec.density_model {
            DensityModel::Uniform => 1.0,
            DensityModel::Disk { thick_share } => juric_relative([0.0; 3], thick_share),
        };
        Density {
            per_ly3: spec.density_per_ly3,
            model: spec.density_model,
            home_relative,
        }
    }

    /// Stars per cubic light year at `p_ly`.
    #[inline]
    pub fn at(&self, p_ly: [f64; 3]) -> f64 {
        match self.model {
            DensityModel::Uniform => self.per_ly3,
            DensityModel::Disk { thick_share } => {
                self.per_ly3 * juric_relative(p_ly, thick_share) / self.home_relative
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn juric_check_values() {
        // light-and-maps.md §5.4 [computed there], n/n0 at R = R⊙ with f = 0.12:
        // total 0.4589 at Z = 300 pc, 0.0800 at 1000 pc, 0.0185 at 2000 pc.
        for (z_pc, expect) in [(300.0, 0.4589), (1000.0, 0.0800), (2000.0, 0.0185)] {
            let p = [0.0, 0.0, (z_pc - Z_SUN_PC) * LY_PER_PC];
            let got = juric_relative(p, 0.12);
            assert!((got / expect - 1.0).abs() < 2e-3, "{z_pc}: {got}");
        }
    }
}
