//! The command-line shell: parse, validate into settings, call the
//! library, report what was written. It never computes physics, routes or
//! pixels itself.

pub mod args;
pub mod demo;
pub mod interrupt;
pub mod map;
pub mod neighbours;
pub mod populate;
pub mod progress;
pub mod routes;
pub mod sky;
pub mod star;
pub mod summary;

use args::{Cli, Command};
use std::process::ExitCode;

/// Runs one parsed command line and returns the process exit code.
pub fn run(cli: Cli) -> anyhow::Result<ExitCode> {
    match cli.command {
        Command::Star(a) => star::run(a),
        Command::Populate(a) => populate::run(a),
        Command::Summary(a) => summary::run(a),
        Command::Demo(a) => demo::run(a),
        Command::Map(a) => map::run(a),
        Command::Neighbours(a) => neighbours::run(a),
        Command::Routes(a) => routes::run(a),
        Command::Sky(a) => sky::run(a),
    }
}
