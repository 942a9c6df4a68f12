//! `--units file|si|metric|imperial` on the human-readable outputs: an imperial rig reads
//! in lbf, in, ft, lb and lbf*ft everywhere, `--units si` gives the SI figures of the
//! JSON, `file` (the default) changes nothing, and JSON stays SI whatever is asked.

use super::support::run::reeve_on;
use super::support::{assert_rel, example_rig, reeve, stdout_of, test_rig, Scratch};

/// Unit symbols that are not US customary, as the reports write them.
const NOT_IMPERIAL: [&str; 11] = [
    "N", "kN", "MN", "m", "mm", "cm", "kg", "g", "N*m", "N*mm", "kN*m",
];

/// Each place in `text` where `symbol` stands as a unit: after a number and a space, in
/// parentheses (a header), after `_` (a CSV header, `ideal_N`), or after `/` or `per `
/// (a ratio), and not followed by more of a word or a product.
fn unit_uses<'a>(text: &'a str, symbol: &str) -> Vec<&'a str> {
    let mut found = Vec::new();
    for (i, _) in text.match_indices(symbol) {
        let before = &text[..i];
        let after = &text[i + symbol.len()..];
        let unit_like_before = before.ends_with('(')
            || before.ends_with('_')
            || before.ends_with('/')
            || before.ends_with("per ")
            || (before.ends_with(' ')
                && before[..before.len() - 1]
                    .chars()
                    .last()
                    .is_some_and(|c| c.is_ascii_digit()));
        let ends = !after.starts_with(|c: char| c.is_alphanumeric() || "*^_-".contains(c));
        if unit_like_before && ends {
            let start = before.len().saturating_sub(30);
            let start = (0..=start)
                .rev()
                .find(|&s| text.is_char_boundary(s))
                .unwrap_or(0);
            let end = (i + symbol.len() + 10).min(text.len());
            let end = (end..=text.len())
                .find(|&e| text.is_char_boundary(e))
                .unwrap_or(text.len());
            found.push(&text[start..end]);
        }
    }
    found
}

/// The text of an SVG or HTML document as shown: without its markup (tags become
/// spaces), style sheets and scripts; other
/// text as it is.
fn visible(text: &str) -> String {
    if !text.trim_start().starts_with('<') {
        return text.to_string();
    }
    // Style sheets and scripts are not shown.
    let mut shown = text.to_string();
    for (open, close) in [("<style", "</style>"), ("<script", "</script>")] {
        while let Some(a) = shown.find(open) {
            let b = shown[a..]
                .find(close)
                .map_or(shown.len(), |b| a + b + close.len());
            shown.replace_range(a..b, " ");
        }
    }
    let mut out = String::new();
    let mut in_tag = false;
    for c in shown.chars() {
        match c {
            '<' => in_tag = true,
            '>' => {
                in_tag = false;
                out.push(' ');
            }
            c if !in_tag => out.push(c),
            _ => {}
        }
    }
    out
}

#[track_caller]
fn assert_only_imperial(what: &str, text: &str) {
    // The method notes state standard gravity by its defined SI value (a constant, not a
    // figure of the rig).
    let text = &visible(text).replace("9.806 65 m/s²", "");
    for symbol in NOT_IMPERIAL {
        let uses = unit_uses(text, symbol);
        assert!(
            uses.is_empty(),
            "{what}: `{symbol}` stands as a unit in an imperial output: {uses:?}"
        );
    }
}

