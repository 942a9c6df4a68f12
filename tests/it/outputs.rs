//! The drawing-set outputs, through the real `reeve` binary: golden text, Markdown and
//! CSV tables; CSV and JSON parsed back; the SVG parsed as XML and rendered to pixels;
//! the HTML report opened in headless Chromium; atomic writes and the refusal to write
//! over the input rig.
//!
//! Golden files live in `tests/golden/`; `REEVE_BLESS=1 cargo test --test it golden`
//! rewrites them. These are format tests, not physics tests: the numbers in the golden
//! files are whatever the solver computes, checked elsewhere against their sources.

use reeve::model::{LineId, PartId};
use std::collections::BTreeSet;
use std::fs;
use std::path::{Path, PathBuf};
use std::process::{Command, Stdio};
use std::time::{Duration, Instant};

use serde::Deserialize;

use crate::support::golden::golden;
use crate::support::{
    assert_abs, example_rig, reeve, reeve_in, stdout_of, Scratch, ONE_SHEAVE, ROOT,
};

const GOLDEN_RIGS: [&str; 2] = ["workshop-hoist", "sash-window"];

#[test]
fn golden_text_tables() {
    for name in GOLDEN_RIGS {
        let r = example_rig(name);
        let out = stdout_of(&["table", &r]);
        assert!(out.trim_end().ends_with(reeve::report::CAUTION));
        golden(&format!("{name}.table.txt"), &out);
        let out = stdout_of(&["table", &r, "--case", "forward"]);
        golden(&format!("{name}.table-forward.txt"), &out);
    }
}

#[test]
fn golden_markdown_tables() {
    for name in GOLDEN_RIGS {
        let r = example_rig(name);
        let out = stdout_of(&["table", &r, "--format", "md"]);
        assert!(out.contains(reeve::report::CAUTION));
        golden(&format!("{name}.table.md"), &out);
    }
}

#[test]
fn golden_csv_tables() {
    for name in GOLDEN_RIGS {
        let r = example_rig(name);
        for table in ["spans", "parts"] {
            let out = stdout_of(&["table", &r, "--format", "csv", "--table", table]);
            golden(&format!("{name}.{table}.csv"), &out);
        }
    }
}

