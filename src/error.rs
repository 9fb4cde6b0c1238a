//! The one error type of the library: everything a user can get wrong.
//!
//! Each variant's message is one lowercase sentence naming the option or
//! file, the bad value and what is allowed. The binary maps every
//! `starloom::Error` to exit code 2.

use std::path::PathBuf;

/// What a user can get wrong, one variant per kind of mistake.
#[derive(Debug, thiserror::Error)]
#[non_exhaustive]
pub enum Error {
    /// A command-line option or settings-file key has a value outside what it allows.
    #[error("{option} got '{value}', but {allowed}")]
    InvalidOption {
        /// The option as the user typed it, e.g. `--mass`.
        option: String,
        /// The value as the user typed it.
        value: String,
        /// What the option accepts, as a clause ("it must be a positive number of solar masses").
        allowed: String,
    },
    /// Two options that cannot be used together, or a required one missing.
    #[error("{0}")]
    Usage(String),
    /// A line of an input file is malformed.
    #[error("{path}, line {line}, column '{column}': {message}")]
    BadRow {
        /// The file being read.
        path: PathBuf,
        /// The line number, the header counting as line 1.
        line: u64,
        /// The column name.
        column: String,
        /// What is wrong, as a clause.
        message: String,
    },
    /// An input file is malformed as a whole (no header, unknown format, bad TOML).
    #[error("{path}: {message}")]
    BadFile {
        /// The file being read.
        path: PathBuf,
        /// What is wrong.
        message: String,
    },
    /// An input file cannot be opened.
    #[error("cannot read {path}: {message}")]
    MissingInput {
        /// The file asked for.
        path: PathBuf,
        /// Why it cannot be read.
        message: String,
    },
    /// An output file exists and `--force` was not given.
    #[error("{0} already exists; pass --force to replace it")]
    OutputExists(PathBuf),
    /// The folder for an output file does not exist.
    #[error("the folder for {0} does not exist; create it first or choose another --out")]
    MissingOutputFolder(PathBuf),
    /// A request would need more memory than is sensible.
    #[error("{0}")]
    TooLarge(String),
    /// An output file would not fit on its file system (see
    /// [`check_free_space`](crate::atomic_file::check_free_space)).
    #[error(
        "{} would take about {} and its file system has {} free, too little with a 5 % margin; split it with --shard K/N (each slice about 1/N of that), write it to a disk with more room or ask for a smaller region",
        path.display(),
        size_text(*estimate_bytes),
        size_text(*free_bytes)
    )]
    NoSpace {
        /// The file to be written.
        path: PathBuf,
        /// Its estimated size, bytes.
        estimate_bytes: u64,
        /// Free bytes on its file system.
        free_bytes: u64,
    },
    /// A name or id that matches nothing, with close suggestions.
    #[error("{what} '{given}' is not in the catalogue{suggestion}")]
    UnknownName {
        /// What was looked for ("system", "star").
        what: String,
        /// What the user typed.
        given: String,
        /// Either empty or "; did you mean ...?".
        suggestion: String,
    },
    /// Writing an output failed (disk full, permissions).
    #[error("cannot write {path}: {message}")]
    Write {
        /// The file being written.
        path: PathBuf,
        /// The operating system's reason.
        message: String,
    },
}

impl Error {
    /// Shorthand for [`Error::InvalidOption`].
    pub fn invalid(option: &str, value: impl ToString, allowed: impl ToString) -> Self {
        Error::InvalidOption {
            option: option.to_string(),
            value: value.to_string(),
            allowed: allowed.to_string(),
        }
    }
}

/// A byte count for a message: decimal gigabytes with one decimal from
/// 1 GB, whole megabytes below.
fn size_text(bytes: u64) -> String {
    if bytes >= 1_000_000_000 {
        format!("{:.1} GB", bytes as f64 / 1e9)
    } else {
        format!("{:.0} MB", bytes as f64 / 1e6)
    }
}

/// The library's result type.
pub type Result<T> = std::result::Result<T, Error>;
