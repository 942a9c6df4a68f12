//! One table type for every output, and its writers. [`Table`] holds typed cells
//! ([`Cell`]) under columns with their alignment; [`write_text_table`],
//! [`write_markdown_table`] and [`write_csv`] write any table, each through the one
//! escaping function of its target ([`super::escape`]).
//!
//! The drawing-set tables of `reeve table` are built here too: one span table (tension
//! in every span) and one part table (wrap, fleet, D/d, tension ratio, pin load and loss
//! share at every part), written as aligned text, Markdown, CSV or JSON ([`json`]). The
//! studies' tables are built by [`super::study`].
//!
//! Text, Markdown and CSV show the rig file's own units, with the unit in every column
//! header; JSON is SI with unit-suffixed keys. Rows follow the report's order (lines and
//! spans in file order, parts in file order, a part's passages in line order), and
//! numbers are formatted by [`super::text::number`], so the output is stable and can be
//! compared byte for byte.

use std::io::{self, Write};

use crate::math::Real;
use crate::units::{Dimension, Unit, UnitSystem};

use super::escape::{csv_field, markdown_cell, text_line};
use super::text::number;
use super::{Report, CAUTION};

mod material;
mod verdict;
pub use material::material_table;

pub mod json;

pub use json::{tables_json, CasesJson, PartJson, SpanJson, TablesJson};

/// Which cases the tables show (`--case`).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum CaseFilter {
    /// Ideal, forward and back.
    #[default]
    All,
    /// No friction only.
    Ideal,
    /// Driving forward only.
    Forward,
    /// Running back only.
    Back,
}

impl CaseFilter {
    /// Every filter, in the order the help lists them.
    pub const ALL: [CaseFilter; 4] = [
        CaseFilter::All,
        CaseFilter::Ideal,
        CaseFilter::Forward,
        CaseFilter::Back,
    ];

    /// One line for the help.
    pub fn describe(self) -> &'static str {
        match self {
            CaseFilter::All => "Ideal, forward and back",
            CaseFilter::Ideal => "No friction",
            CaseFilter::Forward => "Driving forward",
            CaseFilter::Back => "Running back",
        }
    }

    /// Lowercase name (`all`, `ideal`, `forward`, `back`).
    pub fn name(self) -> &'static str {
        match self {
            CaseFilter::All => "all",
            CaseFilter::Ideal => "ideal",
            CaseFilter::Forward => "forward",
            CaseFilter::Back => "back",
        }
    }
    fn ideal(self) -> bool {
        matches!(self, CaseFilter::All | CaseFilter::Ideal)
    }
    fn forward(self) -> bool {
        matches!(self, CaseFilter::All | CaseFilter::Forward)
    }
    fn back(self) -> bool {
        matches!(self, CaseFilter::All | CaseFilter::Back)
    }
}

/// Which of the two tables to write (`--table`).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum TableChoice {
    /// The span table, then the part table.
    #[default]
    Both,
    /// Spans only.
    Spans,
    /// Parts only.
    Parts,
}

impl TableChoice {
    /// Every choice, in the order the help lists them.
    pub const ALL: [TableChoice; 3] = [TableChoice::Both, TableChoice::Spans, TableChoice::Parts];

    /// Lowercase name (`both`, `spans`, `parts`).
    pub fn name(self) -> &'static str {
        match self {
            TableChoice::Both => "both",
            TableChoice::Spans => "spans",
            TableChoice::Parts => "parts",
        }
    }

    /// One line for the help.
    pub fn describe(self) -> &'static str {
        match self {
            TableChoice::Both => "Spans and parts",
            TableChoice::Spans => "Spans only",
            TableChoice::Parts => "Parts only",
        }
    }
}

/// Who reads the table: a person (text, Markdown, HTML) or a program (CSV).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum Style {
    /// `from → to` in one column, degrees as `°`.
    #[default]
    Human,
    /// ASCII headers (`deg`), `from` and `to` in columns of their own: what a
    /// spreadsheet sorts and filters on, read correctly whatever its text encoding.
    Data,
}

impl Style {
    fn degrees(self) -> &'static str {
        match self {
            Style::Human => "°",
            Style::Data => "deg",
        }
    }
}

/// Horizontal alignment of a column.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Align {
    /// Names.
    Left,
    /// Numbers.
    Right,
}

