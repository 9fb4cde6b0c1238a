//! What the binary does on Ctrl-C (SIGINT) or SIGTERM: remove the
//! temporary files being written (see
//! [`remove_unfinished`](crate::atomic_file::remove_unfinished)), say so in
//! one line and exit with the shell's code for the signal, 128 + its
//! number (130 for SIGINT, 143 for SIGTERM). SIGHUP keeps its default, so
//! `nohup starloom populate ...` still outlives its terminal (a handler
//! would replace the ignore that `nohup` sets).

/// Starts a thread that waits for SIGINT or SIGTERM and then
/// cleans up and exits. Call it once, from the binary; library users keep
/// the default signal handling. On systems other than Unix it does
/// nothing.
pub fn install() -> std::io::Result<()> {
    #[cfg(unix)]
    {
        use signal_hook::consts::{SIGINT, SIGTERM};
        let mut signals = signal_hook::iterator::Signals::new([SIGINT, SIGTERM])?;
        std::thread::Builder::new()
            .name("signals".into())
            .spawn(move || {
                if let Some(signal) = signals.forever().next() {
                    let cleanup = crate::atomic_file::remove_unfinished();
                    eprintln!("starloom: {}", message(&cleanup));
                    std::process::exit(128 + signal);
                }
            })?;
    }
    Ok(())
}

/// The line printed after a clean-up, without the `starloom: ` prefix.
fn message(cleanup: &crate::atomic_file::Cleanup) -> String {
    if cleanup.finished == 0 {
        "interrupted; nothing was written".into()
    } else {
        format!(
            "interrupted; kept {} and left no partial one",
            crate::report::counted(cleanup.finished, "complete file", "complete files")
        )
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::atomic_file::Cleanup;

    #[test]
    fn message_says_whether_anything_was_written() {
        let mut cleanup = Cleanup::default();
        assert_eq!(message(&cleanup), "interrupted; nothing was written");
        cleanup.finished = 1;
        assert_eq!(
            message(&cleanup),
            "interrupted; kept 1 complete file and left no partial one"
        );
    }
}
