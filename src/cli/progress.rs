//! Progress bars: shown on a terminal, silent when stderr is piped.

use indicatif::{ProgressBar, ProgressDrawTarget, ProgressStyle};
use std::io::IsTerminal;

/// A progress bar over `total` units of work, hidden unless stderr is a terminal.
pub fn bar(total: u64, what: &str) -> ProgressBar {
    let bar = ProgressBar::with_draw_target(Some(total), ProgressDrawTarget::stderr());
    if !std::io::stderr().is_terminal() {
        bar.set_draw_target(ProgressDrawTarget::hidden());
    }
    bar.set_style(
        ProgressStyle::with_template("{msg:>10} [{bar:40}] {percent:>3}% {elapsed_precise}")
            .unwrap_or_else(|_| ProgressStyle::default_bar())
            .progress_chars("=> "),
    );
    bar.set_message(what.to_string());
    bar
}
