//! The light of one object in one pass: spectral class, true colour,
//! absolute visual magnitude and habitable zone, as
//! [`star_profile`](super::star_profile) needs them for every star.
//!
//! The direct functions stay the references: [`spectral_class::classify`],
//! [`blackbody_color::color_rgb`], [`photometry::abs_mag_v`] and
//! [`habitable_zone::habitable_zone`]. This module only avoids repeated and
//! avoidable work between them:
//! - the caller may pass log10 L and log10 Teff when it has them for free
//!   (the main sequence works in ln L and ln R, a brown dwarf's L is an
//!   exponential); otherwise they come from one `ln` each, only where they
//!   are needed. Either way they differ from `log10` by rounding only
//!   (tested: M_V within 1e-9 mag of [`photometry::abs_mag_v`] for every
//!   kind except white dwarfs and neutron stars);
//! - white dwarfs and neutron stars take their blackbody BC_V from
//!   [`photometry::bc_v_blackbody_table`], within
//!   [`photometry::BC_V_BLACKBODY_TABLE_MAX_ERROR_MAG`] (1e-4 mag) of the
//!   direct formula (tested here on whole profiles and in `photometry`);
//! - class, colour and habitable zone are the same functions, so the same
//!   values (tested for equality).

use super::kinds::{ClassCode, Fidelity, HabitableZone, StarKind};
use super::photometry::{
    self, DWARF_TABLE_BC_BELOW_K, M_BOL_SUN, NO_LIGHT_MAG, TORRES_TEFF_RANGE_K,
};
use super::{blackbody_color, habitable_zone, spectral_class};

/// log10 of the nominal solar Teff, 5772 K (IAU 2015 B3), to the last bit
/// (a test checks it against `5772f64.log10()`).
pub const LOG10_TEFF_SUN_K: f64 = 3.761_326_322_421_456_6;

/// Logarithms a caller may already hold; NaN means "not known".
#[derive(Debug, Clone, Copy)]
pub struct KnownLogs {
    /// log10 of the luminosity in Lsun.
    pub log10_luminosity: f64,
    /// log10 of Teff in kelvin.
    pub log10_teff: f64,
}

impl KnownLogs {
    /// Nothing known: every logarithm is computed when needed.
    pub const NONE: KnownLogs = KnownLogs {
        log10_luminosity: f64::NAN,
        log10_teff: f64::NAN,
    };
}

/// What the light functions say about one object.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Light {
    /// Spectral class.
    pub class: ClassCode,
    /// True colour, sRGB; black for an object without light.
    pub color_rgb: [u8; 3],
    /// Absolute visual magnitude.
    pub abs_mag_v: f64,
    /// Habitable zone (all zero for an object without light).
    pub hz: HabitableZone,
}

const NO_ZONE: HabitableZone = HabitableZone {
    inner_au: 0.0,
    outer_au: 0.0,
    optimistic_inner_au: 0.0,
    optimistic_outer_au: 0.0,
    teff_in_range: false,
};

/// Class, colour, magnitude and habitable zone of an object of `kind` with
/// this Teff (K) and luminosity (Lsun), for the given fidelity (which only
/// picks the habitable-zone rule).
///
/// # Allocations
/// None.
#[inline]
pub fn light(
    kind: StarKind,
    teff_k: f64,
    luminosity_lsun: f64,
    logs: KnownLogs,
    fidelity: Fidelity,
) -> Light {
    let shines = luminosity_lsun > 0.0 && teff_k > 0.0;
    let hz = if !shines {
        NO_ZONE
    } else {
        match fidelity {
            Fidelity::Fitted => habitable_zone::habitable_zone(teff_k, luminosity_lsun),
            Fidelity::Rules => habitable_zone::habitable_zone_rules(luminosity_lsun),
        }
    };
    Light {
        class: spectral_class::classify(kind, teff_k, luminosity_lsun, 0.0),
        color_rgb: if shines {
            blackbody_color::color_rgb(teff_k)
        } else {
            [0, 0, 0]
        },
        abs_mag_v: abs_mag_v(kind, teff_k, luminosity_lsun, logs),
        hz,
    }
}

