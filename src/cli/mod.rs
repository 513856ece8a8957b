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

/// `--reaction NAME`: the planned reactions of the library, each listed in
/// the help with its summary from `fragments/reactions.tsv`.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct ReactionArg(pub acidsite::advice::practice::Reaction);

impl clap::ValueEnum for ReactionArg {
    fn value_variants<'a>() -> &'a [Self] {
        static ALL: std::sync::OnceLock<Vec<ReactionArg>> = std::sync::OnceLock::new();
        ALL.get_or_init(|| {
            acidsite::advice::practice::Reaction::ALL
                .iter()
                .map(|&r| ReactionArg(r))
                .collect()
        })
    }

    fn to_possible_value(&self) -> Option<clap::builder::PossibleValue> {
        let v = clap::builder::PossibleValue::new(self.0.name());
        let summary = acidsite::advice::practice::practice()
            .ok()
            .map(|p| capitalised(&p.reaction(self.0).summary));
        Some(match summary {
            Some(text) => v.help(text),
            None => v,
        })
    }
}

/// `--control SIDE`: which enolate of a ketone with two sides.
#[derive(Debug, Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
pub enum ControlArg {
    /// The less substituted enolate, formed fastest (strong hindered base, low temperature)
    Kinetic,
    /// The more substituted, more stable enolate (equilibrating conditions)
    Thermodynamic,
}

impl From<ControlArg> for acidsite::advice::practice::Control {
    fn from(c: ControlArg) -> Self {
        match c {
            ControlArg::Kinetic => acidsite::advice::practice::Control::Kinetic,
            ControlArg::Thermodynamic => acidsite::advice::practice::Control::Thermodynamic,
        }
    }
}

/// The text with its first letter in upper case (help lines are sentences).
fn capitalised(text: &str) -> String {
    let mut c = text.chars();
    match c.next() {
        Some(f) => f.to_uppercase().chain(c).collect(),
        None => String::new(),
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
