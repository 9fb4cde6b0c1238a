//! The `routes` command.

use std::process::ExitCode;

/// Arguments of `starloom routes`.
#[derive(Debug, clap::Args)]
pub struct RoutesArgs {}

/// Runs `starloom routes`.
pub fn run(_args: RoutesArgs) -> anyhow::Result<ExitCode> {
    Err(anyhow::anyhow!(
        "the routes command is not available in this build"
    ))
}
