//! Integration tests of the mol area, one binary (link time is most of
//! the test build): each module is one file beside this one, named by concern.
//! `cargo test --release --test mol -- <module>::` runs one of them.

#[path = "mol_fuzz.rs"]
mod mol_fuzz;
#[path = "mol_perception.rs"]
mod mol_perception;
#[path = "mol_reference.rs"]
mod mol_reference;
#[path = "mol_rings.rs"]
mod mol_rings;
#[path = "mol_sdf.rs"]
mod mol_sdf;
#[path = "mol_stereo.rs"]
mod mol_stereo;
