//! Atomic writes, and the refusal to write over the input rig.

use super::*;

#[test]
fn refuses_to_write_over_the_input_rig() {
    let dir = Scratch::new("refuse");
    let copy = dir.join("rig.yaml");
    fs::copy(example_rig("sash-window"), &copy).unwrap();
    let before = fs::read(&copy).unwrap();
    let sub = dir.join("sub");
    fs::create_dir_all(&sub).unwrap();
    let roundabout = sub.join("..").join("rig.yaml");
    for target in [copy.clone(), roundabout] {
        for cmd in [
            vec![
                "draw",
                copy.to_str().unwrap(),
                "-o",
                target.to_str().unwrap(),
            ],
            vec![
                "report",
                copy.to_str().unwrap(),
                "-o",
                target.to_str().unwrap(),
            ],
            vec![
                "table",
                copy.to_str().unwrap(),
                "-o",
                target.to_str().unwrap(),
            ],
        ] {
            let out = reeve(&cmd);
            assert_eq!(out.code, 2, "{cmd:?}");
            assert!(
                out.stderr.contains("refusing to write over the input"),
                "{}",
                out.stderr
            );
            assert_eq!(fs::read(&copy).unwrap(), before, "the rig is untouched");
        }
    }
    // A symlink to the rig is the rig.
    #[cfg(unix)]
    {
        let link = dir.join("link.svg");
        std::os::unix::fs::symlink(&copy, &link).unwrap();
        let out = reeve(&["draw", copy.to_str().unwrap(), "-o", link.to_str().unwrap()]);
        assert_eq!(out.code, 2);
        assert_eq!(fs::read(&copy).unwrap(), before);
    }
}

#[test]
fn sweep_plot_refuses_to_write_over_the_input_rig() {
    // Guards the input rig against `sweep --plot`: a plot path that names the rig (here
    // `./rig.yaml`) is refused, exit 2, and the rig is unchanged.
    let dir = Scratch::new("plot-input");
    dir.write("rig.yaml", ONE_SHEAVE);
    let out = reeve_in(
        &dir,
        &[
            "sweep",
            "rig.yaml",
            "--vary",
            "parts.s.bearing.mu=0.05..0.2",
            "--steps",
            "3",
            "--plot",
            "./rig.yaml",
        ],
    );
    assert_eq!(out.code, 2, "{}", out.stderr);
    assert!(out.stderr.contains("refusing to write over the input rig"));
    assert_eq!(
        std::fs::read_to_string(dir.join("rig.yaml")).unwrap(),
        ONE_SHEAVE,
        "the input rig was changed"
    );
}

#[test]
fn a_failed_write_leaves_no_partial_file() {
    use reeve::report::file::write_atomically;
    let dir = Scratch::new("atomic");
    let target = dir.join("drawing.svg");
    // An error half-way: nothing appears.
    let err = write_atomically(&target, |w| {
        w.write_all(b"<svg>half")?;
        Err(std::io::Error::other("disk full (injected)"))
    })
    .unwrap_err();
    assert!(err.to_string().contains("injected"));
    assert!(!target.exists());
    // An existing file survives a failed rewrite unchanged.
    fs::write(&target, "old drawing").unwrap();
    let _ = write_atomically(&target, |w| {
        w.write_all(b"new but broken")?;
        Err(std::io::Error::other("injected"))
    });
    assert_eq!(fs::read_to_string(&target).unwrap(), "old drawing");
    // No temporary files are left behind.
    let names: Vec<String> = fs::read_dir(&dir)
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .collect();
    assert_eq!(names, vec!["drawing.svg".to_string()]);
    // A success replaces it whole.
    write_atomically(&target, |w| w.write_all(b"new drawing")).unwrap();
    assert_eq!(fs::read_to_string(&target).unwrap(), "new drawing");

    // Through the binary: a folder that does not exist fails with exit 2 and no file.
    let missing = dir.join("no-such-folder").join("rig.svg");
    let out = reeve(&[
        "draw",
        &example_rig("sash-window"),
        "-o",
        missing.to_str().unwrap(),
    ]);
    assert_eq!(out.code, 2);
    assert!(out.stderr.contains("cannot write"));
    assert!(!missing.exists());
    // `-o -` is stdout, and `-o FILE` writes the same bytes to the file.
    let file = dir.join("rig.svg");
    let out = reeve(&[
        "draw",
        &example_rig("sash-window"),
        "-o",
        file.to_str().unwrap(),
    ])
    .expect_code(0);
    assert!(out.stdout.is_empty());
    let stdout = stdout_of(&["draw", &example_rig("sash-window"), "-o", "-"]);
    assert_eq!(fs::read_to_string(&file).unwrap(), stdout);
}

