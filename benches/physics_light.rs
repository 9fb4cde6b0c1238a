//! Per-star cost of the light functions of the physics core: true colour,
//! spectral class, habitable zone and absolute visual magnitude, each over
//! 10^4 stars spread across the whole temperature range.
//!
//! Run with `cargo bench --bench physics_light`; divide the reported time by
//! 10 000 for the cost per star.

use starloom::physics::StarKind;
use starloom::physics::blackbody_color::color_rgb;
use starloom::physics::habitable_zone::habitable_zone;
use starloom::physics::photometry::abs_mag_v;
use starloom::physics::spectral_class::classify;

const N_STARS: usize = 10_000;

fn main() {
    divan::main();
}

/// Temperatures from 2000 K to 40 000 K in a fixed shuffled order (a
/// multiplicative congruential walk, so branch prediction and the cache
/// see no simple pattern), with luminosities along a rough main sequence.
fn stars() -> Vec<(f64, f64)> {
    let mut state: u64 = 0x2545_f491_4f6c_dd1d;
    (0..N_STARS)
        .map(|_| {
            state = state
                .wrapping_mul(6_364_136_223_846_793_005)
                .wrapping_add(1);
            let u = (state >> 11) as f64 / (1u64 << 53) as f64;
            let teff_k = 2000.0 * 20f64.powf(u);
            let luminosity_lsun = (teff_k / 5772.0).powi(7);
            (teff_k, luminosity_lsun)
        })
        .collect()
}

#[divan::bench]
fn color_rgb_10k(bencher: divan::Bencher) {
    let input = stars();
    color_rgb(5772.0); // Build the table outside the timing.
    bencher.bench(|| {
        input
            .iter()
            .map(|&(t, _)| color_rgb(divan::black_box(t))[1] as u32)
            .sum::<u32>()
    });
}

#[divan::bench]
fn classify_10k(bencher: divan::Bencher) {
    let input = stars();
    bencher.bench(|| {
        input
            .iter()
            .map(|&(t, l)| {
                classify(StarKind::MainSequence, divan::black_box(t), l, 1.0).letter() as u32
            })
            .sum::<u32>()
    });
}

#[divan::bench]
fn habitable_zone_10k(bencher: divan::Bencher) {
    let input = stars();
    bencher.bench(|| {
        input
            .iter()
            .map(|&(t, l)| habitable_zone(divan::black_box(t), l).inner_au)
            .sum::<f64>()
    });
}

#[divan::bench]
fn abs_mag_v_10k(bencher: divan::Bencher) {
    let input = stars();
    bencher.bench(|| {
        input
            .iter()
            .map(|&(t, l)| abs_mag_v(StarKind::MainSequence, divan::black_box(t), l))
            .sum::<f64>()
    });
}
