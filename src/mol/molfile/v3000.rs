//! V3000 connection tables: `M  V30` lines (a trailing `-` continues a line),
//! the COUNTS line, the ATOM and BOND blocks with their keyword properties
//! (`CHG=`, `MASS=`, `RAD=`, `VAL=`); other blocks are skipped.

use super::{
    bond_order, check_count, element_of, radical_electrons, MolfileError, MolfileErrorKind, Table,
    TableAtom,
};
use crate::mol::read::RawOrder;
use crate::mol::MAX_ATOMS;

/// V3000: logical lines (continuations joined), each with its first
/// physical line number.
pub(super) fn read_v3000(lines: &[&str]) -> Result<Table, MolfileError> {
    let mut logical: Vec<(usize, String)> = Vec::new();
    let mut pending: Option<(usize, String)> = None;
    let mut ended = false;
    for (j, line) in lines.iter().enumerate().skip(4) {
        let ln = j + 1;
        if line.starts_with("M  END") {
            ended = true;
            break;
        }
        let Some(body) = line.strip_prefix("M  V30 ") else {
            if pending.is_some() {
                return Err(MolfileError::format(
                    ln,
                    "a V3000 line ending in '-' is not continued",
                ));
            }
            continue;
        };
        let (start, mut text) = pending.take().unwrap_or((ln, String::new()));
        let body = body.trim_end();
        if let Some(cont) = body.strip_suffix('-') {
            text.push_str(cont);
            pending = Some((start, text));
        } else {
            text.push_str(body);
            logical.push((start, text));
        }
    }
    if !ended {
        return Err(MolfileError::format(
            lines.len(),
            "the molfile has no 'M  END' line",
        ));
    }
    let mut na = None;
    let mut atoms: Vec<TableAtom> = Vec::new();
    let mut ids: std::collections::HashMap<i64, usize> = std::collections::HashMap::new();
    let mut bonds = Vec::new();
    let mut stereo = Vec::new();
    let mut block = "";
    for (ln, text) in &logical {
        let ln = *ln;
        let words = split_v3000(text);
        let first = words.first().map(String::as_str).unwrap_or("");
        match first {
            "COUNTS" => {
                let get = |k: usize| words.get(k).and_then(|s| s.parse::<i64>().ok());
                let (Some(a), Some(_)) = (get(1), get(2)) else {
                    return Err(MolfileError::format(
                        ln,
                        "the COUNTS line does not hold the atom and bond counts",
                    ));
                };
                na = Some(check_count(a, "atom", ln)?);
                continue;
            }
            "BEGIN" => {
                block = match words.get(1).map(String::as_str) {
                    Some("ATOM") => "atom",
                    Some("BOND") => "bond",
                    Some("CTAB") => "",
                    _ => "other",
                };
                continue;
            }
            "END" => {
                block = "";
                continue;
            }
            _ => {}
        }
        match block {
            "atom" => {
                let Some(id) = words.first().and_then(|s| s.parse::<i64>().ok()) else {
                    return Err(MolfileError::format(
                        ln,
                        "atom line does not start with an atom number",
                    ));
                };
                let symbol = words.get(1).map(String::as_str).unwrap_or("");
                if symbol.starts_with('[') || symbol.starts_with("NOT") {
                    return Err(MolfileError::unsupported(
                        ln,
                        "atom lists are not supported",
                    ));
                }
                if symbol.is_empty() {
                    return Err(MolfileError::format(ln, "atom line has no element symbol"));
                }
                let mut xyz = [0.0; 3];
                for k in 2..5 {
                    match words.get(k).and_then(|s| s.parse::<f64>().ok()) {
                        Some(v) if v.is_finite() => xyz[k - 2] = v,
                        _ => {
                            return Err(MolfileError::format(
                                ln,
                                "atom line does not hold three coordinates after the symbol",
                            ))
                        }
                    }
                }
                let (element, mut isotope) = element_of(symbol, ln)?;
                let mut atom = TableAtom {
                    element,
                    isotope: None,
                    charge: 0,
                    radical: 0,
                    valence: None,
                    line: ln,
                    xyz,
                };
                for w in words.iter().skip(6) {
                    let Some((key, value)) = w.split_once('=') else {
                        continue;
                    };
                    let bad = || MolfileError::format(ln, format!("{key}={value} is not a number"));
                    match key {
                        "CHG" => {
                            let v: i64 = value.parse().map_err(|_| bad())?;
                            if !(-15..=15).contains(&v) {
                                return Err(MolfileError::format(
                                    ln,
                                    format!("charge {v} is out of range"),
                                ));
                            }
                            atom.charge = v as i8;
                        }
                        "MASS" => {
                            let v: i64 = value.parse().map_err(|_| bad())?;
                            if !(1..=999).contains(&v) {
                                return Err(MolfileError::format(
                                    ln,
                                    format!("mass number {v} is out of range"),
                                ));
                            }
                            isotope = Some(v as u16);
                        }
                        "RAD" => {
                            atom.radical = radical_electrons(value.parse().map_err(|_| bad())?, ln)?
                        }
                        "VAL" => {
                            let v: i64 = value.parse().map_err(|_| bad())?;
                            atom.valence = match v {
                                0 => None,
                                -1 => Some(0),
                                1..=14 => Some(v as u8),
                                _ => {
                                    return Err(MolfileError::format(
                                        ln,
                                        format!("valence {v} is out of range"),
                                    ))
                                }
                            };
                        }
                        _ => {}
                    }
                }
                atom.isotope = isotope;
                if ids.insert(id, atoms.len()).is_some() {
                    return Err(MolfileError::format(
                        ln,
                        format!("atom number {id} is used twice"),
                    ));
                }
                if atoms.len() >= MAX_ATOMS {
                    return Err(MolfileError {
                        kind: MolfileErrorKind::TooLarge,
                        message: format!("more than {MAX_ATOMS} atoms"),
                        line: Some(ln),
                        atom: None,
                    });
                }
                atoms.push(atom);
            }
            "bond" => {
                let get = |k: usize| words.get(k).and_then(|s| s.parse::<i64>().ok());
                let (Some(_), Some(t), Some(a), Some(b)) = (get(0), get(1), get(2), get(3)) else {
                    return Err(MolfileError::format(
                        ln,
                        "bond line does not hold a number, a type and two atoms",
                    ));
                };
                let (Some(&x), Some(&y)) = (ids.get(&a), ids.get(&b)) else {
                    let missing = if ids.contains_key(&a) { b } else { a };
                    return Err(MolfileError::format(
                        ln,
                        format!("bond to atom {missing}, which the atom block does not define"),
                    ));
                };
                if x == y {
                    return Err(MolfileError::format(
                        ln,
                        format!("bond from atom {a} to itself"),
                    ));
                }
                let order = bond_order(t, ln)?;
                bonds.push((x, y, order, ln));
                // CFG=1 wedge, 3 hash, 2 either; in V2000 terms.
                let cfg = words
                    .iter()
                    .skip(4)
                    .find_map(|w| w.strip_prefix("CFG="))
                    .and_then(|v| v.parse::<u8>().ok());
                stereo.push(match (cfg, order) {
                    (Some(1), _) => 1,
                    (Some(3), _) => 6,
                    (Some(2), RawOrder::Double) => 3,
                    (Some(2), _) => 4,
                    _ => 0,
                });
            }
            _ => {}
        }
    }
    let Some(na) = na else {
        return Err(MolfileError::format(
            4,
            "the V3000 connection table has no COUNTS line",
        ));
    };
    if na != atoms.len() {
        return Err(MolfileError::format(
            4,
            format!(
                "COUNTS announces {na} atoms, the atom block holds {}",
                atoms.len()
            ),
        ));
    }
    Ok(Table {
        atoms,
        bonds,
        stereo,
    })
}

/// Split a V3000 line into words; double-quoted words keep their spaces,
/// and parenthesised lists stay one word.
fn split_v3000(text: &str) -> Vec<String> {
    let mut out = Vec::new();
    let mut cur = String::new();
    let mut quote = false;
    let mut depth = 0i32;
    for c in text.chars() {
        match c {
            '"' => {
                quote = !quote;
                cur.push(c);
            }
            '(' if !quote => {
                depth += 1;
                cur.push(c);
            }
            ')' if !quote => {
                depth -= 1;
                cur.push(c);
            }
            c if c.is_whitespace() && !quote && depth <= 0 => {
                if !cur.is_empty() {
                    out.push(std::mem::take(&mut cur));
                }
            }
            c => cur.push(c),
        }
    }
    if !cur.is_empty() {
        out.push(cur);
    }
    out
}
