//! Integration tests of the advice area, one binary (link time is most of
//! the test build): each module is one file beside this one, named by concern.
//! `cargo test --release --test advice -- <module>::` runs one of them.

mod common;

#[path = "advice_caller_data.rs"]
mod advice_caller_data;
#[path = "advice_catalogue.rs"]
mod advice_catalogue;
#[path = "advice_equilibrium.rs"]
mod advice_equilibrium;
#[path = "advice_planning.rs"]
mod advice_planning;
#[path = "advice_practice.rs"]
mod advice_practice;
#[path = "advice_practice_rows.rs"]
mod advice_practice_rows;
#[path = "advice_reactions.rs"]
mod advice_reactions;
#[path = "advice_reactions_independent.rs"]
mod advice_reactions_independent;
#[path = "advice_robustness.rs"]
mod advice_robustness;
#[path = "advice_snapshots.rs"]
mod advice_snapshots;
