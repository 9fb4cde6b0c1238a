//! The `demo` command.

use std::process::ExitCode;

/// Arguments of `starloom demo`.
#[derive(Debug, clap::Args)]
pub struct DemoArgs {}

/// Runs `starloom demo`.
pub fn run(_args: DemoArgs) -> anyhow::Result<ExitCode> {
    Err(anyhow::anyhow!(
        "the demo command is not available in this build"
    ))
}