/// Every human-readable output of `rig` with `--units imperial` (and a chart), with a
/// stroke of the drive and a rope key to vary.
fn imperial_outputs(rig: &str, stroke: &str, vary: &str) -> Vec<(String, String)> {
    let scratch = Scratch::new("units");
    let chart = scratch.join("chart.svg");
    let chart_arg = chart.display().to_string();
    let u = ["--units", "imperial"];
    let run = |args: &[&str]| {
        let mut all: Vec<&str> = args.to_vec();
        all.extend(u);
        // A check that fails (exit 1) still writes its text; its diagnostics on stderr
        // are scanned with it.
        let ran = reeve(&all);
        assert!(ran.code == 0 || ran.code == 1, "{args:?}: {}", ran.stderr);
        (args.join(" "), format!("{}\n{}", ran.stdout, ran.stderr))
    };
    let mut out = vec![
        run(&["check", rig]),
        run(&["table", rig]),
        run(&["table", rig, "--format", "md"]),
        run(&["table", rig, "--format", "csv"]),
        run(&["table", rig, "--format", "csv", "--table", "parts"]),
        run(&["draw", rig, "-o", "-"]),
        run(&["report", rig, "-o", "-"]),
        run(&["compare", rig, rig]),
        run(&["compare", rig, rig, "--format", "md"]),
        run(&["compare", rig, rig, "--format", "csv"]),
        run(&["rank", rig]),
        run(&["rank", rig, "--format", "csv"]),
        run(&["sweep", rig, "--stroke", stroke, "--steps", "3"]),
        run(&[
            "sweep", rig, "--stroke", stroke, "--steps", "3", "--format", "csv",
        ]),
        run(&[
            "sweep", rig, "--vary", vary, "--steps", "3", "--format", "csv",
        ]),
        run(&[
            "sweep", rig, "--vary", vary, "--steps", "3", "--plot", &chart_arg,
        ]),
    ];
    out.push((
        "sweep chart".into(),
        std::fs::read_to_string(&chart).expect("chart written"),
    ));
    out
}

#[test]
fn an_imperial_rig_reads_in_imperial_units_throughout() {
    let rig = test_rig("imperial-winch.yaml");
    let outputs = imperial_outputs(&rig, "90 deg", "ropes.line.mu=0.1..0.3");
    for (what, text) in &outputs {
        assert_only_imperial(what, text);
    }
    // And the imperial units are there: forces, sizes, span lengths, masses, torques.
    let check = &outputs[0].1;
    assert!(check.contains(" lbf*ft"), "torque in lbf*ft:\n{check}");
    assert!(check.contains(" ft "), "span lengths in ft:\n{check}");
    assert!(check.contains(" lbf "), "tensions in lbf:\n{check}");
    let table = &outputs[1].1;
    assert!(
        table.contains("Units: length in (spans ft), force lbf, mass lb, torque lbf*ft"),
        "{table}"
    );
    assert!(table.contains("length (ft)") && table.contains("pin load forward (lbf)"));
    let svg = &outputs[5].1;
    assert!(
        svg.contains(" in<") || svg.contains(" in "),
        "dimensions in inches"
    );
    let html = &outputs[6].1;
    assert!(html.contains("(lbf)") && html.contains("lbf*ft"));
}

#[test]
fn a_metric_rig_with_units_imperial_has_no_stray_metric_unit() {
    // The workshop hoist is written in mm and kN, the gallery panel in mm and N with
    // bend-loss and axial-load columns, the cliff raise in m with a rope's stiffness and
    // weight: the same scan on their outputs.
    for (name, stroke, vary) in [
        ("workshop-hoist", "300 mm", "ropes.wire8.mu=0.1..0.3"),
        ("gallery-panel", "200 mm", "ropes.wire4.mu=0.1..0.3"),
        // A rope with stiffness and weight: stretch, sag, lost travel and spring rate.
        ("cliff-raise", "300 mm", "ropes.static11.mu=0.2..0.3"),
    ] {
        for (what, text) in imperial_outputs(&example_rig(name), stroke, vary) {
            assert_only_imperial(&format!("{name}: {what}"), &text);
        }
    }
}

/// CSV rows (header and records) of a run's stdout.
fn csv_of(args: &[&str]) -> (Vec<String>, Vec<Vec<String>>) {
    let text = stdout_of(args);
    let mut reader = csv::Reader::from_reader(text.as_bytes());
    let headers = reader
        .headers()
        .unwrap()
        .iter()
        .map(str::to_string)
        .collect();
    let rows = reader
        .records()
        .map(|r| r.unwrap().iter().map(str::to_string).collect())
        .collect();
    (headers, rows)
}

