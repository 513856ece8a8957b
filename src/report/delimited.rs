//! CSV and TSV rows of output records.
//!
//! Two layouts:
//! * one row per molecule ([`Layout::Molecule`]): the top C–H site, its pKa,
//!   the recommended base, equivalents, conversion and warnings;
//! * one row per site ([`Layout::Site`]); a molecule without sites or a failed
//!   record still gives one row, with the site fields empty.
//!
//! Columns carried through from a CSV/TSV input are written after `id`, in
//! their input order. CSV fields are quoted when they hold the separator,
//! a quote, a line break or leading/trailing space (RFC 4180 quoting); TSV has
//! no quoting, so tabs and line breaks inside a field become spaces. List
//! fields (atoms, warnings) are joined with `;` and ` | `.
//!
//! ```
//! use acidsite::report::delimited::{Delimiter, Layout, RowWriter};
//! use acidsite::report::record::Pairs;
//! use acidsite::report::{analyze, Options};
//!
//! // Hydroxyacetone with one column carried through from a CSV input.
//! let mut rec = analyze("OCC(=O)C", 1, Some("h1".into()), &Options::default());
//! rec.columns = Some(Pairs(vec![("note".into(), "dry, cold".into())]));
//!
//! let csv = RowWriter {
//!     delimiter: Delimiter::Comma,
//!     layout: Layout::Molecule,
//!     carried: vec!["note".into()],
//! };
//! assert!(csv.header().starts_with("line,id,note,smiles,ok,"));
//! // The carried field holds the separator, so it is quoted.
//! assert!(csv.rows(&rec).starts_with("1,h1,\"dry, cold\",OCC(=O)C,true,"));
//!
//! // One row per site, most acidic first.
//! let tsv = RowWriter { delimiter: Delimiter::Tab, layout: Layout::Site, carried: Vec::new() };
//! let rows = tsv.rows(&rec);
//! assert_eq!(rows.lines().count(), rec.sites.as_ref().unwrap().len());
//! let first: Vec<&str> = rows.lines().next().unwrap().split('\t').collect();
//! assert_eq!(first[5], "1"); // the `rank` column
//! ```

use super::record::{Record, SiteOut};

/// Field separator.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Delimiter {
    /// Comma-separated values with RFC 4180 quoting.
    Comma,
    /// Tab-separated values without quoting (tabs and line breaks inside a
    /// field become spaces).
    Tab,
}

/// Row layout.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Layout {
    /// One row per record: the most acidic C–H site and the advice.
    Molecule,
    /// One row per acidic site, most acidic first; a record without sites
    /// still gives one row.
    Site,
}

const MOLECULE_COLUMNS: &[&str] = &[
    "smiles",
    "ok",
    "formula",
    "top_ch_atoms",
    "top_ch_class",
    "top_ch_pka_dmso",
    "top_ch_pka_water",
    "top_ch_uncertainty",
    "base",
    "equivalents",
    "solvent",
    "temperature_c",
    "conversion",
    "warnings",
    "error",
];

const SITE_COLUMNS: &[&str] = &[
    "smiles",
    "ok",
    "formula",
    "rank",
    "atoms",
    "element",
    "hydrogens",
    "class",
    "pka_dmso",
    "pka_water",
    "uncertainty",
    "regio",
    "error",
];

/// Writes header and rows as strings (each ending in `\n`).
#[derive(Debug, Clone)]
pub struct RowWriter {
    /// Field separator.
    pub delimiter: Delimiter,
    /// One row per molecule or one per site.
    pub layout: Layout,
    /// Names of carried-through input columns.
    pub carried: Vec<String>,
}

impl RowWriter {
    /// The header line.
    pub fn header(&self) -> String {
        let mut fields: Vec<String> = vec!["line".into(), "id".into()];
        fields.extend(self.carried.iter().cloned());
        let cols = match self.layout {
            Layout::Molecule => MOLECULE_COLUMNS,
            Layout::Site => SITE_COLUMNS,
        };
        fields.extend(cols.iter().map(|s| s.to_string()));
        self.join(&fields)
    }

