//! The `reeve` command line (thin: the work is in the library).
fn main() {}