/// One cell, kept as a value so each format can render it its own way.
#[derive(Debug, Clone, PartialEq)]
pub enum Cell {
    /// Plain text (a name).
    Text(String),
    /// A number in display units with its significant figures; `None` is missing.
    Number(Option<Real>, usize),
    /// A unit direction; `None` is missing.
    Direction(Option<[Real; 3]>),
}

/// Significant figures in CSV beyond those of the text table (a spreadsheet computes
/// with the numbers, a person only reads them).
const CSV_EXTRA_FIGURES: usize = 2;

impl Cell {
    /// The cell as a person reads it: `—` for a missing value.
    pub fn text(&self) -> String {
        match self {
            Cell::Text(s) => s.clone(),
            Cell::Number(x, sig) => clean_zero(number(*x, *sig)),
            Cell::Direction(Some(d)) => direction(d),
            Cell::Direction(None) => "—".to_string(),
        }
    }

    /// The cell for a spreadsheet: more figures, empty when missing.
    pub fn csv(&self) -> String {
        match self {
            Cell::Text(s) => s.clone(),
            Cell::Number(None, _) | Cell::Direction(None) => String::new(),
            Cell::Number(x, sig) => clean_zero(number(*x, sig + CSV_EXTRA_FIGURES)),
            Cell::Direction(Some(d)) => direction(d),
        }
    }
}

/// Drops the sign of a number that rounds to zero (`-0.000` → `0.000`).
fn clean_zero(s: String) -> String {
    match s.strip_prefix('-') {
        Some(rest) if rest.chars().all(|c| c == '0' || c == '.') => rest.to_string(),
        _ => s,
    }
}

/// A unit vector's component with three decimals, trailing zeros dropped.
fn component(x: Real) -> String {
    let s = format!("{x:.3}");
    clean_zero(s.trim_end_matches('0').trim_end_matches('.').to_string())
}

/// A unit direction as `(x, y, z)`, components as [`component`].
fn direction(d: &[Real; 3]) -> String {
    format!(
        "({}, {}, {})",
        component(d[0]),
        component(d[1]),
        component(d[2])
    )
}

/// A column: header (with its unit) and alignment.
#[derive(Debug, Clone, PartialEq)]
pub struct Column {
    /// Header, unit included (`length (mm)`).
    pub header: String,
    /// Alignment.
    pub align: Align,
}

/// How a table is laid out. The two layouts are the two shapes of output the commands
/// have always written (kept byte for byte: they are compared against golden files).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum Layout {
    /// A drawing-set table (`reeve table`, the HTML report): in text its title, the
    /// header and a rule of dashes; in Markdown every column's alignment marked
    /// (`:---`, `---:`); in CSV CRLF line ends (RFC 4180).
    #[default]
    Sheet,
    /// A study table (`compare`, `sweep`, `rank`, `spread`), inside a document that
    /// writes the title: in text the header and rows only; in Markdown right-aligned
    /// columns marked (`---:`) and left-aligned ones plain (`---`); in CSV LF line ends.
    Study,
}

/// A titled table of cells, ready for any writer.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Table {
    /// Title (`Spans`, `Parts`); a study table's title is its document's.
    pub title: String,
    /// How the writers lay it out.
    pub layout: Layout,
    /// Columns.
    pub columns: Vec<Column>,
    /// Rows, each as long as `columns` (a shorter row leaves its last cells empty).
    pub rows: Vec<Vec<Cell>>,
}

impl Table {
    fn new(title: &str) -> Table {
        Table {
            title: title.to_string(),
            ..Table::default()
        }
    }

    fn column(&mut self, header: impl Into<String>, align: Align) {
        self.columns.push(Column {
            header: header.into(),
            align,
        });
    }

    /// A study table: the first column (names) left-aligned, the others right-aligned.
    pub fn study() -> Table {
        Table {
            layout: Layout::Study,
            ..Table::default()
        }
    }

    /// A study table with these headers and rows of text.
    pub fn study_with(headers: Vec<String>, rows: Vec<Vec<String>>) -> Table {
        let mut t = Table::study();
        t.headers(headers);
        for row in rows {
            t.text_row(row);
        }
        t
    }

    /// Adds a column: left-aligned when it is the first, right-aligned after.
    pub fn header(&mut self, header: impl Into<String>) {
        let align = if self.columns.is_empty() {
            Align::Left
        } else {
            Align::Right
        };
        self.column(header, align);
    }

