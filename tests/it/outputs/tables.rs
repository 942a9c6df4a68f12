//! Golden text, Markdown and CSV tables; CSV and JSON parsed back.

use super::*;

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
