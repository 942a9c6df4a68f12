//! `reeve completions` and `reeve manual`: generated from the clap definitions, each
//! names every subcommand.

use crate::support::{reeve, stdout_of, Scratch};

/// Every subcommand, as `reeve --help` lists it (the list is read from the binary, so a
/// new command is checked without editing this test).
fn subcommands() -> Vec<String> {
    let help = stdout_of(&["--help"]);
    let list: Vec<String> = help
        .split("Commands:")
        .nth(1)
        .expect("help lists the commands")
        .lines()
        .skip(1)
        .take_while(|l| !l.trim().is_empty())
        .filter_map(|l| l.split_whitespace().next().map(str::to_string))
        .filter(|name| name != "help")
        .collect();
    assert!(list.len() >= 10, "{help}");
    list
}

#[test]
fn every_shell_script_mentions_every_subcommand() {
    let commands = subcommands();
    for shell in ["bash", "zsh", "fish", "powershell"] {
        let script = stdout_of(&["completions", shell]);
        for command in &commands {
            assert!(
                script.contains(command.as_str()),
                "{shell} script does not mention `{command}`"
            );
        }
    }
}

#[test]
fn an_unknown_shell_is_refused() {
    let (code, _, err) = reeve(&["completions", "tcsh"]).parts();
    assert_eq!(code, 2, "{err}");
    assert!(err.contains("powershell"), "{err}");
}

/// The manual's headers as roff reads them: `.TH` first among the requests that are not
/// string definitions, then `.SH NAME`, `.SH SYNOPSIS`, and a section per subcommand.
#[test]
fn the_manual_is_roff_and_names_every_subcommand() {
    let page = stdout_of(&["manual"]);
    let requests: Vec<&str> = page
        .lines()
        .filter(|l| l.starts_with('.') && !l.starts_with(".ie") && !l.starts_with(".el"))
        .collect();
    assert!(requests[0].starts_with(".TH reeve 1"), "{}", requests[0]);
    let sections: Vec<&str> = requests
        .iter()
        .filter_map(|l| l.strip_prefix(".SH "))
        .collect();
    assert_eq!(&sections[..2], ["NAME", "SYNOPSIS"], "{sections:?}");
    for line in page.lines().filter(|l| l.starts_with('.')) {
        let request = line[1..].split_whitespace().next().unwrap_or("");
        assert!(
            ["TH", "SH", "SS", "TP", "ie", "el", "PP", "RS", "RE", "br", "IP"].contains(&request),
            "unexpected roff request: {line}"
        );
    }
    for command in subcommands() {
        let heading = format!("\"REEVE {}\"", command.to_uppercase());
        assert!(sections.contains(&heading.as_str()), "no section {heading}");
    }
}

#[test]
fn the_manual_is_written_to_a_file() {
    let dir = Scratch::new("manual");
    let path = dir.join("reeve.1");
    let ran = reeve(&["manual", "-o", path.to_str().unwrap()]).expect_code(0);
    assert!(ran.parts().1.is_empty());
    let page = std::fs::read_to_string(&path).unwrap();
    assert_eq!(page, stdout_of(&["manual"]));
}
