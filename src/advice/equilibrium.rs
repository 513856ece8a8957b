//! Deprotonation equilibrium of one substrate with one base.
//!
//! Model. The substrate's acidic hydrogens are grouped into *units*. A unit
//! gives up at most one proton, at one of its alternative *microsites*
//! (the two α-carbons of an unsymmetrical ketone are alternatives of one
//! unit: the second deprotonation of an enolate is not considered). Units are
//! independent proton-transfer equilibria coupled only through the shared
//! base:
//!
//! ```text
//! HA_j + B-  <=>  A_j- + BH      K_j = 10^(pKa(BH) - pKa(HA_j))
//! ```
//!
//! With r = [B-]/[BH], microsite j of a unit carries x_j = K_j r and the unit
//! is deprotonated with fraction X/(1+X), X = sum of x_j. Mass balance
//! (C substrate, B0 base, A0 conjugate acid present from the start, e.g. the
//! solvent ethanol at 17.1 M for NaOEt in EtOH):
//!
//! ```text
//! D = C * sum_u F_u(r),   [B-] = B0 - D,   [BH] = A0 + D,   r = [B-]/[BH]
//! ```
//!
//! The single unknown s = log10 r is found on the bracket [-400, 400], which
//! always contains the root (the residual is strictly monotone in s):
//! Newton steps where they stay inside the shrinking bracket, bisection
//! otherwise, so the solver converges for any pKa difference. Mono-, di- and
//! higher anion populations follow from the unit fractions (independent
//! units: a Poisson-binomial distribution, exact for any number of units).
//! Concentrations are molar and activity coefficients are taken as 1.

use super::catalogue::{catalogue, Base, CatalogueError, Scale};
use super::features::{detect_features, site_units};
use crate::mol::Molecule;
use crate::sites::SiteReport;
use std::fmt;
use std::rc::Rc;

mod for_base;
pub(crate) use for_base::{choose_scale, ScaleChoice};
pub use for_base::{equilibrium_for, equilibrium_for_using, EquilibriumOptions};

/// One place a unit can lose its proton.
#[derive(Debug, Clone, PartialEq)]
pub struct Microsite {
    /// Index into `SiteReport::sites` (or any caller-chosen label).
    pub site: usize,
    /// Atoms of the site (input order).
    pub atoms: Vec<usize>,
    /// pKa on the scale of the calculation.
    pub pka: f64,
}

/// A group of alternative microsites that gives up at most one proton.
#[derive(Debug, Clone, PartialEq)]
pub struct AcidUnit {
    /// The microsites that compete for this unit's one proton (both
    /// α-carbons of one ketone C=O); at least one.
    pub alternatives: Vec<Microsite>,
}

/// Numerical problem statement.
#[derive(Debug, Clone, PartialEq)]
pub struct EquilibriumInput {
    /// Independent acidic units of one substrate molecule; all pKa values
    /// on the same scale as [`base_pka`](Self::base_pka).
    pub units: Vec<AcidUnit>,
    /// pKa of the base's conjugate acid on the same scale as the units.
    pub base_pka: f64,
    /// Base equivalents relative to substrate.
    pub equivalents: f64,
    /// Substrate concentration, mol/L.
    pub concentration: f64,
    /// Conjugate acid present from the start (the protic solvent), mol/L; 0 if none.
    pub acid_solvent_molar: f64,
}

/// Deprotonated fraction of one site.
#[derive(Debug, Clone, PartialEq)]
pub struct SiteFraction {
    /// The microsite's [`Microsite::site`] label (an index into
    /// `SiteReport::sites` when set up by [`equilibrium_for`]).
    pub site: usize,
    /// Atoms of the site, 0-based in input order.
    pub atoms: Vec<usize>,
    /// pKa used for this microsite, on [`Equilibrium::scale`] (including
    /// any second-stage shift applied by [`equilibrium_for`]).
    pub pka: f64,
    /// Fraction of substrate molecules deprotonated at this site, 0..=1.
    pub deprotonated: f64,
}

