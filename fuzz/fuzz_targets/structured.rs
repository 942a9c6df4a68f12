//! Fuzz target: a rig file with commands, run in-process through the library paths the
//! command line uses: `--set`, `variants`, `compare`, `sweep` (`--vary` and
//! `--stroke`), `rank` (with `--to`), `spread`, the span and part tables, the SVG
//! drawing and its DXF, the HTML report and the studies' charts.
//!
//! The input is rig text; lines that start with `#%` (YAML comments, so the rig's line
//! numbers stay as written) are commands, at most [`MAX_COMMANDS`] of them:
//!
//! ```text
//! #% set KEY=VALUE                   an override, as `--set` (applies to every command)
//! #% check                           check text and JSON
//! #% table FORMAT CASE CHOICE        text|md|csv|json, all|ideal|forward|back, both|spans|parts
//! #% draw VIEW                       front|side|top|iso|auto (SVG and DXF)
//! #% html VIEW
//! #% variants FORMAT                 compare --variants
//! #% compare FORMAT                  the rig as written beside the rig with the overrides
//! #% sweep KEY=FROM..TO STEPS FORMAT
//! #% stroke DISTANCE STEPS FORMAT
//! #% rank FORMAT [BEARING]           BEARING as `--to` takes it (`rolling`, `{kind: ...}`)
//! #% spread SAMPLES SEED FORMAT
//! ```
//!
//! Without commands it runs `check`, every table, `draw auto` and `html auto`. Study
//! sizes are capped so that one input runs in milliseconds.
//!
//! Oracles: no panic; no non-finite number in any result (walked as a YAML value, which
//! keeps NaN and infinities that JSON would turn into `null`) nor a `NaN` or `inf` in any
//! text, table, chart or drawing; efficiencies between 0 and 1 or absent; every JSON
//! output parses; every SVG (drawings, charts, and each one inside the HTML) parses as
//! XML with finite coordinates; every DXF is ASCII, pairs of lines, with finite numbers;
//! every load error names the file and locates each problem (a line and column, or the
//! key or part it concerns).
//!
//! Run (nightly): `cargo +nightly fuzz run structured corpus/structured -- -dict=rig.dict
//! -max_len=4096 -timeout=5`.
#![no_main]

use libfuzzer_sys::fuzz_target;
use reeve::model::PartKind;
use reeve::report::html;
use reeve::report::svg::{self, DrawOptions, View};
use reeve::report::table::{self, CaseFilter, Style, TableChoice};
use reeve::report::Format;
use reeve::rig::{LoadError, RigText};
use reeve::study::{compare, rank, spread, sweep, RigSource, StudyError};

/// Commands run per input, at most.
const MAX_COMMANDS: usize = 6;
/// Overrides per input, at most.
const MAX_SETS: usize = 8;
/// Sweep steps, stroke steps and spread samples, at most.
const MAX_STEPS: usize = 6;
const MAX_STROKE_STEPS: usize = 4;
const MAX_SAMPLES: usize = 8;
/// `rank` solves the rig twice per round part and per coefficient: skip big rigs.
const MAX_RANK_PARTS: usize = 12;

const SOURCE: &str = "fuzz.yaml";