fn column(headers: &[String], name: &str) -> usize {
    headers
        .iter()
        .position(|h| h == name)
        .unwrap_or_else(|| panic!("no column `{name}` in {headers:?}"))
}

#[test]
fn units_si_on_an_imperial_rig_gives_the_si_figures() {
    let rig = test_rig("imperial-winch.yaml");
    let json = super::support::json_of(&["table", &rig, "--json"]);
    let (headers, rows) = csv_of(&["table", &rig, "--format", "csv", "--units", "si"]);
    let (length, forward) = (
        column(&headers, "length (m)"),
        column(&headers, "tension forward (N)"),
    );
    for (i, row) in rows.iter().enumerate() {
        let span = &json["spans"][i];
        let csv = |c: usize| row[c].parse::<f64>().unwrap();
        // CSV numbers have six significant figures.
        assert_rel(
            "span length, m",
            csv(length),
            span["length_m"].as_f64().unwrap(),
            5e-6,
        );
        assert_rel(
            "forward tension, N",
            csv(forward),
            span["tension_n"]["forward"].as_f64().unwrap(),
            5e-6,
        );
    }
    let (headers, rows) = csv_of(&[
        "table", &rig, "--format", "csv", "--table", "parts", "--units", "si",
    ]);
    let pin = column(&headers, "pin load forward (N)");
    let lead = rows.iter().position(|r| r[0] == "lead").unwrap();
    let lead_json = json["parts"]
        .as_array()
        .unwrap()
        .iter()
        .find(|p| p["part"] == "lead")
        .unwrap();
    assert_rel(
        "lead pin load, N",
        rows[lead][pin].parse().unwrap(),
        lead_json["pin_load_n"]["forward"].as_f64().unwrap(),
        5e-6,
    );
    // The summary too: the torque in N*m as `check --json` gives it, to four figures.
    let check = super::support::json_of(&["check", &rig, "--json"]);
    let ideal = check["ideal"]["value"].as_f64().unwrap();
    let text = stdout_of(&["check", &rig, "--units", "si"]);
    let shown = format!("{:.2} N*m", ideal);
    assert!(text.contains(&shown), "`{shown}` in:\n{text}");
    // 150 lbf at the drum's pitch radius (4 + 0.25)/2 in = 0.177083 ft: 26.5625 lbf*ft
    // ideal (a 150 lb mass weighs 150 lbf under standard gravity, by definition).
    let imperial = stdout_of(&["check", &rig]);
    assert!(imperial.contains("26.56 lbf*ft"), "{imperial}");
    assert_rel("ideal torque, N*m", ideal, 26.5625 * 1.355_818, 1e-6);
}

#[test]
fn units_file_is_the_default_and_json_stays_si() {
    let rig = example_rig("workshop-hoist");
    for args in [
        vec!["table", rig.as_str()],
        vec!["check", rig.as_str()],
        vec!["draw", rig.as_str(), "-o", "-"],
    ] {
        let plain = stdout_of(&args);
        let mut with = args.clone();
        with.extend(["--units", "file"]);
        assert_eq!(
            plain,
            stdout_of(&with),
            "{args:?}: --units file changes nothing"
        );
    }
    for command in [
        vec!["check", rig.as_str(), "--json"],
        vec!["table", rig.as_str(), "--json"],
        vec!["compare", rig.as_str(), rig.as_str(), "--json"],
    ] {
        let plain = stdout_of(&command);
        for units in ["si", "metric", "imperial"] {
            let mut with = command.clone();
            with.extend(["--units", units]);
            assert_eq!(
                plain,
                stdout_of(&with),
                "{command:?} --units {units}: JSON is SI"
            );
        }
    }
}

