//! The `map` command.

use std::process::ExitCode;

/// Arguments of `starloom map`.
#[derive(Debug, clap::Args)]
pub struct MapArgs {}

/// Runs `starloom map`.
pub fn run(_args: MapArgs) -> anyhow::Result<ExitCode> {
    Err(anyhow::anyhow!(
        "the map command is not available in this build"
    ))
}
