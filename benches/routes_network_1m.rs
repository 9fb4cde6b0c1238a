//! The jump network of a sector of about 10^6 stars with an 8 ly jump
//! range: reading the catalogue, then building the network (k-d tree and
//! pair search), its regions and its lanes. Each part is timed on its own.
//!
//! Run with `cargo bench --bench routes_network_1m`. The first run writes
//! the catalogue (a sphere of 457 ly radius at the default density, seed
//! one) under the target directory and reuses it afterwards. Set
//! `STARLOOM_BENCH_RUNS` to change the number of timed runs (default 3).

use starloom::routes::{JumpNetwork, Systems};
use starloom::spec::{SectorSpec, Shape};
use std::time::Instant;

const JUMP_LY: f64 = 8.0;
const RADIUS_LY: f64 = 457.0;

fn main() {
    let dir = std::path::PathBuf::from(env!("CARGO_TARGET_TMPDIR"));
    std::fs::create_dir_all(&dir).expect("target tmp dir");
    let path = dir.join("routes_network_1m.csv");
    if !path.exists() {
        let spec = SectorSpec::new(
            1,
            Shape::Sphere {
                radius_ly: RADIUS_LY,
            },
            [0.0; 3],
        );
        let t = Instant::now();
        let rep = starloom::sampler::write_sector(&spec, &path, false, None, &|_, _| {})
            .expect("the benchmark sector is written");
        eprintln!(
            "wrote {} ({} objects) in {:.2} s",
            path.display(),
            rep.objects,
            t.elapsed().as_secs_f64()
        );
    }
    let runs: usize = std::env::var("STARLOOM_BENCH_RUNS")
        .ok()
        .and_then(|v| v.parse().ok())
        .unwrap_or(3);
    println!(
        "threads {}, jump {JUMP_LY} ly, catalogue {}",
        rayon::current_num_threads(),
        path.display()
    );
    println!(
        "run   read_s  systems_s  network_s  forest_s  net+forest_s  total_s  systems  links  regions  lanes_ly"
    );
    for run in 0..runs {
        let t0 = Instant::now();
        let cat = starloom::catalogue::read_catalogue(&path).expect("catalogue reads");
        let t1 = Instant::now();
        let systems = Systems::from_catalogue(&cat);
        let t2 = Instant::now();
        let net = JumpNetwork::build(&systems.positions_ly, JUMP_LY);
        let t3 = Instant::now();
        let forest = net.spanning_forest();
        let s = net.summary(&forest);
        let t4 = Instant::now();
        let secs = |a: Instant, b: Instant| (b - a).as_secs_f64();
        println!(
            "{run:>3}  {:>7.3}  {:>9.3}  {:>9.3}  {:>8.3}  {:>12.3}  {:>7.3}  {:>7}  {:>5}  {:>7}  {:.1}",
            secs(t0, t1),
            secs(t1, t2),
            secs(t2, t3),
            secs(t3, t4),
            secs(t1, t4),
            secs(t0, t4),
            s.systems,
            s.links,
            s.regions,
            s.lanes_ly
        );
        eprintln!("({} rows)", cat.len());
    }
}