/// Equilibrium composition.
#[derive(Debug, Clone, PartialEq)]
pub struct Equilibrium {
    /// Base name (empty when solved from a bare [`EquilibriumInput`]).
    pub base: String,
    /// Scale of the site values used.
    pub scale: Scale,
    /// Conjugate-acid pKa used.
    pub base_pka: f64,
    /// Base equivalents relative to substrate.
    pub equivalents: f64,
    /// Substrate concentration, mol/L.
    pub concentration: f64,
    /// Protic solvent that is the base's conjugate acid, with its molarity.
    pub acid_solvent: Option<(String, f64)>,
    /// One entry per microsite, in input order.
    pub sites: Vec<SiteFraction>,
    /// Deprotonated fraction of each unit.
    pub units: Vec<f64>,
    /// `anions[k]`: fraction of substrate carrying k removed protons
    /// (k = 0 neutral, 1 mono-anion, 2 di-anion ...). Sums to 1.
    pub anions: Vec<f64>,
    /// Free base left at equilibrium, mol/L.
    pub free_base_molar: f64,
    /// Free base left as a fraction of the base added, 0..=1 (0 when no
    /// base was added).
    pub free_base_fraction: f64,
    /// Conjugate acid at equilibrium, mol/L (solvent included).
    pub conjugate_acid_molar: f64,
    /// log10(\[B-\]/\[BH\]) at equilibrium.
    pub log_ratio: f64,
    /// |free base + protons removed - base added| / max(base, substrate).
    pub mass_balance_residual: f64,
    /// Root-finding iterations used.
    pub iterations: u32,
    /// Plain-language notes on the scale and conditions used.
    pub notes: Vec<String>,
}

impl Equilibrium {
    /// Fraction of substrate deprotonated at any microsite of `site`.
    pub fn site_fraction(&self, site: usize) -> f64 {
        self.sites
            .iter()
            .filter(|s| s.site == site)
            .map(|s| s.deprotonated)
            .sum()
    }
}

/// What the solver or its set-up could not do.
#[derive(Debug, Clone, PartialEq)]
#[non_exhaustive]
pub enum EquilibriumError {
    /// A number outside its allowed range (name, value).
    Invalid(&'static str, f64),
    /// No catalogue base has this name (the name as given).
    UnknownBase(String),
    /// The base has no conjugate-acid pKa comparable with the sites.
    NoCommonScale(String),
    /// The site report has no site with a pKa on the chosen scale, so
    /// there is nothing to deprotonate.
    NoSites,
    /// The embedded base catalogue failed validation (a build defect).
    Catalogue(CatalogueError),
}

impl fmt::Display for EquilibriumError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            EquilibriumError::Invalid(what, v) => write!(f, "invalid {what}: {v}"),
            EquilibriumError::UnknownBase(b) => {
                write!(f, "unknown base {b:?}: not in the base catalogue")
            }
            EquilibriumError::NoCommonScale(b) => write!(
                f,
                "no pKa scale on which both {b} and the molecule's sites have values"
            ),
            EquilibriumError::NoSites => write!(f, "the molecule has no acidic site with a pKa"),
            EquilibriumError::Catalogue(e) => write!(f, "base catalogue: {e}"),
        }
    }
}

impl std::error::Error for EquilibriumError {}

const S_LO: f64 = -400.0;
const S_HI: f64 = 400.0;

pub(crate) fn log10_sum_exp10(values: impl Iterator<Item = f64> + Clone) -> f64 {
    let m = values.clone().fold(f64::NEG_INFINITY, f64::max);
    if !m.is_finite() {
        return m;
    }
    m + values.map(|x| exp10(x - m)).sum::<f64>().log10()
}

/// 10^x computed as e^(x ln 10) (cheaper than `powf`; relative error of a
/// few ulp times |x|, far below the precision of any pKa).
#[inline]
pub(crate) fn exp10(x: f64) -> f64 {
    (x * std::f64::consts::LN_10).exp()
}

/// Deprotonated fraction of each unit at log ratio `s`.
fn unit_fractions(units: &[AcidUnit], base_pka: f64, s: f64) -> Vec<f64> {
    units
        .iter()
        .map(|u| {
            let lx = log10_sum_exp10(u.alternatives.iter().map(|m| base_pka - m.pka + s));
            if lx == f64::NEG_INFINITY {
                0.0
            } else {
                1.0 / (1.0 + 10f64.powf(-lx))
            }
        })
        .collect()
}

