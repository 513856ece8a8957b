//! Hammett σ constants (`fragments/sigma.tsv`) and benzene-ring positions.
//!
//! A ring substituent is recognised by an exact comparison of its atoms
//! (element, aromaticity, charge, hydrogens, bond orders), read outwards
//! from the ring up to a few bonds deep, with the substituent SMILES of the
//! σ table (attachment point written `*`).

use std::collections::HashMap;

use super::rules::RuleError;
use crate::mol::{BondOrder, Molecule};

/// A six-membered aromatic ring seen from its ipso atom.
#[derive(Debug, Clone)]
pub(crate) struct Ring {
    pub atoms: [usize; 6],
    pub meta: [usize; 2],
    pub para: Option<usize>,
    pub all_carbon: bool,
}

/// Find a six-membered aromatic ring through `ipso` (depth-limited search,
/// at most 6 bonds; cheap).
pub(crate) fn ring_positions(mol: &Molecule, ipso: usize) -> Option<Ring> {
    if !mol.atoms.get(ipso)?.aromatic {
        return None;
    }
    let mut path = [ipso; 6];
    fn walk(mol: &Molecule, path: &mut [usize; 6], depth: usize) -> bool {
        let last = path[depth - 1];
        for nb in mol.neighbors(last) {
            if !matches!(mol.bonds[nb.bond].order, BondOrder::Aromatic) {
                continue;
            }
            let next = nb.atom;
            if depth == 6 {
                if next == path[0] {
                    return true;
                }
                continue;
            }
            if path[..depth].contains(&next) {
                continue;
            }
            path[depth] = next;
            if walk(mol, path, depth + 1) {
                return true;
            }
        }
        false
    }
    if !walk(mol, &mut path, 1) {
        return None;
    }
    let all_carbon = path.iter().all(|&a| mol.atoms[a].element == 6);
    Some(Ring {
        atoms: path,
        meta: [path[2], path[4]],
        para: Some(path[3]),
        all_carbon,
    })
}

/// One row of the σ table (`fragments/sigma.tsv`). σ values are
/// dimensionless Hammett substituent constants.
#[derive(Debug, Clone)]
pub struct SigmaEntry {
    /// Substituent name (column `name`), e.g. `methyl`.
    pub name: String,
    /// Substituent SMILES (column `substituent_smiles`), `[*]` marking the
    /// ring carbon it is attached to, e.g. `[*]C`.
    pub smiles: String,
    /// σm (column `sigma_meta`).
    pub sigma_m: f64,
    /// σp (column `sigma_para`); also used for ortho positions.
    pub sigma_p: f64,
    /// σp⁻ (column `sigma_para_minus`), for sites in through-conjugation
    /// with the ring; None (empty cell) = not known, σp is used instead.
    pub sigma_p_minus: Option<f64>,
    /// Citation key (column `source`), e.g. `hansch1991`.
    pub source: String,
}

/// The σ table indexed by substituent key.
#[derive(Debug, Clone, Default)]
pub struct SigmaTable {
    /// Rows in file order.
    pub entries: Vec<SigmaEntry>,
    by_key: HashMap<String, usize>,
    /// [`key_hash`] of every key, sorted: a substituent whose hash is not
    /// here has no entry, and its key text is never built.
    hashes: Vec<u64>,
}

const MAX_ATOMS: usize = 12;

/// Canonical text of the substituent rooted at `atom`, entered from
/// `parent`; None when it is larger than [`MAX_ATOMS`].
fn key(mol: &Molecule, atom: usize, parent: usize) -> Option<String> {
    let mut seen = vec![parent, atom];
    let k = key_rec(mol, atom, parent, &mut seen, 0)?;
    Some(k)
}

fn key_rec(
    mol: &Molecule,
    atom: usize,
    parent: usize,
    seen: &mut Vec<usize>,
    depth: usize,
) -> Option<String> {
    if depth > 6 || seen.len() > MAX_ATOMS + 1 {
        return None;
    }
    let a = &mol.atoms[atom];
    let mut s = format!(
        "{}{}{}h{}",
        a.element,
        if a.aromatic { "a" } else { "" },
        if a.charge != 0 {
            format!("q{}", a.charge)
        } else {
            String::new()
        },
        a.hydrogens
    );
    let mut kids = Vec::new();
    for nb in mol.neighbors(atom) {
        if nb.atom == parent {
            continue;
        }
        let order = super::estimate::order_code(mol.bonds[nb.bond].order);
        if seen.contains(&nb.atom) {
            kids.push(format!("{order}%"));
            continue;
        }
        seen.push(nb.atom);
        kids.push(format!(
            "{order}{}",
            key_rec(mol, nb.atom, atom, seen, depth + 1)?
        ));
    }
    kids.sort();
    for k in kids {
        s.push('(');
        s.push_str(&k);
        s.push(')');
    }
    Some(s)
}

/// Molecule atoms visited by [`key_hash`]: the same list [`key_rec`] keeps,
/// on the stack (it never holds more than `MAX_ATOMS + 2` atoms).
struct Seen {
    atoms: [usize; MAX_ATOMS + 4],
    len: usize,
}

impl Seen {
    fn contains(&self, a: usize) -> bool {
        self.atoms[..self.len].contains(&a)
    }
    fn push(&mut self, a: usize) -> bool {
        match self.atoms.get_mut(self.len) {
            Some(slot) => {
                *slot = a;
                self.len += 1;
                true
            }
            None => false,
        }
    }
}

/// 64-bit mixing step (the SplitMix64 finaliser).
fn mix64(mut x: u64) -> u64 {
    x = (x ^ (x >> 30)).wrapping_mul(0xbf58_476d_1ce4_e5b9);
    x = (x ^ (x >> 27)).wrapping_mul(0x94d0_49bb_1331_11eb);
    x ^ (x >> 31)
}

