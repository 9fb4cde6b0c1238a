//! Times reading a catalogue: every column, and only the columns a map
//! sheet or a route network needs.
//!
//! ```text
//! cargo run --release --example read_timing -- CATALOGUE.csv [all|map|routes] [REPEATS]
//! ```
//! Prints the wall time of each read (best of REPEATS, default 3) and the
//! rows read; a second argument times one column set only.

use starloom::catalogue::reader::{Columns, read_catalogue_columns};
use std::path::PathBuf;
use std::time::Instant;

fn main() -> Result<(), Box<dyn std::error::Error>> {
    let path = PathBuf::from(
        std::env::args()
            .nth(1)
            .ok_or("give a catalogue file: read_timing CATALOGUE.csv")?,
    );
    let only = std::env::args().nth(2);
    let repeats: usize = std::env::args()
        .nth(3)
        .map_or(Ok(3), |r| r.parse())
        .map_err(|_| "REPEATS must be a whole number")?;
    for (label, columns) in [
        ("all", Columns::ALL),
        ("map", starloom::map::CATALOGUE_COLUMNS),
        ("routes", starloom::routes::CATALOGUE_COLUMNS),
    ] {
        if only.as_deref().is_some_and(|o| o != label) {
            continue;
        }
        let mut best = f64::INFINITY;
        let mut rows = 0;
        for _ in 0..repeats {
            let t = Instant::now();
            let cat = read_catalogue_columns(&path, columns)?;
            best = best.min(t.elapsed().as_secs_f64());
            rows = cat.len();
        }
        println!("{label:<7} columns {:8.1} ms  ({rows} rows)", best * 1e3);
    }
    Ok(())
}