    /// Adds columns as [`Table::header`] does.
    pub fn headers(&mut self, headers: impl IntoIterator<Item = String>) {
        for h in headers {
            self.header(h);
        }
    }

    /// Adds a row of text cells.
    pub fn text_row(&mut self, cells: Vec<String>) {
        self.rows.push(cells.into_iter().map(Cell::Text).collect());
    }

    /// The table without the columns whose header starts with `prefix` (the HTML
    /// report lists the axial loads apart, so its part table still fits a page).
    pub fn without_columns(&self, prefix: &str) -> Table {
        let keep: Vec<bool> = self
            .columns
            .iter()
            .map(|c| !c.header.starts_with(prefix))
            .collect();
        let pick = |cells: &[Cell]| -> Vec<Cell> {
            cells
                .iter()
                .zip(&keep)
                .filter(|(_, k)| **k)
                .map(|(c, _)| c.clone())
                .collect()
        };
        Table {
            title: self.title.clone(),
            layout: self.layout,
            columns: self
                .columns
                .iter()
                .filter(|c| !c.header.starts_with(prefix))
                .cloned()
                .collect(),
            rows: self.rows.iter().map(|r| pick(r)).collect(),
        }
    }
}

/// Significant figures shown for lengths, forces and ratios.
const FIGURES: usize = 4;

/// A cell of an SI value in the shown unit of `dimension`; with the header
/// `format!("... ({})", units.unit(dimension))` this is all a new column needs.
pub fn in_units(x: Option<Real>, dimension: Dimension, units: &UnitSystem) -> Cell {
    in_unit(x, units.unit(dimension))
}

/// A cell of an SI value in `unit` (a span length in `units.span_length`).
pub fn in_unit(x: Option<Real>, unit: Unit) -> Cell {
    Cell::Number(x.map(|v| v / unit.si), FIGURES)
}

/// The columns that name a span, at the start of every table of spans: line, span
/// index, and its ends (`from → to` for people, `from` and `to` apart as data).
pub(super) fn span_columns(t: &mut Table, style: Style) {
    t.column("line", Align::Left);
    t.column("span", Align::Right);
    match style {
        Style::Human => t.column("from → to", Align::Left),
        Style::Data => {
            t.column("from", Align::Left);
            t.column("to", Align::Left);
        }
    }
}

/// The span table: line, span index, from → to, length, tension per case, safety factor.
pub fn span_table(report: &Report, units: &UnitSystem, cases: CaseFilter, style: Style) -> Table {
    let (len, force) = (units.span_length.symbol, units.force.symbol);
    let mut t = Table::new("Spans");
    span_columns(&mut t, style);
    t.column(format!("length ({len})"), Align::Right);
    if cases.ideal() {
        t.column(format!("tension ideal ({force})"), Align::Right);
    }
    if cases.forward() {
        t.column(format!("tension forward ({force})"), Align::Right);
    }
    if cases.back() {
        t.column(format!("tension back ({force})"), Align::Right);
    }
    t.column("safety factor", Align::Right);
    for s in &report.spans {
        let mut row = vec![Cell::Text(s.line.clone()), Cell::Text(s.index.to_string())];
        match style {
            Style::Human => row.push(Cell::Text(format!("{} → {}", s.from, s.to))),
            Style::Data => {
                row.push(Cell::Text(s.from.clone()));
                row.push(Cell::Text(s.to.clone()));
            }
        }
        row.push(in_unit(s.length_m, units.span_length));
        if cases.ideal() {
            row.push(in_units(s.tension_n.ideal, Dimension::Force, units));
        }
        if cases.forward() {
            row.push(in_units(s.tension_n.forward, Dimension::Force, units));
        }
        if cases.back() {
            row.push(in_units(s.tension_n.back, Dimension::Force, units));
        }
        row.push(Cell::Number(s.safety_factor, 3));
        t.rows.push(row);
    }
    t
}

/// The pin-load direction: one `(x, y, z)` column for a person, three numeric columns
/// for a spreadsheet.
fn direction_columns(t: &mut Table, case: &str, style: Style) {
    match style {
        Style::Human => t.column(format!("pin dir {case}"), Align::Left),
        Style::Data => {
            for axis in ["x", "y", "z"] {
                t.column(format!("pin dir {case} {axis}"), Align::Right);
            }
        }
    }
}

