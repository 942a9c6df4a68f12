//! The integration tests of `reeve`: one test binary, one module per subject, sharing
//! one support module (the binary runner, closeness, golden files, the example rig and
//! the rig generators). Run one subject with `cargo test --test it SUBJECT::`.

mod support;

mod architecture;
mod cli;
mod dxf;
mod figures;
mod friction_published;
mod generators;
mod geometry;
mod load_errors;
mod material;
mod material_warnings;
mod motion;
mod motion_checks;
mod motion_progress;
mod motion_travel;
mod numerics;
mod outputs;
mod pin_loads_3d;
mod properties;
mod properties_bending;
mod properties_material;
mod published;
mod rigs;
mod rope_bending;
mod studies;
mod tools;
mod units_out;
