//! Integration tests of the serve area, one binary (link time is most of
//! the test build): each module is one file beside this one, named by concern.
//! `cargo test --release --test serve -- <module>::` runs one of them.

mod serve_common;

#[path = "serve_api.rs"]
mod serve_api;
#[path = "serve_browser.rs"]
mod serve_browser;
