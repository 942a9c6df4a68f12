//! The rig file as written (format 1): serde structs with `deny_unknown_fields`.
