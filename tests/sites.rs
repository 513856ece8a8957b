//! Integration tests of the sites area, one binary (link time is most of
//! the test build): each module is one file beside this one, named by concern.
//! `cargo test --release --test sites -- <module>::` runs one of them.

mod sites_helpers;
mod tsv;

#[path = "sites_bench.rs"]
mod sites_bench;
#[path = "sites_corpus.rs"]
mod sites_corpus;
#[path = "sites_coverage.rs"]
mod sites_coverage;
#[path = "sites_dmso_measured.rs"]
mod sites_dmso_measured;
#[path = "sites_issue11.rs"]
mod sites_issue11;
#[path = "sites_mechanisms.rs"]
mod sites_mechanisms;
#[path = "sites_nmp.rs"]
mod sites_nmp;
#[path = "sites_process_review.rs"]
mod sites_process_review;
#[path = "sites_review_2.rs"]
mod sites_review_2;
#[path = "sites_robust.rs"]
mod sites_robust;
#[path = "sites_rule_water.rs"]
mod sites_rule_water;
#[path = "sites_rules.rs"]
mod sites_rules;
#[path = "sites_snapshots.rs"]
mod sites_snapshots;
#[path = "sites_water_screen.rs"]
mod sites_water_screen;
