//! `reeve new KIND [NAME]`: a starter rig for one of the common jobs, written atomically
//! and never over an existing file, with the rig schema (`rig-1.json`) beside it for the
//! editor that reads the rig's modeline. `reeve new` alone lists the kinds.
//!
//! Each starter is a commented rig of our own invented scenario (`src/cli/starters/`)
//! that loads and solves; the tests check every one.

use std::path::{Path, PathBuf};

use clap::Args;

use reeve::report::file::write_new;

use super::args::one_of;
use super::destination::{emit, Destination};
use super::schema::schema_text;
use super::{write_out, Failure, EXIT_OK};

/// One starter rig.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Starter {
    /// The word of `reeve new KIND`.
    pub name: &'static str,
    /// One line on what it is.
    pub describe: &'static str,
    /// The rig.
    pub text: &'static str,
}

/// The starters, in the order `reeve new` lists them.
pub const STARTERS: &[Starter] = &[
    Starter {
        name: "tackle",
        describe: "a multi-part tackle (four parts, two blocks) lifting a load by hand",
        text: include_str!("starters/tackle.yaml"),
    },
    Starter {
        name: "counterweight",
        describe: "a counterweight over one sheave balancing a sliding panel",
        text: include_str!("starters/counterweight.yaml"),
    },
    Starter {
        name: "hinge",
        describe: "a hinge drum turning a lid, pulled by a cord over a lead sheave",
        text: include_str!("starters/hinge.yaml"),
    },
    Starter {
        name: "rescue",
        describe: "a 2:1 rescue raise with a redirect (with the life-safety cautions)",
        text: include_str!("starters/rescue.yaml"),
    },
    Starter {
        name: "line-set",
        describe: "a theatre counterweight line set: two lift lines, arbor, purchase line",
        text: include_str!("starters/line-set.yaml"),
    },
    Starter {
        name: "winch",
        describe: "a winch drum raising a weight over one head sheave",
        text: include_str!("starters/winch.yaml"),
    },
];

/// The schema file the starters' modeline names, written beside the rig.
pub const SCHEMA_FILE: &str = "rig-1.json";

/// `reeve new [KIND] [NAME]`.
#[derive(Debug, Args)]
pub struct NewArgs {
    /// Which starter; without it, the kinds are listed.
    #[arg(value_name = "KIND", value_parser = starter_parser())]
    pub kind: Option<Starter>,
    /// The rig file to write (default `KIND.yaml`; `-` prints it); never an existing file.
    #[arg(value_name = "NAME")]
    pub name: Option<PathBuf>,
    /// Do not write the schema file `rig-1.json` beside the rig.
    #[arg(long)]
    pub no_schema: bool,
}

fn starter_parser() -> impl clap::builder::TypedValueParser<Value = Starter> {
    one_of(STARTERS.iter().map(|s| (*s, s.name, &[][..], s.describe)))
}

/// Lists the starters, or writes one.
pub fn run_new(args: NewArgs) -> Result<i32, Failure> {
    let Some(starter) = args.kind else {
        return write_out(|w| {
            writeln!(w, "Starter rigs: reeve new KIND [NAME]")?;
            for s in STARTERS {
                writeln!(w, "  {:<14} {}", s.name, s.describe)?;
            }
            Ok(())
        })
        .map(|()| EXIT_OK);
    };
    let path = args
        .name
        .unwrap_or_else(|| PathBuf::from(format!("{}.yaml", starter.name)));
    if path.as_os_str() == "-" {
        emit(&Destination::Stdout, Path::new(""), |w| {
            w.write_all(starter.text.as_bytes())
        })?;
        return Ok(EXIT_OK);
    }
    // Linked into place only if nothing is there by then: no check-then-write window.
    write_new(&path, |w| w.write_all(starter.text.as_bytes())).map_err(|source| {
        if source.kind() == std::io::ErrorKind::AlreadyExists {
            exists(&path)
        } else {
            Failure::File {
                path: path.clone(),
                source,
            }
        }
    })?;
    let mut wrote = format!("wrote {}: {}", path.display(), starter.describe);
    if !args.no_schema {
        let folder = path.parent().unwrap_or(Path::new(""));
        let schema = folder.join(SCHEMA_FILE);
        // An existing schema file is the user's (perhaps from an older reeve): kept,
        // even one that appears while this one is written.
        let text = schema_text()?;
        match write_new(&schema, |w| w.write_all(text.as_bytes())) {
            Ok(()) => {
                wrote += &format!(
                    "\nwrote {}: the rig schema its first line names, for editor help",
                    schema.display()
                );
            }
            Err(e) if e.kind() == std::io::ErrorKind::AlreadyExists => {}
            Err(source) => {
                return Err(Failure::File {
                    path: schema.clone(),
                    source,
                })
            }
        }
    }
    write_out(|w| {
        writeln!(w, "{wrote}")?;
        writeln!(w, "next: reeve check {}", path.display())
    })?;
    Ok(EXIT_OK)
}

/// Exit 2, with a clear message, for a `path` that exists (a file, a folder, even a
/// dangling link): `new` never writes over anything.
fn exists(path: &Path) -> Failure {
    Failure::Input(format!(
        "`{}` already exists; `reeve new` never writes over a file: give another NAME \
         or remove it first",
        path.display()
    ))
}
