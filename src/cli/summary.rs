//! The `summary` command: counts, shares and statistics of a catalogue.

use crate::render::hr_diagram::hr_scene;
use crate::render::output::{Format, parse_dpi, write_scenes};
use crate::render::paper::{Theme, parse_theme};
use std::path::PathBuf;
use std::process::ExitCode;

/// Arguments of `starloom summary`.
#[derive(Debug, clap::Args)]
#[command(
    after_help = "The hz_inner_au/hz_outer_au columns and the habitable-host flag are simplified \
models for fiction and games, not guidance for any real-world decision."
)]
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
    let dpi = parse_dpi(&args.dpi)?;
    let theme = parse_theme(&args.theme)?;
    let Some(path) = &args.hr else {
        return Ok(None);
    };
    Format::from_path(path, "--hr")?;
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
    // The sector's own volume, from the sidecar spec when there is one;
    // for a catalogue written with --shard K/N, the shard's part of it.
    let volume = crate::spec::SpecFile::read(&crate::spec::sidecar_path(&args.catalogue))
        .ok()
        .and_then(|f| {
            let shard = f
                .shard
                .as_deref()
                .and_then(|t| super::populate::parse_shard("shard", t).ok());
            // Pins do not change the volume, and the pin file may have moved.
            let mut volume_only = f;
            volume_only.pin = None;
            volume_only.pin_fnv1a = None;
            let spec = volume_only.resolve(0, std::path::Path::new("/")).ok()?;
            Some(crate::sampler::shard_volume_ly3(&spec, shard))
        });
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
    print!("{}", crate::report::summary_text(&cat, &s));
    Ok(ExitCode::SUCCESS)
}
