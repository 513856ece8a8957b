//! A SMILES writer for molecules that were not read from SMILES (molfiles):
//! Kekulé form, atoms in depth-first order from the lowest index of each
//! component, branches in index order. Not canonical. The text reads back
//! as the same molecule: every atom whose hydrogens the organic-subset rule
//! would not give is written in brackets with its hydrogen count.

use super::{elements, Molecule};
use std::fmt::Write as _;

/// The SMILES and the order in which atoms were written (`order[k]` is the
/// index of the k-th atom of the text).
pub(crate) fn write(mol: &Molecule) -> (String, Vec<usize>) {
    let n = mol.atoms.len();
    let mut bond_sum = vec![0u32; n];
    for b in &mol.bonds {
        bond_sum[b.atoms[0]] += b.kekule as u32;
        bond_sum[b.atoms[1]] += b.kekule as u32;
    }
    // Depth-first pass: pre-order, tree children, ring-closure bonds.
    let mut visited = vec![false; n];
    let mut parent_bond = vec![usize::MAX; n];
    let mut children: Vec<Vec<usize>> = vec![Vec::new(); n];
    let mut ring_bond = vec![false; mol.bonds.len()];
    let mut roots = Vec::new();
    let mut stack: Vec<(usize, usize)> = Vec::new();
    for root in 0..n {
        if visited[root] {
            continue;
        }
        roots.push(root);
        visited[root] = true;
        stack.push((root, 0));
        while let Some(&mut (v, ref mut k)) = stack.last_mut() {
            let nb = mol.neighbors(v);
            if *k >= nb.len() {
                stack.pop();
                continue;
            }
            let x = nb[*k];
            *k += 1;
            if x.bond == parent_bond[v] || ring_bond[x.bond] {
                continue;
            }
            if visited[x.atom] {
                ring_bond[x.bond] = true;
            } else {
                visited[x.atom] = true;
                parent_bond[x.atom] = x.bond;
                children[v].push(x.atom);
                stack.push((x.atom, 0));
            }
        }
    }
    // Writing pass, same pre-order.
    let mut out = String::with_capacity(n * 3);
    let mut order = Vec::with_capacity(n);
    let mut digit_of_bond = vec![0u16; mol.bonds.len()];
    let mut free: Vec<bool> = vec![true; 100];
    enum Step {
        Atom(usize),
        Open,
        Close,
    }
    for (r, &root) in roots.iter().enumerate() {
        if r > 0 {
            out.push('.');
        }
        let mut todo = vec![Step::Atom(root)];
        while let Some(step) = todo.pop() {
            let v = match step {
                Step::Open => {
                    out.push('(');
                    continue;
                }
                Step::Close => {
                    out.push(')');
                    continue;
                }
                Step::Atom(v) => v,
            };
            if parent_bond[v] != usize::MAX {
                out.push_str(bond_symbol(mol.bonds[parent_bond[v]].kekule));
            }
            order.push(v);
            atom_text(mol, v, bond_sum[v], &mut out);
            for x in mol.neighbors(v) {
                if !ring_bond[x.bond] {
                    continue;
                }
                if digit_of_bond[x.bond] == 0 {
                    // Opening (the other atom comes later): the lowest free digit.
                    let d = (1..100).find(|&d| free[d]).unwrap_or(99);
                    free[d] = false;
                    digit_of_bond[x.bond] = d as u16;
                    out.push_str(bond_symbol(mol.bonds[x.bond].kekule));
                    push_digit(&mut out, d);
                } else {
                    let d = digit_of_bond[x.bond] as usize;
                    free[d] = true;
                    push_digit(&mut out, d);
                }
            }
            // Popped as: ( c0 ) ( c1 ) ... ck
            if let Some((&last, rest)) = children[v].split_last() {
                todo.push(Step::Atom(last));
                for &c in rest.iter().rev() {
                    todo.push(Step::Close);
                    todo.push(Step::Atom(c));
                    todo.push(Step::Open);
                }
            }
        }
    }
    (out, order)
}

fn push_digit(out: &mut String, d: usize) {
    if d < 10 {
        out.push((b'0' + d as u8) as char);
    } else {
        let _ = write!(out, "%{d:02}");
    }
}

fn bond_symbol(kekule: u8) -> &'static str {
    match kekule {
        2 => "=",
        3 => "#",
        4 => "$",
        _ => "",
    }
}

/// Append the text of atom `i`: bare organic-subset symbol when the
/// organic rule gives its hydrogens, else a bracket atom.
fn atom_text(mol: &Molecule, i: usize, bonds: u32, out: &mut String) {
    let a = &mol.atoms[i];
    let organic = matches!(a.element, 0 | 5 | 6 | 7 | 8 | 9 | 15 | 16 | 17 | 35 | 53);
    if organic && a.charge == 0 && a.isotope.is_none() {
        let implied = if a.element == 0 {
            0
        } else {
            elements::normal_valences(a.element)
                .iter()
                .map(|&t| t as u32)
                .find(|&t| t >= bonds)
                .map_or(0, |t| t - bonds)
        };
        if implied == a.hydrogens as u32 {
            out.push_str(a.symbol());
            return;
        }
    }
    out.push('[');
    if let Some(iso) = a.isotope {
        let _ = write!(out, "{iso}");
    }
    out.push_str(a.symbol());
    match a.hydrogens {
        0 => {}
        1 => out.push('H'),
        h => {
            let _ = write!(out, "H{h}");
        }
    }
    match a.charge {
        0 => {}
        1 => out.push('+'),
        -1 => out.push('-'),
        c if c > 0 => {
            let _ = write!(out, "+{c}");
        }
        c => {
            let _ = write!(out, "-{}", -c);
        }
    }
    out.push(']');
}
