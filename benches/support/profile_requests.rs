//! The (mass, age) pairs the profile benchmark and the `physics_timing`
//! example both time, so the two figures are of the same work.

use rand::RngExt;
use starloom::physics::{KindChoice, StarRequest};
use starloom::seed::{Stream, rng_for};
use starloom::units::{Gigayears, SolarMasses};

/// Number of requests.
pub const N_STARS: usize = 1_000_000;

/// Log-uniform masses in `lo..hi` Msun, uniform ages 0–13.8 Gyr.
pub fn requests(lo: f64, hi: f64) -> Vec<StarRequest> {
    let mut rng = rng_for(2026, 1, Stream::Other);
    (0..N_STARS)
        .map(|_| {
            let u: f64 = rng.random();
            let a: f64 = rng.random();
            StarRequest {
                mass: SolarMasses::new(lo * (hi / lo).powf(u)).expect("a mass in range"),
                age: Gigayears::new(13.8 * a).expect("an age in range"),
                kind: KindChoice::Auto,
            }
        })
        .collect()
}
