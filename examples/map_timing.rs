//! Times a map sheet of about a million stars on A3 at 300 dpi: reading the
//! catalogue, building the sheet and writing the PNG, stage by stage.
//!
//! The setting is invented: the "Cindermark Expanse", a 1000 × 1000 × 400 ly
//! slab at the default local density (about 10^6 objects).
//!
//! ```text
//! cargo run --release --example map_timing [-- CATALOGUE.csv]
//! ```
//! Without an argument the catalogue is generated once into the target
//! folder and reused.

use starloom::map::{MapOptions, build_sheets};
use starloom::render::overlay::Overlay;
use starloom::render::paper::Paper;
use starloom::spec::{SectorSpec, Shape};
use std::path::PathBuf;
use std::time::Instant;

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
    let t0 = Instant::now();
    let cat = starloom::catalogue::reader::read_catalogue_columns(
        &csv,
        starloom::map::CATALOGUE_COLUMNS,
    )?;
    let t1 = Instant::now();
    let opts = MapOptions {
        paper: Paper::A3,
        dpi: 300.0,
        title: Some("Cindermark Expanse".into()),
        ..MapOptions::default()
    };
    let sheets = build_sheets(&cat, &opts, &Overlay::default())?;
    let t2 = Instant::now();
    let out = dir.join("cindermark.png");
    starloom::render::output::write_scenes(
        std::slice::from_ref(&sheets.sheets[0].scene),
        &out,
        opts.dpi,
        true,
    )?;
    let t3 = Instant::now();
    println!(
        "{} rows, {} systems on A3 at 300 dpi ({} threads)",
        cat.len(),
        sheets.systems,
        rayon::current_num_threads()
    );
    println!("read catalogue {:>8.1} ms", (t1 - t0).as_secs_f64() * 1e3);
    println!("build sheet    {:>8.1} ms", (t2 - t1).as_secs_f64() * 1e3);
    println!("write PNG      {:>8.1} ms", (t3 - t2).as_secs_f64() * 1e3);
    println!("total          {:>8.1} ms", (t3 - t0).as_secs_f64() * 1e3);
    Ok(())
}
