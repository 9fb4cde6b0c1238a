//! Times `sky_view` (and the CSV and chart building) on a catalogue of
//! 10^6 stars: `cargo run --release --example sky_timing [N]`.

use starloom::catalogue::{Catalogue, StarRow};
use starloom::physics::{Fidelity, KindChoice, StarRequest, star_profile};
use starloom::sky::{ChartOptions, SkyOptions, sky_chart, sky_csv, sky_view};
use starloom::units::{Gigayears, SolarMasses};
use std::time::Instant;

fn main() {
    let n: u64 = std::env::args()
        .nth(1)
        .and_then(|a| a.parse().ok())
        .unwrap_or(1_000_000);
    let profiles: Vec<_> = [0.15, 0.3, 0.6, 0.9, 1.0, 1.4, 2.5]
        .iter()
        .map(|&m| {
            star_profile(
                &StarRequest {
                    mass: SolarMasses::new(m).unwrap(),
                    age: Gigayears::new(3.0).unwrap(),
                    kind: KindChoice::Auto,
                },
                Fidelity::Fitted,
            )
        })
        .collect();
    // Deterministic scatter through a 1000 ly cube (a simple LCG).
    let mut cat = Catalogue::default();
    let mut s: u64 = 1;
    let mut next = || {
        s = s
            .wrapping_mul(6364136223846793005)
            .wrapping_add(1442695040888963407);
        (s >> 11) as f64 / (1u64 << 53) as f64
    };
    for i in 0..n {
        let pos = [
            1000.0 * next() - 500.0,
            1000.0 * next() - 500.0,
            1000.0 * next() - 500.0,
        ];
        let p = profiles[(i % profiles.len() as u64) as usize];
        cat.push(StarRow {
            id: i + 1,
            system: i + 1,
            name: format!("Star {i}"),
            position_ly: pos,
            profile: p,
            separation_au: 0.0,
            period_days: 0.0,
            origin: Default::default(),
        });
    }
    let threads = rayon::current_num_threads();
    let t = Instant::now();
    let view = sky_view(&cat, 0, &SkyOptions::default());
    let view_s = t.elapsed().as_secs_f64();
    let t = Instant::now();
    let csv = sky_csv(&view);
    let csv_s = t.elapsed().as_secs_f64();
    let t = Instant::now();
    let scene = sky_chart(&view, &ChartOptions::default());
    let chart_s = t.elapsed().as_secs_f64();
    println!(
        "{n} stars, {threads} threads: sky_view {view_s:.3} s, csv {csv_s:.3} s ({} MB), chart scene {chart_s:.4} s ({} items), {} visible",
        csv.len() / 1_000_000,
        scene.items.len(),
        view.visible_count
    );
}
