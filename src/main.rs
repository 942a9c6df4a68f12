//! The `reeve` command line (thin: parse arguments, run, map the result to an exit code).

use clap::Parser;

fn main() {
    let cli = match reeve::cli::Cli::try_parse() {
        Ok(cli) => cli,
        Err(e) => {
            let code = if e.use_stderr() {
                reeve::cli::EXIT_BAD_INPUT
            } else {
                0
            };
            let _ = e.print();
            std::process::exit(code);
        }
    };
    let code = match reeve::cli::run(cli) {
        Ok(code) => code,
        Err(failure) => {
            eprintln!("reeve: {}", failure.message);
            failure.code
        }
    };
    std::process::exit(code);
}
