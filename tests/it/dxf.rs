//! `reeve draw --format dxf`, read back by a small reader of DXF group codes written here
//! from the format's published description (pairs of lines: a group code, then its
//! value; sections of entities, each starting at code 0), independent of the writer.

use std::collections::BTreeMap;

use super::support::{example_rig, json_of, reeve, stdout_of, test_rig, Scratch};

/// One entity or table record: its type (code 0) and its groups in order.
#[derive(Debug, Clone)]
struct Entity {
    kind: String,
    groups: Vec<(u16, String)>,
}

impl Entity {
    fn get(&self, code: u16) -> Option<&str> {
        self.groups
            .iter()
            .find(|(c, _)| *c == code)
            .map(|(_, v)| v.as_str())
    }
    fn number(&self, code: u16) -> f64 {
        self.get(code)
            .unwrap_or_else(|| panic!("{} without group {code}", self.kind))
            .trim()
            .parse()
            .unwrap_or_else(|e| panic!("{} group {code}: {e}", self.kind))
    }
    fn layer(&self) -> &str {
        self.get(8).unwrap_or("0")
    }
}

/// A DXF file read as sections of records: `{"HEADER": [...], "ENTITIES": [...]}`.
#[derive(Debug)]
struct Dxf {
    sections: BTreeMap<String, Vec<Entity>>,
}

/// Reads the group-code pairs and splits them into sections and records; panics where the
/// file breaks the format (an odd number of lines, a code that is not a number, a section
/// that never ends, text after `EOF`).
fn read_dxf(text: &str) -> Dxf {
    let lines: Vec<&str> = text.lines().collect();
    assert!(lines.len() % 2 == 0, "DXF is pairs of lines");
    let pairs: Vec<(u16, String)> = lines
        .chunks(2)
        .map(|p| {
            let code = p[0]
                .trim()
                .parse::<u16>()
                .unwrap_or_else(|e| panic!("group code `{}`: {e}", p[0]));
            (code, p[1].to_string())
        })
        .collect();
    let mut sections = BTreeMap::new();
    let mut i = 0;
    while i < pairs.len() {
        match (&pairs[i].0, pairs[i].1.as_str()) {
            (0, "EOF") => {
                assert_eq!(i + 1, pairs.len(), "nothing after EOF");
                return Dxf { sections };
            }
            (0, "SECTION") => {
                let (code, name) = &pairs[i + 1];
                assert_eq!(*code, 2, "a section's name follows it");
                i += 2;
                let mut records: Vec<Entity> = Vec::new();
                loop {
                    let (code, value) = pairs.get(i).expect("section ends with ENDSEC");
                    if *code == 0 && value == "ENDSEC" {
                        break;
                    }
                    if *code == 0 {
                        records.push(Entity {
                            kind: value.clone(),
                            groups: Vec::new(),
                        });
                    } else if let Some(r) = records.last_mut() {
                        r.groups.push((*code, value.clone()));
                    } else {
                        // Header variables: one pseudo-record per `9 $NAME`.
                        records.push(Entity {
                            kind: String::new(),
                            groups: vec![(*code, value.clone())],
                        });
                    }
                    i += 1;
                }
                sections.insert(name.clone(), records);
                i += 1;
            }
            other => panic!("unexpected group {other:?} outside a section"),
        }
    }
    panic!("no EOF")
}

/// The header's variables: `$NAME` → the groups after it.
fn header(dxf: &Dxf) -> BTreeMap<String, Vec<(u16, String)>> {
    let mut vars = BTreeMap::new();
    let mut name = None;
    for r in &dxf.sections["HEADER"] {
        for (code, value) in &r.groups {
            if *code == 9 {
                name = Some(value.clone());
                vars.insert(value.clone(), Vec::new());
            } else if let Some(n) = &name {
                vars.get_mut(n).unwrap().push((*code, value.clone()));
            }
        }
    }
    vars
}

/// The text of every `TEXT` on `layer`, with `\U+XXXX` decoded.
fn texts(dxf: &Dxf, layer: &str) -> Vec<String> {
    dxf.sections["ENTITIES"]
        .iter()
        .filter(|e| e.kind == "TEXT" && e.layer() == layer)
        .map(|e| decode(e.get(1).unwrap_or("")))
        .collect()
}

fn decode(s: &str) -> String {
    let mut out = String::new();
    let mut rest = s;
    while let Some(i) = rest.find("\\U+") {
        out.push_str(&rest[..i]);
        let hex = &rest[i + 3..i + 7];
        out.push(char::from_u32(u32::from_str_radix(hex, 16).unwrap()).unwrap());
        rest = &rest[i + 7..];
    }
    out.push_str(rest);
    out.replace("%%%", "%")
}

fn draw_dxf(rig: &str, extra: &[&str]) -> String {
    let mut args = vec!["draw", rig, "--format", "dxf", "-o", "-"];
    args.extend(extra);
    stdout_of(&args)
}

