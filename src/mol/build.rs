//! Turning the written atoms and bonds into a validated molecule: hydrogen
//! folding, implicit hydrogens, charge separation, kekulization, valence
//! checks, rings, aromaticity, components and stereo (see the module
//! documentation of `mol` for the rules).

use super::read::{self, RawOrder};
use super::{
    aromatic, elements, kekule, rings, stereo, valence_table, Atom, Bond, BondOrder, ErrorKind,
    MolError, Molecule, Neighbor,
};

fn raw_order_value(o: RawOrder) -> u8 {
    match o {
        RawOrder::Elided | RawOrder::Single | RawOrder::Aromatic => 1,
        RawOrder::Double => 2,
        RawOrder::Triple => 3,
        RawOrder::Quadruple => 4,
    }
}

fn error_at(kind: ErrorKind, message: String, atom: &Atom, smiles: &str) -> MolError {
    MolError::new(kind, message, Some(atom.span.start), smiles)
}

fn describe(atom: &Atom) -> String {
    let sym = atom.symbol();
    if atom.aromatic {
        sym.to_lowercase()
    } else {
        sym.to_string()
    }
}

/// Borrowed view of the compressed adjacency rows.
pub(crate) struct Adj<'a> {
    pub(crate) start: &'a [u32],
    pub(crate) list: &'a [Neighbor],
}

impl<'a> Adj<'a> {
    #[inline]
    pub(crate) fn get(&self, i: usize) -> &'a [Neighbor] {
        &self.list[self.start[i] as usize..self.start[i + 1] as usize]
    }
}

/// Compressed adjacency rows from a bond list.
fn adjacency_of(n: usize, bonds: &[Bond]) -> (Vec<u32>, Vec<Neighbor>) {
    let mut start = vec![0u32; n + 1];
    for b in bonds {
        start[b.atoms[0] + 1] += 1;
        start[b.atoms[1] + 1] += 1;
    }
    for i in 0..n {
        start[i + 1] += start[i];
    }
    // Fill using start[i + 1] as the cursor of row i, then it ends at the
    // row's end, which is exactly the start of row i + 1.
    let mut adjacency = vec![Neighbor { atom: 0, bond: 0 }; bonds.len() * 2];
    for k in (0..n).rev() {
        start[k + 1] = start[k];
    }
    for (k, b) in bonds.iter().enumerate() {
        let [x, y] = b.atoms;
        adjacency[start[x + 1] as usize] = Neighbor { atom: y, bond: k };
        start[x + 1] += 1;
        adjacency[start[y + 1] as usize] = Neighbor { atom: x, bond: k };
        start[y + 1] += 1;
    }
    (start, adjacency)
}

/// Valence a (possibly charged) atom may have, as RDKit accepts it.
fn valence_allowed(z: u8, charge: i8, valence: u32) -> bool {
    let Some(row) = valence_table::TABLE.get(z as usize) else {
        return false;
    };
    let any = 0x3ff;
    if !(valence_table::CHARGE_MIN..=valence_table::CHARGE_MAX).contains(&charge) {
        // Unusual charges: only elements without a valence rule.
        return row.2[4] == any;
    }
    let mask = row.2[(charge - valence_table::CHARGE_MIN) as usize];
    mask == any || (valence <= 9 && mask & (1 << valence) != 0)
}

