//! The HTML report opened in headless Chromium.

use super::*;

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