#[test]
fn table_writes_to_a_file_with_o() {
    let dir = Scratch::new("table");
    let file = dir.join("spans.csv");
    let r = example_rig("workshop-hoist");
    reeve(&["table", &r, "--format", "csv", "-o", file.to_str().unwrap()]).expect_code(0);
    let stdout = stdout_of(&["table", &r, "--format", "csv"]);
    assert_eq!(fs::read_to_string(&file).unwrap(), stdout);
}

/// The names in a folder, sorted.
fn names_in(dir: &Path) -> Vec<String> {
    let mut names: Vec<String> = fs::read_dir(dir)
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .collect();
    names.sort();
    names
}

/// Guards against stale temporary files: one left by an earlier run (killed, or whose
/// PID this process now has) never blocks the next write, and one of a dead process
/// older than a minute is removed.
#[test]
fn a_stale_temp_file_never_blocks_the_next_write() {
    use reeve::report::file::write_atomically;
    let dir = Scratch::new("stale-temp");
    let target = dir.join("out.svg");
    // Every name this process would try first is taken.
    for n in 0..64 {
        fs::write(
            dir.join(format!(".out.svg.{}-{n}.tmp", std::process::id())),
            "stale",
        )
        .unwrap();
    }
    write_atomically(&target, |w| w.write_all(b"new")).unwrap();
    assert_eq!(fs::read_to_string(&target).unwrap(), "new");
    // Through the binary: a dead process's old temp file goes, a fresh one stays (it may
    // be another machine's write in progress), and a live process's stays.
    let dead_old = dir.join(".out.svg.2147480000-0.tmp");
    let dead_new = dir.join(".out.svg.2147480001-0.tmp");
    let live = dir.join(".out.svg.1-0.tmp");
    for p in [&dead_old, &dead_new, &live] {
        fs::write(p, "stale").unwrap();
    }
    let hour_ago = std::time::SystemTime::now() - Duration::from_secs(3600);
    for p in [&dead_old, &live] {
        fs::File::options()
            .write(true)
            .open(p)
            .unwrap()
            .set_modified(hour_ago)
            .unwrap();
    }
    let r = example_rig("sash-window");
    reeve(&["draw", &r, "-o", target.to_str().unwrap()]).expect_code(0);
    assert!(
        !dead_old.exists(),
        "a dead process's old temp file was kept"
    );
    assert!(dead_new.exists() && live.exists());
}

/// Guards signal clean-up: SIGTERM, SIGINT or SIGHUP during a write removes the
/// temporary file before the process ends (by the signal, as before). The write runs
/// in a child copy of this test binary, which signals itself half-way.
#[cfg(unix)]
#[test]
fn a_signal_during_a_write_leaves_no_temp_file() {
    use std::os::unix::process::ExitStatusExt;
    if let Ok(target) = std::env::var("REEVE_SIGNAL_CHILD_TARGET") {
        let signal = std::env::var("REEVE_SIGNAL_CHILD_SIGNAL").unwrap();
        let _ = reeve::report::file::write_atomically(Path::new(&target), |w| {
            w.write_all(b"<svg>half")?;
            w.flush()?;
            Command::new("kill")
                .args([format!("-{signal}"), std::process::id().to_string()])
                .status()?;
            std::thread::sleep(Duration::from_secs(10));
            Ok(())
        });
        unreachable!("the signal ends the child");
    }
    for (signal, number) in [("TERM", 15), ("INT", 2), ("HUP", 1)] {
        let dir = Scratch::new("signal");
        let target = dir.join("out.svg");
        let status = Command::new(std::env::current_exe().unwrap())
            .args([
                "--exact",
                "outputs::writes::a_signal_during_a_write_leaves_no_temp_file",
                "--nocapture",
            ])
            .env("REEVE_SIGNAL_CHILD_TARGET", &target)
            .env("REEVE_SIGNAL_CHILD_SIGNAL", signal)
            .stdout(Stdio::null())
            .stderr(Stdio::null())
            .status()
            .unwrap();
        assert_eq!(status.signal(), Some(number), "SIG{signal}: {status:?}");
        assert_eq!(
            names_in(&dir),
            Vec::<String>::new(),
            "SIG{signal} left files"
        );
    }
}

/// Guards the input check against other names of the same file: `-o` onto a hard link
/// of the input rig is refused like the rig itself (same device and inode).
#[cfg(unix)]
#[test]
fn refuses_to_write_over_a_hard_link_of_the_input_rig() {
    let dir = Scratch::new("hard-link");
    let copy = dir.join("rig.yaml");
    fs::copy(example_rig("sash-window"), &copy).unwrap();
    let before = fs::read(&copy).unwrap();
    let link = dir.join("drawing.svg");
    fs::hard_link(&copy, &link).unwrap();
    for cmd in ["draw", "report", "table"] {
        let out = reeve(&[cmd, copy.to_str().unwrap(), "-o", link.to_str().unwrap()]);
        assert_eq!(out.code, 2, "{cmd}");
        let err = out.stderr;
        assert!(
            err.contains("refusing to write over the input"),
            "{cmd}: {err}"
        );
        assert_eq!(fs::read(&copy).unwrap(), before, "{cmd}: the rig changed");
    }
}

