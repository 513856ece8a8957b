//! Integration tests of the smarts area, one binary (link time is most of
//! the test build): each module is one file beside this one, named by concern.
//! `cargo test --release --test smarts -- <module>::` runs one of them.

#[path = "smarts_consistency.rs"]
mod smarts_consistency;
#[path = "smarts_match.rs"]
mod smarts_match;
#[path = "smarts_parse.rs"]
mod smarts_parse;
#[path = "smarts_reference.rs"]
mod smarts_reference;