#[test]
fn units_metric_is_the_drawing_set_of_the_readme() {
    let rig = test_rig("imperial-winch.yaml");
    let table = stdout_of(&["table", &rig, "--units", "metric"]);
    assert!(
        table.contains("Units: length mm (spans m), force kN, mass kg, torque kN*m"),
        "{table}"
    );
    assert!(table.contains("length (m)") && table.contains("tension forward (kN)"));
    let check = stdout_of(&["check", &rig, "--units", "metric"]);
    assert!(check.contains(" kN*m"), "{check}");
}

#[test]
fn units_refuses_an_unknown_system() {
    let rig = example_rig("workshop-hoist");
    let ran = reeve(&["table", &rig, "--units", "cgs"]);
    assert_eq!(ran.code, 2, "{}", ran.stderr);
    assert!(ran.stderr.contains("imperial"), "{}", ran.stderr);
}

#[test]
fn motion_with_units_imperial_has_no_metric_unit_and_its_csv_follows() {
    // The ballast panel (a metric rig) moves, jerks and hits its stops, so the text has
    // events, strokes, the energy line and `stop-speed` warnings with figures.
    let rig = example_rig("ballast-panel");
    let scratch = Scratch::new("motion-units");
    let chart = scratch.join("motion.svg");
    let chart_arg = chart.display().to_string();
    let text = stdout_of(&["motion", &rig, "--units", "imperial", "--plot", &chart_arg]);
    assert!(
        text.contains("stop-speed") && text.contains("ft/s"),
        "{text}"
    );
    assert_only_imperial("motion text", &text);
    let svg = std::fs::read_to_string(&chart).expect("chart written");
    assert_only_imperial("motion chart", &svg);
    let csv = stdout_of(&["motion", &rig, "--units", "imperial", "--format", "csv"]);
    assert_only_imperial("motion csv", &csv);
    let (headers, rows) = csv_of(&["motion", &rig, "--units", "imperial", "--format", "csv"]);
    let (si_headers, si_rows) = csv_of(&["motion", &rig, "--format", "csv"]);
    assert_eq!(
        headers,
        [
            "t_s",
            "position_in",
            "speed_ft_per_s",
            "drive_value_lb",
            "tension_lbf"
        ]
    );
    // Without --units the CSV stays SI, as it was.
    assert_eq!(
        si_headers,
        [
            "t_s",
            "position_m",
            "speed_m_per_s",
            "drive_value_kg",
            "tension_n"
        ]
    );
    let last = rows.len() - 1;
    let value = |r: &[Vec<String>], row: usize, col: usize| r[row][col].parse::<f64>().unwrap();
    assert_rel(
        "position, in",
        value(&rows, last, 1) * 0.0254,
        value(&si_rows, last, 1),
        1e-12,
    );
    assert_rel(
        "drive, lb",
        value(&rows, last, 3) * 0.45359237,
        value(&si_rows, last, 3),
        1e-12,
    );
    assert_rel(
        "tension, lbf",
        value(&rows, last, 4) * 4.4482216152605,
        value(&si_rows, last, 4),
        1e-12,
    );
    // JSON stays SI.
    let json = stdout_of(&["motion", &rig, "--units", "imperial", "--format", "json"]);
    assert!(json.contains("\"position_unit\": \"m\""), "{json:.300}");
}

