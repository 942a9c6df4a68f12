//! Progress bars for the long studies (`spread`, `sweep`, `rank`) through indicatif,
//! drawn on stderr only when stderr is a terminal: piped or redirected output never
//! carries progress text. The library only reports its steps
//! ([`reeve::progress::Progress`]); this is the one place a bar is drawn.

use std::io::IsTerminal;

use indicatif::{ProgressBar, ProgressDrawTarget, ProgressStyle};

/// A bar for one study, hidden unless stderr is a terminal (and `TERM` is not `dumb`).
pub struct Bar {
    bar: ProgressBar,
    terminal: bool,
}

impl Bar {
    /// A bar labelled `what` (`spread`, `sweep`, `rank`).
    pub fn new(what: &'static str) -> Bar {
        let terminal =
            std::io::stderr().is_terminal() && std::env::var("TERM").map_or(true, |t| t != "dumb");
        // Hidden until the study says how many runs it makes, so no empty bar shows.
        let bar = ProgressBar::hidden();
        let style = ProgressStyle::with_template("{msg} [{bar:40}] {pos}/{len} runs, {eta} left")
            .map(|s| s.progress_chars("=> "))
            .unwrap_or_else(|_| ProgressStyle::default_bar());
        bar.set_style(style);
        bar.set_message(what);
        Bar { bar, terminal }
    }
}

impl reeve::progress::Progress for Bar {
    fn start(&self, total: usize) {
        self.bar.set_length(total as u64);
        self.bar.set_position(0);
        if self.terminal {
            self.bar.set_draw_target(ProgressDrawTarget::stderr());
        }
    }

    fn step(&self) {
        self.bar.inc(1);
    }

    fn steps(&self, n: usize) {
        self.bar.inc(n as u64);
    }

    fn finish(&self) {
        self.bar.finish_and_clear();
    }
}

impl Drop for Bar {
    /// A study that fails leaves no bar behind its message.
    fn drop(&mut self) {
        self.bar.finish_and_clear();
    }
}
