//! The commands that help a designer's own tools: `completions` (a shell's completion
//! script) and `manual` (a roff man page), both generated from the clap definitions of
//! [`Cli`](super::Cli), so they cannot drift from the flags.

use std::io::Write;
use std::path::PathBuf;

use clap::{Args, CommandFactory, ValueEnum};

use super::destination::{emit, Destination};
use super::{Cli, Failure, EXIT_OK};

/// The shells `completions` writes for.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum ShellName {
    /// Bash (bash-completion).
    Bash,
    /// Zsh (a `_reeve` file on `fpath`).
    Zsh,
    /// Fish (`~/.config/fish/completions/reeve.fish`).
    Fish,
    /// PowerShell (dot-source it from the profile).
    Powershell,
}

impl ShellName {
    fn generator(self) -> clap_complete::Shell {
        match self {
            ShellName::Bash => clap_complete::Shell::Bash,
            ShellName::Zsh => clap_complete::Shell::Zsh,
            ShellName::Fish => clap_complete::Shell::Fish,
            ShellName::Powershell => clap_complete::Shell::PowerShell,
        }
    }
}

/// `reeve completions SHELL`.
#[derive(Debug, Args)]
pub struct CompletionsArgs {
    /// The shell to write the completion script for.
    #[arg(value_enum)]
    pub shell: ShellName,
}

/// `reeve manual [-o FILE]`.
#[derive(Debug, Args)]
pub struct ManualArgs {
    /// Write the page here (atomically) instead of to stdout; `-` is stdout.
    #[arg(short = 'o', long = "output", value_name = "FILE")]
    pub output: Option<PathBuf>,
}

/// Prints the completion script for one shell.
pub fn run_completions(args: CompletionsArgs) -> Result<i32, Failure> {
    let mut command = Cli::command();
    let mut script = Vec::new();
    clap_complete::generate(args.shell.generator(), &mut command, "reeve", &mut script);
    super::write_out(|w| w.write_all(&script))?;
    Ok(EXIT_OK)
}

/// Writes the manual page: the top command, then a section per subcommand with its
/// flags, so one page documents the whole command line.
pub fn run_manual(args: ManualArgs) -> Result<i32, Failure> {
    let page = manual_page().map_err(Failure::Stdout)?;
    let destination = Destination::from_arg(args.output.as_deref(), Destination::Stdout);
    // No rig is read, so there is no input to protect: an empty path matches no file.
    emit(&destination, std::path::Path::new(""), |w| {
        w.write_all(&page)
    })?;
    Ok(EXIT_OK)
}

/// The roff text of the manual page.
fn manual_page() -> std::io::Result<Vec<u8>> {
    let command = Cli::command();
    let mut page = Vec::new();
    let man = clap_mangen::Man::new(command.clone());
    man.render_title(&mut page)?;
    man.render_name_section(&mut page)?;
    man.render_synopsis_section(&mut page)?;
    man.render_description_section(&mut page)?;
    man.render_options_section(&mut page)?;
    // The command list, by the commands' own names: clap_mangen's list cites a page per
    // command (`reeve-check(1)`), which this one page replaces.
    writeln!(page, ".SH COMMANDS")?;
    for sub in command.get_subcommands() {
        let name = sub.get_name();
        let about = sub.get_about().map(|a| a.to_string()).unwrap_or_default();
        let section = if name == "help" {
            "".to_string()
        } else {
            format!(" (section REEVE {} below)", name.to_uppercase())
        };
        writeln!(
            page,
            ".TP\n\\fBreeve {name}\\fR\n{}{}",
            roff_text(&about),
            roff_text(&section)
        )?;
    }
    // Each subcommand's own synopsis and flags, under its own heading.
    for sub in command.get_subcommands().filter(|s| s.get_name() != "help") {
        let name = sub.get_name();
        writeln!(page, ".SH \"REEVE {}\"", name.to_uppercase())?;
        let sub_man = clap_mangen::Man::new(
            sub.clone()
                .display_name(format!("reeve-{name}"))
                .bin_name(format!("reeve {name}")),
        );
        let mut part = Vec::new();
        sub_man.render_synopsis_section(&mut part)?;
        sub_man.render_options_section(&mut part)?;
        // Nested sections become subsections of this one.
        let part = String::from_utf8_lossy(&part).replace(".SH ", ".SS ");
        page.extend_from_slice(part.as_bytes());
    }
    man.render_version_section(&mut page)?;
    Ok(page)
}

/// `text` as a line of roff body text: backslashes and hyphens escaped, and a leading
/// `.` or `'` (a request to roff) guarded.
fn roff_text(text: &str) -> String {
    let escaped = text.replace('\\', "\\\\").replace('-', "\\-");
    if escaped.starts_with(['.', '\'']) {
        format!("\\&{escaped}")
    } else {
        escaped
    }
}
