//! Subcommands, one file each, plus the streaming input shared by `annotate`.

pub mod annotate;
pub mod bases;
pub mod draw;
pub mod equilibrium;
pub mod html;
pub mod input;
pub mod output;
pub mod rules;
pub mod scan;
pub mod sdf_input;
pub mod serve;

use acidsite::report::{Flag, Scale};

/// How a run ended when nothing fatal happened.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Outcome {
    /// Every record was read and analysed.
    AllFine,
    /// At least one record failed (its error record was written).
    SomeFailed,
}

/// True when the error is (caused by) writing to a closed pipe.
pub fn is_broken_pipe(e: &anyhow::Error) -> bool {
    e.chain().any(|c| {
        c.downcast_ref::<std::io::Error>()
            .is_some_and(|io| io.kind() == std::io::ErrorKind::BrokenPipe)
    })
}

/// `--scale` values.
#[derive(Debug, Clone, Copy, PartialEq, Eq, clap::ValueEnum, Default)]
pub enum ScaleArg {
    /// pKa in dimethyl sulfoxide (Bordwell scale).
    #[default]
    Dmso,
    /// pKa in water.
    Water,
}

impl From<ScaleArg> for Scale {
    fn from(s: ScaleArg) -> Scale {
        match s {
            ScaleArg::Dmso => Scale::Dmso,
            ScaleArg::Water => Scale::Water,
        }
    }
}

/// clap value parser for `--flag NAME=SMARTS`.
pub fn parse_flag(spec: &str) -> Result<Flag, String> {
    Flag::parse(spec).map_err(|e| e.to_string())
}

/// Refuse a `--flag` name given twice (its counts would share one JSON key;
/// issue 17).
pub fn check_flags(flags: &[Flag]) -> anyhow::Result<()> {
    for (i, f) in flags.iter().enumerate() {
        if flags[..i].iter().any(|g| g.name == f.name) {
            anyhow::bail!(
                "--flag {} is given twice; each pattern needs its own name",
                f.name
            );
        }
    }
    Ok(())
}

/// clap value parser for `--reaction NAME` (an unknown name: exit 2 with the
/// valid names).
pub fn parse_reaction(s: &str) -> Result<acidsite::advice::practice::Reaction, String> {
    acidsite::advice::practice::Reaction::parse(s).map_err(|e| e.to_string())
}

/// clap value parser for `--control kinetic|thermodynamic`.
pub fn parse_control(s: &str) -> Result<acidsite::advice::practice::Control, String> {
    acidsite::advice::practice::Control::parse(s).map_err(|e| e.to_string())
}

/// Refuse an unknown `--base` before any work (a bad option: exit 2).
pub fn check_base(name: Option<&str>) -> anyhow::Result<()> {
    if let Some(n) = name {
        let cat = acidsite::advice::catalogue()
            .map_err(|e| anyhow::anyhow!("the embedded base catalogue is invalid: {e}"))?;
        if cat.get(n).is_none() {
            anyhow::bail!("no base named {n:?} in the catalogue (run `acidsite bases`)");
        }
    }
    Ok(())
}