fn direction_cells(row: &mut Vec<Cell>, direction: Option<[Real; 3]>, style: Style) {
    match style {
        Style::Human => row.push(Cell::Direction(direction)),
        Style::Data => {
            for axis in 0..3 {
                // Three decimals, as in the text table (a unit vector's components).
                row.push(match direction {
                    Some(d) => Cell::Text(component(d[axis])),
                    None => Cell::Number(None, 3),
                });
            }
        }
    }
}

/// The part table: one row per passage of a line over a round part, one row for every
/// other part; pin load magnitude and direction per case, loss share (forward case),
/// and where the rig has them the bend loss share and the axial load (DESIGN.md §7).
pub fn part_table(report: &Report, units: &UnitSystem, cases: CaseFilter, style: Style) -> Table {
    let deg = style.degrees();
    let force = units.force.symbol;
    let mut t = Table::new("Parts");
    t.column("part", Align::Left);
    t.column("kind", Align::Left);
    t.column("line", Align::Left);
    t.column(format!("wrap ({deg})"), Align::Right);
    t.column(format!("fleet in ({deg})"), Align::Right);
    t.column(format!("fleet out ({deg})"), Align::Right);
    t.column("D/d", Align::Right);
    if cases.forward() {
        t.column("ratio forward", Align::Right);
    }
    if cases.back() {
        t.column("ratio back", Align::Right);
    }
    if cases.ideal() {
        t.column(format!("pin load ideal ({force})"), Align::Right);
        direction_columns(&mut t, "ideal", style);
    }
    if cases.forward() {
        t.column(format!("pin load forward ({force})"), Align::Right);
        direction_columns(&mut t, "forward", style);
    }
    if cases.back() {
        t.column(format!("pin load back ({force})"), Align::Right);
        direction_columns(&mut t, "back", style);
    }
    if cases.forward() {
        t.column("loss share (%)", Align::Right);
    }
    // The rope-as-material columns (DESIGN.md §7) only where they say something, so a
    // rig without them prints the tables it always printed.
    let bending = cases.forward()
        && report
            .parts
            .iter()
            .any(|p| p.material.bend_loss_share.is_some_and(|s| s > 0.0));
    if bending {
        t.column("bend loss share (%)", Align::Right);
    }
    let axial = report
        .parts
        .iter()
        .any(|p| p.material.has_axial(&p.pin_load_n));
    for (case, shown) in [("forward", cases.forward()), ("back", cases.back())] {
        if axial && shown {
            t.column(format!("axial load {case} ({force})"), Align::Right);
        }
    }
    for p in &report.parts {
        let part_cells = |row: &mut Vec<Cell>| {
            if cases.ideal() {
                row.push(in_units(p.pin_load_ideal_n, Dimension::Force, units));
                direction_cells(row, p.pin_load_direction_ideal, style);
            }
            if cases.forward() {
                row.push(in_units(p.pin_load_n.forward, Dimension::Force, units));
                direction_cells(row, p.pin_load_direction.forward, style);
            }
            if cases.back() {
                row.push(in_units(p.pin_load_n.back, Dimension::Force, units));
                direction_cells(row, p.pin_load_direction.back, style);
            }
            if cases.forward() {
                row.push(Cell::Number(p.loss_share.map(|s| s * 100.0), 3));
            }
            if bending {
                let share = p.material.bend_loss_share.map(|s| s * 100.0);
                row.push(Cell::Number(share, 3));
            }
            let a = &p.material.axial_load_n;
            for (value, shown) in [(a.forward, cases.forward()), (a.back, cases.back())] {
                if axial && shown {
                    row.push(in_units(value, Dimension::Force, units));
                }
            }
        };
        if p.passages.is_empty() {
            let mut row = vec![
                Cell::Text(p.name.clone()),
                Cell::Text(p.kind.to_string()),
                Cell::Text(String::new()),
                Cell::Number(None, FIGURES),
                Cell::Number(None, FIGURES),
                Cell::Number(None, FIGURES),
                Cell::Number(None, FIGURES),
            ];
            if cases.forward() {
                row.push(Cell::Number(None, FIGURES));
            }
            if cases.back() {
                row.push(Cell::Number(None, FIGURES));
            }
            part_cells(&mut row);
            t.rows.push(row);
        }
        for pass in &p.passages {
            let mut row = vec![
                Cell::Text(p.name.clone()),
                Cell::Text(p.kind.to_string()),
                Cell::Text(pass.line.clone()),
                Cell::Number(pass.wrap_deg, FIGURES),
                Cell::Number(pass.fleet_in_deg, 3),
                Cell::Number(pass.fleet_out_deg, 3),
                Cell::Number(pass.bend_ratio, 3),
            ];
            if cases.forward() {
                row.push(Cell::Number(pass.tension_ratio.forward, 5));
            }
            if cases.back() {
                row.push(Cell::Number(pass.tension_ratio.back, 5));
            }
            part_cells(&mut row);
            t.rows.push(row);
        }
    }
    t
}

