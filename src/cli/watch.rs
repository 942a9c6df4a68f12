//! watch
use super::Failure;
use clap::Args;
/// `reeve watch`.
#[derive(Debug, Args)]
pub struct WatchArgs {}
/// `reeve watch`.
pub fn run_watch(_args: WatchArgs) -> Result<i32, Failure> {
    Ok(0)
}
