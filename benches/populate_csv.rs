//! Whole-path timings of `populate` to CSV (spec → file) for 10^6 and 10^7
//! stars, and of reading the 10^6 file back with `read_catalogue`.
//!
//! Run with `cargo bench --bench populate_csv` (set
//! `STARLOOM_BENCH_STARS=1e6` for the small case only). Each case writes a
//! fresh file into a temporary folder and deletes it afterwards; the
//! 10^7 case writes about 2.7 GB. Printed per case: wall time, ns per
//! star, bytes written, the process's peak resident memory so far
//! (`VmHWM`) and the load average beside it, since the machine is shared.
//! `VmHWM` is a high-water mark: after the 10^6 read-back it holds the
//! reader's peak, so take `populate`'s own memory from the CLI instead
//! (`/usr/bin/time -f %M starloom populate ...`).
//!
//! Measured 2026-12-02 on the 2-core VM, shared with other sessions'
//! builds, with the CLI (`starloom populate --box 1000,1000,400 --seed 1`,
//! 1 003 204 stars, 1 292 008 rows, 273 MB; fresh output path):
//! - before (main at c38c46b), load 0.7: 0.78-0.83 s wall, 1.40 s user +
//!   0.1 s system, 181-188 % CPU, peak RSS 18.8 MB (19 B/star);
//! - after (sliding window of batches written in order, loop-free number
//!   formatting), load 0.7: 0.71-0.76 s wall, 1.31-1.38 s user + 0.1 s
//!   system, 191-197 % CPU, peak RSS 12.0 MB (12 B/star);
//! - 10^7 (`--box 1000,1000,4000`, 2.74 GB) at load 3.7-3.9 (`cat
//!   /proc/loadavg`): after 12.0 s wall, before 9.1 s wall, both 13.8 s
//!   user; the wall times follow the other sessions' load, not the code.
//!   Peak RSS after: 16.8 MB (1.7 B/star).
//! - this bench at load 3.5-3.9: 1.67 s for 10^6, 18.0 s for 10^7.
//!
//! The 0.6 s target for 10^6 was not met then: about 1.4 CPU-seconds of
//! work (number formatting still about 40 % of the profile, generation
//! and physics most of the rest, `write` copying into the page cache
//! 5-10 %) cannot finish in under 0.7 s on two cores.
//!
//! Measured 2026-12-02 (branch `pop`: rows written in one window of a
//! `TextBuffer` whose room stays initialised, word-sized number stores,
//! copied primary system ids and unchanged initial masses, names from
//! padded parts, IMF constants computed once), same CLI command, old and
//! new binaries run alternately, load average 3-5 from other sessions:
//! - instructions (callgrind, `--box 737,737,737`): before 8.83e9, after
//!   6.03e9 (−32 %); formatting 4540 → about 2570 instructions a row, now
//!   about half of all instructions (physics about 15 %);
//! - 10^6 user CPU: before 1.36-1.63 s, after 0.96-1.11 s; system CPU
//!   0.07-0.9 s for both, depending on whether the page-cache pages are
//!   fresh to the VM (a plain `dd` of 273 MB takes 0.07-0.83 s system);
//! - 10^6 wall with the machine nearly idle (load 0.4-0.7), six runs
//!   each: before 0.69-1.43 s (user 1.04-1.39 s), after 0.51-0.72 s
//!   (user 0.74-0.86 s, system 0.08-0.15 s; four of six at or under
//!   0.62 s); at load 5: before 1.55-2.6 s, after 1.05-1.8 s. The
//!   workers are never blocked (per-thread `schedstat`: run + runnable ≈
//!   wall), so on idle cores the wall time is about (user + system) / 2;
//! - 10^7 (2.75 GB, previous output removed and `sync`ed first) at load
//!   2.2-2.8: before 13.4 s wall, 13.0 s user, 4.0 s system; after
//!   11.0-11.4 s wall, 7.3-8.2 s user, 3.6-5.3 s system. The main
//!   thread's `write` into the page cache costs 1.4 s per GB of system
//!   time here (3.9 s of the 10^7 run), against 0.35 s per GB for a plain
//!   `dd`, and pages that are dirty or fresh to the VM make it vary
//!   from run to run: the 6 s target for 10^7 is not met, mostly for that;
//! - peak RSS 13.5-17.7 MB (under 18 B/star) for 10^6 and 10^7.
//!
//! Measured 2026-12-02 17:00-17:15 UTC on a different 2-core VM (AMD EPYC,
//! 1 MB L2), idle apart from these runs (load average 0.2-1.2, mostly the
//! runs themselves), main with `pop`, the shorter physics chains and the
//! catalogue written in 256 KiB `write` calls (`WRITE_PIECE_BYTES` in
//! src/sampler/mod.rs; before, one call per batch of a few MiB), CLI as
//! above, previous output removed and `sync`ed first:
//! - 10^6: 0.41-0.56 s wall over 14 runs (0.75 s once, the first run
//!   after a 2.75 GB file), 0.70-0.94 s user, 0.04-0.12 s system;
//! - 10^7, old and new writes interleaved, same bytes (md5): 256 KiB
//!   writes 5.38-5.48 s wall, 7.9-9.0 s user, 1.3-2.4 s system; one call
//!   per batch 5.99-6.58 s wall, 2.7-3.2 s system;
//! - this bench (10^6, the read-back, then 10^7 in one process, no `sync`
//!   between): 10^6 0.51-0.56 s, 10^7 6.1-8.2 s (the 10^7 write follows
//!   the 10^6 file's dirty pages);
//! - peak RSS 11-17.7 MB.
//!
//! Measured 2026-12-04 18:48-19:15 UTC on a 2-core AMD EPYC VM (2 MiB L2,
//! 32 MiB L3), idle apart from these runs (load average 0.5-1.3), CLI,
//! fresh output paths:
//! - 10^6 (`--box 737,737,737 --seed 1`, 1 001 462 stars, 1 289 413
//!   rows, 273 MB): 0.45-0.69 s wall over 9 runs (7 of 9 under 0.55 s);
//!   `--box 1000,1000,400`: 0.37-0.39 s wall, 0.61-0.67 s user, 0.08-0.11 s
//!   system; peak RSS 14-17 MB;
//! - 10^7 (`--box 1587,1587,1587`, 12.9 M rows, 2.74 GB), previous output
//!   removed and `sync`ed: 4.10, 5.00, 5.18 and 6.92 s wall, 5.9-6.2 s
//!   user, 1.6-6.9 s system; replacing an existing 2.74 GB file with
//!   `--force`: 6.45-8.42 s; peak RSS 17 MB (1.7 B/star). The system
//!   time is the kernel's page cache: a plain `dd` of the same 2.74 GB
//!   in 256 KiB blocks took 0.63-6.98 s of system time on this VM;
//! - this bench: 10^6 0.36-0.77 s (0.77 s the first run after the
//!   Python comparison wrote its file), 10^7 8.1 s (after the 10^6 file
//!   and its read-back, no `sync`);
//! - `tools/compare_populate_python.py` (NumPy 2.4.6, pandas 3.1.1) on
//!   the same 1 289 413 rows: 20.7 s wall, 20.5 s of it in `to_csv`.

