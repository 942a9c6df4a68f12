//! The `reeve` command line (thin: parse arguments, run, map the result to an exit code).

use clap::Parser;

fn main() {
    let cli = match reeve::cli::Cli::try_parse() {
        Ok(cli) => cli,
        Err(e) => {
            if !e.use_stderr() {
                // Help and version.
                let _ = e.print();
                std::process::exit(0);
            }
            // The message quotes what was typed: never echo a control character raw.
            let rendered = e.render().to_string();
            eprint!("{}", reeve::text::printable_lines(&rendered));
            std::process::exit(reeve::cli::EXIT_BAD_INPUT);
        }
    };
    let code = match reeve::cli::run(cli) {
        Ok(code) => code,
        Err(failure) => {
            // Messages quote names and values: never echo a control character raw.
            eprintln!("reeve: {}", reeve::text::printable_lines(&failure.message));
            failure.code
        }
    };
    std::process::exit(code);
}
