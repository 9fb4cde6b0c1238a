//! The `summary` command: counts, shares and statistics of a catalogue.

use crate::render::hr_diagram::hr_scene;
use crate::render::output::{Format, check_dpi, write_scenes};
use crate::render::paper::Theme;
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
    /// Also draw a Hertzsprung–Russell diagram into this file (.png, .svg or .pdf).
    #[arg(long, value_name = "PATH")]
    pub hr: Option<PathBuf>,
    /// Resolution of a PNG diagram, dots per inch (10–2400).
    #[arg(
        long,
        default_value = "300",
        value_name = "N",
        allow_hyphen_values = true
    )]
    pub dpi: String,
    /// Colours of the diagram: print (light paper) or screen (dark).
    #[arg(long, default_value = "print", value_name = "THEME")]
    pub theme: String,
    /// Replace the diagram file if it exists.
    #[arg(long)]
    pub force: bool,
}

/// Checks the diagram options before any work, so a refusal costs nothing.
fn diagram_options(args: &SummaryArgs) -> crate::Result<Option<(PathBuf, f32, Theme)>> {
    let dpi: f32 = args.dpi.trim().parse().map_err(|_| {
        crate::Error::invalid(
            "--dpi",
            &args.dpi,
            "it must be a resolution from 10 to 2400 dots per inch",
        )
    })?;
    check_dpi("--dpi", dpi)?;
    let theme = Theme::parse(&args.theme).ok_or_else(|| {
        crate::Error::invalid("--theme", &args.theme, "it must be print or screen")
    })?;
    let Some(path) = &args.hr else {
        return Ok(None);
    };
    Format::from_path(path)?;
    crate::atomic_file::check_target(path, args.force)?;
    Ok(Some((path.clone(), dpi, theme)))
}

/// Runs `starloom summary`.
pub fn run(args: SummaryArgs) -> anyhow::Result<ExitCode> {
    let diagram = diagram_options(&args)?;
    let cat = crate::catalogue::read_catalogue(&args.catalogue)?;
    if let Some((path, dpi, theme)) = &diagram {
        let scene = hr_scene(&cat, *theme);
        write_scenes(std::slice::from_ref(&scene), path, *dpi, args.force)?;
    }
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
    if let Some((path, _, _)) = &diagram {
        println!(
            "wrote the Hertzsprung–Russell diagram to {}",
            path.display()
        );
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
