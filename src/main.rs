//! The starloom binary: parse, run, turn errors into exit codes.

use clap::Parser;
use std::process::ExitCode;

fn main() -> ExitCode {
    let cli = starloom::cli::args::Cli::parse();
    // Without the handler a signal still stops the run, only leaving the
    // temporary file behind, so a failure to install it is not fatal.
    let _ = starloom::cli::interrupt::install();
    match starloom::cli::run(cli) {
        Ok(code) => code,
        Err(err) => {
            if is_broken_pipe(&err) {
                return ExitCode::SUCCESS;
            }
            eprintln!("starloom: {err:#}");
            if err.downcast_ref::<starloom::Error>().is_some() {
                ExitCode::from(2)
            } else {
                ExitCode::from(1)
            }
        }
    }
}

fn is_broken_pipe(err: &anyhow::Error) -> bool {
    err.chain().any(|cause| {
        cause
            .downcast_ref::<std::io::Error>()
            .is_some_and(|e| e.kind() == std::io::ErrorKind::BrokenPipe)
    })
}
