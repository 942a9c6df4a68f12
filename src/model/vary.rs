//! What a study varies, as the rig file states it: a named [`Variant`] (a set of
//! `KEY=VALUE` overrides from `variants:`) and an [`Uncertain`] value (a key written as
//! a range, with its [`Distribution`] in the written unit). `rig/` reads them from the
//! file (`rig::overrides`); `study/` runs them. Plain data: no file layer, no physics.

/// A named set of overrides from the rig file's `variants:` key.
#[derive(Debug, Clone, PartialEq)]
pub struct Variant {
    /// The variant's name as written.
    pub name: String,
    /// Its settings, `KEY=VALUE` pairs in written order.
    pub settings: Vec<(String, String)>,
}

/// How an uncertain value is spread.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Distribution {
    /// Uniform between the bounds (`{min: a, max: b}`).
    Uniform {
        /// Lower bound.
        min: f64,
        /// Upper bound.
        max: f64,
    },
    /// Normal, truncated at zero (`{mean: m, sd: s}`).
    Normal {
        /// Mean.
        mean: f64,
        /// Standard deviation, 0 or more.
        sd: f64,
    },
}

impl Distribution {
    /// The value deterministic commands use: the middle of a uniform range, the mean of
    /// a normal one (never below zero).
    pub fn nominal(&self) -> f64 {
        match *self {
            Distribution::Uniform { min, max } => 0.5 * (min + max),
            Distribution::Normal { mean, .. } => mean.max(0.0),
        }
    }
}

/// A value written as a range in the rig file, in the file's own numbers.
#[derive(Debug, Clone, PartialEq)]
pub struct Uncertain {
    /// Key path, as an override addresses it (`parts.head.bearing.mu`).
    pub key: String,
    /// The spread, in the written unit.
    pub distribution: Distribution,
    /// The unit written after the numbers (`kg`), empty for bare numbers.
    pub unit: String,
}

impl Uncertain {
    /// The override that sets this key to `value` (in the written unit).
    pub fn setting(&self, value: f64) -> (String, String) {
        let text = if self.unit.is_empty() {
            format!("{value}")
        } else {
            format!("{value} {}", self.unit)
        };
        (self.key.clone(), text)
    }
}
