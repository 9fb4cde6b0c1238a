//! The `populate` command.

use std::process::ExitCode;

/// Arguments of `starloom populate`.
#[derive(Debug, clap::Args)]
pub struct PopulateArgs {}

/// Runs `starloom populate`.
pub fn run(_args: PopulateArgs) -> anyhow::Result<ExitCode> {
    Err(anyhow::anyhow!(
        "the populate command is not available in this build"
    ))
}
