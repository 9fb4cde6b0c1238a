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

pub mod blackbody_color;
pub mod habitable_zone;
pub mod kinds;
pub mod photometry;
pub mod spectral_class;

pub use kinds::{ClassCode, Fidelity, HabitableZone, KindChoice, StarKind, StarProfile};

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

/// The complete profile of one object.
///
/// # Allocations
/// None: the profile is plain data, the class is a fixed-size code.
pub fn star_profile(request: &StarRequest, fidelity: Fidelity) -> StarProfile {
    evolution_placeholder(request, fidelity)
}

// Temporary stand-in so that the rest of the crate compiles while the
// physics core is written; replaced by the fitted and rules modules.
fn evolution_placeholder(request: &StarRequest, _fidelity: Fidelity) -> StarProfile {
    let m = request.mass.get();
    let l = m.powf(3.5);
    let r = if m < 1.0 { m.powf(0.8) } else { m.powf(0.5) };
    let teff = 5772.0 * l.powf(0.25) / r.sqrt();
    StarProfile {
        kind: StarKind::MainSequence,
        class: ClassCode::from_str_lossy("G2V"),
        mass_msun: m,
        initial_mass_msun: m,
        radius_rsun: r,
        luminosity_lsun: l,
        teff_k: teff,
        age_gyr: request.age.get(),
        lifetime_gyr: 10.0 * m / l,
        hz: HabitableZone {
            inner_au: (l / 1.1).sqrt(),
            outer_au: (l / 0.53).sqrt(),
            optimistic_inner_au: (l / 1.7753).sqrt(),
            optimistic_outer_au: (l / 0.3179).sqrt(),
            teff_in_range: (2600.0..=7200.0).contains(&teff),
        },
        color_rgb: [255, 255, 255],
        abs_mag_v: 4.83 - 2.5 * l.log10(),
        habitable_host: false,
    }
}