#[test]
fn the_dxf_holds_the_drawing_in_layers_and_the_tension_table() {
    let rig = example_rig("workshop-hoist");
    let text = draw_dxf(&rig, &[]);
    assert!(text.is_ascii(), "ASCII DXF");
    let dxf = read_dxf(&text);
    let vars = header(&dxf);
    assert_eq!(vars["$ACADVER"][0].1, "AC1009", "release 12");
    assert_eq!(
        vars["$INSUNITS"][0].1.trim(),
        "4",
        "millimetres, the file's unit"
    );

    // Layers by kind, declared in the LAYER table.
    let layers: Vec<String> = dxf.sections["TABLES"]
        .iter()
        .filter(|r| r.kind == "LAYER")
        .map(|r| r.get(2).unwrap().to_string())
        .collect();
    for name in ["sheaves", "spans", "labels", "table", "title"] {
        assert!(
            layers.contains(&name.to_string()),
            "layer {name} in {layers:?}"
        );
    }
    let entities = &dxf.sections["ENTITIES"];
    for e in entities {
        if e.kind != "VERTEX" && e.kind != "SEQEND" {
            assert!(
                layers.contains(&e.layer().to_string()),
                "{} on an undeclared layer {}",
                e.kind,
                e.layer()
            );
        }
        assert!(
            ["LINE", "CIRCLE", "TEXT", "POLYLINE", "VERTEX", "SEQEND"].contains(&e.kind.as_str()),
            "entity {}",
            e.kind
        );
    }

    // One span line per span of the report, at the span's true length in mm (the
    // default view of this rig is the isometric one, which keeps no length; so draw
    // the front view, where these spans lie in the sheet's plane).
    let front = read_dxf(&draw_dxf(&rig, &["--view", "front"]));
    let report = json_of(&["check", &rig, "--json"]);
    let spans: Vec<&Entity> = front.sections["ENTITIES"]
        .iter()
        .filter(|e| e.kind == "LINE" && e.layer() == "spans")
        .collect();
    let expected = report["spans"].as_array().unwrap();
    assert_eq!(spans.len(), expected.len(), "one LINE per span");
    for (line, span) in spans.iter().zip(expected) {
        let length = (line.number(11) - line.number(10)).hypot(line.number(21) - line.number(20));
        let true_length = span["length_m"].as_f64().unwrap() * 1000.0;
        // The sheet keeps coordinates to 0.1 px: at 1:20, 0.1 px is 0.53 mm.
        assert!(
            (length - true_length).abs() < 1.5,
            "span {} drawn {length} mm long, {true_length} mm in the report",
            span["index"]
        );
        assert!(line.get(62).is_some(), "a span carries its tension colour");
    }
    // Round parts: one closed outline each on `sheaves`.
    let sheaves = front.sections["ENTITIES"]
        .iter()
        .filter(|e| e.kind == "POLYLINE" && e.layer() == "sheaves")
        .count();
    assert_eq!(sheaves, 4, "four sheaves");

    // Labels: every part named, every span's forward tension shown.
    let labels = texts(&dxf, "labels").join(" | ");
    for part in ["becket", "upper.a", "hook", "winch"] {
        assert!(labels.contains(part), "label of {part} in {labels}");
    }
    assert!(labels.contains(" kN"), "{labels}");

    // Title block: the title, the units and the scale.
    let title = texts(&dxf, "title").join(" | ");
    assert!(title.contains("Four-part hoist tackle"), "{title}");
    assert!(title.contains("Units: length mm, force kN"), "{title}");
    assert!(title.contains("Scale 1:"), "{title}");
    assert!(title.contains("Caution"), "{title}");

    // The tension table: the headers with their units, then every span's figures as
    // `reeve table` shows them.
    let table = texts(&dxf, "table");
    for header in [
        "from → to",
        "length (mm)",
        "tension ideal (kN)",
        "tension forward (kN)",
        "tension back (kN)",
        "safety factor",
    ] {
        assert!(table.iter().any(|t| t == header), "{header} in {table:?}");
    }
    let csv = stdout_of(&["table", &rig, "--format", "csv"]);
    let mut reader = csv::Reader::from_reader(csv.as_bytes());
    let rows: Vec<csv::StringRecord> = reader.records().map(|r| r.unwrap()).collect();
    let text_table = stdout_of(&["table", &rig, "--table", "spans"]);
    for row in &rows {
        let route = format!("{} → {}", &row[2], &row[3]);
        assert!(table.contains(&route), "{route} in the DXF table");
        // The forward tension as the text table rounds it.
        let line = text_table.lines().find(|l| l.contains(&route)).unwrap();
        let forward = line.split_whitespace().rev().nth(2).unwrap();
        assert!(
            table.iter().any(|t| t == forward),
            "forward tension {forward} of {route} in the DXF table"
        );
    }
}

