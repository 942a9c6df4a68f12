//! Line charts of the studies (sweep, stroke) as standalone SVG: one or more panels
//! stacked vertically, each with labelled axes (units in the labels), round-number
//! ticks and a legend. Missing points (a failed step) break the line rather than being
//! joined over.

use std::fmt::Write as _;

use super::escape::xml as esc;
use crate::math::Real;

/// One line of a chart: a name for the legend and its points (None = no value there).
#[derive(Debug, Clone, PartialEq)]
pub struct Series {
    /// Legend entry.
    pub name: String,
    /// (x, y) points in plotting units; y None where the value is missing.
    pub points: Vec<(Real, Option<Real>)>,
}

/// One chart panel.
#[derive(Debug, Clone, PartialEq)]
pub struct Panel {
    /// Title above the panel.
    pub title: String,
    /// X-axis label with unit.
    pub x_label: String,
    /// Y-axis label with unit.
    pub y_label: String,
    /// The lines.
    pub series: Vec<Series>,
}

const WIDTH: Real = 720.0;
const PANEL_HEIGHT: Real = 360.0;
const LEFT: Real = 80.0;
const RIGHT: Real = 170.0;
const TOP: Real = 40.0;
const BOTTOM: Real = 60.0;
const COLOURS: &[&str] = &[
    "#1f77b4", "#d62728", "#2ca02c", "#9467bd", "#ff7f0e", "#8c564b",
];

/// Round tick positions covering [lo, hi] (about five).
pub fn ticks(lo: Real, hi: Real) -> Vec<Real> {
    if !(lo.is_finite() && hi.is_finite()) || hi <= lo {
        return vec![lo];
    }
    let raw = (hi - lo) / 5.0;
    let mag = 10f64.powf(raw.log10().floor());
    let step = [1.0, 2.0, 2.5, 5.0, 10.0]
        .iter()
        .map(|m| m * mag)
        .find(|s| *s >= raw)
        .unwrap_or(10.0 * mag);
    let first = (lo / step).ceil() as i64;
    let last = (hi / step).floor() as i64;
    (first..=last).map(|i| i as Real * step).collect()
}

fn label(x: Real) -> String {
    let s = crate::report::text::number(Some(x), 4);
    if s.contains('.') && !s.contains('e') {
        s.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        s
    }
}

/// Writes the panels as one SVG document.
pub fn svg(panels: &[Panel]) -> String {
    let height = PANEL_HEIGHT * panels.len().max(1) as Real;
    let mut out = String::new();
    let _ = writeln!(
        out,
        r#"<svg xmlns="http://www.w3.org/2000/svg" width="{WIDTH}" height="{height}" viewBox="0 0 {WIDTH} {height}" font-family="sans-serif" font-size="12">"#
    );
    let _ = writeln!(
        out,
        r#"<rect width="{WIDTH}" height="{height}" fill="white"/>"#
    );
    for (k, panel) in panels.iter().enumerate() {
        panel_svg(&mut out, panel, k as Real * PANEL_HEIGHT);
    }
    out.push_str("</svg>\n");
    out
}