/// Charge-separate pentavalent nitrogen (nitro, N-oxide, azide written with
/// five bonds) and halogen oxides written with double bonds, as RDKit's
/// clean-up does: `CN(=O)=O` is read as `C[N+](=O)[O-]`, `OCl(=O)(=O)=O`
/// as `O[Cl+3]([O-])([O-])[O-]`.
fn charge_separate(atoms: &mut [Atom], bonds: &mut [Bond], start: &[u32], adj: &[Neighbor]) {
    let nb = |i: usize| &adj[start[i] as usize..start[i + 1] as usize];
    for i in 0..atoms.len() {
        let z = atoms[i].element;
        if atoms[i].charge != 0 || !matches!(z, 7 | 17 | 35 | 53) {
            continue;
        }
        let v: u32 = nb(i)
            .iter()
            .map(|x| bonds[x.bond].kekule as u32)
            .sum::<u32>()
            + atoms[i].hydrogens as u32;
        let terminal_o = |x: &Neighbor, atoms: &[Atom], bonds: &[Bond]| {
            bonds[x.bond].kekule == 2
                && bonds[x.bond].order != BondOrder::Aromatic
                && atoms[x.atom].element == 8
                && atoms[x.atom].charge == 0
                && nb(x.atom).len() == 1
        };
        if z == 7 {
            let pentavalent = v == 5 || (atoms[i].aromatic && v == 4);
            if !pentavalent {
                continue;
            }
            if let Some(x) = nb(i).iter().find(|x| terminal_o(x, atoms, bonds)) {
                let x = *x;
                bonds[x.bond].kekule = 1;
                bonds[x.bond].order = BondOrder::Single;
                atoms[x.atom].charge = -1;
                atoms[i].charge = 1;
            } else if let Some(x) = nb(i).iter().find(|x| {
                bonds[x.bond].kekule == 3
                    && atoms[x.atom].element == 7
                    && atoms[x.atom].charge == 0
                    && nb(x.atom).len() == 1
            }) {
                let x = *x;
                bonds[x.bond].kekule = 2;
                bonds[x.bond].order = BondOrder::Double;
                atoms[x.atom].charge = -1;
                atoms[i].charge = 1;
            }
        } else if v > 1 {
            let oxo: Vec<Neighbor> = nb(i)
                .iter()
                .filter(|x| terminal_o(x, atoms, bonds))
                .copied()
                .collect();
            for x in &oxo {
                bonds[x.bond].kekule = 1;
                bonds[x.bond].order = BondOrder::Single;
                atoms[x.atom].charge = -1;
            }
            atoms[i].charge = oxo.len() as i8;
        }
    }
}

