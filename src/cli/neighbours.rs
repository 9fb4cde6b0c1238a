//! The `neighbours` command.

use std::process::ExitCode;

/// Arguments of `starloom neighbours`.
#[derive(Debug, clap::Args)]
pub struct NeighboursArgs {}

/// Runs `starloom neighbours`.
pub fn run(_args: NeighboursArgs) -> anyhow::Result<ExitCode> {
    Err(anyhow::anyhow!(
        "the neighbours command is not available in this build"
    ))
}
