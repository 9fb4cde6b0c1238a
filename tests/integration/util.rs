//! Helpers: a fresh work folder per test and a runner for the built binary.

#![allow(dead_code)]

use std::path::{Path, PathBuf};
use std::process::{Command, Output};

/// A fresh, empty folder under the target directory for one test.
pub fn work_dir(name: &str) -> PathBuf {
    let dir = PathBuf::from(env!("CARGO_TARGET_TMPDIR")).join(name);
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).unwrap();
    dir
}

/// Runs the starloom binary with `args` in folder `dir`.
pub fn starloom(dir: &Path, args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_starloom"))
        .args(args)
        .current_dir(dir)
        .output()
        .expect("the starloom binary runs")
}

/// Standard output as text.
pub fn stdout(out: &Output) -> String {
    String::from_utf8_lossy(&out.stdout).into_owned()
}

/// Standard error as text.
pub fn stderr(out: &Output) -> String {
    String::from_utf8_lossy(&out.stderr).into_owned()
}

/// Asserts a user error: exit code 2, one line on stderr mentioning `needle`.
pub fn assert_user_error(out: &Output, needle: &str) {
    let err = stderr(out);
    assert_eq!(out.status.code(), Some(2), "exit code; stderr: {err}");
    assert!(
        err.contains(needle),
        "stderr should mention {needle:?}: {err}"
    );
    assert_eq!(
        err.trim_end().lines().count(),
        1,
        "one line expected: {err}"
    );
    assert!(!err.contains("panicked"), "no panic: {err}");
}

/// Runs the starloom binary with `args` in folder `dir`, with extra
/// environment variables `envs`.
pub fn starloom_env(dir: &Path, args: &[&str], envs: &[(&str, &str)]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_starloom"))
        .args(args)
        .envs(envs.iter().copied())
        .current_dir(dir)
        .output()
        .expect("the starloom binary runs")
}

/// Runs the binary and asserts it succeeded; returns its output.
pub fn starloom_ok(dir: &Path, args: &[&str]) -> Output {
    let out = starloom(dir, args);
    assert_eq!(
        out.status.code(),
        Some(0),
        "starloom {args:?} failed: {}",
        stderr(&out)
    );
    out
}

/// The bytes of a file in `dir`.
pub fn read_bytes(dir: &Path, name: &str) -> Vec<u8> {
    std::fs::read(dir.join(name)).unwrap_or_else(|e| panic!("cannot read {name}: {e}"))
}