#[test]
fn the_svg_sheet_carries_the_same_tension_table() {
    // The stand-alone SVG and the DXF are one sheet: the table's cells are the same text.
    let rig = example_rig("workshop-hoist");
    let svg = stdout_of(&["draw", &rig, "-o", "-"]);
    let doc = roxmltree::Document::parse(&svg).unwrap();
    let group = doc
        .descendants()
        .find(|n| n.attribute("class") == Some("tension-table"))
        .expect("a tension table on the sheet");
    let svg_cells: Vec<String> = group
        .descendants()
        .filter(|n| n.tag_name().name() == "text")
        .filter_map(|n| n.text().map(str::to_string))
        .collect();
    let dxf_cells = texts(&read_dxf(&draw_dxf(&rig, &[])), "table");
    assert_eq!(svg_cells, dxf_cells);
    // The HTML report's inline drawing has none: the report shows the tables itself.
    let html = stdout_of(&["report", &rig, "-o", "-"]);
    assert!(!html.contains("tension-table"));
}

#[test]
fn the_dxf_follows_the_units_and_the_extension() {
    let rig = test_rig("imperial-winch.yaml");
    let scratch = Scratch::new("dxf");
    let out = scratch.join("winch.dxf");
    reeve(&["draw", &rig, "-o", out.to_str().unwrap()]).expect_code(0);
    let text = std::fs::read_to_string(&out).unwrap();
    let dxf = read_dxf(&text);
    assert_eq!(header(&dxf)["$INSUNITS"][0].1.trim(), "1", "inches");
    let table = texts(&dxf, "table");
    // The file's own units: one length unit, inches.
    assert!(table.iter().any(|t| t == "length (in)"), "{table:?}");
    assert!(
        table.iter().any(|t| t == "tension forward (lbf)"),
        "{table:?}"
    );
    // --units imperial: span lengths in feet, the drawing still in inches.
    let imperial = read_dxf(&draw_dxf(&rig, &["--units", "imperial"]));
    assert_eq!(header(&imperial)["$INSUNITS"][0].1.trim(), "1", "inches");
    assert!(texts(&imperial, "table").iter().any(|t| t == "length (ft)"));
    // --units si: metres, newtons.
    let si = read_dxf(&draw_dxf(&rig, &["--units", "si"]));
    assert_eq!(header(&si)["$INSUNITS"][0].1.trim(), "6", "metres");
    assert!(texts(&si, "table")
        .iter()
        .any(|t| t == "tension forward (N)"));
    // A `.svg` output stays an SVG.
    let svg = scratch.join("winch.svg");
    reeve(&["draw", &rig, "-o", svg.to_str().unwrap()]).expect_code(0);
    assert!(std::fs::read_to_string(&svg).unwrap().starts_with("<?xml"));
}

#[test]
fn the_dxf_is_never_written_over_the_input() {
    let scratch = Scratch::new("dxf-input");
    let rig = scratch.write(
        "rig.dxf",
        &std::fs::read_to_string(example_rig("workshop-hoist")).unwrap(),
    );
    let before = std::fs::read_to_string(&rig).unwrap();
    let ran = reeve(&["draw", rig.to_str().unwrap(), "-o", rig.to_str().unwrap()]);
    assert_eq!(ran.code, 2, "{}", ran.stderr);
    assert_eq!(std::fs::read_to_string(&rig).unwrap(), before);
}

#[test]
fn every_example_rig_in_every_view_gives_a_readable_dxf() {
    let rigs = std::fs::read_dir(format!("{}/rigs", super::support::ROOT)).unwrap();
    for entry in rigs {
        let path = entry.unwrap().path();
        if path.extension().and_then(|e| e.to_str()) != Some("yaml") {
            continue;
        }
        let rig = path.display().to_string();
        for view in ["front", "side", "top", "iso"] {
            let text = draw_dxf(&rig, &["--view", view, "--units", "imperial"]);
            assert!(text.is_ascii(), "{rig} {view}: ASCII");
            let dxf = read_dxf(&text);
            for e in &dxf.sections["ENTITIES"] {
                for (code, value) in &e.groups {
                    if (10..=59).contains(code) {
                        let x: f64 = value.trim().parse().unwrap_or_else(|err| {
                            panic!("{rig} {view}: {} group {code} `{value}`: {err}", e.kind)
                        });
                        assert!(x.is_finite(), "{rig} {view}: {x}");
                    }
                }
            }
            // A POLYLINE's vertices end with SEQEND.
            let kinds: Vec<&str> = dxf.sections["ENTITIES"]
                .iter()
                .map(|e| e.kind.as_str())
                .collect();
            let mut open = false;
            for k in kinds {
                match k {
                    "POLYLINE" => {
                        assert!(!open, "{rig} {view}: POLYLINE inside a POLYLINE");
                        open = true;
                    }
                    "VERTEX" => assert!(open, "{rig} {view}: VERTEX outside a POLYLINE"),
                    "SEQEND" => open = false,
                    _ => assert!(!open, "{rig} {view}: {k} before SEQEND"),
                }
            }
        }
    }
}
