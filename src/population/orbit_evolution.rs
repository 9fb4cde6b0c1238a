//! From the orbit a companion was born on to the orbit it has today.
//!
//! [`draw_orbit`](super::multiplicity::draw_orbit) draws a period and a
//! semi-major axis for the initial (zero-age) masses. When a member has
//! since lost mass (a giant's wind, or the envelope a white dwarf,
//! neutron star or black hole left behind), the orbit has changed; this
//! module turns the drawn orbit into the present one. Pure functions, no
//! random draws: the system's random stream is the same as without it.
//!
//! # Model
//! Each member is taken in turn, primary first (it is the more massive, so
//! it evolved first), holding the other at the mass it had then:
//! - **Wind (detached).** Slow, isotropic mass loss keeps `a · M_total`
//!   constant (Jeans 1924, MNRAS 85, 2; the wind case of Hurley, Tout &
//!   Pols 2002, MNRAS 329, 897, from memory: equation number not checked).
//!   Without a common envelope the present separation is therefore
//!   `a_initial · (M1,i + M2,i) / (M1 + M2)` whatever the order.
//! - **Common envelope.** A remnant's progenitor whose largest radius
//!   ([`largest_radius_rsun`], the tip of the asymptotic giant branch for a
//!   white dwarf) reached the companion's initial orbit (`a_initial <
//!   R_max`) engulfed it. The orbit then shrinks by the energy formalism of
//!   Webbink 1984 (ApJ 277, 355) with α·λ = 1 and the envelope's binding
//!   energy taken at `R = a_initial`:
//!   `a_f / a_i = M_core · M_2 / (M_donor · (M_2 + 2 · M_env))`, with
//!   `M_donor` the initial mass, `M_core` the remnant's mass and
//!   `M_env = M_donor − M_core` (this form from memory; the same as
//!   Webbink's with the Roche-lobe fraction set to 1). If either star then
//!   overfills its Roche lobe (Eggleton 1983, ApJ 268, 368, from memory:
//!   `r_L / a = 0.49 q^(2/3) / (0.6 q^(2/3) + ln(1 + q^(1/3)))`) the pair
//!   merged and the companion is not listed; the merger product is not
//!   modelled (the remnant stays as it is).
//! - Neutron stars and black holes that stay in the neighbourhood get the
//!   same two rules as an approximation: the natal kick, which changes
//!   (and usually unbinds) real orbits, is not applied to the orbit.
//! - The present period follows from Kepler's third law with the present
//!   masses: `a³ = (M1 + M2) · P²` in au, years and Msun (textbook).
//!
//! # Limits
//! A rough, deterministic stand-in for binary evolution. Interaction
//! starts only when the star's radius reaches the separation itself, not
//! its Roche lobe (about 0.4 a for equal masses, Eggleton 1983), so fewer
//! systems interact than in nature; the wind widening before the largest
//! radius is ignored for the engulfment test, which goes the other way.
//! Stable mass transfer, tides, eccentricity (orbits are circular here)
//! and a giant that is engulfing its companion today are not modelled.
//! When a primary is kicked away its companions stay unbound where they
//! were (`Population::draw_system`): the first becomes the primary and a
//! later one keeps its separation, with its period about the new primary
//! (an approximation: the real orbits after the kick are not followed).
//!
//! # Allocations
//! None; O(1) per companion, and companions of two unevolved members
//! keep the drawn orbit bit for bit.

use super::multiplicity::kepler_period_days;
use crate::physics::constants::R_SUN_PER_AU;
use crate::physics::{Fidelity, StarProfile, largest_radius_rsun, main_sequence};
use crate::units::SolarMasses;

/// A companion's orbit about the primary today.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum PresentOrbit {
    /// Still a detached binary.
    Detached {
        /// Semi-major axis, au.
        separation_au: f64,
        /// Period, days.
        period_days: f64,
    },
    /// Merged in a common envelope: no companion left to list.
    Merged,
}