    /// The row(s) for one record.
    pub fn rows(&self, rec: &Record) -> String {
        let mut lead: Vec<String> = vec![rec.line.to_string(), rec.id.clone().unwrap_or_default()];
        // The record's columns come in the order of `carried` (both follow
        // the header): take them by position, so a row costs time linear in
        // the number of columns (issue 17); look names up only if the
        // orders differ.
        let cols = rec.columns.as_ref().map(|c| &c.0[..]).unwrap_or(&[]);
        let in_order = cols.len() == self.carried.len()
            && cols.iter().zip(&self.carried).all(|((k, _), n)| k == n);
        for (i, name) in self.carried.iter().enumerate() {
            let v = if in_order {
                cols[i].1.clone()
            } else {
                cols.iter()
                    .find(|(k, _)| k == name)
                    .map(|(_, v)| v.clone())
                    .unwrap_or_default()
            };
            lead.push(v);
        }
        lead.push(rec.input.clone());
        lead.push(rec.ok.to_string());
        lead.push(rec.formula.clone().unwrap_or_default());
        let error = rec
            .error
            .as_ref()
            .map(|e| match e.position {
                Some(p) => format!("{}: {} (at character {p})", e.kind, e.message),
                None => format!("{}: {}", e.kind, e.message),
            })
            .unwrap_or_default();
        match self.layout {
            Layout::Molecule => {
                let mut f = lead;
                let top = rec.top_carbon_site();
                f.push(top.map(|s| atoms(&s.atoms)).unwrap_or_default());
                f.push(top.map(|s| s.class.clone()).unwrap_or_default());
                f.push(num1(top.and_then(|s| s.pka_dmso)));
                f.push(num1(top.and_then(|s| s.pka_water)));
                f.push(num1(top.map(|s| s.uncertainty)));
                let adv = rec.advice.as_ref().and_then(|a| a.as_ref());
                f.push(adv.and_then(|a| a.base.clone()).unwrap_or_default());
                f.push(num(adv.and_then(|a| a.equivalents)));
                f.push(adv.and_then(|a| a.solvent.clone()).unwrap_or_default());
                f.push(num(adv.and_then(|a| a.temperature_c)));
                f.push(num(adv.and_then(|a| a.conversion)));
                f.push(adv.map(|a| a.warnings.join(" | ")).unwrap_or_default());
                f.push(error);
                self.join(&f)
            }
            Layout::Site => {
                let sites: &[SiteOut] = rec.sites.as_deref().unwrap_or(&[]);
                if sites.is_empty() {
                    let mut f = lead;
                    f.extend(std::iter::repeat_n(String::new(), 9));
                    f.push(error);
                    return self.join(&f);
                }
                let mut out = String::new();
                for s in sites {
                    let mut f = lead.clone();
                    f.push(s.rank.to_string());
                    f.push(atoms(&s.atoms));
                    f.push(s.element.clone());
                    f.push(s.hydrogens.to_string());
                    f.push(s.class.clone());
                    f.push(num1(s.pka_dmso));
                    f.push(num1(s.pka_water));
                    f.push(num1(Some(s.uncertainty)));
                    f.push(s.regio.unwrap_or_default().to_string());
                    f.push(error.clone());
                    out.push_str(&self.join(&f));
                }
                out
            }
        }
    }

    fn join(&self, fields: &[String]) -> String {
        let sep = match self.delimiter {
            Delimiter::Comma => ',',
            Delimiter::Tab => '\t',
        };
        let mut line = String::new();
        for (i, f) in fields.iter().enumerate() {
            if i > 0 {
                line.push(sep);
            }
            match self.delimiter {
                Delimiter::Comma => push_csv_field(&mut line, f),
                Delimiter::Tab => line.extend(f.chars().map(|c| match c {
                    '\t' | '\n' | '\r' => ' ',
                    c => c,
                })),
            }
        }
        line.push('\n');
        line
    }
}

fn push_csv_field(line: &mut String, f: &str) {
    let needs_quotes = f.contains([',', '"', '\n', '\r'])
        || f.starts_with(char::is_whitespace)
        || f.ends_with(char::is_whitespace);
    if needs_quotes {
        line.push('"');
        line.push_str(&f.replace('"', "\"\""));
        line.push('"');
    } else {
        line.push_str(f);
    }
}

fn atoms(a: &[usize]) -> String {
    a.iter()
        .map(|i| i.to_string())
        .collect::<Vec<_>>()
        .join(";")
}

/// A pKa or uncertainty: one decimal, as in the text report (the JSON
/// record keeps two); -0.0 is written 0.0.
fn num1(x: Option<f64>) -> String {
    x.map(|v| {
        let t = format!("{v:.1}");
        if t == "-0.0" {
            "0.0".into()
        } else {
            t
        }
    })
    .unwrap_or_default()
}

fn num(x: Option<f64>) -> String {
    x.map(|v| v.to_string()).unwrap_or_default()
}

/// Split one CSV line into fields (RFC 4180 quoting within the line; a
/// record never spans lines here). Returns None on an unterminated quote.
pub fn split_csv_line(line: &str) -> Option<Vec<String>> {
    if !line.contains('"') {
        // Nothing quoted: every comma separates.
        return Some(line.split(',').map(str::to_string).collect());
    }
    let mut fields = Vec::new();
    let mut cur = String::new();
    let mut chars = line.chars().peekable();
    let mut in_quotes = false;
    let mut at_field_start = true;
    while let Some(c) = chars.next() {
        if in_quotes {
            if c == '"' {
                if chars.peek() == Some(&'"') {
                    cur.push('"');
                    chars.next();
                } else {
                    in_quotes = false;
                }
            } else {
                cur.push(c);
            }
        } else if c == '"' && at_field_start {
            in_quotes = true;
            at_field_start = false;
        } else if c == ',' {
            fields.push(std::mem::take(&mut cur));
            at_field_start = true;
        } else {
            cur.push(c);
            at_field_start = false;
        }
    }
    if in_quotes {
        return None;
    }
    fields.push(cur);
    Some(fields)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn split_csv_line_given_quoted_fields() {
        assert_eq!(
            split_csv_line(r#"a,"b,c","d""e",,"#).unwrap(),
            vec!["a", "b,c", "d\"e", "", ""]
        );
        assert!(split_csv_line(r#"a,"b"#).is_none());
    }

    #[test]
    fn push_csv_field_given_special_characters() {
        let mut s = String::new();
        push_csv_field(&mut s, "a,\"b\"");
        assert_eq!(s, "\"a,\"\"b\"\"\"");
        let mut s = String::new();
        push_csv_field(&mut s, "CC(=O)C");
        assert_eq!(s, "CC(=O)C");
    }
}
