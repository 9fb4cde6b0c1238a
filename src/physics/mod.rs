//! Star physics: pure functions of already-drawn inputs, no randomness.
//!
//! One entry point, [`star_profile`], turns (initial mass, age, kind
//! choice, fidelity) into a complete [`StarProfile`]: current mass, radius,
//! luminosity, effective temperature, evolutionary stage, spectral class,
//! habitable zone, true colour and absolute visual magnitude.
//!
//! Two fidelity levels share the interface ([`Fidelity`]): `Fitted`
//! (published fitting formulae, the default) and `Rules` (textbook power
//! laws, common practice).
//!
//! **Architecture invariant:** physics never sees a random-number generator.

pub mod black_hole;
pub mod brown_dwarf;
pub mod constants;
pub mod derived;
pub mod effective_temperature;
pub mod evolution;
pub mod explicit_kind;
pub mod giant_branch;
pub mod habitable_host;
pub mod kinds;
pub mod light;
pub mod main_sequence;
pub mod neutron_star;
pub mod request_limits;
pub mod rules;
pub mod track_table;
pub mod white_dwarf;

pub mod blackbody_color;
pub mod habitable_zone;
pub mod photometry;
pub mod spectral_class;

pub use evolution::RemnantThresholds;
pub use kinds::{ClassCode, Fidelity, HabitableZone, KindChoice, StarKind, StarProfile};
pub use request_limits::{allowed_mass_range, typical_age_gyr};

use crate::units::{Gigayears, SolarMasses};

/// What to build: an initial mass, an age and which kind of object.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct StarRequest {
    /// Initial (zero-age) mass for `KindChoice::Auto`; the object's own
    /// mass for an explicit kind.
    pub mass: SolarMasses,
    /// Age since the star formed.
    pub age: Gigayears,
    /// Follow evolution from mass and age, or build one kind directly.
    pub kind: KindChoice,
}

/// The complete profile of one object, with the default remnant thresholds.
///
/// # Allocations
/// None: the profile is plain data, the class is a fixed-size code.
///
/// # Guarantees
/// Every number is finite for masses and ages in the allowed ranges
/// ([`allowed_mass_range`], 0–13.8 Gyr). Black holes have L = 0, Teff = 0,
/// a black colour, zero habitable-zone edges and the photometry
/// module's faint sentinel magnitude.
pub fn star_profile(request: &StarRequest, fidelity: Fidelity) -> StarProfile {
    star_profile_with(request, fidelity, &RemnantThresholds::default())
}

/// [`star_profile`] with chosen initial-mass thresholds between white
/// dwarfs, neutron stars and black holes.
pub fn star_profile_with(
    request: &StarRequest,
    fidelity: Fidelity,
    thresholds: &RemnantThresholds,
) -> StarProfile {
    let mass = request.mass.get();
    let age = request.age.get();
    let (body, logs) = match (request.kind, fidelity) {
        (KindChoice::Auto, Fidelity::Fitted) => evolution::evolve_with_logs(mass, age, thresholds),
        (KindChoice::Auto, Fidelity::Rules) => {
            (rules::evolve(mass, age, thresholds), light::KnownLogs::NONE)
        }
        (KindChoice::Explicit(kind), _) => (
            explicit_kind::build(kind, mass, age, fidelity, thresholds),
            light::KnownLogs::NONE,
        ),
    };
    profile_from_body(&body, fidelity, logs)
}

/// The largest radius, Rsun, that a star of this initial mass reaches
/// before it becomes a remnant (the tip of the asymptotic giant branch for
/// a white-dwarf progenitor), with the default remnant thresholds.
///
/// # Allocations
/// None: one interpolated track of [`track_table`] (`fitted`) or one
/// power law (`rules`).
pub fn largest_radius_rsun(initial_mass: SolarMasses, fidelity: Fidelity) -> f64 {
    let m = initial_mass.get();
    match fidelity {
        Fidelity::Fitted => {
            track_table::track(m.clamp(evolution::HYDROGEN_BURNING_MIN_MSUN, 150.0))
                .largest_radius_rsun()
        }
        Fidelity::Rules => rules::largest_radius_rsun(m),
    }
}

/// Adds classification, colour, habitable zone and magnitude to a body.
#[inline]
fn profile_from_body(
    body: &evolution::Body,
    fidelity: Fidelity,
    logs: light::KnownLogs,
) -> StarProfile {
    let lit = light::light(body.kind, body.teff_k, body.luminosity_lsun, logs, fidelity);
    StarProfile {
        kind: body.kind,
        class: lit.class,
        mass_msun: body.mass_msun,
        initial_mass_msun: body.initial_mass_msun,
        radius_rsun: body.radius_rsun,
        luminosity_lsun: body.luminosity_lsun,
        teff_k: body.teff_k,
        age_gyr: body.age_gyr,
        lifetime_gyr: body.lifetime_gyr,
        hz: lit.hz,
        color_rgb: lit.color_rgb,
        abs_mag_v: lit.abs_mag_v,
        habitable_host: habitable_host::is_habitable_host(
            body.kind,
            body.initial_mass_msun,
            body.age_gyr,
        ),
    }
}

#[cfg(test)]
mod tests;