/// [`photometry::abs_mag_v`] using known logarithms and the blackbody
/// table (module docs).
#[inline]
pub fn abs_mag_v(kind: StarKind, teff_k: f64, luminosity_lsun: f64, logs: KnownLogs) -> f64 {
    if kind == StarKind::BlackHole || !(luminosity_lsun.is_finite() && luminosity_lsun > 0.0) {
        return NO_LIGHT_MAG;
    }
    let log10_l = if logs.log10_luminosity.is_nan() {
        luminosity_lsun.ln() * std::f64::consts::LOG10_E
    } else {
        logs.log10_luminosity
    };
    let m_bol = (M_BOL_SUN - 2.5 * log10_l).min(NO_LIGHT_MAG);
    if m_bol >= NO_LIGHT_MAG {
        return NO_LIGHT_MAG;
    }
    let bc = match kind {
        StarKind::WhiteDwarf | StarKind::NeutronStar => photometry::bc_v_blackbody_table(teff_k),
        StarKind::MainSequence | StarKind::BrownDwarf
            if teff_k.is_nan() || teff_k < DWARF_TABLE_BC_BELOW_K =>
        {
            photometry::bc_v_dwarf_table(teff_k)
        }
        _ => {
            let (t_min, t_max) = TORRES_TEFF_RANGE_K;
            let t = teff_k.max(t_min).min(t_max);
            let log10_t = if t == teff_k && !logs.log10_teff.is_nan() {
                logs.log10_teff
            } else {
                t.ln() * std::f64::consts::LOG10_E
            };
            photometry::bc_v_torres_log(log10_t)
        }
    };
    (m_bol - bc).min(NO_LIGHT_MAG)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::physics::photometry::BC_V_BLACKBODY_TABLE_MAX_ERROR_MAG;

    #[test]
    fn solar_log_constant() {
        assert_eq!(LOG10_TEFF_SUN_K, 5772f64.log10());
    }

    #[test]
    fn light_matches_the_direct_functions() {
        // Dense sweep of every kind over 100 K–2e6 K and 1e-8–1e7 Lsun: class,
        // colour and zone identical to the direct functions; M_V within 1e-9 mag (rounding
        // noise of the Torres polynomial, whose coefficients reach 1e5),
        // or the blackbody-table bound for white dwarfs and neutron stars.
        let mut n = 0;
        for kind in StarKind::ALL {
            for i in 0..4000 {
                let teff = 100.0 * (2e4f64).powf(i as f64 / 3999.0);
                for lum in [1e-8, 3.3e-4, 0.02, 1.0, 870.0, 1e7] {
                    for (fidelity, logs) in [
                        (Fidelity::Fitted, KnownLogs::NONE),
                        (
                            Fidelity::Rules,
                            KnownLogs {
                                log10_luminosity: f64::log10(lum),
                                log10_teff: f64::log10(teff),
                            },
                        ),
                    ] {
                        let got = light(kind, teff, lum, logs, fidelity);
                        let want = photometry::abs_mag_v(kind, teff, lum);
                        let tol = match kind {
                            StarKind::WhiteDwarf | StarKind::NeutronStar => {
                                BC_V_BLACKBODY_TABLE_MAX_ERROR_MAG
                            }
                            _ => 1e-9,
                        };
                        assert!(
                            (got.abs_mag_v - want).abs() <= tol,
                            "{kind} {teff} {lum}: {} vs {want}",
                            got.abs_mag_v
                        );
                        let class = spectral_class::classify_by_search(kind, teff, lum, 1.0);
                        assert_eq!(got.class, class, "{kind} {teff} {lum}");
                        assert_eq!(got.color_rgb, blackbody_color::color_rgb(teff));
                        let hz = match fidelity {
                            Fidelity::Fitted => habitable_zone::habitable_zone(teff, lum),
                            Fidelity::Rules => habitable_zone::habitable_zone_rules(lum),
                        };
                        assert_eq!(got.hz, hz);
                        n += 1;
                    }
                }
            }
        }
        assert!(n > 400_000);
    }

    #[test]
    fn no_light() {
        for kind in StarKind::ALL {
            for (teff, lum) in [(0.0, 0.0), (5000.0, 0.0), (0.0, 1.0), (f64::NAN, f64::NAN)] {
                let got = light(kind, teff, lum, KnownLogs::NONE, Fidelity::Fitted);
                assert_eq!(got.abs_mag_v, photometry::abs_mag_v(kind, teff, lum));
                if !(teff > 0.0 && lum > 0.0) {
                    assert_eq!(got.color_rgb, [0, 0, 0]);
                    assert_eq!(got.hz, NO_ZONE);
                }
            }
        }
    }
}