/// Guards the symlink choice (README): `-o` onto a symlink writes through it, replacing
/// the file it points at atomically and keeping the link, as a shell redirection would;
/// a dangling link's target is created.
#[cfg(unix)]
#[test]
fn output_onto_a_symlink_writes_through_it() {
    let dir = Scratch::new("symlink");
    let real = dir.join("real.svg");
    fs::write(&real, "old").unwrap();
    let link = dir.join("link.svg");
    std::os::unix::fs::symlink("real.svg", &link).unwrap();
    let r = example_rig("sash-window");
    reeve(&["draw", &r, "-o", link.to_str().unwrap()]).expect_code(0);
    assert!(
        fs::symlink_metadata(&link)
            .unwrap()
            .file_type()
            .is_symlink(),
        "the link was replaced"
    );
    assert!(fs::read_to_string(&real).unwrap().contains("<svg"));
    // A dangling link: its target is created in the target's folder.
    let sub = dir.join("sub");
    fs::create_dir_all(&sub).unwrap();
    let dangling = dir.join("dangling.svg");
    std::os::unix::fs::symlink("sub/new.svg", &dangling).unwrap();
    reeve(&["draw", &r, "-o", dangling.to_str().unwrap()]).expect_code(0);
    assert!(fs::symlink_metadata(&dangling)
        .unwrap()
        .file_type()
        .is_symlink());
    assert!(fs::read_to_string(sub.join("new.svg"))
        .unwrap()
        .contains("<svg"));
    assert_eq!(names_in(&sub), vec!["new.svg".to_string()]);
}

#[cfg(unix)]
#[test]
fn output_to_a_fifo_writes_into_it_and_keeps_it() {
    // Guards special files: `-o` onto a FIFO writes into it and leaves it a FIFO (writing a
    // temporary file and renaming it over the target would replace it with a regular file).
    use std::io::Read;
    use std::os::unix::fs::FileTypeExt;
    let dir = Scratch::new("fifo");
    dir.write("rig.yaml", ONE_SHEAVE);
    let fifo = dir.join("out.svg");
    let made = Command::new("mkfifo").arg(&fifo).status();
    if !matches!(made, Ok(s) if s.success()) {
        eprintln!("mkfifo is not available; skipped");
        return;
    }
    // Opened for reading and writing, a FIFO does not block, and it keeps a reader
    // present while reeve writes (the drawing is far below the pipe's buffer).
    let mut end = std::fs::OpenOptions::new()
        .read(true)
        .write(true)
        .open(&fifo)
        .unwrap();
    let out = reeve_in(&dir, &["draw", "rig.yaml", "-o", "out.svg"]);
    assert_eq!(out.code, 0, "{}", out.stderr);
    let kind = std::fs::symlink_metadata(&fifo).unwrap().file_type();
    assert!(kind.is_fifo(), "the FIFO was replaced by a regular file");
    let mut buf = [0u8; 512];
    let n = end.read(&mut buf).unwrap();
    assert!(String::from_utf8_lossy(&buf[..n]).contains("<svg"));
}

#[test]
fn an_output_that_is_a_folder_is_named_as_one() {
    // `-o sub` and `-o sub/` onto an existing folder say that it is a folder (with a
    // slash the system's own words were "not a directory"), and leave no file behind.
    let dir = Scratch::new("output-folder");
    let copy = dir.join("rig.yaml");
    fs::copy(example_rig("sash-window"), &copy).unwrap();
    let sub = dir.join("sub");
    fs::create_dir_all(&sub).unwrap();
    let slashed = format!("{}/", sub.display());
    for target in [sub.to_str().unwrap(), slashed.as_str()] {
        for cmd in ["draw", "report", "table"] {
            let out = reeve(&[cmd, copy.to_str().unwrap(), "-o", target]);
            assert_eq!(out.code, 2, "{cmd} -o {target}");
            assert!(
                out.stderr.contains("is a folder"),
                "{cmd} -o {target}: {}",
                out.stderr
            );
        }
    }
    let left: Vec<_> = fs::read_dir(&*dir)
        .unwrap()
        .flatten()
        .map(|e| e.file_name())
        .collect();
    assert_eq!(left.len(), 2, "{left:?}");
    assert_eq!(fs::read_dir(&sub).unwrap().count(), 0);
}
