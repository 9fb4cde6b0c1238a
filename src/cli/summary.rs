//! The `summary` command: counts, shares and statistics of a catalogue.

use std::path::PathBuf;
use std::process::ExitCode;

/// Arguments of `starloom summary`.
#[derive(Debug, clap::Args)]
pub struct SummaryArgs {
    /// The catalogue (.csv or .jsonl).
    pub catalogue: PathBuf,
    /// Print JSON instead of text.
    #[arg(long)]
    pub json: bool,
}

/// Runs `starloom summary`.
pub fn run(args: SummaryArgs) -> anyhow::Result<ExitCode> {
    let cat = crate::catalogue::read_catalogue(&args.catalogue)?;
    // The sector's own volume, from the sidecar spec when there is one.
    let mut side = args.catalogue.as_os_str().to_owned();
    side.push(".toml");
    let volume = crate::spec::SpecFile::read(std::path::Path::new(&side))
        .ok()
        .and_then(|f| f.resolve(0, std::path::Path::new("/")).ok())
        .map(|s| s.shape.volume_ly3());
    let s = crate::report::summarise(&cat, volume);
    if args.json {
        println!("{}", serde_json::to_string_pretty(&s)?);
        return Ok(ExitCode::SUCCESS);
    }
    if let Some(t) = &cat.meta.title {
        println!("{t}");
    }
    println!(
        "{} objects: {} stars, {} brown dwarfs, in {} systems",
        s.objects, s.stars, s.brown_dwarfs, s.systems
    );
    println!(
        "volume {:.4e} ly³, {:.5} stars per ly³",
        s.volume_ly3, s.star_density_per_ly3
    );
    println!(
        "multiple systems {:.1} %, {:.3} companions per system",
        100.0 * s.multiplicity_fraction,
        s.companions_per_system
    );
    println!("by kind:");
    for (k, n) in &s.by_kind {
        println!(
            "  {k:<18} {n:>10}  {:>6.2} %",
            100.0 * *n as f64 / s.objects.max(1) as f64
        );
    }
    let ms: u64 = s.main_sequence_by_class.values().sum();
    println!("main sequence by class:");
    for (c, n) in &s.main_sequence_by_class {
        println!(
            "  {c:<18} {n:>10}  {:>6.2} %",
            100.0 * *n as f64 / ms.max(1) as f64
        );
    }
    println!(
        "habitable-host candidates (simplified model, for fiction): {}",
        s.habitable_hosts
    );
    println!(
        "nearest system: mean {:.2} ly, median {:.2} ly (random placement expects a mean of {:.2} ly)",
        s.nearest_neighbour_mean_ly,
        s.nearest_neighbour_median_ly,
        s.nearest_neighbour_poisson_mean_ly
    );
    Ok(ExitCode::SUCCESS)
}