fuzz_target!(|data: &[u8]| {
    // The CLI refuses non-UTF-8 files before parsing; do the same.
    let Ok(text) = std::str::from_utf8(data) else {
        return;
    };
    let mut sets = Vec::new();
    let mut commands = Vec::new();
    for line in text.lines() {
        let Some(command) = line.strip_prefix("#%") else {
            continue;
        };
        let command = command.trim();
        if let Some(set) = command.strip_prefix("set ") {
            // As the CLI's `parse_sets`: a `--set` without `=` is refused before loading.
            if let Some((k, v)) = set.split_once('=') {
                if sets.len() < MAX_SETS {
                    sets.push((k.trim().to_string(), v.trim().to_string()));
                }
            }
        } else if commands.len() < MAX_COMMANDS {
            commands.push(command.to_string());
        }
    }
    let ctx = Context {
        text,
        nan_word: has_word(text, "nan"),
        inf_word: has_word(text, "inf"),
    };
    let source = RigSource::new(RigText::from_text(text, SOURCE), &sets);
    // Every command starts as the CLI does: the rig with its overrides must load and solve.
    let rig = match source.load(&[]) {
        Ok(rig) => rig,
        Err(e) => return ctx.study_error(&e),
    };
    let solution = match source.solve_rig(&rig) {
        Ok(s) => s,
        Err(e) => return ctx.study_error(&e),
    };
    for sub in &solution.subrigs {
        for value in [sub.ideal.value, sub.forward.value, sub.back.value] {
            assert!(value.is_finite(), "a solved rig gave {value}");
        }
    }
    let report = reeve::study::assess(&rig, &solution);
    ctx.values(&report, "report");
    if commands.is_empty() {
        commands = vec![
            "check".into(),
            "table text all both".into(),
            "table md forward both".into(),
            "table csv back parts".into(),
            "table json all both".into(),
            "draw auto".into(),
            "html auto".into(),
        ];
    }
    for command in &commands {
        let mut words = command.split_whitespace();
        let verb = words.next().unwrap_or_default();
        let arg = |i: usize| command.split_whitespace().nth(i + 1).unwrap_or_default();
        match verb {
            "check" => {
                let mut out = Vec::new();
                reeve::report::text::write_check(&mut out, &rig, &report, SOURCE).unwrap();
                ctx.text(&out, "check");
                ctx.json(&serde_json::to_string(&report).unwrap(), "check --json");
            }
            "table" => {
                let cases = match arg(1) {
                    "ideal" => CaseFilter::Ideal,
                    "forward" => CaseFilter::Forward,
                    "back" => CaseFilter::Back,
                    _ => CaseFilter::All,
                };
                let choice = match arg(2) {
                    "spans" => TableChoice::Spans,
                    "parts" => TableChoice::Parts,
                    _ => TableChoice::Both,
                };
                let mut out = Vec::new();
                match arg(0) {
                    "json" => {
                        let json = table::tables_json(&report, cases, choice);
                        ctx.values(&json, "table json");
                        ctx.json(&serde_json::to_string(&json).unwrap(), "table json");
                    }
                    format => {
                        let style = if format == "csv" {
                            Style::Data
                        } else {
                            Style::Human
                        };
                        let tables = table::tables(&report, &rig.units, cases, choice, style);
                        match format {
                            "md" => table::write_markdown(&mut out, &report, &rig.units, &tables),
                            "csv" => tables
                                .iter()
                                .try_for_each(|t| table::write_csv(&mut out, t)),
                            _ => table::write_text(&mut out, &report, &rig.units, &tables),
                        }
                        .unwrap();
                        ctx.text(&out, "table");
                    }
                }
            }
            "draw" | "html" => {
                let options = DrawOptions {
                    view: match arg(0) {
                        "front" => Some(View::Front),
                        "side" => Some(View::Side),
                        "top" => Some(View::Top),
                        "iso" => Some(View::Iso),
                        _ => None,
                    },
                    date: "2026-01-01".to_string(),
                    standalone: verb == "draw",
                };
                let mut out = Vec::new();
                if verb == "draw" {
                    svg::write_svg(&mut out, &rig, &solution, &report, &options).unwrap();
                    ctx.svg(std::str::from_utf8(&out).unwrap(), "draw");
                    // The DXF of the same sheet: ASCII, pairs of lines, every number finite.
                    let mut dxf = Vec::new();
                    reeve::report::dxf::write_dxf(&mut dxf, &rig, &solution, &report, &options)
                        .unwrap();
                    assert!(dxf.is_ascii(), "dxf: not ASCII");
                    ctx.text(&dxf, "dxf");
                    let lines: Vec<&str> = std::str::from_utf8(&dxf).unwrap().lines().collect();
                    assert!(lines.len() % 2 == 0, "dxf: not pairs of lines");
                    for pair in lines.chunks(2) {
                        let code: u16 = pair[0].trim().parse().expect("dxf: group code");
                        if (10..=59).contains(&code) {
                            let x: f64 = pair[1].trim().parse().expect("dxf: a number");
                            assert!(x.is_finite(), "dxf: {x} at group {code}");
                        }
                    }
                } else {
                    html::write_html(&mut out, &rig, &solution, &report, &options, SOURCE).unwrap();
                    ctx.html(std::str::from_utf8(&out).unwrap());
                }
            }
            "variants" => match compare::compare_variants(&source) {
                Ok(c) => {
                    ctx.values(&c, "variants");
                    ctx.formats(arg(0), "variants", |w, f| {
                        reeve::report::study::compare::write(w, &c, f)
                    });
                }
                Err(e) => ctx.study_error(&e),
            },
            "compare" => {
                let plain = RigSource::new(RigText::from_text(text, "plain.yaml"), &[]);
                match compare::compare_rigs(&[plain, source.clone()]) {
                    Ok(c) => {
                        ctx.values(&c, "compare");
                        ctx.formats(arg(0), "compare", |w, f| {
                            reeve::report::study::compare::write(w, &c, f)
                        });
                    }
                    Err(e) => ctx.study_error(&e),
                }
            }
            "sweep" => {
                let steps = arg(1).parse::<usize>().unwrap_or(3).clamp(1, MAX_STEPS);
                let vary = match sweep::parse_vary(arg(0)) {
                    Ok(v) => v,
                    Err(e) => {
                        ctx.study_error(&e);
                        continue;
                    }
                };
                match sweep::sweep(&source, &vary, steps, &()) {
                    Ok(s) => {
                        ctx.values(&s, "sweep");
                        ctx.formats(arg(2), "sweep", |w, f| {
                            reeve::report::study::sweep::write_sweep(w, &s, f)
                        });
                        ctx.svg(&reeve::report::study::sweep::sweep_chart(&s), "sweep chart");
                    }
                    Err(e) => ctx.study_error(&e),
                }
            }
            "stroke" => {
                // A distance may be two words (`50 mm`): take what is left but the last
                // two words when there are more than three.
                let rest: Vec<&str> = command.split_whitespace().skip(1).collect();
                let (distance, steps, format) = match rest.len() {
                    0 => (String::new(), 2, ""),
                    1 => (rest[0].to_string(), 2, ""),
                    2 => (rest[0].to_string(), rest[1].parse().unwrap_or(2), ""),
                    n => (
                        rest[..n - 2].join(" "),
                        rest[n - 2].parse().unwrap_or(2),
                        rest[n - 1],
                    ),
                };
                let steps = steps.clamp(1, MAX_STROKE_STEPS);
                match sweep::stroke(&source, &distance, steps, 2, &()) {
                    Ok(s) => {
                        ctx.values(&s, "stroke");
                        ctx.formats(format, "stroke", |w, f| {
                            reeve::report::study::sweep::write_stroke(w, &s, f)
                        });
                        ctx.svg(
                            &reeve::report::study::sweep::stroke_chart(&s),
                            "stroke chart",
                        );
                    }
                    Err(e) => ctx.study_error(&e),
                }
            }
            "rank" => {
                let round = rig
                    .parts
                    .iter()
                    .filter(|p| {
                        matches!(
                            p.kind,
                            PartKind::Sheave(_) | PartKind::Guide(_) | PartKind::Drum(_)
                        )
                    })
                    .count();
                if round > MAX_RANK_PARTS {
                    continue;
                }
                let to = command
                    .split_whitespace()
                    .skip(2)
                    .collect::<Vec<_>>()
                    .join(" ");
                let alt = (!to.is_empty()).then(|| rank::Alternative::parse(&to));
                if let Some(rank::Alternative::Bearing(bearing)) = &alt {
                    // As the CLI: a bearing is checked once on the first sheave.
                    if let Some(p) = rig
                        .parts
                        .iter()
                        .find(|p| matches!(p.kind, PartKind::Sheave(_)))
                    {
                        let key = format!("parts.{}.bearing", p.name);
                        if let Err(e) = source.load(&[(key, bearing.clone())]) {
                            ctx.study_error(&e);
                            continue;
                        }
                    }
                }
                match rank::rank(&source, alt.as_ref(), &()) {
                    Ok(r) => {
                        ctx.values(&r, "rank");
                        ctx.formats(arg(0), "rank", |w, f| {
                            reeve::report::study::rank::write(w, &r, f)
                        });
                    }
                    Err(e) => ctx.study_error(&e),
                }
            }
            "spread" => {
                let samples = arg(0).parse::<usize>().unwrap_or(4).clamp(1, MAX_SAMPLES);
                let seed = arg(1).parse::<u64>().unwrap_or(1);
                match spread::spread(&source, samples, seed, 1, &()) {
                    Ok(s) => {
                        ctx.values(&s, "spread");
                        ctx.formats(arg(2), "spread", |w, f| {
                            reeve::report::study::spread::write(w, &s, f)
                        });
                    }
                    Err(e) => ctx.study_error(&e),
                }
            }
            _ => {}
        }
    }
});

