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
    print!("{}", crate::report::summary_text(&cat, &s));
    Ok(ExitCode::SUCCESS)
}
