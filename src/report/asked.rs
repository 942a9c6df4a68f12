//! The asked quantity: which part's force, mass or torque the solver found, whether
//! that part is the drive or a load, and why that quantity where the file did not say.
//! One type for the report and every study; its [`Quantity`] gives the unit and the
//! dimension the writers show it in.

use serde::ser::{Serialize, SerializeMap, Serializer};

use crate::model::Rig;
use crate::solve::{Quantity, SubRigSolution};

/// Whether the asked part is the drive or a load (DESIGN.md §3): forward is the least
/// value that starts the rig for a drive, the greatest load the drive moves for a load.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Role {
    /// The asked part is the drive.
    Drive,
    /// The asked part is a load.
    Load,
}

impl Role {
    /// `drive` or `load`.
    pub fn name(self) -> &'static str {
        match self {
            Role::Drive => "drive",
            Role::Load => "load",
        }
    }
}

/// The asked quantity of a sub-rig.
///
/// In JSON it is `{"part", "quantity", "unit", "role"}` in the studies; the `check`
/// report's `solve_for` keeps the keys of DESIGN.md §5 (`part`, `quantity`, `unit`, and
/// `note` where there is one) through [`Asked::serialize_in_report`].
#[derive(Debug, Clone, PartialEq)]
pub struct Asked {
    /// Part name.
    pub part: String,
    /// The quantity (its name, SI unit and dimension).
    pub quantity: Quantity,
    /// Drive or load.
    pub role: Role,
    /// Why this quantity, where the file did not say (a `solve_for` block without
    /// `load`).
    pub note: Option<String>,
}

impl Asked {
    /// The asked quantity of a sub-rig, with the note the report gives.
    pub fn of(rig: &Rig, sub: &SubRigSolution) -> Asked {
        Asked {
            part: rig.parts[sub.solve_for].name.clone(),
            quantity: sub.quantity,
            role: if sub.drive_unknown() {
                Role::Drive
            } else {
                Role::Load
            },
            note: super::quantity_note(rig, sub),
        }
    }

    /// SI unit of the values.
    pub fn unit(&self) -> &'static str {
        self.quantity.si_unit()
    }

    /// Whether two asked quantities are like with like: the same quantity, asked of a
    /// drive or of a load alike (the part may differ).
    pub fn like(&self, other: &Asked) -> bool {
        (self.quantity, self.role) == (other.quantity, other.role)
    }

    /// The `solve_for` object of the `check` report: `part`, `quantity`, `unit`, and
    /// `note` when there is one.
    ///
    /// # Errors
    /// The serializer's.
    pub fn serialize_in_report<S: Serializer>(asked: &Asked, s: S) -> Result<S::Ok, S::Error> {
        let mut map = s.serialize_map(None)?;
        map.serialize_entry("part", &asked.part)?;
        map.serialize_entry("quantity", asked.quantity.name())?;
        map.serialize_entry("unit", asked.unit())?;
        if let Some(note) = &asked.note {
            map.serialize_entry("note", note)?;
        }
        map.end()
    }
}

impl Serialize for Asked {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        let mut map = s.serialize_map(Some(4))?;
        map.serialize_entry("part", &self.part)?;
        map.serialize_entry("quantity", self.quantity.name())?;
        map.serialize_entry("unit", self.unit())?;
        map.serialize_entry("role", self.role.name())?;
        map.end()
    }
}
