//! Control characters and formulas escaped in every output; sources named right.

use super::*;

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
