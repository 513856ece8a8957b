//! V2000 connection tables: fixed columns (with a whitespace fallback for
//! short lines), the atom and bond blocks and the `M  CHG`/`M  ISO`/`M  RAD`
//! property lines.

use super::super::read::RawOrder;
use super::{
    bond_order, check_count, element_of, radical_electrons, MolfileError, Table, TableAtom,
};

/// Fixed-column field (characters `from..to`, trimmed), or None when the
/// line is too short.
fn col(line: &str, from: usize, to: usize) -> Option<&str> {
    if !line.is_ascii() || line.len() <= from {
        return None;
    }
    Some(line[from..to.min(line.len())].trim())
}

fn int_field(line: &str, from: usize, to: usize) -> Option<i64> {
    match col(line, from, to) {
        None => Some(0),
        Some("") => Some(0),
        Some(s) => s.parse().ok(),
    }
}

pub(super) fn read_v2000(lines: &[&str]) -> Result<Table, MolfileError> {
    let counts = lines[3];
    let ws: Vec<&str> = counts.split_whitespace().collect();
    let na = int_field(counts, 0, 3)
        .or_else(|| ws.first().and_then(|s| s.parse().ok()))
        .ok_or_else(|| {
            MolfileError::format(4, "the counts line does not start with the atom count")
        })?;
    let nb = int_field(counts, 3, 6)
        .or_else(|| ws.get(1).and_then(|s| s.parse().ok()))
        .ok_or_else(|| MolfileError::format(4, "the counts line has no bond count"))?;
    let na = check_count(na, "atom", 4)?;
    let nb = check_count(nb, "bond", 4)?;
    let mut atoms = Vec::with_capacity(na);
    for i in 0..na {
        let ln = 5 + i;
        let Some(line) = lines.get(4 + i) else {
            return Err(MolfileError::format(
                lines.len(),
                format!("the molfile ends in the atom block: {na} atoms announced, {i} found"),
            ));
        };
        let f: Vec<&str> = line.split_whitespace().collect();
        let fixed = line.is_ascii() && line.len() >= 34;
        let (coords, symbol) = if fixed {
            (
                [col(line, 0, 10), col(line, 10, 20), col(line, 20, 30)],
                col(line, 31, 34).unwrap_or(""),
            )
        } else {
            (
                [f.first().copied(), f.get(1).copied(), f.get(2).copied()],
                f.get(3).copied().unwrap_or(""),
            )
        };
        let mut xyz = [0.0; 3];
        for (k, c) in coords.into_iter().enumerate() {
            match c.and_then(|c| c.trim().parse::<f64>().ok()) {
                Some(v) if v.is_finite() => xyz[k] = v,
                _ => {
                    return Err(MolfileError::format(
                        ln,
                        format!("atom line {} does not start with three coordinates", i + 1),
                    ))
                }
            }
        }
        if symbol.is_empty() {
            return Err(MolfileError::format(
                ln,
                format!("atom line {} has no element symbol", i + 1),
            ));
        }
        let (element, isotope) = element_of(symbol, ln)?;
        let num = |from: usize, k: usize| -> Result<i64, MolfileError> {
            let v = if fixed {
                int_field(line, from, from + 3)
            } else {
                Some(f.get(k).and_then(|s| s.parse().ok()).unwrap_or(0))
            };
            v.ok_or_else(|| {
                MolfileError::format(
                    ln,
                    format!("atom line {} has a field that is not a number", i + 1),
                )
            })
        };
        let code = num(36, 5)?;
        let (charge, radical) = match code {
            0 => (0, 0),
            1..=3 => (4 - code as i8, 0),
            4 => (0, 1),
            5..=7 => (4 - code as i8, 0),
            _ => {
                return Err(MolfileError::format(
                    ln,
                    format!("charge code {code} is not 0 to 7"),
                ))
            }
        };
        let valence = match num(48, 9)? {
            0 => None,
            15 => Some(0),
            v @ 1..=14 => Some(v as u8),
            v => {
                return Err(MolfileError::format(
                    ln,
                    format!("valence field {v} is not 0 to 15"),
                ))
            }
        };
        atoms.push(TableAtom {
            element,
            isotope,
            charge,
            radical,
            valence,
            line: ln,
            xyz,
        });
    }
    let mut bonds = Vec::with_capacity(nb);
    let mut stereo = Vec::with_capacity(nb);
    for k in 0..nb {
        let ln = 5 + na + k;
        let Some(line) = lines.get(4 + na + k) else {
            return Err(MolfileError::format(
                lines.len(),
                format!("the molfile ends in the bond block: {nb} bonds announced, {k} found"),
            ));
        };
        let f: Vec<&str> = line.split_whitespace().collect();
        let fixed = line.is_ascii() && line.len() >= 9;
        let get = |from: usize, j: usize| -> Option<i64> {
            if fixed {
                col(line, from, from + 3).and_then(|s| s.parse().ok())
            } else {
                f.get(j).and_then(|s| s.parse().ok())
            }
        };
        let (Some(a), Some(b), Some(t)) = (get(0, 0), get(3, 1), get(6, 2)) else {
            return Err(MolfileError::format(
                ln,
                format!(
                    "bond line {} does not hold two atom numbers and a type",
                    k + 1
                ),
            ));
        };
        bonds.push(checked_bond(a, b, t, na, ln)?);
        // Bond stereo field: 1 wedge, 6 hash, 4 either; 3 either (double).
        stereo.push(match get(9, 3) {
            Some(s @ (1 | 3 | 4 | 6)) => s as u8,
            _ => 0,
        });
    }
    let mut table = Table {
        atoms,
        bonds,
        stereo,
    };
    // Property block.
    let mut charges_reset = false;
    let mut radicals_reset = false;
    let mut ended = false;
    for (j, line) in lines.iter().enumerate().skip(4 + na + nb) {
        let ln = j + 1;
        if line.starts_with("M  END") {
            ended = true;
            break;
        }
        if line.starts_with("$$$$") || line.starts_with("> ") {
            break;
        }
        let tag = line.get(..6).unwrap_or("");
        if !matches!(tag, "M  CHG" | "M  ISO" | "M  RAD") {
            continue;
        }
        let values: Vec<i64> = line[6..]
            .split_whitespace()
            .map(|s| s.parse::<i64>())
            .collect::<Result<_, _>>()
            .map_err(|_| {
                MolfileError::format(ln, format!("{tag} line has a field that is not a number"))
            })?;
        let n = values.first().copied().unwrap_or(0);
        if n < 0 || values.len() < 1 + 2 * n as usize {
            return Err(MolfileError::format(
                ln,
                format!("{tag} line announces {n} entries but holds fewer"),
            ));
        }
        if tag == "M  CHG" && !charges_reset {
            charges_reset = true;
            table.atoms.iter_mut().for_each(|a| a.charge = 0);
        }
        if tag == "M  RAD" && !radicals_reset {
            radicals_reset = true;
            table.atoms.iter_mut().for_each(|a| a.radical = 0);
        }
        for pair in values[1..1 + 2 * n as usize].chunks(2) {
            let (a, v) = (pair[0], pair[1]);
            let Some(atom) = (a >= 1)
                .then(|| table.atoms.get_mut(a as usize - 1))
                .flatten()
            else {
                return Err(MolfileError::format(
                    ln,
                    format!("{tag} names atom {a}, but there are {na} atoms"),
                ));
            };
            match tag {
                "M  CHG" => {
                    if !(-15..=15).contains(&v) {
                        return Err(MolfileError::format(
                            ln,
                            format!("charge {v} is out of range"),
                        ));
                    }
                    atom.charge = v as i8;
                }
                "M  ISO" => {
                    if !(1..=999).contains(&v) {
                        return Err(MolfileError::format(
                            ln,
                            format!("mass number {v} is out of range"),
                        ));
                    }
                    atom.isotope = Some(v as u16);
                }
                _ => atom.radical = radical_electrons(v, ln)?,
            }
        }
    }
    if !ended {
        return Err(MolfileError::format(
            lines.len(),
            "the molfile has no 'M  END' line",
        ));
    }
    Ok(table)
}

fn checked_bond(
    a: i64,
    b: i64,
    t: i64,
    na: usize,
    ln: usize,
) -> Result<(usize, usize, RawOrder, usize), MolfileError> {
    for x in [a, b] {
        if x < 1 || x as usize > na {
            return Err(MolfileError::format(
                ln,
                format!("bond to atom {x}, but there are {na} atoms"),
            ));
        }
    }
    if a == b {
        return Err(MolfileError::format(
            ln,
            format!("bond from atom {a} to itself"),
        ));
    }
    Ok((a as usize - 1, b as usize - 1, bond_order(t, ln)?, ln))
}
