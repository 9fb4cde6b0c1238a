//! Ctrl-C or SIGTERM during a long write removes the hidden temporary
//! file and exits with 128 + the signal number (regression: the partial
//! `.NAME.<pid>.tmp`, gigabytes of it, used to stay behind).

use crate::util::{stderr, work_dir};
use std::process::{Command, Stdio};
use std::time::{Duration, Instant};

/// Starts a populate of a few gigabytes, sends `signal` as soon as its
/// temporary file has data, and checks the exit code, the message and
/// that the folder is left empty.
#[cfg(unix)]
fn check_interrupted_write(name: &str, signal: &str, code: i32) {
    let dir = work_dir(name);
    let child = Command::new(env!("CARGO_BIN_EXE_starloom"))
        .args([
            "populate", "--sphere", "985", "--seed", "1", "--out", "k.csv",
        ])
        .current_dir(&dir)
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .expect("the starloom binary runs");
    let started = Instant::now();
    let writing = || {
        std::fs::read_dir(&dir).unwrap().any(|e| {
            let e = e.unwrap();
            e.file_name().to_string_lossy().ends_with(".tmp")
                && e.metadata().is_ok_and(|m| m.len() > 0)
        })
    };
    while !writing() && started.elapsed() < Duration::from_secs(60) {
        std::thread::sleep(Duration::from_millis(5));
    }
    assert!(writing(), "no temporary file appeared within 60 s");
    let kill = Command::new("kill")
        .args([signal, &child.id().to_string()])
        .status()
        .expect("kill runs");
    assert!(kill.success());
    let out = child.wait_with_output().unwrap();
    let err = stderr(&out);
    assert_eq!(out.status.code(), Some(code), "exit code; stderr: {err}");
    assert_eq!(err.trim_end(), "starloom: interrupted; nothing was written");
    let left: Vec<_> = std::fs::read_dir(&dir)
        .unwrap()
        .map(|e| e.unwrap().file_name())
        .collect();
    assert!(left.is_empty(), "left behind: {left:?}");
}

#[test]
#[cfg(unix)]
fn sigint_during_populate_removes_the_temporary_file() {
    check_interrupted_write("interrupt_sigint", "-INT", 130);
}

#[test]
#[cfg(unix)]
fn sigterm_during_populate_removes_the_temporary_file() {
    check_interrupted_write("interrupt_sigterm", "-TERM", 143);
}
