//! The `sky` command.

use std::process::ExitCode;

/// Arguments of `starloom sky`.
#[derive(Debug, clap::Args)]
pub struct SkyArgs {}

/// Runs `starloom sky`.
pub fn run(_args: SkyArgs) -> anyhow::Result<ExitCode> {
    Err(anyhow::anyhow!(
        "the sky command is not available in this build"
    ))
}