/// The tables asked for, in order.
pub fn tables(
    report: &Report,
    units: &UnitSystem,
    cases: CaseFilter,
    choice: TableChoice,
    style: Style,
) -> Vec<Table> {
    let mut out = Vec::new();
    if choice != TableChoice::Parts {
        out.push(span_table(report, units, cases, style));
    }
    if choice != TableChoice::Spans {
        out.push(part_table(report, units, cases, style));
    }
    if choice != TableChoice::Parts {
        match style {
            Style::Human => out.extend(material_table(report, units, cases, style)),
            Style::Data => {
                if let Some(spans) = out.first_mut() {
                    material::append_material_columns(spans, report, units, cases);
                }
            }
        }
    }
    out
}

/// Display width of a cell (characters, not bytes: `→` and `—` are one column).
fn width(s: &str) -> usize {
    s.chars().count()
}

fn pad(s: &str, w: usize, align: Align) -> String {
    let fill = " ".repeat(w.saturating_sub(width(s)));
    match align {
        Align::Left => format!("{s}{fill}"),
        Align::Right => format!("{fill}{s}"),
    }
}

/// Writes one table as aligned plain text: title, header, rule, rows, or for a study
/// table the header and rows only (unsafe characters escaped before the columns are
/// measured).
pub fn write_text_table(w: &mut dyn Write, table: &Table) -> io::Result<()> {
    let cells: Vec<Vec<String>> = table
        .rows
        .iter()
        .map(|r| {
            r.iter()
                .map(|c| text_line(&c.text()).into_owned())
                .collect()
        })
        .collect();
    let headers: Vec<String> = table
        .columns
        .iter()
        .map(|c| text_line(&c.header).into_owned())
        .collect();
    let widths: Vec<usize> = headers
        .iter()
        .enumerate()
        .map(|(i, header)| {
            cells
                .iter()
                .filter_map(|r| r.get(i))
                .map(|s| width(s))
                .chain([width(header)])
                .max()
                .unwrap_or(0)
        })
        .collect();
    let line = |parts: Vec<String>| parts.join("  ").trim_end().to_string();
    let sheet = table.layout == Layout::Sheet;
    if sheet {
        writeln!(w, "{}", text_line(&table.title))?;
    }
    writeln!(
        w,
        "{}",
        line(
            table
                .columns
                .iter()
                .zip(&headers)
                .zip(&widths)
                .map(|((c, h), &n)| pad(h, n, c.align))
                .collect()
        )
    )?;
    if sheet {
        writeln!(
            w,
            "{}",
            line(widths.iter().map(|&n| "-".repeat(n)).collect())
        )?;
    }
    for row in &cells {
        writeln!(
            w,
            "{}",
            line(
                row.iter()
                    .zip(&table.columns)
                    .zip(&widths)
                    .map(|((s, c), &n)| pad(s, n, c.align))
                    .collect()
            )
        )?;
    }
    Ok(())
}

/// Writes the tables as plain text, with a heading naming the rig and the units, and
/// the caution at the end.
pub fn write_text(
    w: &mut dyn Write,
    report: &Report,
    units: &UnitSystem,
    tables: &[Table],
) -> io::Result<()> {
    writeln!(w, "{}", text_line(&report.title))?;
    writeln!(w, "Units: {}", units_line(units))?;
    for t in tables {
        writeln!(w)?;
        write_text_table(w, t)?;
    }
    if let Some(line) = verdict::failing_checks(report) {
        writeln!(w)?;
        writeln!(w, "{}", text_line(&line))?;
    }
    writeln!(w)?;
    writeln!(w, "{CAUTION}")
}