/// Hash of the text [`key`] gives for the same arguments (None exactly
/// when `key` gives None), made by the same walk without building text:
/// equal keys always give equal hashes (the branches are combined by a
/// sum and an xor, so their order does not matter).
fn key_hash(mol: &Molecule, atom: usize, parent: usize) -> Option<u64> {
    let mut seen = Seen {
        atoms: [usize::MAX; MAX_ATOMS + 4],
        len: 0,
    };
    seen.push(parent);
    seen.push(atom);
    key_hash_rec(mol, atom, parent, &mut seen, 0)
}

fn key_hash_rec(
    mol: &Molecule,
    atom: usize,
    parent: usize,
    seen: &mut Seen,
    depth: usize,
) -> Option<u64> {
    if depth > 6 || seen.len > MAX_ATOMS + 1 {
        return None;
    }
    let a = mol.atoms.get(atom)?;
    let label = u64::from(a.element)
        | u64::from(a.aromatic) << 8
        | u64::from(a.charge as u8) << 16
        | u64::from(a.hydrogens) << 24;
    let (mut sum, mut xor, mut count) = (0u64, 0u64, 0u64);
    for nb in mol.neighbors(atom) {
        if nb.atom == parent {
            continue;
        }
        let order = u64::from(super::estimate::order_code(mol.bonds.get(nb.bond)?.order));
        let kid = if seen.contains(nb.atom) {
            mix64(order ^ 0x2545_f491_4f6c_dd1d)
        } else {
            if !seen.push(nb.atom) {
                return None;
            }
            let h = key_hash_rec(mol, nb.atom, atom, seen, depth + 1)?;
            mix64(h ^ order.wrapping_mul(0x9e37_79b9_7f4a_7c15))
        };
        sum = sum.wrapping_add(kid);
        xor ^= kid.rotate_left(23);
        count += 1;
    }
    let h = mix64(mix64(label ^ 0x5163_7a2b_9e37_79b9) ^ sum);
    Some(mix64(h ^ xor ^ count.wrapping_mul(0xd6e8_feb8_6659_fd93)))
}

impl SigmaTable {
    /// Read the σ table. Columns: `id`, `substituent_smiles` (attachment
    /// `[*]`), `name`, `sigma_meta`, `sigma_para`, `sigma_para_minus` (may be
    /// empty), `source`.
    pub fn parse(file: &str, text: &str) -> Result<SigmaTable, RuleError> {
        let err = |line: usize, m: String| RuleError {
            file: file.to_string(),
            line,
            message: m,
        };
        let mut cols: Vec<&str> = Vec::new();
        let mut t = SigmaTable::default();
        for (n, raw) in text.lines().enumerate() {
            let line = n + 1;
            if raw.starts_with('#') || raw.trim().is_empty() {
                continue;
            }
            let cells: Vec<&str> = raw.split('\t').map(str::trim).collect();
            if cols.is_empty() {
                cols = cells;
                continue;
            }
            let get = |name: &str| -> Result<&str, RuleError> {
                let i = cols
                    .iter()
                    .position(|c| *c == name)
                    .ok_or_else(|| err(0, format!("missing column `{name}`")))?;
                cells
                    .get(i)
                    .copied()
                    .ok_or_else(|| err(line, format!("missing cell `{name}`")))
            };
            let num = |name: &str| -> Result<Option<f64>, RuleError> {
                let v = get(name)?;
                if v.is_empty() {
                    return Ok(None);
                }
                v.parse::<f64>()
                    .ok()
                    .filter(|x| x.is_finite() && x.abs() < 5.0)
                    .map(Some)
                    .ok_or_else(|| err(line, format!("`{name}`: `{v}` is not a σ value")))
            };
            let name = get("name")?.to_string();
            let _id = get("id")?;
            let smiles = get("substituent_smiles")?.to_string();
            let (Some(sigma_m), Some(sigma_p)) = (num("sigma_meta")?, num("sigma_para")?) else {
                return Err(err(line, "σm and σp are required".into()));
            };
            let sigma_p_minus = num("sigma_para_minus")?;
            let mol = Molecule::from_smiles(&smiles)
                .map_err(|e| err(line, format!("substituent SMILES: {e}")))?;
            let star = mol.atoms.iter().position(|a| a.element == 0);
            let Some(star) = star else {
                return Err(err(
                    line,
                    "substituent SMILES needs a `*` attachment".into(),
                ));
            };
            let Some(first) = mol.neighbors(star).first().map(|nb| nb.atom) else {
                return Err(err(line, "`*` is not bonded".into()));
            };
            let (Some(k), Some(h)) = (key(&mol, first, star), key_hash(&mol, first, star)) else {
                return Err(err(line, "substituent too large".into()));
            };
            t.hashes.push(h);
            let idx = t.entries.len();
            t.entries.push(SigmaEntry {
                name,
                smiles,
                sigma_m,
                sigma_p,
                sigma_p_minus,
                source: get("source")?.to_string(),
            });
            t.by_key.entry(k).or_insert(idx);
        }
        t.hashes.sort_unstable();
        t.hashes.dedup();
        Ok(t)
    }

    /// σ entry for the substituent whose first atom is `sub`, attached to
    /// ring atom `ring_atom` (atom indices of `mol`, 0-based in input
    /// order). None when the substituent is not in the table (or has more
    /// than 12 atoms).
    pub fn lookup(&self, mol: &Molecule, ring_atom: usize, sub: usize) -> Option<&SigmaEntry> {
        let h = key_hash(mol, sub, ring_atom)?;
        self.hashes.binary_search(&h).ok()?;
        let k = key(mol, sub, ring_atom)?;
        self.by_key.get(&k).map(|&i| &self.entries[i])
    }
}