/// What the oracles need to know about the input.
struct Context<'a> {
    text: &'a str,
    /// The input spells `nan` or `inf` as a word (a name, a title): such a word in an
    /// output may be the input's own text, so only values are checked for it.
    nan_word: bool,
    inf_word: bool,
}

/// Whether `word` occurs in `text` (any case) with no letter or digit either side.
fn has_word(text: &str, word: &str) -> bool {
    let lower = text.to_ascii_lowercase();
    lower.match_indices(word).any(|(i, _)| {
        let before = lower[..i].chars().next_back();
        let after = lower[i + word.len()..].chars().next();
        !before.is_some_and(|c| c.is_alphanumeric()) && !after.is_some_and(|c| c.is_alphanumeric())
    })
}

impl Context<'_> {
    /// A study's error: a load error is located; the others are worded.
    fn study_error(&self, e: &StudyError) {
        match e {
            StudyError::Load(e) => self.load_error(e),
            StudyError::Solve { source_name, error } => {
                assert!(source_name.starts_with(SOURCE) || source_name.starts_with("plain.yaml"));
                assert!(!error.to_string().is_empty(), "an empty solve error");
            }
            StudyError::Input(m) => assert!(!m.trim().is_empty(), "an empty study error"),
        }
    }

    fn load_error(&self, e: &LoadError) {
        assert!(!e.problems.is_empty(), "a load error without a problem");
        for p in &e.problems {
            assert!(
                !p.message.trim().is_empty(),
                "a problem without a message: {p:?}"
            );
            match p.location {
                Some(l) => assert!(
                    l.line >= 1 && l.column >= 1,
                    "a problem at line {} column {}: {p:?}",
                    l.line,
                    l.column
                ),
                None => assert!(
                    !p.subject.trim().is_empty() || p.message.contains("(override `"),
                    "a problem with neither a location nor a subject: {p:?}"
                ),
            }
        }
        let shown = e.to_string();
        self.text(shown.as_bytes(), "load error");
    }

    /// No non-finite number anywhere in a result, and every efficiency in 0..=1.
    fn values(&self, value: &impl serde::Serialize, what: &str) {
        let value = serde_yaml::to_value(value).expect("a result serializes");
        walk(&value, what, false);
    }

    /// Text output: no `NaN` or `inf` unless the input wrote that word itself.
    fn text(&self, out: &[u8], what: &str) {
        let s = std::str::from_utf8(out).unwrap_or_else(|_| panic!("{what}: not UTF-8"));
        if !self.nan_word {
            assert!(!has_word(s, "nan"), "{what}: NaN in\n{s}");
        }
        if !self.inf_word {
            assert!(!has_word(s, "inf"), "{what}: inf in\n{s}");
        }
        let _ = self.text;
    }

    fn json(&self, s: &str, what: &str) {
        let _: serde_json::Value =
            serde_json::from_str(s).unwrap_or_else(|e| panic!("{what}: bad JSON ({e}):\n{s}"));
        self.text(s.as_bytes(), what);
    }

    /// Writes a study in every format (or the one named) and checks each.
    fn formats(
        &self,
        name: &str,
        what: &str,
        write: impl Fn(&mut dyn std::io::Write, Format) -> std::io::Result<()>,
    ) {
        let all = [Format::Text, Format::Markdown, Format::Csv, Format::Json];
        let chosen: Vec<Format> = match Format::parse(name) {
            Some(f) => vec![f],
            None => all.to_vec(),
        };
        for f in chosen {
            let mut out = Vec::new();
            write(&mut out, f).unwrap();
            if f == Format::Json {
                self.json(std::str::from_utf8(&out).unwrap(), what);
            } else {
                self.text(&out, what);
            }
        }
    }

    /// An SVG parses as XML and every coordinate in it is a finite number.
    fn svg(&self, s: &str, what: &str) {
        self.text(s.as_bytes(), what);
        let doc = roxmltree::Document::parse(s)
            .unwrap_or_else(|e| panic!("{what}: the SVG does not parse ({e}):\n{s}"));
        for node in doc.descendants().filter(|n| n.is_element()) {
            for a in node.attributes() {
                if !matches!(
                    a.name(),
                    "x" | "y"
                        | "x1"
                        | "y1"
                        | "x2"
                        | "y2"
                        | "cx"
                        | "cy"
                        | "r"
                        | "rx"
                        | "ry"
                        | "width"
                        | "height"
                        | "points"
                        | "d"
                        | "transform"
                        | "viewBox"
                        | "stroke-width"
                        | "font-size"
                ) {
                    continue;
                }
                for number in numbers(a.value()) {
                    assert!(
                        number.is_finite(),
                        "{what}: <{} {}=\"{}\"> is not finite",
                        node.tag_name().name(),
                        a.name(),
                        a.value()
                    );
                    assert!(
                        number.abs() < 1e9,
                        "{what}: <{} {}=\"{}\"> is off the sheet",
                        node.tag_name().name(),
                        a.name(),
                        a.value()
                    );
                }
            }
        }
    }

    /// The HTML report: its text and every inline SVG.
    fn html(&self, s: &str) {
        self.text(s.as_bytes(), "html");
        let mut rest = s;
        while let Some(start) = rest.find("<svg") {
            let end = rest[start..]
                .find("</svg>")
                .unwrap_or_else(|| panic!("html: an <svg> without its end"));
            let svg = &rest[start..start + end + "</svg>".len()];
            self.svg(svg, "html svg");
            rest = &rest[start + end..];
        }
    }
}

