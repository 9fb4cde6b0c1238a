//! Population synthesis: what each system holds.
//!
//! For one system (given its seed key) this draws the primary's initial
//! mass from the IMF, the number of companions and their mass ratios and
//! orbits, one age for the whole system, evolves every member through
//! [`crate::physics::star_profile`] and removes neutron stars and black
//! holes that natal kicks carried away. White dwarfs, giants and remnants
//! are not imposed: they follow from mass and age. Orbits are drawn for
//! the initial masses and then carried to the present masses
//! ([`orbit_evolution`]: wind widening, common envelopes, mergers).
//!
//! **Architecture invariant:** all random draws of a system come from one
//! generator seeded by (universe seed, system key), in a fixed order, so a
//! system is the same whatever region or thread produced it.

pub mod initial_mass_function;
pub mod multiplicity;
pub mod orbit_evolution;
pub mod remnants;
pub mod star_ages;

use crate::physics::{KindChoice, StarKind, StarProfile, StarRequest, star_profile};
use crate::seed::{Stream, rng_for};
use crate::spec::PopulationModel;
use crate::units::{Gigayears, SolarMasses};
use initial_mass_function::{Imf, MIN_MASS_MSUN};
use orbit_evolution::PresentOrbit;
use star_ages::AgeModel;

/// Most members a system can have (primary + companions).
pub const MAX_MEMBERS: usize = 1 + multiplicity::MAX_COMPANIONS;

/// One member of a system.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Member {
    /// Slot in the system as drawn (0 = primary), kept when others are removed.
    pub slot: u8,
    /// Physical profile.
    pub profile: StarProfile,
    /// Semi-major axis of the orbit about the primary, au (0 for the primary).
    pub separation_au: f64,
    /// Orbital period about the primary, days (0 for the primary).
    pub period_days: f64,
}

/// A resolved population model, ready to draw systems.
#[derive(Debug, Clone)]
pub struct Population {
    model: PopulationModel,
    imf: Imf,
    ages: AgeModel,
}

impl Population {
    /// Prepares the IMF and age model of `model`.
    pub fn new(model: &PopulationModel) -> Population {
        Population {
            model: *model,
            imf: Imf::new(model.imf),
            ages: AgeModel::new(model.ages_gyr[0], model.ages_gyr[1]),
        }
    }

    /// The model this population draws from.
    pub fn model(&self) -> &PopulationModel {
        &self.model
    }

    /// Draws the system with key `system_key` into `out` (cleared first),
    /// primary first.
    ///
    /// # Allocations
    /// None once `out` has capacity [`MAX_MEMBERS`].
    pub fn draw_system(&self, seed: u64, system_key: u64, out: &mut Vec<Member>) {
        out.clear();
        let mut rng = rng_for(seed, system_key, Stream::System);
        let m1 = self.imf.sample(&mut rng);
        let age = self.ages.sample(&mut rng);
        let n_comp = multiplicity::draw_companion_count(m1, &mut rng);
        let mut masses = [m1, 0.0, 0.0, 0.0];
        let mut orbits = [(0.0, 0.0); MAX_MEMBERS];
        for c in 1..=n_comp {
            let q = multiplicity::draw_mass_ratio(m1, MIN_MASS_MSUN, &mut rng);
            masses[c] = (q * m1).max(MIN_MASS_MSUN);
            orbits[c] = multiplicity::draw_orbit(m1, masses[c], &mut rng);
        }
        // Kicks are drawn in slot order for every neutron star and black
        // hole, whatever happens to the orbits afterwards, so the stream
        // is the same as when orbits were not evolved.
        let mut profiles = [None; MAX_MEMBERS];
        let mut stays = [false; MAX_MEMBERS];
        for slot in 0..=n_comp {
            let profile = self.evolve(masses[slot], age);
            stays[slot] = self.model.keep_remnants
                || !matches!(profile.kind, StarKind::NeutronStar | StarKind::BlackHole)
                || remnants::stays_after_kick(profile.mass_msun, &mut rng);
            profiles[slot] = Some(profile);
        }
        let Some(primary) = profiles[0] else {
            return;
        };
        // A primary kicked out of the neighbourhood leaves its companions
        // behind unbound: the first that is left becomes the system's
        // primary (no orbit) and any later one orbits it at its own
        // separation.
        let mut head_msun: Option<f64> = None;
        for slot in 0..=n_comp {
            let Some(profile) = profiles[slot].filter(|_| stays[slot]) else {
                continue;
            };
            let (separation_au, period_days) = if slot == 0 {
                (0.0, 0.0)
            } else {
                match orbit_evolution::present_orbit(
                    orbits[slot].1,
                    orbits[slot].0,
                    &primary,
                    &profile,
                    self.model.fidelity,
                ) {
                    PresentOrbit::Detached {
                        separation_au,
                        period_days,
                    } => (separation_au, period_days),
                    PresentOrbit::Merged => continue,
                }
            };
            let (separation_au, period_days) = match (stays[0], head_msun) {
                (true, _) => (separation_au, period_days),
                (false, None) => (0.0, 0.0),
                (false, Some(head)) => (
                    separation_au,
                    multiplicity::kepler_period_days(separation_au, head + profile.mass_msun),
                ),
            };
            head_msun.get_or_insert(profile.mass_msun);
            out.push(Member {
                slot: slot as u8,
                profile,
                separation_au,
                period_days,
            });
        }
    }

