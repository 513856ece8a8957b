//! The `acidsite` command line. Library errors are typed; anyhow lives here
//! (and in `src/cli/`) only.
//!
//! Exit codes: 0 all records fine, 1 some records failed, 2 fatal (unreadable
//! file, bad options). A closed stdout pipe ends the run quietly with 0.

mod cli;

#[global_allocator]
static GLOBAL: mimalloc::MiMalloc = mimalloc::MiMalloc;

use clap::{Parser, Subcommand};
use std::io::Write;
use std::process::ExitCode;

/// Acidic sites, pKa estimates and base advice for enolate and carbanion
/// chemistry. Estimates carry their uncertainty; advice never replaces a risk
/// assessment by qualified chemists.
#[derive(Parser)]
#[command(name = "acidsite", version, about, max_term_width = 100)]
struct Cli {
    #[command(subcommand)]
    command: Command,
}

#[derive(Subcommand)]
enum Command {
    /// Report the acidic sites and base advice for one or more SMILES.
    Scan(cli::scan::Args),
    /// Annotate a compound list (.smi, .csv, .tsv, .sdf, optionally gzipped, or stdin).
    Annotate(cli::annotate::Args),
    /// Draw a molecule as SVG with its acidic sites marked.
    Draw(cli::draw::Args),
    /// List the base catalogue with pKa values and sources.
    Bases(cli::bases::Args),
    /// List the fragment rule set with values and sources.
    Rules(cli::rules::Args),
    /// Solve the deprotonation equilibrium of a molecule with a base.
    Equilibrium(cli::equilibrium::Args),
    /// Serve the local web page (one molecule or a list, in your browser).
    Serve(cli::serve::Args),
}

fn main() -> ExitCode {
    let cli = Cli::parse();
    let result = match cli.command {
        Command::Scan(a) => cli::scan::run(a),
        Command::Annotate(a) => cli::annotate::run(a),
        Command::Draw(a) => cli::draw::run(a),
        Command::Bases(a) => cli::bases::run(a),
        Command::Rules(a) => cli::rules::run(a),
        Command::Equilibrium(a) => cli::equilibrium::run(a),
        Command::Serve(a) => cli::serve::run(a),
    };
    match result {
        Ok(cli::Outcome::AllFine) => ExitCode::from(0),
        Ok(cli::Outcome::SomeFailed) => ExitCode::from(1),
        Err(e) if cli::is_broken_pipe(&e) => ExitCode::from(0),
        Err(e) => {
            let _ = writeln!(std::io::stderr(), "acidsite: error: {e:#}");
            ExitCode::from(2)
        }
    }
}
