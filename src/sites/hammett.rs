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

/// One row of the σ table.
#[derive(Debug, Clone)]
pub struct SigmaEntry {
    pub name: String,
    pub smiles: String,
    pub sigma_m: f64,
    pub sigma_p: f64,
    pub sigma_p_minus: Option<f64>,
    pub source: String,
}

/// The σ table indexed by substituent key.
#[derive(Debug, Clone, Default)]
pub struct SigmaTable {
    pub entries: Vec<SigmaEntry>,
    by_key: HashMap<String, usize>,
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
            let Some(k) = key(&mol, first, star) else {
                return Err(err(line, "substituent too large".into()));
            };
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
        Ok(t)
    }

    /// σ entry for the substituent `sub` on ring atom `ring_atom`.
    pub fn lookup(&self, mol: &Molecule, ring_atom: usize, sub: usize) -> Option<&SigmaEntry> {
        let k = key(mol, sub, ring_atom)?;
        self.by_key.get(&k).map(|&i| &self.entries[i])
    }
}
