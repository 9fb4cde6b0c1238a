//! Times complete star profiles on one core by the CPU time the thread
//! used, which other processes on a shared machine barely disturb (wall
//! time does: a busy neighbour takes the core away).
//!
//! ```text
//! cargo run --release --example physics_timing -- [ROUNDS]
//! ```
//! For 10^6 random (mass, age) pairs, as in `benches/physics_profiles.rs`
//! (log-uniform masses, uniform ages 0–13.8 Gyr), prints the fastest and
//! median CPU nanoseconds per profile over ROUNDS rounds (default 15) for
//! 0.013–150 Msun and 0.08–2 Msun, fitted fidelity, and the sum of the
//! fastest times of each tenth of the input (the steadiest figure on a
//! busy machine). CPU time comes from
//! the first field of `/proc/thread-self/schedstat` (nanoseconds on a
//! CPU), so this runs on Linux only.

#[path = "../benches/support/profile_requests.rs"]
mod profile_requests;

use profile_requests::{N_STARS, requests};
use starloom::physics::{Fidelity, star_profile};
use std::hint::black_box;

/// Nanoseconds this thread has spent on a CPU.
fn thread_cpu_ns() -> Result<u64, Box<dyn std::error::Error>> {
    let text = std::fs::read_to_string("/proc/thread-self/schedstat")?;
    let first = text.split_whitespace().next().ok_or("empty schedstat")?;
    Ok(first.parse()?)
}

fn main() -> Result<(), Box<dyn std::error::Error>> {
    let rounds: usize = std::env::args()
        .nth(1)
        .map_or(Ok(15), |r| r.parse())
        .map_err(|_| "ROUNDS must be a whole number")?;
    for (label, lo, hi) in [("0.013-150 Msun", 0.013, 150.0), ("0.08-2 Msun", 0.08, 2.0)] {
        let input = requests(lo, hi);
        let mut per_star_ns = Vec::with_capacity(rounds);
        // Fastest time of each tenth of the input over all rounds: a
        // neighbour that takes the cache or the core for a moment spoils
        // one tenth of one round, not the estimate.
        let mut fastest_chunk_ns = [u64::MAX; 10];
        // One untimed round builds the lookup tables.
        for round in 0..=rounds {
            let mut used = 0;
            for (chunk, fastest) in input
                .chunks(N_STARS / fastest_chunk_ns.len())
                .zip(&mut fastest_chunk_ns)
            {
                let start = thread_cpu_ns()?;
                let mut sum = 0.0;
                for request in chunk {
                    let p = star_profile(black_box(request), Fidelity::Fitted);
                    sum += p.luminosity_lsun + p.abs_mag_v + p.color_rgb[0] as f64;
                }
                black_box(sum);
                let chunk_ns = thread_cpu_ns()? - start;
                used += chunk_ns;
                if round > 0 {
                    *fastest = (*fastest).min(chunk_ns);
                }
            }
            if round > 0 {
                per_star_ns.push(used as f64 / N_STARS as f64);
            }
        }
        per_star_ns.sort_by(f64::total_cmp);
        println!(
            "fitted {label}: {:.1} ns from the fastest tenths, fastest round {:.1} ns, \
             median round {:.1} ns CPU per profile ({rounds} rounds of 10^6)",
            fastest_chunk_ns.iter().sum::<u64>() as f64 / N_STARS as f64,
            per_star_ns[0],
            per_star_ns[per_star_ns.len() / 2]
        );
    }
    Ok(())
}
