//! Integration tests of the depict area, one binary (link time is most of
//! the test build): each module is one file beside this one, named by concern.
//! `cargo test --release --test depict -- <module>::` runs one of them.

#[path = "depict_quality.rs"]
mod depict_quality;
#[path = "depict_robust.rs"]
mod depict_robust;
#[path = "depict_snapshots.rs"]
mod depict_snapshots;
#[path = "depict_stereo.rs"]
mod depict_stereo;
