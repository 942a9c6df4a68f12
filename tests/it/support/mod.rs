//! What the test modules share, each in one place: the binary runner ([`run`]), scratch
//! folders, where the rig files are, and the rig generators that the benchmarks share
//! ([`generators`], included by path from `benches/`).

pub mod close;
pub mod generators;
pub mod golden;
pub mod run;
pub mod terminal;

use std::path::{Path, PathBuf};
use std::sync::atomic::{AtomicU32, Ordering};

pub use close::{assert_abs, assert_rel};
pub use run::{json_of, reeve, reeve_in, stdout_of};

use reeve::model::Rig;
use reeve::solve::{solve, Solution, SolveOptions};

/// The example rig of DESIGN.md section 4, byte for byte (`tests/rigs/design-example.yaml`,
/// which the library's own loader tests include too). Tests edit it and check the line
/// numbers of the problems they cause, so the file carries no comment of its own.
pub const EXAMPLE: &str = include_str!("../../rigs/design-example.yaml");

/// A small rig that solves (`tests/rigs/one-sheave.yaml`): a 5 kg weight over one
/// plain-bearing sheave, hauled by hand. Tests edit it and check line numbers.
pub const ONE_SHEAVE: &str = include_str!("../../rigs/one-sheave.yaml");

/// The package's root folder (where `rigs/` and `tests/` are).
pub const ROOT: &str = env!("CARGO_MANIFEST_DIR");

/// `rigs/NAME.yaml`, an example rig shipped to users, as a path argument.
pub fn example_rig(name: &str) -> String {
    format!("{ROOT}/rigs/{name}.yaml")
}

/// `tests/rigs/NAME`, a rig made for the tests (`review/…` for the small probing rigs).
pub fn test_rig(name: &str) -> String {
    format!("{ROOT}/tests/rigs/{name}")
}

/// Rig text, loaded and solved with the default options; fails the test, showing the
/// text, where either step fails.
#[track_caller]
pub fn solve_text(text: &str) -> (Rig, Solution) {
    let rig = reeve::rig::load_str(text, "test.yaml")
        .unwrap_or_else(|e| panic!("rig does not load: {e}\n{text}"));
    let solution = solve(&rig, &SolveOptions::default())
        .unwrap_or_else(|e| panic!("rig does not solve: {e}\n{text}"));
    (rig, solution)
}

/// `tests/rigs/NAME` with its text changed by `edit`, loaded (not solved).
#[track_caller]
pub fn edited_rig(name: &str, edit: impl FnOnce(String) -> String) -> Rig {
    let text = std::fs::read_to_string(test_rig(name)).unwrap_or_else(|e| panic!("{name}: {e}"));
    reeve::rig::load_str(&edit(text), name).unwrap_or_else(|e| panic!("{name} does not load: {e}"))
}

/// `tests/rigs/NAME`, loaded and solved with the default options.
#[track_caller]
pub fn solve_test_rig(name: &str) -> (Rig, Solution) {
    let rig = edited_rig(name, |text| text);
    let solution = solve(&rig, &SolveOptions::default()).unwrap_or_else(|e| panic!("{name}: {e}"));
    (rig, solution)
}

/// A fresh empty folder under the system's temporary folder, removed when dropped.
pub struct Scratch(PathBuf);

impl Scratch {
    /// A new folder whose name carries `tag`, this process and a counter.
    pub fn new(tag: &str) -> Scratch {
        static N: AtomicU32 = AtomicU32::new(0);
        let dir = std::env::temp_dir().join(format!(
            "reeve-test-{tag}-{}-{}",
            std::process::id(),
            N.fetch_add(1, Ordering::Relaxed)
        ));
        let _ = std::fs::remove_dir_all(&dir);
        std::fs::create_dir_all(&dir).expect("scratch folder");
        Scratch(dir)
    }

    /// Writes `text` to the file `name` in the folder; its path.
    pub fn write(&self, name: &str, text: &str) -> PathBuf {
        let path = self.0.join(name);
        std::fs::write(&path, text).unwrap_or_else(|e| panic!("{}: {e}", path.display()));
        path
    }
}

impl std::ops::Deref for Scratch {
    type Target = Path;
    fn deref(&self) -> &Path {
        &self.0
    }
}

impl AsRef<Path> for Scratch {
    fn as_ref(&self) -> &Path {
        &self.0
    }
}

impl Drop for Scratch {
    fn drop(&mut self) {
        let _ = std::fs::remove_dir_all(&self.0);
    }
}

/// Asserts the energy audit of every case of every sub-rig balances (DESIGN.md §3 step
/// 5: drive power = load power + losses, to round-off).
#[track_caller]
pub fn audit_ok(solution: &reeve::solve::Solution) {
    for sub in &solution.subrigs {
        for case in [&sub.ideal, &sub.forward, &sub.back] {
            assert!(
                case.audit_residual < 1e-9,
                "{}: energy audit residual {}",
                case.case.name(),
                case.audit_residual
            );
        }
    }
}