/// Turn the written atoms and bonds into a validated molecule: fold
/// hydrogens, add implicit hydrogens, kekulize aromatic input, check
/// valences, find rings, perceive aromaticity, find components.
pub(crate) fn build(smiles: &str, raw: read::Raw) -> Result<Molecule, MolError> {
    let read::Raw {
        atoms: raw_atoms,
        bonds: raw_bonds,
        spans,
        stereo: raw_stereo,
    } = raw;
    let n_raw = raw_atoms.len();
    // Hydrogens to fold (only when hydrogen atoms were written).
    let has_h = raw_atoms.iter().any(|a| a.element == 1);
    let mut fold: Vec<bool> = Vec::new();
    if has_h {
        let mut raw_degree = vec![0u32; n_raw];
        for b in &raw_bonds {
            raw_degree[b.a as usize] += 1;
            raw_degree[b.b as usize] += 1;
        }
        let foldable = |i: usize| {
            let a = &raw_atoms[i];
            a.element == 1 && a.charge == 0 && a.hcount.unwrap_or(0) == 0 && raw_degree[i] == 1
        };
        fold = vec![false; n_raw];
        for b in &raw_bonds {
            if !matches!(b.order, RawOrder::Elided | RawOrder::Single) {
                continue;
            }
            let (ba, bb) = (b.a as usize, b.b as usize);
            for (h, heavy) in [(ba, bb), (bb, ba)] {
                if foldable(h) && raw_atoms[heavy].element != 1 {
                    fold[h] = true;
                }
            }
        }
    }
    let folded = |i: usize| fold.get(i).copied().unwrap_or(false);
    // new_index[i] = index after folding (unused for a folded H); identity
    // when nothing is folded.
    let mut new_index: Vec<usize> = if has_h {
        vec![usize::MAX; n_raw]
    } else {
        Vec::new()
    };
    let mut atoms = Vec::with_capacity(n_raw);
    for (i, a) in raw_atoms.iter().enumerate() {
        if folded(i) {
            continue;
        }
        if has_h {
            new_index[i] = atoms.len();
        }
        atoms.push(Atom {
            element: a.element,
            aromatic: a.aromatic,
            charge: a.charge,
            isotope: a.isotope,
            hydrogens: a.hcount.unwrap_or(0),
            heavy_hydrogens: 0,
            tritium: 0,
            map: a.map,
            bracket: a.bracket,
            span: spans[i].clone(),
        });
    }
    let n = atoms.len();
    let mut bonds: Vec<Bond> = Vec::with_capacity(raw_bonds.len());
    let mut star_links: Vec<usize> = Vec::new();
    for b in &raw_bonds {
        let (ba, bb) = (b.a as usize, b.b as usize);
        let (fa, fb) = (folded(ba), folded(bb));
        if fa || fb {
            let (h, heavy) = if fa { (ba, bb) } else { (bb, ba) };
            let atom = &mut atoms[if has_h { new_index[heavy] } else { heavy }];
            atom.hydrogens = atom.hydrogens.saturating_add(1);
            if matches!(raw_atoms[h].isotope, Some(2) | Some(3)) {
                atom.heavy_hydrogens = atom.heavy_hydrogens.saturating_add(1);
            }
            if raw_atoms[h].isotope == Some(3) {
                atom.tritium = atom.tritium.saturating_add(1);
            }
            continue;
        }
        let (x, y) = if has_h {
            (new_index[ba], new_index[bb])
        } else {
            (ba, bb)
        };
        let both_aromatic = raw_atoms[ba].aromatic && raw_atoms[bb].aromatic;
        // A wildcard bonded to an aromatic atom may be part of its ring:
        // decided once rings are known.
        let star_link = b.order == RawOrder::Elided
            && ((raw_atoms[ba].element == 0 && raw_atoms[bb].aromatic)
                || (raw_atoms[bb].element == 0 && raw_atoms[ba].aromatic));
        if star_link {
            star_links.push(bonds.len());
        }
        let aromatic = match b.order {
            RawOrder::Aromatic => true,
            RawOrder::Elided => both_aromatic,
            _ => false,
        };
        let order = if aromatic {
            BondOrder::Aromatic
        } else {
            match raw_order_value(b.order) {
                2 => BondOrder::Double,
                3 => BondOrder::Triple,
                4 => BondOrder::Quadruple,
                _ => BondOrder::Single,
            }
        };
        bonds.push(Bond {
            atoms: [x, y],
            order,
            kekule: raw_order_value(b.order),
        });
    }
    let (adjacency_start, adjacency) = adjacency_of(n, &bonds);
    charge_separate(&mut atoms, &mut bonds, &adjacency_start, &adjacency);
    let nb = Adj {
        start: &adjacency_start,
        list: &adjacency,
    };

    // Implicit hydrogens by the organic-subset valence rules; aromatic atoms
    // that have room for a pi bond must get a double bond in kekulization.
    let mut implicit_h = vec![0u8; n];
    let mut needs_pi = vec![false; n];
    let mut bond_sum = vec![0u32; n];
    for b in &bonds {
        let v = b.kekule as u32;
        bond_sum[b.atoms[0]] += v;
        bond_sum[b.atoms[1]] += v;
    }
    for (i, atom) in atoms.iter_mut().enumerate() {
        let v = bond_sum[i] + atom.hydrogens as u32;
        let targets = if atom.bracket || atom.charge != 0 {
            elements::charged_valences(atom.element, atom.charge)
        } else {
            elements::normal_valences(atom.element)
        };
        let Some(&t) = targets.iter().find(|&&t| t as u32 >= v) else {
            continue;
        };
        let t = t as u32;
        if atom.aromatic && t > v {
            needs_pi[i] = true;
        }
        if !atom.bracket {
            let h = if atom.aromatic && t > v {
                t - v - 1
            } else {
                t - v
            };
            implicit_h[i] = h as u8;
            atom.hydrogens = atom.hydrogens.saturating_add(h as u8);
        }
    }

    // Rings with every bond; perceived again below without dative bonds
    // if there are any.
    let mut ring_info = rings::perceive(n, &bonds, &nb, &[], smiles)?;

    // Wildcards inside aromatic rings (`*1ccccc1`) are aromatic and may or
    // may not take a double bond.
    let mut optional_pi = Vec::new();
    for &b in &star_links {
        if ring_info.bond_in_ring[b] {
            bonds[b].order = BondOrder::Aromatic;
            for a in bonds[b].atoms {
                if atoms[a].element == 0 && !atoms[a].aromatic {
                    atoms[a].aromatic = true;
                    optional_pi.push(a);
                }
            }
        }
    }

    // Aromatic input: every aromatic atom must be in a ring, and the pi
    // atoms must pair up along ring bonds written aromatic.
    if atoms.iter().any(|a| a.aromatic) {
        for (i, a) in atoms.iter().enumerate() {
            if a.aromatic && ring_info.atom_rings[i] == 0 {
                return Err(error_at(
                    ErrorKind::Aromaticity,
                    format!("aromatic atom '{}' is not in a ring", describe(a)),
                    a,
                    smiles,
                ));
            }
        }
        // Try without the wildcards' pi bonds first, then with them.
        let mut attempt = 0;
        let (pi_atoms, adj, mate) = loop {
            let mut pi_atoms: Vec<usize> = Vec::with_capacity(n);
            pi_atoms.extend(
                (0..n).filter(|&i| needs_pi[i] || (attempt == 1 && optional_pi.contains(&i))),
            );
            let mut local = vec![usize::MAX; n];
            for (k, &i) in pi_atoms.iter().enumerate() {
                local[i] = k;
            }
            let mut adj = kekule::Graph {
                start: Vec::with_capacity(pi_atoms.len() + 1),
                list: Vec::with_capacity(pi_atoms.len() * 3),
            };
            adj.start.push(0);
            for &i in &pi_atoms {
                for x in nb.get(i) {
                    if bonds[x.bond].order == BondOrder::Aromatic
                        && ring_info.bond_in_ring[x.bond]
                        && local[x.atom] != usize::MAX
                    {
                        adj.list.push((local[x.atom], x.bond));
                    }
                }
                adj.start.push(adj.list.len());
            }
            let mate = kekule::perfect_matching(&adj);
            let complete = mate.iter().all(|m| *m != usize::MAX);
            if complete || optional_pi.is_empty() || attempt == 1 {
                break (pi_atoms, adj, mate);
            }
            attempt += 1;
        };
        if let Some(k) = mate.iter().position(|m| *m == usize::MAX) {
            // Point at the likeliest culprit in that ring system: a
            // pyridine-type 'n' that should be [nH], else the unpaired atom.
            let mut system = vec![pi_atoms[k]];
            let mut seen = vec![false; n];
            seen[pi_atoms[k]] = true;
            let mut head = 0;
            while head < system.len() {
                let v = system[head];
                head += 1;
                for x in nb.get(v) {
                    if bonds[x.bond].order == BondOrder::Aromatic && !seen[x.atom] {
                        seen[x.atom] = true;
                        system.push(x.atom);
                    }
                }
            }
            system.sort_unstable();
            let culprit = system
                .iter()
                .copied()
                .find(|&i| {
                    atoms[i].element == 7
                        && !atoms[i].bracket
                        && needs_pi[i]
                        && nb.get(i).len() == 2
                })
                .unwrap_or(pi_atoms[k]);
            let a = &atoms[culprit];
            let hint = if a.element == 7 && !a.bracket {
                "; if this nitrogen carries a hydrogen (pyrrole type), write it [nH]"
            } else {
                ""
            };
            return Err(error_at(
                ErrorKind::Aromaticity,
                format!(
                    "cannot kekulize the aromatic ring system containing this '{}': its atoms cannot be given alternating double bonds{}",
                    describe(a),
                    hint
                ),
                a,
                smiles,
            ));
        }
        for b in bonds.iter_mut() {
            if b.order == BondOrder::Aromatic {
                b.kekule = 1;
            }
        }
        for (k, &m) in mate.iter().enumerate() {
            if m > k {
                if let Some(&(_, bond)) = adj[k].iter().find(|(w, _)| *w == m) {
                    bonds[bond].kekule = 2;
                }
            }
        }
        for b in bonds.iter_mut() {
            if b.order == BondOrder::Aromatic {
                b.order = if b.kekule == 2 {
                    BondOrder::Double
                } else {
                    BondOrder::Single
                };
            }
        }
        for s in bond_sum.iter_mut() {
            *s = 0;
        }
        for b in &bonds {
            bond_sum[b.atoms[0]] += b.kekule as u32;
            bond_sum[b.atoms[1]] += b.kekule as u32;
        }
    }

    // Valence check on the Kekulé structure. A donor atom (N, O, P, S...)
    // over its valence because of single bonds to metals has those bonds
    // treated as dative (they do not count toward its valence), as RDKit does
    // for organometallics written with plain bonds.
    let mut dative_donor = vec![u32::MAX; bonds.len()];
    for (i, a) in atoms.iter().enumerate() {
        let mut v = bond_sum[i] + a.hydrogens as u32;
        if valence_allowed(a.element, a.charge, v) {
            continue;
        }
        if !elements::is_metal(a.element) {
            for x in nb.get(i) {
                if bonds[x.bond].kekule == 1
                    && elements::is_metal(atoms[x.atom].element)
                    && dative_donor[x.bond] == u32::MAX
                {
                    dative_donor[x.bond] = i as u32;
                    v -= 1;
                    if valence_allowed(a.element, a.charge, v) {
                        break;
                    }
                }
            }
        }
        if !valence_allowed(a.element, a.charge, v) {
            let charge = match a.charge {
                0 => String::new(),
                c => format!(" with charge {:+}", c),
            };
            return Err(error_at(
                ErrorKind::Valence,
                format!(
                    "valence {} is not allowed for {}{}",
                    bond_sum[i] + a.hydrogens as u32,
                    a.symbol(),
                    charge
                ),
                a,
                smiles,
            ));
        }
    }
    for (b, &d) in dative_donor.iter().enumerate() {
        if d != u32::MAX {
            bond_sum[d as usize] -= bonds[b].kekule as u32;
        }
    }
    // Dative bonds make no rings (as in RDKit's ring information).
    if dative_donor.iter().any(|&d| d != u32::MAX) {
        let skip: Vec<bool> = dative_donor.iter().map(|&d| d != u32::MAX).collect();
        ring_info = rings::perceive(n, &bonds, &nb, &skip, smiles)?;
    }

    // Aromaticity perception from scratch on the Kekulé structure.
    // Only ring atoms are looked at; the others get empty facts.
    let any_dative = dative_donor.iter().any(|&d| d != u32::MAX);
    let facts: Vec<aromatic::AtomFacts> = (0..n)
        .map(|i| {
            let a = &atoms[i];
            if ring_info.atom_rings[i] == 0 {
                return aromatic::AtomFacts {
                    degree: 0,
                    bond_order_sum: 0,
                    explicit_h: 0,
                    radicals: 0,
                };
            }
            let row = nb.get(i);
            let degree = if any_dative {
                row.iter()
                    .filter(|x| dative_donor[x.bond] != i as u32)
                    .count() as i32
            } else {
                row.len() as i32
            };
            let v = bond_sum[i] as i32 + a.hydrogens as i32;
            let radicals = if a.bracket && a.element != 0 {
                elements::charged_valences(a.element, a.charge)
                    .iter()
                    .find(|&&t| t as i32 >= v)
                    .map_or(0, |&t| t as i32 - v)
            } else {
                0
            };
            aromatic::AtomFacts {
                degree,
                bond_order_sum: bond_sum[i] as i32,
                explicit_h: (a.hydrogens - implicit_h[i]) as i32,
                radicals,
            }
        })
        .collect();
    let (atom_arom, bond_arom) = aromatic::perceive(&atoms, &bonds, &nb, &facts, &ring_info);
    for (a, &ar) in atoms.iter_mut().zip(&atom_arom) {
        a.aromatic = ar;
    }
    for (b, &ar) in bonds.iter_mut().zip(&bond_arom) {
        if ar && matches!(b.kekule, 1 | 2) {
            b.order = BondOrder::Aromatic;
        }
    }

    // Connected components, numbered in order of their first atom.
    let mut component = vec![u32::MAX; n];
    let mut count = 0u32;
    let mut stack = Vec::with_capacity(n);
    for s in 0..n {
        if component[s] != u32::MAX {
            continue;
        }
        component[s] = count;
        stack.push(s);
        while let Some(v) = stack.pop() {
            for x in nb.get(v) {
                if component[x.atom] == u32::MAX {
                    component[x.atom] = count;
                    stack.push(x.atom);
                }
            }
        }
        count += 1;
    }
    // Main component: most heavy atoms among those containing carbon (else
    // among all); the first written wins a tie.
    let mut heavy = vec![0usize; count as usize];
    let mut carbon = vec![false; count as usize];
    for (i, a) in atoms.iter().enumerate() {
        let c = component[i] as usize;
        if a.element != 1 {
            heavy[c] += 1;
        }
        if a.element == 6 {
            carbon[c] = true;
        }
    }
    let any_carbon = carbon.iter().any(|c| *c);
    let mut main = 0u32;
    let mut best = None;
    for c in 0..count as usize {
        if any_carbon && !carbon[c] {
            continue;
        }
        if best.is_none_or(|b| heavy[c] > b) {
            best = Some(heavy[c]);
            main = c as u32;
        }
    }

    let marks = raw_stereo.then(|| {
        stereo::collect(&raw_atoms, &raw_bonds, |i| {
            if !has_h {
                Some(i)
            } else if fold[i] {
                None
            } else {
                Some(new_index[i])
            }
        })
    });
    let mut mol = Molecule {
        atoms,
        bonds,
        adjacency_start,
        adjacency,
        implicit_h,
        rings: ring_info,
        component,
        component_count: count as usize,
        main_component: main,
        dative_donor,
        stereo: stereo::Stereo::default(),
    };
    if let Some(marks) = marks {
        mol.stereo = stereo::perceive(&mol, marks);
    }
    Ok(mol)
}
