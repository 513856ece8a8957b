//! Integration tests of the report area, one binary (link time is most of
//! the test build): each module is one file beside this one, named by concern.
//! `cargo test --release --test report -- <module>::` runs one of them.

mod common;

#[path = "report_brief.rs"]
mod report_brief;
#[path = "report_json.rs"]
mod report_json;
#[path = "report_mapped.rs"]
mod report_mapped;
#[path = "report_schema.rs"]
mod report_schema;