/// Allocation-free core of the solver: s = log10([B-]/[BH]) at equilibrium
/// for units given by their log10 K (`base pKa - site pKa`, summed over a
/// unit's microsites; `-inf` for a unit that cannot lose a proton), substrate
/// `c`, base `b0` and initial conjugate acid `a0` (mol/L). Returns s and the
/// iterations used; s = -inf when no base is present.
///
/// The condition is free base = r x conjugate acid, with r = 10^s, free base
/// B0 - D and conjugate acid A0 + D (D: protons removed). The root is kept in
/// a bracket (initially [-400, 400], which always holds it); a Newton step
/// that leaves the bracket, or is more than half the step before the last,
/// is replaced by bisection, so the method converges for any pKa
/// difference. The Newton step comes from whichever form of the condition
/// is nearly linear in s where the iterate is:
/// - most base free (a weak base): h(s) = log10(B0 - D) - log10(A0 + D) - s;
/// - most base consumed, near the root: g(s) = (B0 - D) - r (A0 + D), smooth
///   where the free base runs to zero (h has a pole there, and Newton on h
///   would only halve the distance each step);
/// - far above the root (r (A0 + D) > B0): p(s) = log10(D + r (A0 + D)) -
///   log10(B0), of slope near 1 there (g is exponential there).
///
/// All three vanish at the same root and share its sign. It stops when a
/// Newton step is at most 1e-7 (the step is taken: the error left is of the
/// order of its square) or the bracket has closed.
pub(crate) fn solve_log_ratio(unit_logk: &[f64], c: f64, b0: f64, a0: f64) -> (f64, u32) {
    if b0 == 0.0 {
        return (f64::NEG_INFINITY, 0);
    }
    let ln10 = std::f64::consts::LN_10;
    // D and dD/ds at s.
    let sums = |s: f64| -> (f64, f64) {
        let (mut d, mut dd) = (0.0, 0.0);
        for &a in unit_logk {
            if a == f64::NEG_INFINITY {
                continue;
            }
            // 10^x as e^(x ln 10): exp is cheaper than powf.
            let f = 1.0 / (1.0 + (-(a + s) * ln10).exp());
            d += f;
            dd += ln10 * f * (1.0 - f);
        }
        (c * d, c * dd)
    };
    let (mut lo, mut hi) = (S_LO, S_HI);
    let mut iterations = 0u32;
    // Start from the greedy titration (exact for one unit), so Newton
    // usually finishes in one to three steps.
    let mut x = start_guess(unit_logk, c, b0, a0)
        .filter(|g| g.is_finite() && *g > lo && *g < hi)
        .unwrap_or(0.5 * (lo + hi));
    // The last two steps taken (bisection test as in safeguarded Newton).
    let (mut step_last, mut step_old) = (hi - lo, hi - lo);
    let s = loop {
        iterations += 1;
        let (d, dd) = sums(x);
        let free = b0 - d;
        let acid = a0 + d;
        // The sign of the condition (positive: the root lies above x, the
        // free base exceeds r x acid) and the Newton step of the form that
        // suits the iterate; the log form needs no 10^x.
        let (sign, newton) = if free > 0.5 * b0 && acid > 0.0 {
            let hx = (free / acid).log10() - x;
            (
                hx,
                x - hx / (-dd / (ln10 * free) - dd / (ln10 * acid) - 1.0),
            )
        } else {
            let r = exp10(x);
            let ra = r * acid;
            let step = if ra <= b0 {
                x - (free - ra) / (-dd - ln10 * ra - r * dd)
            } else {
                let px = ((d + ra) / b0).log10();
                x - px * ln10 * (d + ra) / (dd + ln10 * ra + r * dd)
            };
            (free - ra, step)
        };
        if sign == 0.0 {
            break x;
        }
        // NaN only from 10^x overflowing against no conjugate acid at all
        // (no unit can lose a proton): all base stays free, the root lies
        // above.
        if sign > 0.0 || sign.is_nan() {
            lo = x;
        } else {
            hi = x;
        }
        if hi - lo <= 1e-13 * (1.0 + x.abs()) || iterations >= 400 {
            break 0.5 * (lo + hi);
        }
        // A Newton step this small is within rounding noise of the root
        // (which may put it just outside the bracket): take it and stop.
        if (newton - x).abs() <= 1e-7 {
            break newton;
        }
        // Bisection when the Newton step leaves the bracket or is not at
        // least halving the step before the last (no fast convergence: the
        // iterates are cycling around an inflection).
        let (next, step) = if newton > lo && newton < hi && (newton - x).abs() <= 0.5 * step_old {
            (newton, (newton - x).abs())
        } else {
            (0.5 * (lo + hi), 0.5 * (hi - lo))
        };
        step_old = step_last;
        step_last = step;
        if (next - x).abs() <= 1e-14 * (1.0 + x.abs()) {
            break next;
        }
        x = next;
    };
    (s, iterations)
}

/// The greedy titration estimate of log10 r: units taken strongest first;
/// while base is left for a whole unit and the unit would be mostly
/// deprotonated by it, the unit counts as fully deprotonated, and the first
/// other unit gets the exact one-unit solution with the base left over and
/// the conjugate acid formed so far. Only a start: the solver brackets the
/// root itself. None when no finite estimate exists.
fn start_guess(unit_logk: &[f64], c: f64, b0: f64, a0: f64) -> Option<f64> {
    // Few units: sort a small copy without allocating.
    let mut buf = [f64::NEG_INFINITY; 16];
    let n = unit_logk.len();
    if n > buf.len() {
        let strongest = unit_logk.iter().cloned().fold(f64::NEG_INFINITY, f64::max);
        return one_unit_log_ratio(strongest, c, b0, a0);
    }
    buf[..n].copy_from_slice(unit_logk);
    let units = &mut buf[..n];
    units.sort_unstable_by(|a, b| b.total_cmp(a));
    let (mut b, mut acid) = (b0, a0);
    for &a in units.iter() {
        if !a.is_finite() {
            break;
        }
        let s1 = one_unit_log_ratio(a, c, b, acid)?;
        if b > c && a + s1 > 0.0 {
            b -= c;
            acid += c;
            continue;
        }
        return Some(s1);
    }
    // Every unit filled: the base left over against the acid formed.
    (b > 0.0 && acid > 0.0).then(|| (b / acid).log10())
}

