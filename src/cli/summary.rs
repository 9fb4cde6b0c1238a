//! The `summary` command.

use std::process::ExitCode;

/// Arguments of `starloom summary`.
#[derive(Debug, clap::Args)]
pub struct SummaryArgs {}

/// Runs `starloom summary`.
pub fn run(_args: SummaryArgs) -> anyhow::Result<ExitCode> {
    Err(anyhow::anyhow!(
        "the summary command is not available in this build"
    ))
}