/// The JSON table as a reader outside the project would declare it.
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
struct TablesIn {
    format: u32,
    title: String,
    cases: String,
    spans: Option<Vec<SpanIn>>,
    parts: Option<Vec<PartIn>>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
struct CasesIn<T> {
    ideal: Option<Option<T>>,
    forward: Option<Option<T>>,
    back: Option<Option<T>>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
struct SpanIn {
    line: String,
    span: usize,
    from: String,
    to: String,
    length_m: Option<f64>,
    tension_n: CasesIn<f64>,
    safety_factor: Option<f64>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
struct PartIn {
    part: String,
    kind: String,
    line: Option<String>,
    wrap_deg: Option<f64>,
    fleet_in_deg: Option<f64>,
    fleet_out_deg: Option<f64>,
    bend_ratio: Option<f64>,
    tension_ratio: CasesIn<f64>,
    pin_load_n: CasesIn<f64>,
    pin_load_direction: CasesIn<[f64; 3]>,
    loss_share: Option<Option<f64>>,
    bend_loss_share: Option<Option<f64>>,
    axial_load_n: CasesIn<f64>,
}

#[test]
fn json_tables_parse_back_in_si() {
    let r = example_rig("workshop-hoist");
    let all: TablesIn = serde_json::from_str(&stdout_of(&["table", &r, "--format", "json"]))
        .expect("JSON parses into the reader's structs");
    assert_eq!(all.format, 1);
    assert_eq!(all.cases, "all");
    assert!(all.title.contains("hoist"));
    let spans = all.spans.expect("spans");
    assert_eq!(spans.len(), 5);
    assert_eq!(
        (
            spans[0].line.as_str(),
            spans[0].span,
            spans[0].from.as_str()
        ),
        ("fall", 0, "becket")
    );
    assert_eq!(spans[4].to, "winch");
    // SI: lengths in metres, tensions in newtons (the file uses mm and kN).
    let last = &spans[4];
    assert_abs("last span length, m", last.length_m.unwrap(), 2.7, 1e-9);
    let forward = last.tension_n.forward.flatten().unwrap();
    assert!(forward > 1000.0 && forward < 5000.0, "{forward} N");
    assert!(last.tension_n.ideal.is_some() && last.tension_n.back.is_some());
    assert!(last.safety_factor.unwrap() > 1.0);
    // The same numbers as `check --json` (one report behind both).
    let check: serde_json::Value =
        serde_json::from_str(&stdout_of(&["check", &r, "--json"])).unwrap();
    let check_forward = check["spans"][4]["tension_n"]["forward"].as_f64().unwrap();
    assert_eq!(forward, check_forward);
    let parts = all.parts.expect("parts");
    let sheave = parts.iter().find(|p| p.part == "upper.b").unwrap();
    assert_eq!(sheave.kind, "sheave");
    assert_eq!(sheave.line.as_deref(), Some("fall"));
    assert_abs("upper.b wrap, °", sheave.wrap_deg.unwrap(), 180.0, 1e-6);
    assert!(sheave.fleet_in_deg.is_some() && sheave.fleet_out_deg.is_some());
    assert!(sheave.bend_ratio.unwrap() > 20.0);
    // Rated sheave, K = 1.04 at 180° (the rig file): forward ratio K.
    assert_abs(
        "upper.b forward ratio",
        sheave.tension_ratio.forward.flatten().unwrap(),
        1.04,
        1e-9,
    );
    let dir = sheave.pin_load_direction.forward.flatten().unwrap();
    let norm = dir.iter().map(|x| x * x).sum::<f64>().sqrt();
    assert_abs("pin load direction, length", norm, 1.0, 1e-9);
    assert!(sheave.pin_load_n.back.flatten().unwrap() > 0.0);
    assert!(sheave.loss_share.flatten().unwrap() > 0.0);
    // DESIGN.md §7: the axial pin load, zero on `upper.b`, whose spans lie in its plane,
    // not on `upper.a`, where the span crossing to the other sheave of the block leaves
    // it at 1.15°; the bend loss share is zero (no `bend_loss` here).
    assert_eq!(sheave.axial_load_n.forward.flatten(), Some(0.0));
    assert_eq!(sheave.bend_loss_share.flatten(), Some(0.0));
    let crossing = parts.iter().find(|p| p.part == "upper.a").unwrap();
    let axial = crossing.axial_load_n.forward.flatten().unwrap();
    let pin = crossing.pin_load_n.forward.flatten().unwrap();
    // Hand check: the crossing span upper.a → lower.b carries 2.061 kN forward, and
    // 2061 N × sin 1.15° = 41.4 N.
    assert!(axial > 30.0 && axial < 50.0, "{axial} N of {pin} N");

    // --case back narrows every per-case field to `back`.
    let back: TablesIn = serde_json::from_str(&stdout_of(&[
        "table", &r, "--format", "json", "--case", "back", "--table", "spans",
    ]))
    .unwrap();
    assert!(back.parts.is_none());
    let s = &back.spans.unwrap()[0];
    assert!(s.tension_n.ideal.is_none() && s.tension_n.forward.is_none());
    assert!(s.tension_n.back.is_some());
}

#[test]
fn csv_parses_back_and_matches_json() {
    for name in GOLDEN_RIGS {
        let r = example_rig(name);
        let csv_text = stdout_of(&["table", &r, "--format", "csv"]);
        let mut reader = csv::Reader::from_reader(csv_text.as_bytes());
        let headers = reader.headers().expect("one header row").clone();
        assert_eq!(&headers[0], "line");
        let forward_col = headers
            .iter()
            .position(|h| h.starts_with("tension forward ("))
            .expect("forward tension column");
        // The unit is in the header: convert back to SI and compare with the JSON.
        let unit = &headers[forward_col]["tension forward (".len()..headers[forward_col].len() - 1];
        let factor = match unit {
            "N" => 1.0,
            "kN" => 1000.0,
            other => panic!("unexpected unit {other}"),
        };
        let json: TablesIn =
            serde_json::from_str(&stdout_of(&["table", &r, "--format", "json"])).unwrap();
        let spans = json.spans.unwrap();
        let rows: Vec<csv::StringRecord> = reader.records().map(|r| r.unwrap()).collect();
        assert_eq!(rows.len(), spans.len());
        for (row, span) in rows.iter().zip(&spans) {
            assert_eq!(row.len(), headers.len());
            assert_eq!(&row[0], span.line);
            let csv_value: f64 = row[forward_col].parse().expect("a plain number");
            let si = span.tension_n.forward.flatten().unwrap();
            // CSV carries 6 significant figures.
            assert_abs(
                &format!("{name}: {csv_value} {unit} in N"),
                csv_value * factor,
                si,
                1e-5 * si.abs(),
            );
        }
        // The part table: the pin direction in three numeric columns, a unit vector.
        let parts_csv = stdout_of(&["table", &r, "--format", "csv", "--table", "parts"]);
        assert!(
            parts_csv.is_ascii() || name != "workshop-hoist",
            "ASCII headers"
        );
        let mut reader = csv::Reader::from_reader(parts_csv.as_bytes());
        let headers = reader.headers().unwrap().clone();
        let col = |h: &str| headers.iter().position(|x| x == h).unwrap();
        let (x, y, z) = (
            col("pin dir forward x"),
            col("pin dir forward y"),
            col("pin dir forward z"),
        );
        let mut directions = 0;
        for row in reader.records() {
            let row = row.unwrap();
            assert_eq!(row.len(), headers.len());
            if row[x].is_empty() {
                continue;
            }
            let v: Vec<f64> = [x, y, z].iter().map(|&i| row[i].parse().unwrap()).collect();
            let norm = v.iter().map(|c| c * c).sum::<f64>().sqrt();
            // Three decimals per component.
            assert!((norm - 1.0).abs() < 3e-3, "{name}: {v:?}");
            directions += 1;
        }
        assert!(directions > 0);
    }
    // CSV holds one table: asking for both is refused with a hint.
    let out = reeve(&[
        "table",
        &example_rig("sash-window"),
        "--format",
        "csv",
        "--table",
        "both",
    ]);
    assert_eq!(out.code, 2);
    assert!(out.stderr.contains("--table spans"));
}

/// Elements of a parsed SVG with this exact class.
fn with_class<'a>(doc: &'a roxmltree::Document, class: &str) -> Vec<roxmltree::Node<'a, 'a>> {
    doc.descendants()
        .filter(|n| n.attribute("class") == Some(class))
        .collect()
}

#[test]
fn svg_is_xml_with_one_element_per_span_and_part_and_renders() {
    for name in ["workshop-hoist", "sash-window", "rescue-haul"] {
        let r = example_rig(name);
        let check: serde_json::Value =
            serde_json::from_str(&stdout_of(&["check", &r, "--json"])).unwrap();
        let span_count = check["spans"].as_array().unwrap().len();
        assert!(span_count > 0, "{name}: no spans to compare");
        let part_names: BTreeSet<String> = check["parts"]
            .as_array()
            .unwrap()
            .iter()
            .map(|p| p["name"].as_str().unwrap().to_string())
            .collect();
        for view in ["front", "side", "top", "iso"] {
            let svg = stdout_of(&["draw", &r, "-o", "-", "--view", view]);
            let doc = roxmltree::Document::parse(&svg)
                .unwrap_or_else(|e| panic!("{name} {view}: not XML: {e}"));
            assert_eq!(doc.root_element().attribute("data-view"), Some(view));
            let spans = with_class(&doc, "span");
            assert_eq!(spans.len(), span_count, "{name} {view}");
            for s in &spans {
                assert!(s.attribute("data-line").is_some() && s.attribute("data-span").is_some());
                let t: f64 = s
                    .attribute("data-tension-forward-n")
                    .unwrap()
                    .parse()
                    .unwrap();
                assert!(t.is_finite());
            }
            let parts: BTreeSet<String> = with_class(&doc, "part")
                .iter()
                .map(|p| p.attribute("data-part").unwrap().to_string())
                .collect();
            assert_eq!(parts, part_names, "{name} {view}");
            assert_eq!(with_class(&doc, "part").len(), part_names.len());
            assert!(svg.contains(&reeve::report::CAUTION[..40]));
            assert!(svg.contains("2026-01-01"), "title block date");
            assert!(
                !svg.contains("NaN") && !svg.contains("=\"inf") && !svg.contains("=\"-inf"),
                "{name} {view}"
            );
            if view == "front" {
                assert_not_blank(&svg, name);
            }
        }
        // Without --view, the default is an orthographic view where one draws the rig as
        // well as the isometric; the hoist's two-sheave blocks overlap in every one of
        // them (the default view's own test).
        let svg = stdout_of(&["draw", &r, "-o", "-"]);
        let doc = roxmltree::Document::parse(&svg).unwrap();
        let expected: &[&str] = if name == "workshop-hoist" {
            &["iso"]
        } else {
            &["front", "side", "top"]
        };
        let view = doc.root_element().attribute("data-view").unwrap();
        assert!(expected.contains(&view), "{name}: default view {view}");
    }
}

/// Renders the SVG with resvg and checks that something other than the white sheet
/// was drawn inside the frame.
fn assert_not_blank(svg: &str, name: &str) {
    use resvg::{tiny_skia, usvg};
    let tree = usvg::Tree::from_str(svg, &usvg::Options::default()).expect("usvg parses");
    let size = tree.size().to_int_size();
    let mut pixmap = tiny_skia::Pixmap::new(size.width(), size.height()).unwrap();
    resvg::render(&tree, tiny_skia::Transform::default(), &mut pixmap.as_mut());
    let background = pixmap.pixel(size.width() / 2, 2).unwrap();
    let differing = pixmap
        .pixels()
        .iter()
        .filter(|p| {
            (p.red(), p.green(), p.blue())
                != (background.red(), background.green(), background.blue())
        })
        .count();
    let total = pixmap.pixels().len();
    assert!(
        differing > total / 500,
        "{name}: the drawing looks blank ({differing} of {total} pixels differ)"
    );
    // Span colours of the tension scale appear (not only black outlines).
    let coloured = pixmap
        .pixels()
        .iter()
        .filter(|p| {
            let (r, g, b) = (p.red() as i32, p.green() as i32, p.blue() as i32);
            (r - g).abs() > 40 || (g - b).abs() > 40 || (r - b).abs() > 40
        })
        .count();
    assert!(
        coloured > 50,
        "{name}: no coloured spans drawn ({coloured})"
    );
}

/// The headless browser, if one is installed.
fn browser() -> Option<PathBuf> {
    for name in [
        "chromium",
        "chromium-browser",
        "google-chrome",
        "google-chrome-stable",
    ] {
        if let Some(path) = std::env::var_os("PATH").and_then(|paths| {
            std::env::split_paths(&paths)
                .map(|d| d.join(name))
                .find(|p| p.is_file())
        }) {
            return Some(path);
        }
    }
    None
}

/// The headless browser; where none is installed, `None` (the caller skips its browser
/// checks, saying so), unless `REEVE_REQUIRE_BROWSER=1` demands one (CI).
pub(crate) fn browser_or_skip(skipped: &str) -> Option<PathBuf> {
    let found = browser();
    if found.is_none() {
        if std::env::var("REEVE_REQUIRE_BROWSER").as_deref() == Ok("1") {
            panic!("REEVE_REQUIRE_BROWSER=1 but no chromium was found on PATH");
        }
        eprintln!("skipped: no headless browser (chromium) on PATH{skipped}");
    }
    found
}

/// A headless browser command with its own profile and the flags that keep it from
/// reaching for the network (NOTES.md).
pub(crate) fn headless(browser: &Path, profile: &Path) -> Command {
    let mut cmd = Command::new(browser);
    cmd.args([
        "--headless",
        "--no-sandbox",
        "--disable-gpu",
        "--disable-quic",
        "--no-first-run",
        "--disable-background-networking",
        "--disable-component-update",
        "--disable-sync",
    ])
    .arg(format!("--user-data-dir={}", profile.display()));
    cmd
}

/// Runs a command with a deadline; returns its stdout.
pub(crate) fn run_with_deadline(mut cmd: Command, deadline: Duration) -> String {
    let mut child = cmd
        .stdout(Stdio::piped())
        .stderr(Stdio::null())
        .spawn()
        .expect("start the browser");
    let mut stdout = child.stdout.take().unwrap();
    let reader = std::thread::spawn(move || {
        let mut s = String::new();
        let _ = std::io::Read::read_to_string(&mut stdout, &mut s);
        s
    });
    let start = Instant::now();
    loop {
        if child.try_wait().unwrap().is_some() {
            break;
        }
        if start.elapsed() > deadline {
            let _ = child.kill();
            let _ = child.wait();
            panic!("the browser did not finish within {deadline:?}");
        }
        std::thread::sleep(Duration::from_millis(100));
    }
    reader.join().unwrap()
}

#[test]
fn html_report_renders_in_a_headless_browser() {
    let dir = Scratch::new("html");
    let html = dir.join("report.html");
    let r = example_rig("workshop-hoist");
    reeve(&["report", &r, "-o", html.to_str().unwrap()]).expect_code(0);
    let text = fs::read_to_string(&html).unwrap();
    // Self-contained: no scripts, no external resources.
    assert!(!text.contains("<script"), "no scripts");
    assert!(
        !text.contains("http://")
            || text.matches("http://").count()
                == text.matches("http://www.w3.org/2000/svg").count()
    );
    assert!(!text.contains("https://"), "no network resources");
    assert!(text.contains("name=\"viewport\""));
    assert!(text.contains("@media print"));
    assert!(text.contains(reeve::report::CAUTION));

    let Some(browser) = browser_or_skip("; the HTML was checked as text only") else {
        return;
    };
    let profile = dir.join("profile");
    fs::create_dir_all(&profile).unwrap();
    let mut cmd = headless(&browser, &profile);
    cmd.arg("--dump-dom")
        .arg(format!("file://{}", html.canonicalize().unwrap().display()));
    let dom = run_with_deadline(cmd, Duration::from_secs(120));
    assert!(
        dom.contains("<main>"),
        "the browser rendered no page:\n{dom:.500}"
    );
    // Summary figures (the headline as `check` prints it).
    let check = stdout_of(&["check", &r]);
    for figure in ["2.023 kN", "2.229 kN", "1.832 kN", "90.7 %"] {
        assert!(check.contains(figure), "check shows {figure}");
        assert!(dom.contains(figure), "the page shows {figure}");
    }
    assert!(dom.contains("id=\"summary-table\""));
    // Both tables, with their rows.
    assert!(dom.contains("id=\"spans\"") && dom.contains("id=\"parts\""));
    assert!(dom.contains("becket → lower.a") || dom.contains("becket &rarr; lower.a"));
    assert!(dom.contains("upper.b"));
    // The drawing, inline, with its spans and parts.
    assert!(dom.contains("<svg"));
    assert_eq!(dom.matches("class=\"span\"").count(), 5);
    assert_eq!(dom.matches("class=\"part\"").count(), 7);
    // Losses, methods with sources, caution.
    assert!(dom.contains("id=\"losses\"") && dom.contains("class=\"bar\""));
    assert!(dom.contains("Euler") && dom.contains("Eytelwein") && dom.contains("friction circle"));
    assert!(dom.contains("Caution:"));
}

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

#[test]
fn the_html_summary_shows_the_friction_at_the_drive() {
    // Guards: the report's summary table has the friction row of `check` (line set:
    // 165.4 − 109.4 = 55.98 N forward, 109.4 − 56.79 = 52.65 N back, with the lift
    // lines' stiffness and weight of issue 11; 55.95 N and 52.62 N before the rope on
    // each sheave's arc (0.80 N on a loft sheave) loaded the journals).
    let html = stdout_of(&["report", &example_rig("line-set"), "-o", "-"]);
    let row = html
        .lines()
        .find(|l| l.contains("<th scope=\"row\">friction</th>"))
        .unwrap_or_else(|| panic!("no friction row"));
    assert!(row.contains("55.98 N") && row.contains("52.65 N"), "{row}");
}

#[test]
fn the_html_summary_words_the_outcome_for_the_drive() {
    // Guards: the report words a counterweight's outcome as `check` does.
    let html = stdout_of(&["report", &example_rig("sash-window"), "-o", "-"]);
    assert!(html.contains("rises by itself"), "counterweight wording");
    assert!(!html.contains("the drive moves the rig"));
}

#[test]
fn html_warnings_render_code_and_name_the_part_once() {
    // Guards: no raw backticks in the report's warnings, code spans as <code>, the
    // part named once, and bend-ratio warnings grouped as in the text.
    let html = stdout_of(&["report", &example_rig("rescue-haul"), "-o", "-"]);
    let start = html
        .find("<section id=\"warnings\">")
        .expect("warnings section");
    let section = &html[start..start + html[start..].find("</section>").unwrap()];
    assert!(!section.contains('`'), "{section}");
    let items: Vec<&str> = section.lines().filter(|l| l.starts_with("<li>")).collect();
    assert_eq!(items.len(), 1, "one grouped bend-ratio warning: {section}");
    assert_eq!(
        items[0].matches("<code>leg.biner</code>").count(),
        1,
        "{}",
        items[0]
    );
    assert!(items[0].contains("<code>static11</code>"), "{}", items[0]);
}

/// A rig for the text-safety tests: one sheave, names chosen by the caller.
fn named_rig(sheave: &str, line: &str, hand: &str) -> String {
    format!(
        "format: 1
units: {{length: mm, force: N, mass: kg}}
ropes:
  r: {{diameter: 6, mu: 0.2}}
parts:
  '{sheave}': {{kind: sheave, at: [0, 0, 2000], axle: [0, 1, 0], diameter: 50,
      bearing: {{kind: plain, pin_diameter: 8, mu: 0.1}}}}
  w: {{kind: weight, at: [-25, 0, 1000], mass: 5}}
  '{hand}': {{kind: haul, at: [25, 0, 1000]}}
lines:
  '{line}': {{rope: r, path: [w, '{sheave}', '{hand}']}}
"
    )
}

/// Guards every writer: a title with control characters (here the file name, which a
/// rig without `title` takes and the loader cannot refuse) never reaches the terminal
/// raw, and the SVG and HTML stay well-formed XML.
#[test]
fn control_characters_in_a_file_name_are_escaped_in_every_output() {
    let dir = Scratch::new("control-name");
    let name = "hoist\u{1b}[31m\u{7}\u{202e}.yaml";
    fs::write(dir.join(name), named_rig("s", "l", "h")).unwrap();
    let file = dir.join(name);
    let file = file.to_str().unwrap();
    let raw = |text: &str| text.contains(['\u{1b}', '\u{7}', '\u{202e}']);
    for args in [
        &["check", file][..],
        &["table", file],
        &["table", file, "--format", "md"],
        &["table", file, "--format", "csv"],
        &["compare", file, file],
        &["compare", file, file, "--format", "md"],
        &["compare", file, file, "--format", "csv"],
        &["rank", file],
        &["sweep", file, "--stroke", "10", "--steps", "2"],
        &[
            "spread",
            file,
            "--samples",
            "2",
            "--set",
            "ropes.r.mu={min: 0.15, max: 0.25}",
        ],
    ] {
        let out = stdout_of(args);
        assert!(!raw(&out), "{args:?}: raw control characters in {out:?}");
    }
    let svg = stdout_of(&["draw", file, "-o", "-"]);
    roxmltree::Document::parse(&svg).unwrap_or_else(|e| panic!("SVG is not XML: {e}"));
    assert!(!raw(&svg) && svg.contains("\\u{1b}"), "{svg}");
    let html = stdout_of(&["report", file, "-o", "-"]);
    assert!(!raw(&html), "raw control characters in the HTML");
    let (_, inline_svg) = html.split_once("<svg").unwrap();
    let inline_svg = format!("<svg{}", inline_svg.split_once("</svg>").unwrap().0) + "</svg>";
    roxmltree::Document::parse(&inline_svg).unwrap_or_else(|e| panic!("inline SVG: {e}"));
}

/// Guards the library's writers: a rig built in code (never through the loader) with a
/// control character in a part name still writes clean text and valid XML.
#[test]
fn control_characters_in_names_built_in_code_are_escaped_by_the_writers() {
    use reeve::report::{html, svg, table, text, Report};
    let mut rig = reeve::rig::load_str(&named_rig("s", "l", "h"), "rig.yaml").unwrap();
    rig.title = "a \u{1b}[2J title".to_string();
    rig.parts[PartId::new(0)].name = "s\u{0}\u{1b}".to_string();
    rig.lines[LineId::new(0)].name = "l\u{85}".to_string();
    let solution = reeve::solve::solve(&rig, &Default::default()).unwrap();
    let report = Report::build(&rig, &solution, reeve::checks::run(&rig, &solution));
    let raw = |bytes: &[u8]| {
        let text = String::from_utf8_lossy(bytes);
        text.contains(['\u{0}', '\u{1b}', '\u{85}'])
    };
    let mut out = Vec::new();
    text::write_check(&mut out, &rig, &report, "rig.yaml").unwrap();
    assert!(!raw(&out), "check text");
    let tables = table::tables(
        &report,
        &rig.units,
        table::CaseFilter::All,
        table::TableChoice::Both,
        table::Style::Human,
    );
    for write in [table::write_text, table::write_markdown] {
        let mut out = Vec::new();
        write(&mut out, &report, &rig.units, &tables).unwrap();
        assert!(!raw(&out), "{}", String::from_utf8_lossy(&out));
    }
    let mut out = Vec::new();
    for t in &tables {
        table::write_csv(&mut out, t).unwrap();
    }
    assert!(!raw(&out), "csv");
    let options = svg::DrawOptions {
        view: None,
        date: "2026-01-01".to_string(),
        standalone: true,
    };
    let mut out = Vec::new();
    svg::write_svg(&mut out, &rig, &solution, &report, &options).unwrap();
    let drawing = String::from_utf8(out).unwrap();
    roxmltree::Document::parse(&drawing).unwrap_or_else(|e| panic!("SVG is not XML: {e}"));
    let mut out = Vec::new();
    html::write_html(&mut out, &rig, &solution, &report, &options, "rig.yaml").unwrap();
    assert!(!raw(&out), "html");
}

/// Guards spreadsheet safety: a CSV cell that a spreadsheet would run as a formula
/// (`=`, `+`, `-`, `@` first) is prefixed with `'`, in the tables and in the studies;
/// numbers, negative ones included, stay numbers.
#[test]
fn csv_cells_that_read_as_formulas_are_prefixed() {
    let dir = Scratch::new("csv-formula");
    let text = named_rig("=HYPERLINK(\"http://x\")", "@SUM(A1)", "-cmd");
    let file = dir.join("+rig.yaml");
    fs::write(&file, text).unwrap();
    let file = file.to_str().unwrap();
    let cells = |args: &[&str]| -> Vec<String> {
        let out = stdout_of(args);
        let mut reader = csv::ReaderBuilder::new()
            .has_headers(false)
            .flexible(true)
            .from_reader(out.as_bytes());
        reader
            .records()
            .flat_map(|r| r.unwrap().iter().map(str::to_string).collect::<Vec<_>>())
            .collect()
    };
    for args in [
        &["table", file, "--format", "csv"][..],
        &["table", file, "--format", "csv", "--table", "parts"],
        &["rank", file, "--format", "csv"],
        &["compare", file, file, "--format", "csv"],
    ] {
        let all = cells(args);
        for cell in &all {
            let formula = cell.starts_with(['=', '@'])
                || (cell.starts_with(['+', '-']) && cell.parse::<f64>().is_err());
            assert!(!formula, "{args:?}: formula cell {cell:?} in {all:?}");
        }
        let named = all.iter().any(|c| {
            ["'=HYPERLINK", "'@SUM(A1)", "'-cmd", "'+rig"]
                .iter()
                .any(|n| c.starts_with(n) || c.contains(&format!("/{}", &n[1..])))
        });
        assert!(named, "{args:?}: no prefixed name in {all:?}");
    }
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
                "outputs::a_signal_during_a_write_leaves_no_temp_file",
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

/// Every `.rs` file under `dir`, recursively.
fn rust_files(dir: &Path, out: &mut Vec<PathBuf>) {
    for entry in fs::read_dir(dir).unwrap() {
        let path = entry.unwrap().path();
        if path.is_dir() {
            rust_files(&path, out);
        } else if path.extension().is_some_and(|e| e == "rs") {
            out.push(path);
        }
    }
}

/// Guards the sources shown to users (README, DEVELOPERS, rigs, doc comments, the HTML
/// report's notes): published handbooks, standards and textbooks, never a manufacturer
/// (tests may name the exact table they check); the wire-rope D/d of 26 belongs to 6x25
/// filler-wire rope; `cone_angle` is a half-angle where the user writes it.
#[test]
fn user_facing_text_names_no_manufacturer_and_the_right_sources() {
    let root = Path::new(ROOT);
    let mut files = vec![root.join("README.md"), root.join("DEVELOPERS.md")];
    rust_files(&root.join("src"), &mut files);
    for e in fs::read_dir(root.join("rigs")).unwrap() {
        files.push(e.unwrap().path());
    }
    let html = stdout_of(&["report", &example_rig("ramp-winch"), "-o", "-"]);
    let mut texts: Vec<(String, String)> = files
        .iter()
        .map(|f| (f.display().to_string(), fs::read_to_string(f).unwrap()))
        .collect();
    texts.push(("the HTML report".to_string(), html.clone()));
    for (name, text) in &texts {
        for maker in ["SKF", "Koyo", "JTEKT"] {
            assert!(!text.contains(maker), "{name} names the maker {maker}");
        }
    }
    let readme = fs::read_to_string(root.join("README.md")).unwrap();
    for needle in ["6x25 filler-wire", "30–34", "half-angle"] {
        assert!(readme.contains(needle), "README lacks `{needle}`");
    }
    assert!(html.contains("half-angle"), "the report's thrust note");
    // The rig loader: every file under src/rig/.
    let mut load = String::new();
    let mut folders = vec![root.join("src/rig")];
    while let Some(folder) = folders.pop() {
        for e in fs::read_dir(folder).unwrap() {
            let path = e.unwrap().path();
            if path.is_dir() {
                folders.push(path);
            } else {
                load.push_str(&fs::read_to_string(path).unwrap());
            }
        }
    }
    assert!(
        load.contains("6x25 filler-wire"),
        "default_min_bend_ratio's source"
    );
}

/// Guards the printed report: with the print stylesheet, every table (the 16-column
/// parts table above all) fits the width of an A4 page inside its 14 mm margins
/// (182 mm, 688 px at 96 px per inch). Measured in headless Chromium on a copy of the
/// report whose print rules apply on screen and which carries a measuring script.
#[test]
fn html_tables_fit_a_printed_a4_page() {
    let Some(browser) = browser_or_skip("") else {
        return;
    };
    let dir = Scratch::new("a4");
    for name in [
        "line-set",
        "rescue-haul",
        "greenhouse-vents",
        "gallery-panel",
    ] {
        let html = stdout_of(&["report", &example_rig(name), "-o", "-"]);
        assert!(html.contains("@media print"));
        let script = "<pre id=\"measure\"></pre><script>\
const width = document.documentElement.clientWidth; const wide = [];\
document.querySelectorAll('table').forEach(t => { const r = t.getBoundingClientRect().right;\
 if (r > width + 0.5) wide.push((t.id || t.className) + ' ' + Math.round(r)); });\
if (document.documentElement.scrollWidth > width) wide.push('page ' + document.documentElement.scrollWidth);\
document.getElementById('measure').textContent = wide.length ? 'too wide: ' + wide.join(', ') + ' > ' + width : 'fits';\
</script></body>";
        let page = html
            .replace("@media print", "@media all")
            .replace("</body>", script);
        let file = dir.join(format!("{name}.html"));
        fs::write(&file, page).unwrap();
        let profile = dir.join(format!("profile-{name}"));
        let mut cmd = headless(&browser, &profile);
        cmd.args(["--hide-scrollbars", "--window-size=688,1200", "--dump-dom"])
            .arg(format!("file://{}", file.canonicalize().unwrap().display()));
        let dom = run_with_deadline(cmd, Duration::from_secs(120));
        let measured = dom
            .split("<pre id=\"measure\">")
            .nth(1)
            .and_then(|s| s.split('<').next())
            .unwrap_or("no measurement");
        assert_eq!(measured, "fits", "{name}");
    }
}

/// Points of an SVG path made of `M`/`L` commands.
fn path_points(d: &str) -> Vec<(f64, f64)> {
    d.split_whitespace()
        .filter_map(|p| {
            let p = p.trim_start_matches(['M', 'L']);
            let (x, y) = p.split_once(',')?;
            Some((x.parse().ok()?, y.parse().ok()?))
        })
        .collect()
}

/// A span on the sheet: its two ends, px.
fn span_ends(n: &roxmltree::Node) -> ((f64, f64), (f64, f64)) {
    let f = |k: &str| n.attribute(k).unwrap().parse::<f64>().unwrap();
    ((f("x1"), f("y1")), (f("x2"), f("y2")))
}

/// Whether two segments lie on top of each other: nearly parallel, overlapping along
/// their length, and nowhere in the overlap more than `gap` px apart.
fn coincide(a: ((f64, f64), (f64, f64)), b: ((f64, f64), (f64, f64)), gap: f64) -> bool {
    let (dx, dy) = (a.1 .0 - a.0 .0, a.1 .1 - a.0 .1);
    let len = dx.hypot(dy);
    if len < 1e-9 {
        return false;
    }
    let (ux, uy) = (dx / len, dy / len);
    let along = |p: (f64, f64)| (p.0 - a.0 .0) * ux + (p.1 - a.0 .1) * uy;
    let across = |p: (f64, f64)| (p.0 - a.0 .0) * -uy + (p.1 - a.0 .1) * ux;
    let (s0, s1) = (along(b.0), along(b.1));
    let (lo, hi) = (s0.min(s1).max(0.0), s0.max(s1).min(len));
    if hi - lo < 10.0 {
        return false;
    }
    // b's offset from a's line at the two ends of the overlap.
    let at = |s: f64| {
        let t = (s - s0) / (s1 - s0);
        across((
            b.0 .0 + (b.1 .0 - b.0 .0) * t,
            b.0 .1 + (b.1 .1 - b.0 .1) * t,
        ))
    };
    (s1 - s0).abs() > 1e-9 && at(lo).abs() < gap && at(hi).abs() < gap
}

/// Guards the default view: the front view of the workshop hoist laid both sheaves of
/// each block and two spans on top of each other, and the labels collided. The view
/// `reeve draw` picks separates every part of the hoist (but the sheaves its hook block
/// carries) and every span; where no view can (the line set's three-groove head block,
/// 40 mm grooves at 1:100), parts and spans drawn on top of each other share one label
/// that names them all; and no two labels overlap.
#[test]
fn the_default_drawing_separates_parts_spans_and_labels() {
    for name in ["workshop-hoist", "line-set", "rescue-haul", "sash-window"] {
        let svg = stdout_of(&["draw", &example_rig(name), "-o", "-"]);
        let doc = roxmltree::Document::parse(&svg).unwrap();
        let label_texts = |class: &str| -> Vec<String> {
            with_class(&doc, class)
                .iter()
                .map(|n| n.text().unwrap_or("").to_string())
                .collect()
        };
        let part_labels = label_texts("part-label");
        let span_labels = label_texts("span-label");
        let strict = name == "workshop-hoist";
        let hubs: Vec<(String, (f64, f64))> = with_class(&doc, "part")
            .iter()
            .filter_map(|g| {
                let hub = g
                    .children()
                    .find(|c| c.tag_name().name() == "circle" && c.attribute("r") == Some("2.2"))?;
                let f = |k: &str| hub.attribute(k).unwrap().parse::<f64>().unwrap();
                Some((
                    g.attribute("data-part").unwrap().to_string(),
                    (f("cx"), f("cy")),
                ))
            })
            .collect();
        // Every round part (sheave, guide, drum) has its hub, so the loops below compare
        // every pair of them.
        let round = reeve(&["check", &example_rig(name), "--json"]).json()["parts"]
            .as_array()
            .unwrap()
            .iter()
            .filter(|p| matches!(p["kind"].as_str(), Some("sheave" | "guide" | "drum")))
            .count();
        assert_eq!(hubs.len(), round, "{name}: hubs found {hubs:?}");
        for (i, (a, pa)) in hubs.iter().enumerate() {
            for (b, pb) in &hubs[i + 1..] {
                let d = (pa.0 - pb.0).hypot(pa.1 - pb.1);
                if d >= 4.0 {
                    continue;
                }
                assert!(!strict, "{name}: `{a}` and `{b}` drawn {d:.1} px apart");
                let named = |n: &str| {
                    l_names(n).iter().any(|l| l == a) && l_names(n).iter().any(|l| l == b)
                };
                assert!(
                    part_labels.iter().any(|l| named(l)),
                    "{name}: `{a}` and `{b}` coincide without one label naming both: {part_labels:?}"
                );
            }
        }
        let spans = with_class(&doc, "span");
        assert!(spans.len() > 1, "{name}: {} spans drawn", spans.len());
        for (i, a) in spans.iter().enumerate() {
            for (j, b) in spans.iter().enumerate().skip(i + 1) {
                if !coincide(span_ends(a), span_ends(b), 4.0)
                    && !coincide(span_ends(b), span_ends(a), 4.0)
                {
                    continue;
                }
                assert!(!strict, "{name}: spans {i} and {j} coincide");
                assert!(
                    span_labels
                        .iter()
                        .any(|l| l.contains(" / ") || l.contains('×')),
                    "{name}: spans {i} and {j} coincide without a shared label: {span_labels:?}"
                );
            }
        }
        let boxes: Vec<(String, (f64, f64, f64, f64))> = doc
            .descendants()
            .filter(|n| matches!(n.attribute("class"), Some("part-label" | "span-label")))
            .map(|n| {
                let text = n.text().unwrap_or("").to_string();
                let f = |k: &str| n.attribute(k).unwrap().parse::<f64>().unwrap();
                let (x, y) = (f("x"), f("y"));
                let w = text.chars().count() as f64 * 11.0 * 0.58;
                (text, (x, y - 11.0, x + w, y + 3.0))
            })
            .collect();
        assert!(
            !part_labels.is_empty() && !span_labels.is_empty(),
            "{name}: labels {boxes:?}"
        );
        for (i, (ta, a)) in boxes.iter().enumerate() {
            for (tb, b) in &boxes[i + 1..] {
                let overlap = a.0 < b.2 && b.0 < a.2 && a.1 < b.3 && b.1 < a.3;
                assert!(!overlap, "{name}: labels `{ta}` and `{tb}` overlap");
            }
        }
    }
}

/// Guards the default view against seeing the rig edge-on: a flat rig of kilometre
/// falls 66 mm apart separates its parts best from the top, where every span is a dot,
/// and a rig along one axis has area only in the isometric view; both are drawn from
/// the front.
#[test]
fn the_default_view_never_sees_the_rig_edge_on() {
    for name in ["block-unknown", "two-subrigs", "frictionless", "slope-cart"] {
        let file = Path::new(ROOT).join(format!("tests/rigs/review/{name}.yaml"));
        let svg = stdout_of(&["draw", file.to_str().unwrap(), "-o", "-"]);
        let doc = roxmltree::Document::parse(&svg).unwrap();
        let view = doc.root_element().attribute("data-view").unwrap();
        let expected = if name == "two-subrigs" {
            "side"
        } else {
            "front"
        };
        assert_eq!(view, expected, "{name}");
    }
}

/// The part names of a part label (`⚠ head.1, head.2`).
fn l_names(label: &str) -> Vec<String> {
    label
        .trim_start_matches("⚠ ")
        .split(", ")
        .map(str::to_string)
        .collect()
}

/// Guards the drawing scale: every drawing is at a standard scale (1:1, 1:2, 1:5, 1:10,
/// 1:20, 1:50 ... or 2:1, 5:1 ...), says which in the title block, is that scale when
/// the stand-alone SVG is printed at its size in millimetres, and its overall dimension
/// line measures the dimension it is labelled with at that scale.
#[test]
fn drawings_use_a_standard_scale_and_say_which() {
    let px_per_mm = 96.0 / 25.4;
    for name in [
        "workshop-hoist",
        "sash-window",
        "line-set",
        "automaton-cord",
        "ramp-winch",
    ] {
        for view in ["front", "side", "top"] {
            let svg = stdout_of(&["draw", &example_rig(name), "-o", "-", "--view", view]);
            let doc = roxmltree::Document::parse(&svg).unwrap();
            let root = doc.root_element();
            let width_mm: f64 = root
                .attribute("width")
                .unwrap()
                .strip_suffix("mm")
                .unwrap()
                .parse()
                .unwrap();
            let view_box_w: f64 = root
                .attribute("viewBox")
                .unwrap()
                .split(' ')
                .nth(2)
                .unwrap()
                .parse()
                .unwrap();
            assert!(
                (view_box_w / width_mm - px_per_mm).abs() < 1e-3,
                "{name} {view}: sheet in mm"
            );
            let title = svg.split("Scale ").nth(1).unwrap_or("");
            let ratio: String = title
                .chars()
                .take_while(|c| c.is_ascii_digit() || *c == ':')
                .collect();
            let (paper, real) = ratio
                .split_once(':')
                .unwrap_or_else(|| panic!("{name} {view}: no scale in the title block"));
            let (paper, real): (f64, f64) = (paper.parse().unwrap(), real.parse().unwrap());
            let standard = |n: f64| {
                let k = n.log10().floor();
                let m = n / 10f64.powf(k);
                [1.0, 2.0, 5.0].iter().any(|s| (m - s).abs() < 1e-9)
            };
            assert!(
                (paper == 1.0 && standard(real)) || (real == 1.0 && standard(paper)),
                "{name} {view}: scale {paper}:{real} is not a standard one"
            );
            // The horizontal overall dimension: its line length against its label.
            let dim = with_class(&doc, "dimension")[0];
            let line = dim
                .children()
                .filter(|c| c.tag_name().name() == "line")
                .nth(2)
                .unwrap();
            let ((x1, _), (x2, _)) = span_ends(&line);
            let label = with_class(&doc, "dimension-label")[0]
                .text()
                .unwrap()
                .to_string();
            let (value, unit) = label.split_once(' ').unwrap();
            let mm = value.parse::<f64>().unwrap()
                * match unit {
                    "mm" => 1.0,
                    "cm" => 10.0,
                    "m" => 1000.0,
                    "in" => 25.4,
                    "ft" => 304.8,
                    u => panic!("unit {u}"),
                };
            let drawn_mm = (x2 - x1).abs() / px_per_mm;
            let expected = mm * paper / real;
            assert!(
                (drawn_mm - expected).abs() <= 0.01 * expected + 0.2,
                "{name} {view}: {label} drawn as {drawn_mm:.2} mm, expected {expected:.2} mm at {ratio}"
            );
        }
    }
}

/// Guards edge-on sheaves: a sheave whose axle lies in the sheet's plane projects to a
/// line of no width; the iso view still draws it as a visible ellipse.
#[test]
fn an_edge_on_sheave_stays_visible_in_the_iso_view() {
    let dir = Scratch::new("edge-on");
    // The iso view looks along (1, -1, 1): an axle along (1, 1, 0) lies in the sheet.
    let text = "format: 1
units: {length: mm, force: N, mass: kg}
ropes:
  r: {diameter: 6, mu: 0.2}
parts:
  s: {kind: sheave, at: [0, 0, 2000], axle: [1, 1, 0], diameter: 200,
      bearing: {kind: plain, pin_diameter: 8, mu: 0.1}}
  w: {kind: weight, at: [-72.4, 72.4, 1000], mass: 5}
  h: {kind: haul, at: [72.4, -72.4, 1000]}
lines:
  l: {rope: r, path: [w, s, h]}
";
    let file = dir.join("edge-on.yaml");
    fs::write(&file, text).unwrap();
    let svg = stdout_of(&["draw", file.to_str().unwrap(), "-o", "-", "--view", "iso"]);
    let doc = roxmltree::Document::parse(&svg).unwrap();
    let part = with_class(&doc, "part")
        .into_iter()
        .find(|g| g.attribute("data-part") == Some("s"))
        .unwrap();
    let outline = part
        .children()
        .find(|c| c.tag_name().name() == "path")
        .unwrap();
    let points = path_points(outline.attribute("d").unwrap());
    // Its width across the projected line (the major axis runs along the rope's plane).
    let (cx, cy) = (
        points.iter().map(|p| p.0).sum::<f64>() / points.len() as f64,
        points.iter().map(|p| p.1).sum::<f64>() / points.len() as f64,
    );
    let far = points
        .iter()
        .copied()
        .max_by(|a, b| {
            (a.0 - cx)
                .hypot(a.1 - cy)
                .total_cmp(&(b.0 - cx).hypot(b.1 - cy))
        })
        .unwrap();
    let (ux, uy) = ((far.0 - cx), (far.1 - cy));
    let n = ux.hypot(uy);
    let across = points
        .iter()
        .map(|p| ((p.0 - cx) * -uy + (p.1 - cy) * ux) / n)
        .fold(0.0f64, |m, d| m.max(d.abs()));
    assert!(n > 10.0, "the sheave's diameter is drawn ({n:.1} px)");
    assert!(
        across >= 2.0,
        "edge-on sheave drawn {:.2} px wide",
        2.0 * across
    );
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
