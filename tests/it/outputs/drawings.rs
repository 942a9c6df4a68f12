//! The SVG drawings parsed as XML and rendered to pixels.

use super::*;

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
