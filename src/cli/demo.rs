//! The `demo` command: writes the built-in *Amberline Reach* scenario
//! into `output/` under the current folder.

use std::path::PathBuf;
use std::process::ExitCode;

/// Arguments of `starloom demo`.
#[derive(Debug, clap::Args)]
#[command(
    after_help = "Habitable zones and the habitable-host flag are simplified models for \
fiction and games, not guidance for any real-world decision."
)]
pub struct DemoArgs {
    /// Folder to write into (created if missing); the demo replaces only its own files there.
    #[arg(long, default_value = "output")]
    pub out: PathBuf,
}

/// Runs `starloom demo`.
pub fn run(args: DemoArgs) -> anyhow::Result<ExitCode> {
    let bar = super::progress::bar(1, "demo");
    let report = crate::demo::write_demo(&args.out, &|done, total| {
        bar.set_length(total.max(1));
        bar.set_position(done);
    })?;
    bar.finish_and_clear();
    println!(
        "{}: {} objects in {} systems, seed {}",
        crate::demo::DEMO_TITLE,
        report.objects,
        report.systems,
        crate::demo::DEMO_SEED
    );
    for f in &report.files {
        println!("wrote {}", f.display());
    }
    Ok(ExitCode::SUCCESS)
}
