//! The output formats of every table-writing command (`table`, `compare`, `sweep`,
//! `rank`, `spread`), named once: the command line offers exactly these words.

/// An output format.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum Format {
    /// Aligned text for a terminal.
    #[default]
    Text,
    /// Markdown tables.
    Markdown,
    /// Comma-separated values (numbers unrounded or in more figures, units in the headers).
    Csv,
    /// One JSON document, SI units, keys carrying their units.
    Json,
}

impl Format {
    /// Every format, in the order the help lists them.
    pub const ALL: [Format; 4] = [Format::Text, Format::Markdown, Format::Csv, Format::Json];

    /// The word that names the format (`text`, `md`, `csv`, `json`).
    pub fn name(self) -> &'static str {
        match self {
            Format::Text => "text",
            Format::Markdown => "md",
            Format::Csv => "csv",
            Format::Json => "json",
        }
    }

    /// Other accepted spellings (`txt`, `markdown`).
    pub fn aliases(self) -> &'static [&'static str] {
        match self {
            Format::Text => &["txt"],
            Format::Markdown => &["markdown"],
            Format::Csv | Format::Json => &[],
        }
    }

    /// One line for the help.
    pub fn describe(self) -> &'static str {
        match self {
            Format::Text => "Aligned plain text",
            Format::Markdown => "Markdown tables",
            Format::Csv => "Comma-separated values (one table per document)",
            Format::Json => "One JSON document, SI units",
        }
    }

    /// The format a word names, by its name or an alias.
    pub fn parse(word: &str) -> Option<Format> {
        Format::ALL
            .into_iter()
            .find(|f| f.name() == word || f.aliases().contains(&word))
    }
}

/// A format of the drawing (`reeve draw --format`).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum DrawingFormat {
    /// SVG, for a browser or a document.
    #[default]
    Svg,
    /// DXF (release 12, ASCII), for a CAD program.
    Dxf,
}

impl DrawingFormat {
    /// Every drawing format, in the order the help lists them.
    pub const ALL: [DrawingFormat; 2] = [DrawingFormat::Svg, DrawingFormat::Dxf];

    /// The word that names it, which is also its file extension.
    pub fn name(self) -> &'static str {
        match self {
            DrawingFormat::Svg => "svg",
            DrawingFormat::Dxf => "dxf",
        }
    }

    /// One line for the help.
    pub fn describe(self) -> &'static str {
        match self {
            DrawingFormat::Svg => "SVG sheet at a standard scale",
            DrawingFormat::Dxf => {
                "DXF (R12) for CAD: the same sheet at full size, layers by kind, the tension table"
            }
        }
    }

    /// The format a file name's extension names (`rig.dxf`), if any.
    pub fn of_path(path: &std::path::Path) -> Option<DrawingFormat> {
        let ext = path.extension()?.to_str()?.to_ascii_lowercase();
        DrawingFormat::ALL.into_iter().find(|f| f.name() == ext)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_name_and_alias_reads_back() {
        for f in Format::ALL {
            assert_eq!(Format::parse(f.name()), Some(f));
            for a in f.aliases() {
                assert_eq!(Format::parse(a), Some(f));
            }
        }
        assert_eq!(Format::parse("markdown"), Some(Format::Markdown));
        assert_eq!(Format::parse("yaml"), None);
    }

    #[test]
    fn drawing_formats_from_extensions() {
        use std::path::Path;
        assert_eq!(
            DrawingFormat::of_path(Path::new("a/rig.DXF")),
            Some(DrawingFormat::Dxf)
        );
        assert_eq!(
            DrawingFormat::of_path(Path::new("rig.svg")),
            Some(DrawingFormat::Svg)
        );
        assert_eq!(DrawingFormat::of_path(Path::new("-")), None);
    }
}