/// The numbers of an attribute value (`M 1.5 -2 L 3e2,4`, `translate(3 4)`, `12px`).
fn numbers(value: &str) -> Vec<f64> {
    let mut out = Vec::new();
    let lower = value.to_ascii_lowercase();
    assert!(
        !has_word(&lower, "nan") && !has_word(&lower, "inf") && !lower.contains("infinity"),
        "a non-finite number in `{value}`"
    );
    let mut token = String::new();
    let flush = |token: &mut String, out: &mut Vec<f64>| {
        if let Ok(x) = token.parse::<f64>() {
            out.push(x);
        }
        token.clear();
    };
    let mut prev = ' ';
    for c in value.chars() {
        let starts_new = c == '-' && !matches!(prev, 'e' | 'E');
        if c.is_ascii_digit() || c == '.' || c == 'e' || c == 'E' || c == '-' || c == '+' {
            if starts_new && !token.is_empty() {
                flush(&mut token, &mut out);
            }
            token.push(c);
        } else {
            flush(&mut token, &mut out);
        }
        prev = c;
    }
    flush(&mut token, &mut out);
    out
}

/// Walks a result: every number finite; under a key naming an efficiency, in 0..=1.
fn walk(value: &serde_yaml::Value, path: &str, efficiency: bool) {
    use serde_yaml::Value;
    match value {
        Value::Number(n) => {
            if let Some(x) = n.as_f64() {
                assert!(x.is_finite(), "{path} = {x}");
                if efficiency {
                    assert!((0.0..=1.0).contains(&x), "{path} = {x}: not an efficiency");
                }
            }
        }
        Value::Sequence(items) => {
            for (i, item) in items.iter().enumerate() {
                walk(item, &format!("{path}[{i}]"), efficiency);
            }
        }
        Value::Mapping(map) => {
            for (k, v) in map {
                let key = k.as_str().unwrap_or("?");
                // `change_pct` holds percent changes, of efficiencies too.
                let path = format!("{path}.{key}");
                let efficiency =
                    (efficiency || key.contains("efficiency")) && !path.contains("change_pct");
                walk(v, &path, efficiency);
            }
        }
        Value::Tagged(t) => walk(&t.value, path, efficiency),
        _ => {}
    }
}
