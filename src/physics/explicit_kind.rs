//! Building one kind of object directly from its own mass (`--kind`),
//! instead of following a star's evolution from its initial mass.
//!
//! - Main sequence: the star at the given age, held at the end of the main
//!   sequence if the age is past it.
//! - White dwarf: the progenitor comes from the inverse Cummings et al.
//!   2018 relation; the dwarf has cooled for (age − progenitor lifetime),
//!   at least 1 Myr. Dwarfs lighter than 0.555 Msun (the relation's lowest
//!   final mass: helium dwarfs made in binaries) or heavier than its value
//!   at 7.91 Msun get no single-star progenitor: initial mass = mass,
//!   cooling age = age.
//! - Neutron star: progenitor from the inverse remnant-mass rule (clamped
//!   to the neutron-star progenitor range), cooling as above.
//! - Black hole: progenitor from the inverse mapping where one exists
//!   (below the 20 Msun stellar cap); otherwise initial mass = mass.
//! - Brown dwarf: the cooling model at that age.
//! - Subgiant, giant, core-helium, asymptotic-giant, supergiant: the star
//!   of that initial mass at the given age if the age falls in that phase,
//!   otherwise at the middle of the phase (the reported age says which).
//!   A mass without that phase (a supergiant of 5 Msun) gets the nearest
//!   phase the track has (its core-helium phase).

use super::Fidelity;
use super::evolution::{
    Body, RemnantThresholds, Track, black_hole_body, brown_dwarf_body, main_sequence_body,
    neutron_star_body, white_dwarf_body,
};
use super::kinds::StarKind;
use super::main_sequence;
use super::rules;
use super::{black_hole, neutron_star, white_dwarf};

/// Builds an object of this kind and mass at this age.
pub fn build(
    kind: StarKind,
    mass: f64,
    age: f64,
    fidelity: Fidelity,
    thresholds: &RemnantThresholds,
) -> Body {
    let rules = fidelity == Fidelity::Rules;
    match kind {
        StarKind::MainSequence => {
            if rules {
                rules::main_sequence(mass, age)
            } else {
                main_sequence_body(mass, age, main_sequence::t_ms_gyr(mass))
            }
        }
        StarKind::BrownDwarf => brown_dwarf_body(mass, age),
        StarKind::WhiteDwarf => {
            let progenitor =
                white_dwarf::initial_mass_msun(mass, thresholds.white_dwarf_max_initial_msun);
            let (initial, t_pre, life) = match progenitor {
                Some(m_i) => {
                    let track = Track::new(m_i, thresholds);
                    (m_i, track.t_end_gyr, track.t_ms_gyr)
                }
                None => (mass, 0.0, 0.0),
            };
            let cooling = (age - t_pre).max(white_dwarf::MIN_COOLING_GYR);
            if rules {
                rules::white_dwarf(mass, initial, cooling, age, life)
            } else {
                white_dwarf_body(mass, initial, cooling, age, life)
            }
        }
        StarKind::NeutronStar => {
            let m_i = neutron_star::initial_from_mass_msun(
                mass,
                thresholds.white_dwarf_max_initial_msun,
                thresholds.neutron_star_max_initial_msun,
            );
            let track = Track::new(m_i, thresholds);
            let cooling = (age - track.t_end_gyr).max(0.0);
            neutron_star_body(mass, m_i, cooling, age, track.t_ms_gyr)
        }
        StarKind::BlackHole => {
            match black_hole::initial_from_mass_msun(mass, thresholds.neutron_star_max_initial_msun)
            {
                Some(m_i) => black_hole_body(mass, m_i, age, main_sequence::t_ms_gyr(m_i)),
                None => black_hole_body(mass, mass, age, 0.0),
            }
        }
        StarKind::Subgiant
        | StarKind::Giant
        | StarKind::CoreHelium
        | StarKind::AsymptoticGiant
        | StarKind::Supergiant => {
            if rules {
                let t_ms = rules::lifetime_gyr(mass);
                let (lo, hi) = (t_ms, t_ms * (1.0 + rules::GIANT_FRACTION_OF_MS));
                let t = if (lo..hi).contains(&age) {
                    age
                } else {
                    0.5 * (lo + hi)
                };
                return rules::giant(mass, t);
            }
            let track = Track::new(mass, thresholds);
            let fallback = (track.t_hei_gyr, track.t_che_end_gyr);
            let (lo, hi) = track.phase_gyr(kind).unwrap_or(fallback);
            let t = if (lo..hi).contains(&age) {
                age
            } else {
                0.5 * (lo + hi)
            };
            track.state_at(t, thresholds)
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn th() -> RemnantThresholds {
        RemnantThresholds::default()
    }

    #[test]
    fn white_dwarf_of_given_mass_cools_with_age() {
        let young = build(StarKind::WhiteDwarf, 0.6, 5.0, Fidelity::Fitted, &th());
        let old = build(StarKind::WhiteDwarf, 0.6, 12.0, Fidelity::Fitted, &th());
        assert_eq!(young.kind, StarKind::WhiteDwarf);
        assert!(old.luminosity_lsun < young.luminosity_lsun);
        // Inverse Cummings 2018 MIST: 0.6 Msun ← (0.6 − 0.489)/0.080 = 1.3875 Msun.
        assert!((young.initial_mass_msun - 1.3875).abs() < 1e-9);
        // A helium white dwarf has no single-star progenitor.
        let he = build(StarKind::WhiteDwarf, 0.3, 5.0, Fidelity::Fitted, &th());
        assert_eq!(he.initial_mass_msun, 0.3);
    }

    #[test]
    fn every_explicit_kind_is_finite() {
        for kind in StarKind::ALL {
            let (lo, hi) = super::super::request_limits::allowed_mass_range(
                super::super::KindChoice::Explicit(kind),
            );
            for fidelity in [Fidelity::Fitted, Fidelity::Rules] {
                for i in 0..=40 {
                    let mass = lo * (hi / lo).powf(i as f64 / 40.0);
                    for age in [0.0, 0.01, 1.0, 4.6, 13.8] {
                        let b = build(kind, mass, age, fidelity, &th());
                        for v in [
                            b.mass_msun,
                            b.initial_mass_msun,
                            b.radius_rsun,
                            b.luminosity_lsun,
                            b.teff_k,
                            b.age_gyr,
                            b.lifetime_gyr,
                        ] {
                            assert!(
                                v.is_finite() && v >= 0.0,
                                "{kind} {mass} {age} {fidelity:?}: {b:?}"
                            );
                        }
                        assert!(b.radius_rsun > 0.0);
                    }
                }
            }
        }
    }
}