/// log10 r for one unit of log10 K = `a` alone: r = [B-]/[BH] solves
/// K (A0 + C) r^2 + (A0 + K (C - B0)) r - B0 = 0, taken in the form of its
/// positive root that avoids cancellation. None when K is out of a safe
/// range or no base is present.
fn one_unit_log_ratio(a: f64, c: f64, b0: f64, a0: f64) -> Option<f64> {
    if !a.is_finite() || a.abs() > 100.0 || b0 <= 0.0 {
        return None;
    }
    let k = exp10(a);
    let qa = k * (a0 + c);
    let p = a0 + k * (c - b0);
    let root = (p * p + 4.0 * qa * b0).sqrt();
    let r = if p >= 0.0 {
        2.0 * b0 / (p + root)
    } else {
        (root - p) / (2.0 * qa)
    };
    (r.is_finite() && r > 0.0).then(|| r.log10())
}

/// Solve the equilibrium numerically.
pub fn solve(input: &EquilibriumInput) -> Result<Equilibrium, EquilibriumError> {
    let c = input.concentration;
    if !(c.is_finite() && c > 0.0 && c <= 100.0) {
        return Err(EquilibriumError::Invalid("concentration (mol/L)", c));
    }
    let eq = input.equivalents;
    if !(eq.is_finite() && (0.0..=1000.0).contains(&eq)) {
        return Err(EquilibriumError::Invalid("equivalents", eq));
    }
    let a0 = input.acid_solvent_molar;
    if !(a0.is_finite() && (0.0..=100.0).contains(&a0)) {
        return Err(EquilibriumError::Invalid("conjugate acid (mol/L)", a0));
    }
    if !input.base_pka.is_finite() || input.base_pka.abs() > 200.0 {
        return Err(EquilibriumError::Invalid("base pKa", input.base_pka));
    }
    for u in &input.units {
        for m in &u.alternatives {
            if !m.pka.is_finite() || m.pka.abs() > 200.0 {
                return Err(EquilibriumError::Invalid("site pKa", m.pka));
            }
        }
    }
    let b0 = eq * c;
    let units = &input.units;
    // Each unit as log10 of its summed K so that its log10 X at s is a + s.
    let unit_logk: Vec<f64> = units
        .iter()
        .map(|u| log10_sum_exp10(u.alternatives.iter().map(|m| input.base_pka - m.pka)))
        .collect();
    let (s, iterations) = solve_log_ratio(&unit_logk, c, b0, a0);
    let fractions: Vec<f64> = if b0 == 0.0 {
        vec![0.0; units.len()]
    } else {
        unit_fractions(units, input.base_pka, s)
    };
    let d = c * fractions.iter().sum::<f64>();
    let r = if b0 == 0.0 { 0.0 } else { 10f64.powf(s) };
    let acid = a0 + d;
    let free = (r * acid).min(b0).max(0.0);
    let residual = (free + d - b0).abs() / b0.max(c);

    let mut sites = Vec::new();
    for (u, f) in units.iter().zip(&fractions) {
        let lx = log10_sum_exp10(u.alternatives.iter().map(|m| input.base_pka - m.pka));
        for m in &u.alternatives {
            let share = if lx.is_finite() {
                10f64.powf(input.base_pka - m.pka - lx)
            } else {
                0.0
            };
            sites.push(SiteFraction {
                site: m.site,
                atoms: m.atoms.clone(),
                pka: m.pka,
                deprotonated: (f * share).clamp(0.0, 1.0),
            });
        }
    }
    // Populations of k-fold deprotonated substrate (independent units).
    let mut anions = vec![1.0];
    for f in &fractions {
        let mut next = vec![0.0; anions.len() + 1];
        for (k, p) in anions.iter().enumerate() {
            next[k] += p * (1.0 - f);
            next[k + 1] += p * f;
        }
        anions = next;
    }
    Ok(Equilibrium {
        base: String::new(),
        scale: Scale::Dmso,
        base_pka: input.base_pka,
        equivalents: eq,
        concentration: c,
        acid_solvent: None,
        sites,
        units: fractions,
        anions,
        free_base_molar: free,
        free_base_fraction: if b0 > 0.0 { free / b0 } else { 0.0 },
        conjugate_acid_molar: acid,
        log_ratio: s,
        mass_balance_residual: residual,
        iterations,
        notes: Vec::new(),
    })
}
