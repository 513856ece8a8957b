//! Base advice: the base catalogue (data in `fragments/`), the deprotonation
//! equilibrium solver, and the recommender with warnings and cautions.
//!
//! OWNER: base-advice work (issue 5).
