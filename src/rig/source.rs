//! The rig file as a study reads it: [`RigText`], the text parsed once and resolved
//! again for every run, implements [`RigFile`] (the trait lives in the model, so that
//! `study/` loads through it without importing the file layer).

use std::path::Path;

use crate::model::param::{Names, Resolved};
use crate::model::source::RigFile;
use crate::model::vary::{Uncertain, Variant};
use crate::model::Rig;
use crate::rig::error::{LoadError, Problem};
use crate::rig::file::{parse_tree, strip_bom};
use crate::rig::load::{ranges_str, read_text, variants_str, ParsedRig};
use crate::rig::overrides::{apply_overrides, read_variants};
use crate::rig::params;

/// A rig file's text, parsed once (no re-parse per sample, step or variation).
#[derive(Debug, Clone)]
pub struct RigText {
    /// The file's text.
    text: String,
    /// Its name in messages (the path as given).
    name: String,
    /// The text parsed, resolved again by every [`RigFile::load`].
    parsed: ParsedRig,
}

impl RigText {
    /// Reads a rig file with the one reader every command uses ([`read_text`]).
    ///
    /// # Errors
    /// A [`LoadError`] naming the file when it cannot be read, is not UTF-8 or is too
    /// large.
    pub fn read(path: &Path) -> Result<RigText, LoadError> {
        let text = read_text(path)?;
        Ok(RigText::from_text(
            strip_bom(&text),
            &path.display().to_string(),
        ))
    }

    /// Rig text held in memory (tests, generated rigs); `name` names it in messages.
    pub fn from_text(text: &str, name: &str) -> RigText {
        RigText {
            text: text.to_string(),
            name: name.to_string(),
            parsed: ParsedRig::parse(text, name),
        }
    }

    /// The file's text.
    pub fn text(&self) -> &str {
        &self.text
    }
}

impl RigFile for RigText {
    fn name(&self) -> &str {
        &self.name
    }

    fn load(&self, overrides: &[(String, String)]) -> Result<Rig, LoadError> {
        self.parsed.load_with(overrides)
    }

    fn ranges(&self, overrides: &[(String, String)]) -> Result<Vec<Uncertain>, LoadError> {
        ranges_str(&self.text, &self.name, overrides)
    }

    fn variants(&self, overrides: &[(String, String)]) -> Result<Vec<Variant>, LoadError> {
        if overrides.is_empty() {
            return variants_str(&self.text, &self.name);
        }
        let fail = |problems: Vec<Problem>| LoadError {
            file: self.name.clone(),
            problems,
        };
        let Some(mut root) = parse_tree(&self.text).map_err(fail)?.0 else {
            return Ok(Vec::new());
        };
        let problems = apply_overrides(&mut root, overrides);
        if !problems.is_empty() {
            return Err(fail(problems));
        }
        let node = root
            .entries()
            .and_then(|top| top.iter().find(|e| e.key == "variants"))
            .map(|e| &e.value)
            .filter(|v| !v.is_null());
        match node.map(read_variants) {
            None => Ok(Vec::new()),
            Some((variants, problems)) if problems.is_empty() => Ok(variants),
            Some((_, problems)) => Err(fail(problems)),
        }
    }

    fn has_key(&self, overrides: &[(String, String)], path: &[&str], key: &str) -> bool {
        let Ok((Some(mut root), _)) = parse_tree(&self.text) else {
            return false;
        };
        if !apply_overrides(&mut root, overrides).is_empty() {
            return false;
        }
        let mut node = &root;
        for step in path {
            let Some(next) = node
                .entries()
                .and_then(|e| e.iter().find(|e| e.key == *step))
            else {
                return false;
            };
            node = &next.value;
        }
        node.entries()
            .is_some_and(|e| e.iter().any(|e| e.key == key))
    }

    fn resolve(&self, rig: &Rig, key: &str, unit: &str) -> Option<Resolved> {
        params::resolve(rig, key, unit)
    }

    fn resolve_in(&self, names: &Names, key: &str, unit: &str) -> Option<Resolved> {
        params::resolve_in(names, key, unit)
    }
}