    /// Evolves a star of initial mass `mass_msun` to `age_gyr`.
    pub fn evolve(&self, mass_msun: f64, age_gyr: f64) -> StarProfile {
        let mass = SolarMasses::new(mass_msun)
            .or(SolarMasses::new(MIN_MASS_MSUN))
            .expect("the lowest mass is a positive constant");
        let age = Gigayears::new(age_gyr.clamp(0.0, crate::units::UNIVERSE_AGE_GYR))
            .or(Gigayears::new(0.0))
            .expect("zero is a valid age");
        star_profile(
            &StarRequest {
                mass,
                age,
                kind: KindChoice::Auto,
            },
            self.model.fidelity,
        )
    }

    /// Mean numbers of stars (not brown dwarfs, after kicks) and of all
    /// members per system, estimated from a fixed, seed-independent sample
    /// of 65 536 systems drawn through [`Population::draw_system`] itself,
    /// so the sampler's system counts reproduce the requested star density.
    /// The relative standard error of the star mean is about 0.15 %.
    pub fn system_means(&self) -> SystemMeans {
        use rayon::prelude::*;
        const N: u64 = 1 << 16;
        const CALIBRATION_SEED: u64 = 0x5EED_CA11_B8A7_E000;
        let (stars, members): (u64, u64) = (0..64u64)
            .into_par_iter()
            .map_init(
                || Vec::with_capacity(MAX_MEMBERS),
                |buf, chunk| {
                    let (mut stars, mut members) = (0u64, 0u64);
                    for i in chunk * (N / 64)..(chunk + 1) * (N / 64) {
                        self.draw_system(CALIBRATION_SEED, i, buf);
                        stars += buf.iter().filter(|m| m.profile.kind.is_star()).count() as u64;
                        members += buf.len() as u64;
                    }
                    (stars, members)
                },
            )
            .reduce(|| (0, 0), |a, b| (a.0 + b.0, a.1 + b.1));
        SystemMeans {
            stars: (stars as f64 / N as f64).max(1e-3),
            members: (members as f64 / N as f64).max(1e-3),
        }
    }
}

/// Mean counts per system of a [`Population`] (see
/// [`Population::system_means`]).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SystemMeans {
    /// Stars per system, brown dwarfs not counted; at least 0.001.
    pub stars: f64,
    /// Members per system (catalogue rows), brown dwarfs counted; at least 0.001.
    pub members: f64,
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn white_dwarf_companions_keep_a_times_total_mass() {
        // Replays the draws of `draw_system` for the first systems of seed 9
        // with a white-dwarf primary and a main-sequence companion, and
        // checks the wind rule a · (M1 + M2) = const (Jeans 1924; from
        // memory) against the orbit drawn for the initial masses, and
        // Kepler's third law a³ = (M1 + M2) P² with the present masses
        // (au, yr, Msun; textbook).
        let population = Population::new(&PopulationModel::default());
        let mut members = Vec::with_capacity(MAX_MEMBERS);
        let mut checked = 0;
        for key in 0..200_000u64 {
            population.draw_system(9, key, &mut members);
            let [primary, companion, ..] = members.as_slice() else {
                continue;
            };
            if primary.slot != 0
                || companion.slot != 1
                || primary.profile.kind != StarKind::WhiteDwarf
                || companion.profile.kind != StarKind::MainSequence
            {
                continue;
            }
            let mut rng = rng_for(9, key, Stream::System);
            let m1 = population.imf.sample(&mut rng);
            let _age = population.ages.sample(&mut rng);
            let _n = multiplicity::draw_companion_count(m1, &mut rng);
            let q = multiplicity::draw_mass_ratio(m1, MIN_MASS_MSUN, &mut rng);
            let m2 = (q * m1).max(MIN_MASS_MSUN);
            let (_, a_initial) = multiplicity::draw_orbit(m1, m2, &mut rng);
            assert_eq!(m1, primary.profile.initial_mass_msun);
            let total = primary.profile.mass_msun + companion.profile.mass_msun;
            if a_initial * crate::physics::constants::R_SUN_PER_AU
                < crate::physics::largest_radius_rsun(
                    SolarMasses::new(m1).unwrap(),
                    crate::physics::Fidelity::Fitted,
                )
            {
                continue; // A common envelope: another test.
            }
            let want = a_initial * (m1 + m2) / total;
            assert!(
                (companion.separation_au / want - 1.0).abs() < 1e-12,
                "key {key}: {} against {want}",
                companion.separation_au
            );
            let p_years = companion.period_days / 365.25;
            let kepler = companion.separation_au.powi(3) / (total * p_years * p_years);
            assert!((kepler - 1.0).abs() < 1e-9, "key {key}: {kepler}");
            assert!(companion.separation_au > a_initial, "key {key}");
            checked += 1;
            if checked == 20 {
                return;
            }
        }
        panic!("only {checked} white-dwarf binaries found");
    }
}
