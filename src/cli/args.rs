//! The command-line definition (clap derive). Values that may be negative
//! or carry units are taken as text and validated in each command's
//! settings step, so the user gets our own message, not a parser's.

use clap::{Parser, Subcommand};

const ABOUT: &str = "Fill a volume of space with believable stars, work out who is near whom, and draw printable map sheets.\n\n\
Starloom is a fiction and game tool: its habitable zones and habitable-host flags are simplified models \
for storytelling, not guidance for any real-world decision.";

/// starloom command line.
#[derive(Debug, Parser)]
#[command(name = "starloom", version, about = ABOUT, long_about = ABOUT)]
pub struct Cli {
    /// What to do.
    #[command(subcommand)]
    pub command: Command,
}

/// The subcommands. Each is parsed once per run, so the size difference
/// between variants does not matter.
#[derive(Debug, Subcommand)]
#[allow(clippy::large_enum_variant)]
pub enum Command {
    /// Profile of one star from its mass (and age).
    Star(super::star::StarArgs),
    /// Fill a volume with stars and write a catalogue.
    Populate(super::populate::PopulateArgs),
    /// Counts, shares and statistics of a catalogue.
    Summary(super::summary::SummaryArgs),
    /// Write the built-in demo scenario into output/.
    Demo(super::demo::DemoArgs),
    /// Draw printable map sheets of a catalogue.
    Map(super::map::MapArgs),
    /// Nearest systems of each system.
    #[command(visible_alias = "neighbors")]
    Neighbours(super::neighbours::NeighboursArgs),
    /// Jump networks, regions, lanes and shortest routes.
    Routes(super::routes::RoutesArgs),
    /// The night sky seen from one star.
    Sky(super::sky::SkyArgs),
}
