//! `acidsite rules`.

use super::Outcome;

#[derive(clap::Args, Debug)]
pub struct Args {}

pub fn run(_args: Args) -> anyhow::Result<Outcome> {
    anyhow::bail!("`rules` needs the library part that is still being built")
}