#[test]
fn warnings_quoting_a_figure_read_in_the_units_shown() {
    // Guards the messages that quote a figure (the rope checks' "heavier than solid
    // steel") against printing it in SI whatever `--units` asks: they go
    // through the units layer as the tables do. Our own probe rig, written in metric: a
    // 10 mm rope given 100 kg/m and an EA of 1000 MN (beyond a solid steel bar).
    let rig = r#"format: 1
title: probe hoist with an impossible rope
units: {length: mm, force: N, mass: kg}
ropes:
  r: {diameter: 10, breaking_strength: 20 kN, mu: 0.2, mass_per_length: 100 kg/m,
      stiffness: 1000 MN}
parts:
  head: {kind: sheave, at: [0, 0, 10000], axle: [0, 1, 0], diameter: 200,
         bearing: {kind: plain, pin_diameter: 20, mu: 0.1}}
  w: {kind: weight, at: [-100, 0, 0], mass: 10}
  hand: {kind: haul, at: [100, 0, 8000]}
lines:
  fall: {rope: r, path: [w, head, hand]}
"#;
    for args in [
        &["check", "--units", "imperial"][..],
        &["table", "--units", "imperial"],
        &["report", "-o", "-", "--units", "imperial"],
    ] {
        let ran = reeve_on(rig, args);
        assert!(ran.code == 0 || ran.code == 1, "{args:?}: {}", ran.stderr);
        let text = format!("{}\n{}", ran.stdout, ran.stderr);
        if args[0] == "check" {
            assert!(
                text.contains("rope-weight") || text.contains("solid steel bar"),
                "{text}"
            );
            assert!(
                text.contains(" lb/ft"),
                "the rope's weight in lb/ft:\n{text}"
            );
        }
        assert_only_imperial(&args.join(" "), &text);
    }
}

#[test]
fn the_html_report_s_motion_section_follows_units() {
    // Guards the HTML report's motion section (events, strokes, warnings with figures,
    // the chart) against showing the file's metric units under `--units imperial`, as the
    // text tables do not: the ballast panel moves, jerks and hits its stops.
    let rig = example_rig("ballast-panel");
    let html = stdout_of(&["report", &rig, "--units", "imperial", "-o", "-"]);
    let start = html
        .find("<section id=\"motion\">")
        .expect("a motion section");
    let end = start + html[start..].find("</section>").expect("its end");
    let section = &html[start..end];
    assert!(
        section.contains("ft/s") && section.contains("(in)") && section.contains("(lb)"),
        "{section:.600}"
    );
    assert_only_imperial("report motion section", section);
    assert_only_imperial("report", &html);
}

#[test]
fn watch_writes_its_check_and_report_in_the_units_asked() {
    // Guards `watch`, the other command that writes the HTML report (with its motion
    // section): it took no `--units`, so its page and check text kept the file's metric
    // units whatever a user of `report --units` expected.
    let dir = Scratch::new("watch-units");
    std::fs::copy(example_rig("ballast-panel"), dir.join("rig.yaml")).expect("copy rig");
    let mut watch = crate::tools::Watching::start(
        &dir,
        &[
            "watch",
            "rig.yaml",
            "-o",
            "report.html",
            "--units",
            "imperial",
        ],
    );
    let first = watch.until("watching rig.yaml");
    let html = std::fs::read_to_string(dir.join("report.html")).expect("report written");
    let (code, out, err) = watch.interrupt();
    assert_eq!(code, 0, "{out}\n{err}");
    assert!(
        html.contains("<section id=\"motion\">"),
        "no motion section"
    );
    assert!(html.contains("ft/s"), "{html:.300}");
    assert_only_imperial("watch report", &html);
    assert_only_imperial("watch check text", &first);
}

#[test]
fn motion_s_geometry_end_warnings_follow_units() {
    // Guards the warnings of a run without `travel` (`geometry-end`, `open-end`): their
    // positions, speeds and the rope drawn are figures, shown in the units asked.
    let rig = example_rig("ramp-winch");
    let text = stdout_of(&["motion", &rig, "--units", "imperial"]);
    assert!(text.contains("[geometry-end]"), "{text}");
    assert_only_imperial("motion geometry-end", &text);
    let back = std::fs::read_to_string(&rig)
        .expect("rig")
        .replace("torque: 30,", "torque: 10,");
    let ran = crate::support::run::reeve_on(&back, &["motion", "--units", "imperial"]);
    assert!(ran.stdout.contains("[open-end]"), "{}", ran.stdout);
    assert!(
        ran.stdout.contains(" ft)"),
        "the rope drawn in ft: {}",
        ran.stdout
    );
    assert_only_imperial("motion open-end", &ran.stdout);
}