/// `length mm, force kN, mass kg, torque N*m`; `length in (spans ft), ...` where span
/// lengths have a unit of their own.
pub fn units_line(units: &UnitSystem) -> String {
    let spans = if units.span_length == units.length {
        String::new()
    } else {
        format!(" (spans {})", units.span_length)
    };
    format!(
        "length {}{spans}, force {}, mass {}, torque {}",
        units.length, units.force, units.mass, units.torque
    )
}

/// Writes the tables as GitHub-flavoured Markdown, ending with the caution.
pub fn write_markdown(
    w: &mut dyn Write,
    report: &Report,
    units: &UnitSystem,
    tables: &[Table],
) -> io::Result<()> {
    writeln!(w, "# {}", markdown_cell(&report.title))?;
    writeln!(w)?;
    writeln!(w, "Units: {}.", units_line(units))?;
    for t in tables {
        writeln!(w)?;
        writeln!(w, "## {}", markdown_cell(&t.title))?;
        writeln!(w)?;
        write_markdown_table(w, t)?;
    }
    if let Some(line) = verdict::failing_checks(report) {
        writeln!(w)?;
        writeln!(w, "**{}**", markdown_cell(&line))?;
    }
    writeln!(w)?;
    writeln!(w, "_{CAUTION}_")
}

/// Writes one table as a Markdown table: header, alignment rule, rows (no title).
pub fn write_markdown_table(w: &mut dyn Write, t: &Table) -> io::Result<()> {
    let header: Vec<String> = t.columns.iter().map(|c| markdown_cell(&c.header)).collect();
    writeln!(w, "| {} |", header.join(" | "))?;
    let rule: Vec<&str> = t
        .columns
        .iter()
        .map(|c| match (c.align, t.layout) {
            (Align::Left, Layout::Sheet) => ":---",
            (Align::Left, Layout::Study) => "---",
            (Align::Right, _) => "---:",
        })
        .collect();
    writeln!(w, "| {} |", rule.join(" | "))?;
    for row in &t.rows {
        let cells: Vec<String> = row.iter().map(|c| markdown_cell(&c.text())).collect();
        writeln!(w, "| {} |", cells.join(" | "))?;
    }
    Ok(())
}

/// Writes one table as CSV: one header row, then the rows; a drawing-set table with
/// CRLF line ends (RFC 4180, which every spreadsheet reads), a study table with LF.
pub fn write_csv(w: &mut dyn Write, table: &Table) -> io::Result<()> {
    let end = match table.layout {
        Layout::Sheet => "\r\n",
        Layout::Study => "\n",
    };
    let header: Vec<String> = table.columns.iter().map(|c| csv_field(&c.header)).collect();
    write!(w, "{}{end}", header.join(","))?;
    for row in &table.rows {
        let cells: Vec<String> = row.iter().map(|c| csv_field(&c.csv())).collect();
        write!(w, "{}{end}", cells.join(","))?;
    }
    Ok(())
}

/// A CSV number: full precision, empty when missing.
pub fn csv_number(x: Option<Real>) -> String {
    match x {
        Some(v) if v.is_finite() => format!("{v}"),
        _ => String::new(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn negative_zero_loses_its_sign() {
        assert_eq!(direction(&[-0.0, -0.0001, 1.0]), "(0, 0, 1)");
        assert_eq!(direction(&[0.0104, -0.5, -0.866]), "(0.01, -0.5, -0.866)");
        assert_eq!(Cell::Number(Some(-1e-12), 3).text(), "-1.00e-12");
        assert_eq!(Cell::Number(None, 3).csv(), "");
    }

    #[test]
    fn text_columns_align_by_characters() {
        let mut t = Table::new("T");
        t.column("a", Align::Left);
        t.column("n", Align::Right);
        t.rows
            .push(vec![Cell::Text("x → y".into()), Cell::Number(Some(1.5), 2)]);
        t.rows
            .push(vec![Cell::Text("z".into()), Cell::Number(None, 2)]);
        let mut out = Vec::new();
        write_text_table(&mut out, &t).unwrap();
        let s = String::from_utf8(out).unwrap();
        assert_eq!(s, "T\na        n\n-----  ---\nx → y  1.5\nz        —\n");
    }
}
