//! The `star` command.

use std::process::ExitCode;

/// Arguments of `starloom star`.
#[derive(Debug, clap::Args)]
pub struct StarArgs {}

/// Runs `starloom star`.
pub fn run(_args: StarArgs) -> anyhow::Result<ExitCode> {
    Err(anyhow::anyhow!(
        "the star command is not available in this build"
    ))
}