/// Roche-lobe radius over separation for a star of mass ratio
/// `q = M_star / M_other` (Eggleton 1983, from memory).
pub fn roche_lobe_fraction(q: f64) -> f64 {
    let q13 = q.cbrt();
    let q23 = q13 * q13;
    0.49 * q23 / (0.6 * q23 + q13.ln_1p())
}

/// Separation after a common envelope, au (α·λ = 1, module docs).
pub fn common_envelope_au(
    a_initial_au: f64,
    donor_msun: f64,
    core_msun: f64,
    other_msun: f64,
) -> f64 {
    let envelope = (donor_msun - core_msun).max(0.0);
    a_initial_au * core_msun * other_msun / (donor_msun * (other_msun + 2.0 * envelope))
}

/// The present orbit of `companion` about `primary`, from the separation
/// `initial_separation_au` and period `initial_period_days` drawn for
/// their initial masses.
pub fn present_orbit(
    initial_separation_au: f64,
    initial_period_days: f64,
    primary: &StarProfile,
    companion: &StarProfile,
    fidelity: Fidelity,
) -> PresentOrbit {
    let stars = [primary, companion];
    let unchanged = |s: &StarProfile| !s.kind.is_remnant() && s.mass_msun == s.initial_mass_msun;
    if unchanged(primary) && unchanged(companion) {
        return PresentOrbit::Detached {
            separation_au: initial_separation_au,
            period_days: initial_period_days,
        };
    }
    let mut a = initial_separation_au;
    let mut mass_then = [primary.initial_mass_msun, companion.initial_mass_msun];
    for donor in 0..2 {
        let other = 1 - donor;
        let star = stars[donor];
        let (before, after) = (star.initial_mass_msun, star.mass_msun);
        let engulfed = star.kind.is_remnant()
            && SolarMasses::new(before)
                .is_some_and(|m| a * R_SUN_PER_AU < largest_radius_rsun(m, fidelity));
        if engulfed {
            a = common_envelope_au(a, before, after, mass_then[other]);
            // The other star's radius then: today's, or its zero-age radius if
            // it has since become a remnant itself.
            let other_radius_rsun = if stars[other].kind.is_remnant() {
                main_sequence::zams_radius_rsun(stars[other].initial_mass_msun)
            } else {
                stars[other].radius_rsun
            };
            let a_rsun = a * R_SUN_PER_AU;
            if star.radius_rsun > roche_lobe_fraction(after / mass_then[other]) * a_rsun
                || other_radius_rsun > roche_lobe_fraction(mass_then[other] / after) * a_rsun
            {
                return PresentOrbit::Merged;
            }
        } else {
            a *= (before + mass_then[other]) / (after + mass_then[other]);
        }
        mass_then[donor] = after;
    }
    PresentOrbit::Detached {
        separation_au: a,
        period_days: kepler_period_days(a, primary.mass_msun + companion.mass_msun),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::physics::{KindChoice, StarKind, StarRequest, star_profile};
    use crate::population::multiplicity::DAYS_PER_YEAR;
    use crate::units::Gigayears;

    fn rel(a: f64, b: f64) -> f64 {
        (a / b - 1.0).abs()
    }

    /// A `fitted` profile of this initial mass at this age.
    fn profile(initial_msun: f64, age_gyr: f64) -> StarProfile {
        star_profile(
            &StarRequest {
                mass: SolarMasses::new(initial_msun).unwrap(),
                age: Gigayears::new(age_gyr).unwrap(),
                kind: KindChoice::Auto,
            },
            Fidelity::Fitted,
        )
    }

    #[test]
    fn roche_lobe_of_equal_masses() {
        // Eggleton 1983 (ApJ 268, 368; formula from memory): q = 1 gives
        // 0.49 / (0.6 + ln 2) = 0.3789205 (derived by hand).
        assert!(rel(roche_lobe_fraction(1.0), 0.378_920_5) < 1e-6);
    }

    #[test]
    fn wind_mass_loss_keeps_a_times_total_mass() {
        // Worked case (Jeans 1924 adiabatic wind, a · M = const; from memory):
        // a 3.0 Msun star at 100 au from a 1.0 Msun star becomes a
        // 0.745 Msun white dwarf (Cummings et al. 2018, ApJ 866, 21, MIST:
        // 0.187 · 3.0 + 0.184). By hand: a = 100 · 4.0 / 1.745 = 229.2264 au,
        // P = sqrt(229.2264³ / 1.745) yr = 959 598 d (Kepler's third law, textbook).
        let mut white_dwarf = profile(3.0, 13.0);
        assert_eq!(white_dwarf.kind, StarKind::WhiteDwarf);
        white_dwarf.mass_msun = 0.745;
        let companion = profile(1.0, 0.1);
        let initial_p_days = (100f64.powi(3) / 4.0).sqrt() * DAYS_PER_YEAR;
        let PresentOrbit::Detached {
            separation_au,
            period_days,
        } = present_orbit(
            100.0,
            initial_p_days,
            &white_dwarf,
            &companion,
            Fidelity::Fitted,
        )
        else {
            panic!("a 100 au companion cannot merge");
        };
        assert!(rel(separation_au, 229.2264) < 1e-6, "{separation_au}");
        assert!(rel(period_days, 959_598.0) < 1e-6, "{period_days}");
    }

    #[test]
    fn unevolved_pairs_keep_the_drawn_orbit() {
        let (a, b) = (profile(1.0, 1.0), profile(0.5, 1.0));
        assert_eq!(
            present_orbit(3.0, 1234.5, &a, &b, Fidelity::Fitted),
            PresentOrbit::Detached {
                separation_au: 3.0,
                period_days: 1234.5
            }
        );
    }

    #[test]
    fn common_envelope_shrinks_or_merges() {
        // A 1.0 Msun progenitor reaches well beyond 0.5 au (107.5 Rsun) on
        // the asymptotic giant branch, so a 0.5 Msun companion there goes
        // through a common envelope. By hand with α·λ = 1 (module docs) and a
        // 0.569 Msun white dwarf (Cummings et al. 2018, MIST: 0.080 · 1 + 0.489):
        // a_f = 0.5 · 0.569 · 0.5 / (1.0 · (0.5 + 2 · 0.431)) = 0.104442 au,
        // P = sqrt(0.104442³ / 1.069) yr = 11.9238 d; the companion's Roche
        // lobe is then 8.3 Rsun, so it survives.
        assert!(largest_radius_rsun(SolarMasses::new(1.0).unwrap(), Fidelity::Fitted) > 107.6);
        let mut white_dwarf = profile(1.0, 13.5);
        assert_eq!(white_dwarf.kind, StarKind::WhiteDwarf);
        white_dwarf.mass_msun = 0.569;
        let companion = profile(0.5, 13.5);
        let PresentOrbit::Detached {
            separation_au,
            period_days,
        } = present_orbit(0.5, 100.0, &white_dwarf, &companion, Fidelity::Fitted)
        else {
            panic!("the companion survives");
        };
        assert!(rel(separation_au, 0.104_442) < 1e-5, "{separation_au}");
        assert!(rel(period_days, 11.9238) < 1e-5, "{period_days}");
        // The example of the defect report: a 5.05 Msun progenitor with a
        // 0.226 Msun companion at 0.0116 au (2.5 Rsun) has a_f = 6.3e-5 au
        // (0.014 Rsun, by hand), inside the companion: merged.
        let massive = profile(5.05, 13.0);
        let small = profile(0.226, 13.0);
        assert_eq!(
            present_orbit(0.0116, 1.0, &massive, &small, Fidelity::Fitted),
            PresentOrbit::Merged
        );
    }
}
