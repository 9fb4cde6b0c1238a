//! Complete star profiles for 10^6 random (mass, age) pairs on one core.
//!
//! Run with `cargo bench --bench physics_profiles`. Per-star cost is the
//! reported time divided by 10^6 (target: under 100 ns).

use rand::RngExt;
use starloom::physics::{Fidelity, KindChoice, StarRequest, star_profile};
use starloom::seed::{Stream, rng_for};
use starloom::units::{Gigayears, SolarMasses};

const N_STARS: usize = 1_000_000;

fn main() {
    divan::main();
}

/// Log-uniform masses in `lo..hi` Msun, uniform ages 0–13.8 Gyr.
fn requests(lo: f64, hi: f64) -> Vec<StarRequest> {
    let mut rng = rng_for(2026, 1, Stream::Other);
    (0..N_STARS)
        .map(|_| {
            let u: f64 = rng.random();
            let a: f64 = rng.random();
            StarRequest {
                mass: SolarMasses::new(lo * (hi / lo).powf(u)).unwrap(),
                age: Gigayears::new(13.8 * a).unwrap(),
                kind: KindChoice::Auto,
            }
        })
        .collect()
}

fn run(bencher: divan::Bencher, lo: f64, hi: f64, fidelity: Fidelity) {
    let input = requests(lo, hi);
    bencher.bench(|| {
        let mut sum = 0.0;
        for request in &input {
            let p = star_profile(divan::black_box(request), fidelity);
            sum += p.luminosity_lsun + p.abs_mag_v + p.color_rgb[0] as f64;
        }
        divan::black_box(sum)
    });
}

/// All masses 0.013–150 Msun log-uniform: many evolved stars and remnants.
#[divan::bench(sample_count = 5, sample_size = 1)]
fn fitted_1m_all_masses(bencher: divan::Bencher) {
    run(bencher, 0.013, 150.0, Fidelity::Fitted);
}

/// Masses 0.08–2 Msun log-uniform: mostly main-sequence stars, as in a field population.
#[divan::bench(sample_count = 5, sample_size = 1)]
fn fitted_1m_low_masses(bencher: divan::Bencher) {
    run(bencher, 0.08, 2.0, Fidelity::Fitted);
}

/// The rules fidelity over all masses.
#[divan::bench(sample_count = 5, sample_size = 1)]
fn rules_1m_all_masses(bencher: divan::Bencher) {
    run(bencher, 0.013, 150.0, Fidelity::Rules);
}

/// The evolution step alone (no class, colour, habitable zone, magnitude), all masses.
#[divan::bench(sample_count = 5, sample_size = 1)]
fn evolve_only_1m_all_masses(bencher: divan::Bencher) {
    let input = requests(0.013, 150.0);
    let thresholds = starloom::physics::RemnantThresholds::default();
    bencher.bench(|| {
        let mut sum = 0.0;
        for request in &input {
            let r = divan::black_box(request);
            let b = starloom::physics::evolution::evolve(r.mass.get(), r.age.get(), &thresholds);
            sum += b.luminosity_lsun + b.teff_k;
        }
        divan::black_box(sum)
    });
}