use starloom::catalogue::reader::read_catalogue;
use starloom::sampler::write_sector;
use starloom::spec::{DEFAULT_DENSITY_PER_LY3, SectorSpec, Shape};
use std::time::Instant;

fn proc_field(file: &str, key: &str) -> String {
    std::fs::read_to_string(file)
        .ok()
        .and_then(|t| {
            t.lines()
                .find(|l| l.starts_with(key))
                .map(|l| l[key.len()..].trim().to_string())
        })
        .unwrap_or_else(|| "?".into())
}

fn load_average() -> String {
    std::fs::read_to_string("/proc/loadavg")
        .map(|t| t.split_whitespace().take(3).collect::<Vec<_>>().join(" "))
        .unwrap_or_else(|_| "?".into())
}

fn main() {
    let sizes: Vec<f64> = std::env::var("STARLOOM_BENCH_STARS")
        .unwrap_or_else(|_| "1e6,1e7".into())
        .split(',')
        .filter_map(|s| s.trim().parse().ok())
        .collect();
    let dir = std::env::temp_dir().join(format!("starloom-bench-{}", std::process::id()));
    std::fs::create_dir_all(&dir).expect("a temporary folder");
    println!(
        "populate_csv: {} threads, load average {}",
        rayon::current_num_threads(),
        load_average()
    );
    for &stars in &sizes {
        let edge_ly = (stars / DEFAULT_DENSITY_PER_LY3).cbrt();
        let spec = SectorSpec::new(
            7,
            Shape::Box {
                size_ly: [edge_ly; 3],
            },
            [0.0; 3],
        );
        let path = dir.join(format!("sector_{stars:.0e}.csv"));
        let start = Instant::now();
        let report = write_sector(&spec, &path, true, None, &|_, _| {}).expect("populate");
        let seconds = start.elapsed().as_secs_f64();
        let bytes = std::fs::metadata(&path).map(|m| m.len()).unwrap_or(0);
        println!(
            "populate {stars:.0e}: {seconds:.3} s wall, {:.0} ns/star, {} stars ({} rows), {:.0} MB, peak RSS {}, load {}",
            seconds * 1e9 / report.stars.max(1) as f64,
            report.stars,
            report.objects,
            bytes as f64 / 1e6,
            proc_field("/proc/self/status", "VmHWM:"),
            load_average()
        );
        if stars <= 2e6 {
            let start = Instant::now();
            let cat = read_catalogue(&path).expect("read back");
            let seconds = start.elapsed().as_secs_f64();
            println!(
                "read_catalogue {stars:.0e}: {seconds:.3} s wall for {} rows, load {}",
                cat.len(),
                load_average()
            );
        }
        let _ = std::fs::remove_file(&path);
    }
    let _ = std::fs::remove_dir_all(&dir);
}
