//! `reeve completions` and `reeve manual`: generated from the clap definitions, each
//! names every subcommand.

use crate::support::golden::diff;
use crate::support::terminal::{assert_no_progress, on_terminal};
use crate::support::{reeve, reeve_in, stdout_of, Scratch, EXAMPLE, ROOT};

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
fn the_manual_cites_no_page_or_document_that_is_not_shipped() {
    // Guards the one page against pointing at pages `reeve manual` never writes
    // (`reeve-check(1)`, ...) and at design notes outside the package: each command
    // is listed by its own name and described in its own section of this page.
    let page = stdout_of(&["manual"]);
    for command in subcommands() {
        let cited = format!("reeve\\-{command}(1)");
        assert!(!page.contains(&cited), "the manual cites {cited}");
        let listed = format!("\\fBreeve {command}\\fR");
        assert!(page.contains(&listed), "the command list lacks {listed}");
    }
    assert!(!page.contains("(1)"), "a page reference left in the manual");
    assert!(!page.contains("DESIGN.md"), "the manual cites DESIGN.md");
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

// ---- `reeve schema` (issue 13 item 1) ----

/// The shipped schema file, `schema/rig-1.json`.
fn shipped_schema_path() -> std::path::PathBuf {
    std::path::Path::new(ROOT).join("schema/rig-1.json")
}

/// The schema the project ships is the one `reeve schema` writes today (regenerate it
/// with `REEVE_BLESS=1 cargo test --test it tools::`, then read the diff).
#[test]
fn the_shipped_schema_is_what_reeve_schema_prints() {
    let printed = stdout_of(&["schema"]);
    let path = shipped_schema_path();
    if std::env::var("REEVE_BLESS").as_deref() == Ok("1") {
        std::fs::write(&path, &printed).unwrap();
        return;
    }
    let shipped = std::fs::read_to_string(&path).unwrap_or_default();
    assert!(
        shipped == printed,
        "schema/rig-1.json differs from `reeve schema` (- shipped, + now); rerun with \
         REEVE_BLESS=1 and read the diff:\n{}",
        diff(&shipped, &printed)
    );
    let dir = Scratch::new("schema");
    let out = dir.join("rig.json");
    reeve(&["schema", "-o", out.to_str().unwrap()]).expect_code(0);
    assert_eq!(std::fs::read_to_string(out).unwrap(), printed);
}

/// The validator, from the shipped file, by an independent JSON Schema implementation.
fn validator() -> jsonschema::Validator {
    let text = std::fs::read_to_string(shipped_schema_path()).unwrap();
    let schema: serde_json::Value = serde_json::from_str(&text).unwrap();
    assert!(
        jsonschema::meta::is_valid(&schema),
        "the schema is not a valid draft 2020-12 schema"
    );
    jsonschema::draft202012::new(&schema).unwrap_or_else(|e| panic!("schema: {e}"))
}

/// A rig's text as the JSON an editor's YAML plug-in checks.
fn as_json(text: &str) -> serde_json::Value {
    serde_yaml::from_str(text).unwrap_or_else(|e| panic!("not YAML ({e}):\n{text}"))
}

/// Every `.yaml` file under `dir`, recursively, sorted.
fn yaml_files(dir: &std::path::Path) -> Vec<std::path::PathBuf> {
    let mut out = Vec::new();
    for entry in std::fs::read_dir(dir).unwrap() {
        let path = entry.unwrap().path();
        if path.is_dir() {
            out.extend(yaml_files(&path));
        } else if path.extension().is_some_and(|e| e == "yaml") {
            out.push(path);
        }
    }
    out.sort();
    out
}

#[test]
fn every_example_rig_names_the_schema_and_validates() {
    let validator = validator();
    let rigs = yaml_files(&std::path::Path::new(ROOT).join("rigs"));
    assert!(rigs.len() >= 7);
    for path in rigs {
        let text = std::fs::read_to_string(&path).unwrap();
        assert_eq!(
            text.lines().next(),
            Some("# yaml-language-server: $schema=../schema/rig-1.json"),
            "{} does not start with the schema modeline",
            path.display()
        );
        let errors: Vec<String> = validator
            .iter_errors(&as_json(&text))
            .map(|e| format!("{} at {}", e, e.instance_path()))
            .collect();
        assert!(errors.is_empty(), "{}: {errors:#?}", path.display());
    }
}

/// The test rigs the loader accepts validate too (those it refuses are error tests).
#[test]
fn every_test_rig_the_loader_accepts_validates() {
    let validator = validator();
    let mut checked = 0;
    for path in yaml_files(&std::path::Path::new(ROOT).join("tests/rigs")) {
        if reeve::rig::load_file(&path).is_err() {
            continue;
        }
        let text = std::fs::read_to_string(&path).unwrap();
        let errors: Vec<String> = validator
            .iter_errors(&as_json(&text))
            .map(|e| format!("{} at {}", e, e.instance_path()))
            .collect();
        assert!(errors.is_empty(), "{}: {errors:#?}", path.display());
        checked += 1;
    }
    assert!(checked >= 10, "{checked}");
}

/// Edits of the example of DESIGN.md §4 that the load error tests refuse; the schema
/// refuses each of them too.
#[test]
fn invalid_rigs_from_the_error_tests_fail_the_schema() {
    let validator = validator();
    assert!(validator.is_valid(&as_json(EXAMPLE)));
    let edits: &[(&str, &str)] = &[
        ("limits:", "limit:"),
        (
            "diameter: 60,\n           bearing: {kind: plain",
            "diamter: 60,\n           bearing: {kind: plain",
        ),
        (
            "{kind: anchor, at: [0, 0, 2400]}",
            "{kind: anchor, at: [0, 0, 2400], bearing: {kind: none}}",
        ),
        ("{kind: anchor,", "{kind: ancor,"),
        (
            "axle: [0, 1, 0], diameter: 60,",
            "axle: [0, 1, 0], diameter: [60],",
        ),
        ("at: [0, 0, 2400]", "at: [0, 0]"),
        (
            "bearing: {kind: rolling, bore: 10, mu: 0.0015}",
            "bearing: rolling",
        ),
        ("mu: 0.12", "mu: high"),
        ("load: {mass: 40}", "load: {mass: heavy}"),
        ("breaking_strength: 7.5 kN", "breaking_strength: 7.5 kips"),
        ("breaking_strength: 7.5 kN", "breaking_strength: 7.5 kg"),
        ("length: mm", "length: furlong"),
        ("diameter: 6,", "diameter: -6,"),
        // A positive quantity written with its unit: zero is refused as the bare 0 is.
        ("diameter: 6,", "diameter: \"0 mm\","),
        ("breaking_strength: 7.5 kN", "breaking_strength: 0.0 kN"),
        ("diameter: 6,", "diameter: -6 mm,"),
        ("pin_diameter: 10", "pin_diameter: 0"),
        ("mu: 0.12", "mu: -0.12"),
        (
            "{kind: rolling, bore: 10, mu: 0.0015}",
            "{kind: rated, efficiency: 1.2}",
        ),
        (
            "{kind: rolling, bore: 10, mu: 0.0015}",
            "{kind: rated, factor: 0.9}",
        ),
        (
            "{kind: rolling, bore: 10, mu: 0.0015}",
            "{kind: rated, factor: 1.1, efficiency: 0.9}",
        ),
        ("fleet_angle: 1.5", "fleet_angle: 0"),
        (
            "axle: [0, 1, 0], diameter: 60,",
            "axle: [0, 0, 0], diameter: 60,",
        ),
        ("load: {mass: 40}", "load: {mass: 40, force: 10}"),
        ("format: 1", "format: 2"),
        ("path: [eye, hook.a, head, hand]", "path: [eye]"),
        (
            "path: [eye, hook.a, head, hand]",
            "path: [eye, {part: hook.a, turns: 1.5}, head, hand]",
        ),
    ];
    assert!(edits.len() >= 12);
    for (from, to) in edits {
        assert!(EXAMPLE.contains(from), "`{from}` not in the example");
        let text = EXAMPLE.replacen(from, to, 1);
        assert!(
            reeve::rig::load_str(&text, "rig.yaml").is_err(),
            "the loader accepts `{to}`"
        );
        assert!(
            !validator.is_valid(&as_json(&text)),
            "the schema accepts `{to}`"
        );
    }
}

// ---- `reeve new` (issue 13 item 2) ----

/// The kinds `reeve new` lists.
fn starter_kinds() -> Vec<String> {
    let list = stdout_of(&["new"]);
    let kinds: Vec<String> = list
        .lines()
        .skip(1)
        .filter_map(|l| l.split_whitespace().next().map(str::to_string))
        .collect();
    for kind in [
        "tackle",
        "counterweight",
        "hinge",
        "rescue",
        "line-set",
        "winch",
    ] {
        assert!(kinds.iter().any(|k| k == kind), "no `{kind}` in:\n{list}");
    }
    kinds
}

/// Every starter is written with the schema beside it, names the schema, validates, and
/// solves with every check passing.
#[test]
fn every_starter_rig_is_written_validates_and_solves() {
    let validator = validator();
    let dir = Scratch::new("new");
    for kind in starter_kinds() {
        let name = format!("my-{kind}.yaml");
        let ran = reeve_in(&dir, &["new", &kind, &name]).expect_code(0);
        assert!(ran.stdout.contains(&name), "{}", ran.stdout);
        let text = std::fs::read_to_string(dir.join(&name)).unwrap();
        assert_eq!(
            text.lines().next(),
            Some("# yaml-language-server: $schema=rig-1.json")
        );
        assert!(
            text.lines().filter(|l| l.starts_with('#')).count() >= 3,
            "{kind}: few comments"
        );
        assert!(
            validator.is_valid(&as_json(&text)),
            "{kind} fails the schema"
        );
        let check = reeve_in(&dir, &["check", &name]).expect_code(0);
        assert!(check.stdout.contains("Caution"), "{}", check.stdout);
        // The same text on stdout with `-`.
        assert_eq!(stdout_of(&["new", &kind, "-"]), text);
    }
    // The schema beside them is the shipped one.
    assert_eq!(
        std::fs::read_to_string(dir.join("rig-1.json")).unwrap(),
        std::fs::read_to_string(shipped_schema_path()).unwrap()
    );
}

#[test]
fn the_rescue_starter_carries_the_life_safety_cautions() {
    let text = stdout_of(&["new", "rescue", "-"]);
    for needle in [
        "LIFE SAFETY",
        "local codes",
        "training",
        "competent person",
        "belay",
    ] {
        assert!(text.contains(needle), "no `{needle}` in the rescue starter");
    }
}

/// `new` never writes over a file (nor a folder or a link), says so, and exits 2; a
/// schema file already there is kept as it is.
#[test]
fn new_never_writes_over_an_existing_file() {
    let dir = Scratch::new("new-exists");
    let rig = dir.write("hoist.yaml", "mine\n");
    dir.write("rig-1.json", "my schema\n");
    let (code, out, err) = reeve_in(&dir, &["new", "tackle", "hoist.yaml"]).parts();
    assert_eq!(code, 2, "{out}{err}");
    assert!(err.contains("`hoist.yaml` already exists"), "{err}");
    assert_eq!(std::fs::read_to_string(&rig).unwrap(), "mine\n");
    reeve_in(&dir, &["new", "tackle", "other.yaml"]).expect_code(0);
    assert_eq!(
        std::fs::read_to_string(dir.join("rig-1.json")).unwrap(),
        "my schema\n"
    );
    std::fs::create_dir(dir.join("folder.yaml")).unwrap();
    assert_eq!(reeve_in(&dir, &["new", "winch", "folder.yaml"]).code, 2);
    // The default name is KIND.yaml.
    reeve_in(&dir, &["new", "winch", "--no-schema"]).expect_code(0);
    assert!(dir.join("winch.yaml").is_file());
    let (code, _, err) = reeve_in(&dir, &["new", "winch"]).parts();
    assert_eq!(code, 2, "{err}");
    let (code, _, err) = reeve(&["new", "gantry"]).parts();
    assert_eq!(code, 2);
    assert!(err.contains("tackle"), "{err}");
}

/// Guards `reeve new`'s write against a check-then-rename window: a file another
/// process creates at the name while the template is being written is kept, the write
/// fails with `AlreadyExists`, and no temporary file is left. (A rename, as
/// `write_atomically` does for outputs, would replace it: the contrast is checked too.)
#[test]
fn a_new_file_is_never_written_over_one_that_appears_meanwhile() {
    use reeve::report::file::{write_atomically, write_new};
    use std::io::Write;
    let dir = Scratch::new("new-race");
    let path = dir.join("hoist.yaml");
    let theirs = |w: &mut dyn Write| {
        std::fs::write(&path, "theirs\n")?;
        w.write_all(b"ours\n")
    };
    let e = write_new(&path, theirs).expect_err("a file appeared at the name");
    assert_eq!(e.kind(), std::io::ErrorKind::AlreadyExists, "{e}");
    assert_eq!(std::fs::read_to_string(&path).unwrap(), "theirs\n");
    let left: Vec<_> = std::fs::read_dir(&*dir)
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .collect();
    assert_eq!(left, ["hoist.yaml"], "a temporary file is left");
    // A dangling link is something at the name too.
    #[cfg(unix)]
    {
        let link = dir.join("link.yaml");
        std::os::unix::fs::symlink(dir.join("nowhere.yaml"), &link).unwrap();
        let e = write_new(&link, |w| w.write_all(b"ours\n")).unwrap_err();
        assert_eq!(e.kind(), std::io::ErrorKind::AlreadyExists, "{e}");
        assert!(!dir.join("nowhere.yaml").exists());
    }
    // With nothing there it writes the whole text.
    let fresh = dir.join("fresh.yaml");
    write_new(&fresh, |w| w.write_all(b"ours\n")).unwrap();
    assert_eq!(std::fs::read_to_string(&fresh).unwrap(), "ours\n");
    // The rename of an ordinary output would have replaced the file that appeared.
    write_atomically(&path, theirs).unwrap();
    assert_eq!(std::fs::read_to_string(&path).unwrap(), "ours\n");
}

// ---- `reeve watch` (issue 13 item 6) ----

/// A running `reeve watch`, its stdout read line by line on a thread.
pub(crate) struct Watching {
    child: std::process::Child,
    lines: std::sync::mpsc::Receiver<String>,
    stderr: std::thread::JoinHandle<String>,
    seen: String,
}

impl Watching {
    pub(crate) fn start(dir: &std::path::Path, args: &[&str]) -> Watching {
        use std::io::BufRead;
        let mut child = std::process::Command::new(env!("CARGO_BIN_EXE_reeve"))
            .args(args)
            .current_dir(dir)
            .env("SOURCE_DATE_EPOCH", "1767225600")
            .stdin(std::process::Stdio::null())
            .stdout(std::process::Stdio::piped())
            .stderr(std::process::Stdio::piped())
            .spawn()
            .expect("start reeve watch");
        let stdout = child.stdout.take().unwrap();
        let (tx, lines) = std::sync::mpsc::channel();
        std::thread::spawn(move || {
            for line in std::io::BufReader::new(stdout)
                .lines()
                .map_while(Result::ok)
            {
                if tx.send(line).is_err() {
                    break;
                }
            }
        });
        let mut err = child.stderr.take().unwrap();
        let stderr = std::thread::spawn(move || {
            let mut s = String::new();
            let _ = std::io::Read::read_to_string(&mut err, &mut s);
            s
        });
        Watching {
            child,
            lines,
            stderr,
            seen: String::new(),
        }
    }

    /// The output up to and including the next line containing `needle` (a generous
    /// deadline against a hang, not a timing assertion).
    #[track_caller]
    pub(crate) fn until(&mut self, needle: &str) -> String {
        let deadline = std::time::Instant::now() + std::time::Duration::from_secs(90);
        let mut round = String::new();
        loop {
            let left = deadline.saturating_duration_since(std::time::Instant::now());
            match self.lines.recv_timeout(left) {
                Ok(line) => {
                    round.push_str(&line);
                    round.push('\n');
                    self.seen.push_str(&line);
                    self.seen.push('\n');
                    if line.contains(needle) {
                        return round;
                    }
                }
                Err(_) => {
                    let _ = self.child.kill();
                    panic!("no `{needle}` from reeve watch; its output:\n{}", self.seen);
                }
            }
        }
    }

    /// Sends SIGINT (Ctrl-C) and waits for the exit; (exit code, stderr).
    pub(crate) fn interrupt(mut self) -> (i32, String, String) {
        // SAFETY: a plain kill(2) on our own child's id.
        unsafe {
            libc::kill(self.child.id() as libc::pid_t, libc::SIGINT);
        }
        let deadline = std::time::Instant::now() + std::time::Duration::from_secs(60);
        let status = loop {
            if let Some(status) = self.child.try_wait().unwrap() {
                break status;
            }
            if std::time::Instant::now() > deadline {
                let _ = self.child.kill();
                panic!("reeve watch did not stop on SIGINT:\n{}", self.seen);
            }
            std::thread::sleep(std::time::Duration::from_millis(50));
        };
        let rest: Vec<String> = self.lines.iter().collect();
        self.seen.push_str(&rest.join("\n"));
        let stderr = self.stderr.join().unwrap();
        (status.code().unwrap_or(-1), self.seen, stderr)
    }
}

/// Whether the report reloads itself: a page that frames it reads how many times the
/// framed report has loaded, after four seconds of the browser's virtual time (the
/// report reloads every two).
fn report_loads_in_a_browser(dir: &std::path::Path, report: &str) -> Option<u32> {
    let browser = crate::outputs::browser_or_skip("; the reload was checked as text only")?;
    let frame = dir.join("frame.html");
    std::fs::write(
        &frame,
        format!(
            "<!DOCTYPE html><html><body><iframe id=\"f\" src=\"{report}\"></iframe><p id=\"out\">none</p>\
             <script>setTimeout(function () {{ var d = document.getElementById('f').contentDocument;\
             document.getElementById('out').textContent = 'loads=' + (d ? d.documentElement.getAttribute('data-reeve-loads') : 'blocked'); }}, 4500);</script></body></html>"
        ),
    )
    .unwrap();
    let profile = dir.join("profile");
    std::fs::create_dir_all(&profile).unwrap();
    let mut cmd = crate::outputs::headless(&browser, &profile);
    cmd.args([
        "--allow-file-access-from-files",
        "--virtual-time-budget=6000",
        "--dump-dom",
    ])
    .arg(format!(
        "file://{}",
        frame.canonicalize().unwrap().display()
    ));
    let dom = crate::outputs::run_with_deadline(cmd, std::time::Duration::from_secs(120));
    let loads = dom
        .split("loads=")
        .nth(1)
        .and_then(|s| s.split('<').next())
        .unwrap_or_else(|| panic!("no load count in:\n{dom:.800}"));
    Some(
        loads
            .trim()
            .parse()
            .unwrap_or_else(|_| panic!("loads={loads}")),
    )
}

/// A real watch in a temporary folder: a save in place, a save by rename (as many
/// editors do), a save with an error, each answered by one round; the report carries its
/// reload while watching and reloads in a browser; SIGINT stops it cleanly (exit 0, the
/// report rewritten without the reload, no temporary file left).
#[test]
fn watch_re_solves_on_every_save_and_stops_cleanly() {
    let dir = Scratch::new("watch");
    reeve_in(&dir, &["new", "tackle", "rig.yaml", "--no-schema"]).expect_code(0);
    let rig = dir.join("rig.yaml");
    let text = std::fs::read_to_string(&rig).unwrap();
    assert!(text.contains("load: {mass: 120}"));
    let mut watch = Watching::start(&dir, &["watch", "rig.yaml", "-o", "report.html"]);
    let first = watch.until("watching rig.yaml");
    // 120 kg on four parts: 120 × 9.80665 / 4 = 294.1995 N ideal.
    assert!(first.contains("294.2 N"), "{first}");
    assert!(first.contains("report: report.html rewritten"), "{first}");
    let live = std::fs::read_to_string(dir.join("report.html")).unwrap();
    assert!(
        live.contains("id=\"reeve-watch\""),
        "no reload script while watching"
    );

    // Saved in place: 150 kg, 150 × 9.80665 / 4 = 367.749 N.
    std::fs::write(&rig, text.replace("mass: 120}", "mass: 150}")).unwrap();
    let second = watch.until("watching rig.yaml");
    assert!(second.contains("367.7 N"), "{second}");

    // Saved by writing another file and renaming it over the rig: 90 kg, 220.650 N.
    let temp = dir.join(".rig.yaml.swp");
    std::fs::write(&temp, text.replace("mass: 120}", "mass: 90}")).unwrap();
    std::fs::rename(&temp, &rig).unwrap();
    let third = watch.until("watching rig.yaml");
    assert!(third.contains("220.6 N"), "{third}");

    if let Some(loads) = report_loads_in_a_browser(&dir, "report.html") {
        assert!(
            loads >= 2,
            "the report did not reload itself (loads={loads})"
        );
    }

    // Saved with a mistake: one round, the problem on stderr, the watch goes on.
    std::fs::write(&rig, text.replace("mass: 120}", "mass: heavy}")).unwrap();
    watch.until("watching rig.yaml");
    let (code, out, err) = watch.interrupt();
    assert_eq!(code, 0, "{out}\n{err}");
    assert!(out.contains("stopped watching rig.yaml"), "{out}");
    assert!(err.contains("parts.hook.load.mass"), "{err}");
    assert!(
        err.contains("^"),
        "the problem shows its line and caret: {err}"
    );
    let kept = std::fs::read_to_string(dir.join("report.html")).unwrap();
    assert!(
        !kept.contains("reeve-watch"),
        "the reload outlived the watch"
    );
    assert!(kept.contains("220.6"), "the last good report is kept");
    let leftovers: Vec<String> = std::fs::read_dir(&*dir)
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .filter(|n| n.ends_with(".tmp"))
        .collect();
    assert!(leftovers.is_empty(), "{leftovers:?}");
}

#[test]
fn watch_refuses_a_report_over_its_rig_or_on_stdout() {
    let dir = Scratch::new("watch-refuse");
    reeve_in(&dir, &["new", "winch", "rig.yaml", "--no-schema"]).expect_code(0);
    let (code, _, err) = reeve_in(&dir, &["watch", "rig.yaml", "-o", "-"]).parts();
    assert_eq!(code, 2, "{err}");
    let (code, _, err) = reeve_in(&dir, &["watch", "rig.yaml", "-o", "rig.yaml"]).parts();
    assert_eq!(code, 2, "{err}");
    assert!(
        err.contains("refusing to write over the input rig"),
        "{err}"
    );
}

// ---- progress of long studies (issue 13 item 8) ----

/// The studies that show progress, each on a rig it suits.
fn long_studies() -> Vec<Vec<String>> {
    let spread = crate::support::test_rig("spread-hoist.yaml");
    let hoist = crate::support::example_rig("workshop-hoist");
    vec![
        vec!["spread".into(), spread, "--samples".into(), "200".into()],
        vec![
            "sweep".into(),
            hoist.clone(),
            "--vary".into(),
            "parts.hook.load.mass=100..900 kg".into(),
            "--steps".into(),
            "30".into(),
        ],
        vec!["rank".into(), hoist],
    ]
}

/// Piped (as here: the test reads both streams), no study writes progress text.
#[test]
fn piped_studies_show_no_progress() {
    for args in long_studies() {
        let args: Vec<&str> = args.iter().map(String::as_str).collect();
        let ran = reeve(&args);
        assert!(ran.code <= 1, "{args:?}: {}", ran.stderr);
        for (stream, text) in [("stdout", &ran.stdout), ("stderr", &ran.stderr)] {
            assert_no_progress(&format!("{args:?}"), stream, text);
        }
    }
}

/// On a terminal (a pseudo-terminal made by util-linux `script`, where installed) the
/// bar is drawn on stderr, and stdout redirected to a file still gets none of it.
#[test]
fn a_terminal_shows_the_progress_bar() {
    let rig = crate::support::test_rig("spread-hoist.yaml");
    let Some((terminal, printed)) = on_terminal("progress", &["spread", &rig, "--samples", "200"])
    else {
        eprintln!("skipped: no `script` on PATH to make a terminal");
        return;
    };
    assert!(
        terminal.contains("spread ["),
        "no bar on the terminal:\n{terminal:.400}"
    );
    assert!(terminal.contains("/200 runs"), "{terminal:.400}");
    assert_no_progress("spread", "the redirected stdout", &printed);
    assert!(printed.contains("Caution"), "{printed}");
}

/// Guards: `schema -o` and `manual -o`, which read no rig, never replace a rig file the
/// user named by mistake (they wrote over it silently).
#[test]
fn schema_and_manual_never_write_over_a_rig_file() {
    let dir = Scratch::new("no-over-rig");
    let rig = dir.write("hoist.yaml", EXAMPLE);
    for command in ["schema", "manual"] {
        let ran = reeve_in(&dir, &[command, "-o", "hoist.yaml"]).expect_code(2);
        assert!(
            ran.stderr.contains("hoist.yaml"),
            "{command}: {}",
            ran.stderr
        );
        assert_eq!(
            std::fs::read_to_string(&rig).expect("rig"),
            EXAMPLE,
            "{command} -o wrote over the rig"
        );
    }
    // A schema file of its own is still replaced (the shipped schema is regenerated so).
    reeve_in(&dir, &["schema", "-o", "rig-1.json"]).expect_code(0);
    reeve_in(&dir, &["schema", "-o", "rig-1.json"]).expect_code(0);
}

/// Guards: `watch` on a folder or a missing file stops at once with exit 2 instead of
/// watching forever with the error printed once.
#[test]
fn watch_refuses_a_folder_or_a_missing_file() {
    use std::process::{Command, Stdio};
    use std::time::{Duration, Instant};
    let dir = Scratch::new("watch-bad");
    std::fs::create_dir_all(dir.join("sub")).expect("folder");
    for target in ["sub", "missing.yaml"] {
        let mut child = Command::new(env!("CARGO_BIN_EXE_reeve"))
            .args(["watch", target])
            .current_dir(&*dir)
            .stdout(Stdio::null())
            .stderr(Stdio::piped())
            .spawn()
            .expect("start reeve watch");
        let started = Instant::now();
        let status = loop {
            if let Some(status) = child.try_wait().expect("wait") {
                break Some(status);
            }
            if started.elapsed() > Duration::from_secs(20) {
                child.kill().expect("kill");
                child.wait().expect("reap");
                break None;
            }
            std::thread::sleep(Duration::from_millis(50));
        };
        let mut stderr = String::new();
        std::io::Read::read_to_string(&mut child.stderr.take().expect("stderr"), &mut stderr)
            .expect("stderr");
        assert_eq!(
            status.and_then(|s| s.code()),
            Some(2),
            "watch {target} did not exit 2 at once: {stderr}"
        );
        assert!(stderr.contains(target), "{target}: {stderr}");
    }
}
