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
}
