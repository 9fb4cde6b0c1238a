//! 10^6 stars on an A3 landscape sheet at 300 dpi (4961 × 3508 px) to PNG
//! bytes: rasterising (star sprites in parallel bands) and encoding, apart
//! and as `png_bytes` runs them (each band filtered while still in the
//! cache and deflated on a compressor thread as the bands arrive).
//!
//! Run with `cargo bench --bench render_stars_a3`; it prints the best and
//! median of a few runs for each stage. Set `RAYON_NUM_THREADS` to compare
//! thread counts.
//!
//! This scene is much harder than a map sheet: stars cover the whole page,
//! all outlined, radii up to 11.6 px. On the 2 cores, idle at the time
//! (load average 0.0-0.3, 2 December 2026): rasterise 319 ms best,
//! encode 198 ms, both 518 ms, `png_bytes` pipelined 420 ms; PNG 40.6 MB.
//! On a 2-core AMD EPYC VM, idle (4 December 2026): rasterise 232 ms best
//! (241 ms median), encode 133 ms, both 365 ms, pipelined 310 ms.

use starloom::render::output::{encode_png, png_bytes};
use starloom::render::paper::Paper;
use starloom::render::raster::rasterise;
use starloom::render::scene::{Item, Rgba, Scene, Stroke};
use std::time::{Duration, Instant};

const N_STARS: usize = 1_000_000;
const DPI: f32 = 300.0;
const RUNS: usize = 5;

/// Stars uniform over the sheet, radii skewed small (most 1–3 px, a few
/// up to 1 mm), colours from a red-to-blue ramp, with a thin outline as
/// the print theme draws them. A fixed LCG keeps the input the same.
fn scene() -> Scene {
    let (w, h) = Paper::A3.size_mm(true);
    let mut state: u64 = 0x9e37_79b9_7f4a_7c15;
    let mut next = || {
        state = state
            .wrapping_mul(6_364_136_223_846_793_005)
            .wrapping_add(1_442_695_040_888_963_407);
        (state >> 40) as f32 / (1u64 << 24) as f32
    };
    let mut centres = Vec::with_capacity(N_STARS);
    let mut radii = Vec::with_capacity(N_STARS);
    let mut fills = Vec::with_capacity(N_STARS);
    for _ in 0..N_STARS {
        centres.push([next() * w, next() * h]);
        radii.push(0.08 + 0.9 * next().powi(8));
        let t = next();
        fills.push(Rgba::rgb(
            (255.0 - 100.0 * t) as u8,
            (170.0 + 60.0 * t) as u8,
            (110.0 + 145.0 * t) as u8,
        ));
    }
    Scene {
        width_mm: w,
        height_mm: h,
        background: Rgba::rgb(255, 255, 255),
        items: vec![Item::Stars {
            centres_mm: centres,
            radii_mm: radii,
            fills,
            outline: Some(Stroke {
                color: Rgba::rgb(60, 60, 70),
                width_mm: 0.05,
                dash_mm: None,
            }),
        }],
    }
}

fn report(name: &str, mut times: Vec<Duration>) {
    times.sort();
    println!(
        "{name:<22} best {:>7.1} ms   median {:>7.1} ms",
        times[0].as_secs_f64() * 1e3,
        times[times.len() / 2].as_secs_f64() * 1e3
    );
}

fn main() {
    let scene = scene();
    let (mut raster, mut encode, mut total) = (Vec::new(), Vec::new(), Vec::new());
    let mut pipelined = Vec::new();
    let mut size = 0;
    for _ in 0..RUNS {
        let t0 = Instant::now();
        let pixmap = rasterise(&scene, DPI).expect("A3 fits in memory");
        let t1 = Instant::now();
        let mut bytes = Vec::with_capacity(16 << 20);
        encode_png(&pixmap, DPI, &mut bytes).expect("PNG encodes");
        let t2 = Instant::now();
        size = bytes.len();
        let t3 = Instant::now();
        let again = png_bytes(&scene, DPI).expect("PNG encodes");
        pipelined.push(t3.elapsed());
        assert!(again == bytes, "png_bytes and encode_png differ");
        raster.push(t1 - t0);
        encode.push(t2 - t1);
        total.push(t2 - t0);
    }
    println!(
        "{N_STARS} stars, A3 landscape at {DPI} dpi, {} threads, PNG {:.1} MB",
        rayon::current_num_threads(),
        size as f64 / 1e6
    );
    report("rasterise", raster);
    report("encode PNG", encode);
    report("raster + PNG", total);
    report("png_bytes (pipelined)", pipelined);
}
