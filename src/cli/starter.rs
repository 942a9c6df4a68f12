//! starter
use super::Failure;
use clap::Args;
/// `reeve new`.
#[derive(Debug, Args)]
pub struct NewArgs {}
/// `reeve new`.
pub fn run_new(_args: NewArgs) -> Result<i32, Failure> {
    Ok(0)
}
