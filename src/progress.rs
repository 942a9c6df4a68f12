//! Told how far a long run has got (a study's runs, a motion's solved positions), for a
//! progress bar: the library draws nothing itself (the command line shows a bar on a
//! terminal only). Its own module so that the solver (`reeve motion`) and the studies
//! both report through it without one depending on the other.

/// Told how far a long run has got. Steps may be reported from several threads at once.
pub trait Progress: Sync {
    /// The run is about to make `total` steps.
    fn start(&self, _total: usize) {}
    /// One more step is done.
    fn step(&self) {}
    /// `n` more steps are done (a thread that reports its steps in batches, so that
    /// threads do not contend for the bar on every step).
    fn steps(&self, n: usize) {
        for _ in 0..n {
            self.step();
        }
    }
    /// The run is done (also after an error).
    fn finish(&self) {}
}

/// No progress shown.
impl Progress for () {}
