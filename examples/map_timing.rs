//! Times a map sheet of about a million stars on A3 at 300 dpi, stage by
//! stage: reading the catalogue, building the sheet (selection,
//! projection, labels, the display list), rasterising, encoding the PNG
//! and writing the file.
//!
//! The setting is invented: the "Cindermark Expanse", a 1000 × 1000 × 400 ly
//! slab at the default local density (about 10^6 objects).
//!
//! ```text
//! cargo run --release --example map_timing [-- CATALOGUE.csv [RUNS]]
//! ```
//! Without a catalogue argument one is generated once into the target
//! folder and reused. With `RUNS` above 1 the catalogue is read once and
//! the drawing stages run `RUNS` times; the best and the median are shown.
//!
//! Figures for a 1 289 414-row catalogue (942 652 systems) on the 2
//! cores, idle at the time (load average 0.0-0.3, 2 December 2026), one
//! run each as the command runs: before the band pipeline, build sheet
//! 192 ms and write PNG (rasterise + encode + write) 268 ms, 460 ms in
//! all; after, build sheet 173 ms, draw + encode PNG 151 ms, write file
//! 13 ms, 337 ms in all (PNG 7.4 MB). Under load from other sessions'
//! builds (load average 1-2) the same stages took 180-220, 150-170 and
//! 6-13 ms.
//!
//! 2026-12-04 on a 2-core AMD EPYC VM, idle (load average 0.5-1.2): the
//! generated catalogue (1 288 502 rows) read 157-169 ms, built 109-111 ms,
//! drawn and encoded 117-120 ms, written 10-34 ms; on `populate --box
//! 737,737,737 --seed 1` (1 289 413 rows) with 5 runs, drawing total
//! 147 ms best, 178 ms median. The whole command, `starloom map p.csv
//! --paper a3 --out m.png --timings`: 0.36-0.39 s wall over 4 runs (0.45-
//! 0.47 s user, 0.14-0.18 s system, 223 MB peak RSS); the same sheet from
//! `tools/compare_map_python.py` (matplotlib 3.11.2): 7.8-8.1 s.

use starloom::map::{MapOptions, build_sheets};
use starloom::render::overlay::Overlay;
use starloom::render::paper::Paper;
use starloom::spec::{SectorSpec, Shape};
use std::path::PathBuf;
use std::time::{Duration, Instant};

fn ms(d: Duration) -> f64 {
    d.as_secs_f64() * 1e3
}

fn main() -> Result<(), Box<dyn std::error::Error>> {
    let dir = PathBuf::from("target/map_timing");
    std::fs::create_dir_all(&dir)?;
    let csv = match std::env::args().nth(1) {
        Some(p) => PathBuf::from(p),
        None => {
            let path = dir.join("cindermark.csv");
            if !path.exists() {
                let mut spec = SectorSpec::new(
                    20_261_202,
                    Shape::Box {
                        size_ly: [1000.0, 1000.0, 400.0],
                    },
                    [0.0, 0.0, 0.0],
                );
                spec.title = Some("Cindermark Expanse".into());
                let t = Instant::now();
                let cat = starloom::sampler::generate(&spec, &|_, _| {})?;
                starloom::catalogue::writer::write_catalogue(&cat, &path, true)?;
                eprintln!("generated {} rows in {:.2?}", cat.len(), t.elapsed());
            }
            path
        }
    };
    let runs: usize = match std::env::args().nth(2) {
        Some(n) => n.parse()?,
        None => 1,
    };
    let t0 = Instant::now();
    let cat = starloom::catalogue::reader::read_catalogue_columns(
        &csv,
        starloom::map::CATALOGUE_COLUMNS,
    )?;
    let read = t0.elapsed();
    let opts = MapOptions {
        paper: Paper::A3,
        dpi: 300.0,
        title: Some("Cindermark Expanse".into()),
        ..MapOptions::default()
    };
    let out = dir.join("cindermark.png");
    // Per run: build, draw + encode (pipelined, as the command does),
    // write, drawing total; then, apart, rasterise alone and encode alone.
    let mut stages: [Vec<Duration>; 6] = Default::default();
    let mut systems = 0;
    let mut png_len = 0;
    for _ in 0..runs.max(1) {
        let t1 = Instant::now();
        let sheets = build_sheets(&cat, &opts, &Overlay::default())?;
        let t2 = Instant::now();
        let scene = &sheets.sheets[0].scene;
        let bytes = starloom::render::output::png_bytes(scene, opts.dpi)?;
        let t3 = Instant::now();
        starloom::atomic_file::write_bytes(&out, true, &bytes)?;
        let t4 = Instant::now();
        let pixmap = starloom::render::raster::rasterise(scene, opts.dpi)?;
        let t5 = Instant::now();
        let mut again = Vec::new();
        starloom::render::output::encode_png(&pixmap, opts.dpi, &mut again)?;
        let t6 = Instant::now();
        assert!(again == bytes, "encode_png and png_bytes differ");
        systems = sheets.systems;
        png_len = bytes.len();
        for (k, d) in [t2 - t1, t3 - t2, t4 - t3, t4 - t1, t5 - t4, t6 - t5]
            .into_iter()
            .enumerate()
        {
            stages[k].push(d);
        }
    }
    println!(
        "{} rows, {} systems on A3 at 300 dpi ({} threads), PNG {:.1} MB",
        cat.len(),
        systems,
        rayon::current_num_threads(),
        png_len as f64 / 1e6
    );
    println!("read catalogue        {:>8.1} ms", ms(read));
    let names = [
        "build sheet",
        "draw + encode PNG",
        "write file",
        "drawing total",
        "(rasterise alone)",
        "(encode alone)",
    ];
    for (name, mut times) in names.into_iter().zip(stages) {
        times.sort();
        if times.len() == 1 {
            println!("{name:<21} {:>8.1} ms", ms(times[0]));
        } else {
            println!(
                "{name:<21} {:>8.1} ms best, {:>8.1} ms median of {}",
                ms(times[0]),
                ms(times[times.len() / 2]),
                times.len()
            );
        }
    }
    Ok(())
}