fn panel_svg(out: &mut String, panel: &Panel, y0: Real) {
    let (px0, px1) = (LEFT, WIDTH - RIGHT);
    let (py0, py1) = (y0 + TOP, y0 + PANEL_HEIGHT - BOTTOM);
    let xs = panel
        .series
        .iter()
        .flat_map(|s| s.points.iter().map(|p| p.0));
    let ys = panel
        .series
        .iter()
        .flat_map(|s| s.points.iter().filter_map(|p| p.1));
    let range = |it: &mut dyn Iterator<Item = Real>| {
        it.filter(|v| v.is_finite())
            .fold(None, |a: Option<(Real, Real)>, v| {
                Some(a.map_or((v, v), |(lo, hi)| (lo.min(v), hi.max(v))))
            })
    };
    let (mut x_lo, mut x_hi) = range(&mut xs.into_iter()).unwrap_or((0.0, 1.0));
    let (mut y_lo, mut y_hi) = range(&mut ys.into_iter()).unwrap_or((0.0, 1.0));
    if x_hi <= x_lo {
        x_lo -= 0.5;
        x_hi += 0.5;
    }
    if y_hi <= y_lo {
        let pad = if y_lo == 0.0 { 1.0 } else { 0.05 * y_lo.abs() };
        y_lo -= pad;
        y_hi += pad;
    } else {
        let pad = 0.05 * (y_hi - y_lo);
        y_lo -= pad;
        y_hi += pad;
    }
    let sx = |x: Real| px0 + (x - x_lo) / (x_hi - x_lo) * (px1 - px0);
    let sy = |y: Real| py1 - (y - y_lo) / (y_hi - y_lo) * (py1 - py0);
    let _ = writeln!(
        out,
        r#"<text x="{}" y="{}" text-anchor="middle" font-size="14" font-weight="bold">{}</text>"#,
        (px0 + px1) / 2.0,
        y0 + 22.0,
        esc(&panel.title)
    );
    let _ = writeln!(
        out,
        r##"<rect x="{px0}" y="{py0}" width="{}" height="{}" fill="none" stroke="#444"/>"##,
        px1 - px0,
        py1 - py0
    );
    for t in ticks(x_lo, x_hi) {
        let x = sx(t);
        let _ = writeln!(
            out,
            r##"<line x1="{x:.1}" y1="{py0}" x2="{x:.1}" y2="{py1}" stroke="#ddd"/><text x="{x:.1}" y="{}" text-anchor="middle">{}</text>"##,
            py1 + 16.0,
            label(t)
        );
    }
    for t in ticks(y_lo, y_hi) {
        let y = sy(t);
        let _ = writeln!(
            out,
            r##"<line x1="{px0}" y1="{y:.1}" x2="{px1}" y2="{y:.1}" stroke="#ddd"/><text x="{}" y="{:.1}" text-anchor="end">{}</text>"##,
            px0 - 6.0,
            y + 4.0,
            label(t)
        );
    }
    let _ = writeln!(
        out,
        r#"<text x="{}" y="{}" text-anchor="middle">{}</text>"#,
        (px0 + px1) / 2.0,
        py1 + 40.0,
        esc(&panel.x_label)
    );
    let _ = writeln!(
        out,
        r#"<text x="{}" y="{}" text-anchor="middle" transform="rotate(-90 {} {})">{}</text>"#,
        px0 - 60.0,
        (py0 + py1) / 2.0,
        px0 - 60.0,
        (py0 + py1) / 2.0,
        esc(&panel.y_label)
    );
    for (i, s) in panel.series.iter().enumerate() {
        let colour = COLOURS[i % COLOURS.len()];
        // Break the line at missing points.
        let mut runs: Vec<Vec<(Real, Real)>> = vec![Vec::new()];
        for &(x, y) in &s.points {
            match y.filter(|y| y.is_finite()) {
                Some(y) if x.is_finite() => {
                    if let Some(run) = runs.last_mut() {
                        run.push((sx(x), sy(y)));
                    }
                }
                _ => runs.push(Vec::new()),
            }
        }
        for run in runs.iter().filter(|r| !r.is_empty()) {
            let pts: Vec<String> = run.iter().map(|(x, y)| format!("{x:.2},{y:.2}")).collect();
            let _ = writeln!(
                out,
                r#"<polyline fill="none" stroke="{colour}" stroke-width="2" points="{}"/>"#,
                pts.join(" ")
            );
            for (x, y) in run {
                let _ = writeln!(
                    out,
                    r#"<circle cx="{x:.2}" cy="{y:.2}" r="2.5" fill="{colour}"/>"#
                );
            }
        }
        let ly = py0 + 14.0 + 20.0 * i as Real;
        let _ = writeln!(
            out,
            r#"<line x1="{}" y1="{ly}" x2="{}" y2="{ly}" stroke="{colour}" stroke-width="2"/><text x="{}" y="{}">{}</text>"#,
            px1 + 12.0,
            px1 + 36.0,
            px1 + 42.0,
            ly + 4.0,
            esc(&s.name)
        );
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn ticks_are_round() {
        assert_eq!(ticks(0.0, 10.0), vec![0.0, 2.0, 4.0, 6.0, 8.0, 10.0]);
        let t = ticks(0.05, 0.21);
        assert_eq!(t.len(), 4, "{t:?}");
        assert!((t[0] - 0.05).abs() < 1e-12 && (t[3] - 0.2).abs() < 1e-12);
    }

    #[test]
    fn svg_has_labels_and_legend() {
        let s = svg(&[Panel {
            title: "t".into(),
            x_label: "mu".into(),
            y_label: "force (N)".into(),
            series: vec![Series {
                name: "forward".into(),
                points: vec![(0.0, Some(1.0)), (1.0, None), (2.0, Some(3.0))],
            }],
        }]);
        assert!(s.starts_with("<svg"));
        assert!(s.contains("force (N)") && s.contains(">forward<"));
        assert_eq!(s.matches("<polyline").count(), 2);
    }
}
