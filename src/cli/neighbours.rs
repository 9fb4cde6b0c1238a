//! The `neighbours` command (alias `neighbors`): the nearest systems of
//! each system, as CSV.

use crate::error::Error;
use crate::routes::{Systems, neighbours, write_neighbours_csv};
use std::io::Write;
use std::path::PathBuf;
use std::process::ExitCode;

/// Arguments of `starloom neighbours`.
#[derive(Debug, clap::Args)]
pub struct NeighboursArgs {
    /// The catalogue (.csv or .jsonl).
    pub catalogue: PathBuf,
    /// How many nearest systems to list for each system (5 unless
    /// `--within` is given).
    #[arg(long, allow_hyphen_values = true)]
    pub k: Option<String>,
    /// List every system within this distance instead (light years, or
    /// with a unit: `12ly`, `4pc`); with `--k` too, at most k of them.
    #[arg(long, allow_hyphen_values = true)]
    pub within: Option<String>,
    /// The CSV file to write (`system,neighbour,rank,distance_ly`);
    /// without it the table goes to standard output.
    #[arg(long)]
    pub out: Option<PathBuf>,
    /// Replace an existing output file.
    #[arg(long)]
    pub force: bool,
}

/// Default number of neighbours.
const DEFAULT_K: usize = 5;

fn parse_k(text: &str) -> crate::Result<usize> {
    match text.trim().parse::<usize>() {
        Ok(k) if k > 0 => Ok(k),
        _ => Err(Error::invalid(
            "--k",
            text,
            "it must be a whole number of systems, 1 or more",
        )),
    }
}

/// Runs `starloom neighbours`.
pub fn run(args: NeighboursArgs) -> anyhow::Result<ExitCode> {
    let k = args.k.as_deref().map(parse_k).transpose()?;
    let within_ly = args
        .within
        .as_deref()
        .map(|t| crate::spec::parse_length_ly("--within", t))
        .transpose()?;
    let k = match (k, within_ly) {
        (None, None) => Some(DEFAULT_K),
        (k, _) => k,
    };
    if let Some(out) = &args.out {
        crate::atomic_file::check_target(out, args.force)?;
    }
    let cat = crate::catalogue::read_catalogue(&args.catalogue)?;
    let systems = Systems::from_catalogue(&cat);
    let table = neighbours(&systems, k, within_ly);
    match &args.out {
        Some(out) => {
            crate::atomic_file::write_atomic(out, args.force, |w| {
                write_neighbours_csv(w, &systems, &table)
            })?;
            let rows: usize = table.iter().map(Vec::len).sum();
            eprintln!(
                "wrote {} ({} for {})",
                out.display(),
                crate::report::counted(rows as u64, "row", "rows"),
                crate::report::counted(systems.len() as u64, "system", "systems")
            );
        }
        None => {
            let stdout = std::io::stdout();
            let mut w = std::io::BufWriter::new(stdout.lock());
            write_neighbours_csv(&mut w, &systems, &table)?;
            w.flush()?;
        }
    }
    Ok(ExitCode::SUCCESS)
}
