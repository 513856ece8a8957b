//! Integration tests of the cli area, one binary (link time is most of
//! the test build): each module is one file beside this one, named by concern.
//! `cargo test --release --test cli -- <module>::` runs one of them.

mod common;

#[path = "cli_annotate_bulk.rs"]
mod cli_annotate_bulk;
#[path = "cli_annotate_formats.rs"]
mod cli_annotate_formats;
#[path = "cli_exit_codes.rs"]
mod cli_exit_codes;
#[path = "cli_issue17.rs"]
mod cli_issue17;
#[path = "cli_layout.rs"]
mod cli_layout;
#[path = "cli_listings.rs"]
mod cli_listings;
#[path = "cli_property.rs"]
mod cli_property;
#[path = "cli_report_screen.rs"]
mod cli_report_screen;
#[path = "cli_scan_snapshots.rs"]
mod cli_scan_snapshots;
#[path = "cli_sdf.rs"]
mod cli_sdf;
