//! The `reeve` command line (thin: parse arguments, run, map the result to an exit code).
//! The command line's modules are in `src/cli/`; the library (`src/lib.rs`) knows no clap.

use clap::Parser;

mod cli;

/// mimalloc: the studies' solves allocate many small, short-lived vectors, which it
/// serves several times faster than the system's allocator (benches/BASELINE.md, "After
/// the lean sample path").
#[global_allocator]
static ALLOCATOR: mimalloc::MiMalloc = mimalloc::MiMalloc;

fn main() {
    let args = match cli::Cli::try_parse() {
        Ok(args) => args,
        Err(e) => {
            if !e.use_stderr() {
                // Help and version.
                let _ = e.print();
                std::process::exit(0);
            }
            // The message quotes what was typed: never echo a control character raw.
            let rendered = e.render().to_string();
            eprint!("{}", reeve::text::printable_lines(&rendered));
            std::process::exit(cli::EXIT_BAD_INPUT);
        }
    };
    let code = match cli::run(args) {
        Ok(code) => code,
        Err(failure) => {
            // The error and its causes, once. Messages quote names and values: never
            // echo a control character raw.
            let message = format!("reeve: {}", reeve::text::printable_lines(&failure.chain()));
            // Under each located problem, the line of the rig and a caret (stderr only).
            eprintln!("{}", cli::snippet::with_snippets(&message));
            failure.code()
        }
    };
    std::process::exit(code);
}
