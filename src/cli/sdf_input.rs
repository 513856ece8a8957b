//! SD input for `annotate` and `--mol` files for `scan` and `draw`: the
//! input format chosen from the file name and the content, SD records read
//! in bounded chunks, and the refusal of inputs the tool cannot read.

use super::input::{InputFormat, LineSource, RawLine, MAX_LINE_BYTES};
use acidsite::mol::sdf::is_record_end;
use std::io;
use std::path::Path;

/// File name endings (before an optional `.gz`) read as SMILES lists.
const SMILES_ENDINGS: &[&str] = &[".smi", ".smiles", ".ism", ".can", ".txt"];

/// The input format: `--input-format` when given; else from the file name
/// (`.sdf`, `.sd`, `.mol`, `.csv`, `.tsv`, `.tab`, `.smi`, `.smiles`,
/// `.ism`, `.can`, `.txt`, each optionally `.gz`); stdin and names without
/// an ending are recognised by their content. A binary input, or an ending
/// the tool does not read, is refused with a message naming the formats it
/// reads.
pub fn choose_format(
    explicit: Option<InputFormat>,
    path: Option<&Path>,
    head: &[u8],
) -> Result<InputFormat, String> {
    if let Some(kind) = binary_kind(head) {
        return Err(format!(
            "unsupported format: the input is {kind}, not text; acidsite reads SMILES lists (.smi), CSV/TSV tables and SD files (.sdf), optionally gzip-compressed"
        ));
    }
    if let Some(f) = explicit {
        return Ok(f);
    }
    let name = path
        .and_then(|p| p.file_name())
        .map(|n| n.to_string_lossy().to_ascii_lowercase())
        .unwrap_or_default();
    let name = name.strip_suffix(".gz").unwrap_or(&name).to_string();
    let by_content = if looks_like_sd(head) {
        InputFormat::Sdf
    } else {
        InputFormat::Smi
    };
    if path.is_none() {
        return Ok(by_content);
    }
    let ending = Path::new(&name)
        .extension()
        .map(|e| e.to_string_lossy().into_owned());
    match ending {
        None => Ok(by_content),
        Some(_) if SMILES_ENDINGS.iter().any(|e| name.ends_with(e)) => Ok(by_content),
        Some(e) => match InputFormat::from_path(Path::new(&name)) {
            InputFormat::Smi => Err(format!(
                "unsupported format: files ending in .{e} are not read; it reads SMILES lists (.smi, .smiles, .txt), CSV/TSV tables (.csv, .tsv) and SD files (.sdf, .mol), optionally .gz; name the layout with --input-format if the file is one of these"
            )),
            f => Ok(f),
        },
    }
}

/// A hint when input read as a SMILES list starts with what looks like the
/// header line of a table: a comma- or tab-separated first line with a
/// column named like a SMILES column (`smiles`, `SMILES`, `canonical_smiles`,
/// ...). Each line would otherwise fail as a SMILES with a comma in it.
pub fn table_header_hint(head: &[u8]) -> Option<String> {
    let first = head.split(|&b| b == b'\n').next()?;
    let first = String::from_utf8_lossy(first);
    let first = first.trim_start_matches('\u{feff}').trim_end_matches('\r');
    let (sep, layout) = if first.contains('\t') {
        ('\t', "tsv")
    } else if first.contains(',') {
        (',', "csv")
    } else {
        return None;
    };
    let named = first.split(sep).any(|c| {
        c.trim()
            .trim_matches('"')
            .to_ascii_lowercase()
            .contains("smiles")
    });
    named.then(|| {
        format!(
            "the first line looks like a table header ({first:?}); read as a SMILES list, every \
             line will fail: add --input-format {layout} (and --column NAME if the SMILES column \
             is not named smiles)"
        )
    })
}

/// A short name for a binary input, or None for text.
fn binary_kind(head: &[u8]) -> Option<&'static str> {
    let magic: &[(&[u8], &str)] = &[
        (b"PK\x03\x04", "a zip archive (or an Office document)"),
        (b"%PDF", "a PDF document"),
        (b"\x89PNG", "a PNG image"),
        (b"\xff\xd8\xff", "a JPEG image"),
        (b"BZh", "a bzip2 archive"),
        (b"\xfd7zXZ", "an xz archive"),
        (b"\x28\xb5\x2f\xfd", "a zstd archive"),
        (b"\xd0\xcf\x11\xe0", "an old Office document"),
        (b"SQLite format", "an SQLite database"),
        (b"\x7fELF", "an executable"),
    ];
    if let Some((_, k)) = magic.iter().find(|(m, _)| head.starts_with(m)) {
        return Some(k);
    }
    // Text lists may hold the odd NUL or stray byte (each becomes an error
    // record); binary data is mostly such bytes. Below 256 bytes a share
    // says little (one stray line would be most of it): a short input must
    // also hold a NUL byte, else each bad line becomes its own error record.
    let sample = &head[..head.len().min(8192)];
    if sample.is_empty() || (sample.len() < 256 && !sample.contains(&0)) {
        return None;
    }
    let control = sample
        .iter()
        .filter(|&&b| b < 0x20 && !matches!(b, b'\t' | b'\n' | b'\r' | 0x0c))
        .count();
    let invalid = String::from_utf8_lossy(sample)
        .chars()
        .filter(|&c| c == char::REPLACEMENT_CHARACTER)
        .count();
    ((control + invalid) * 10 > sample.len()).then_some("binary data")
}

/// An SD file or molfile: a counts line with `V2000`/`V3000` on line 4, or
/// a `$$$$` / `M  END` line near the start.
fn looks_like_sd(head: &[u8]) -> bool {
    let text = String::from_utf8_lossy(&head[..head.len().min(16384)]);
    let mut lines = text.lines();
    if lines
        .clone()
        .nth(3)
        .is_some_and(|l| l.contains("V2000") || l.contains("V3000"))
    {
        return true;
    }
    lines.any(|l| l.starts_with("$$$$") || l.starts_with("M  END"))
}

/// The next SD record: its text (up to the `$$$$` line), first line and
/// number. A record over [`MAX_LINE_BYTES`] is cut (`truncated`) and the
/// rest read and dropped up to its `$$$$`. Blank text after the last record
/// gives no record.
pub fn next_sd_record(source: &mut LineSource, number: &mut u64) -> io::Result<Option<RawLine>> {
    let mut bytes = Vec::new();
    let mut first = 0u64;
    let mut truncated = false;
    while let Some((line, text, cut)) = source.next_physical_line()? {
        if first == 0 {
            first = line;
        }
        if is_record_end(&text) {
            *number += 1;
            return Ok(Some(RawLine {
                line: first,
                bytes,
                truncated,
                record: *number,
            }));
        }
        truncated |= cut;
        if bytes.len() + text.len() + 1 > MAX_LINE_BYTES {
            truncated = true;
        } else {
            bytes.extend_from_slice(&text);
            bytes.push(b'\n');
        }
    }
    if bytes.iter().all(|b| b.is_ascii_whitespace()) {
        return Ok(None);
    }
    *number += 1;
    Ok(Some(RawLine {
        line: first,
        bytes,
        truncated,
        record: *number,
    }))
}

/// Up to `max_records` SD records or about `max_bytes`.
pub fn next_sd_chunk(
    source: &mut LineSource,
    number: &mut u64,
    max_records: usize,
    max_bytes: usize,
) -> io::Result<Vec<RawLine>> {
    let mut chunk = Vec::new();
    let mut bytes = 0usize;
    while chunk.len() < max_records && bytes < max_bytes {
        match next_sd_record(source, number)? {
            Some(r) => {
                bytes += r.bytes.len();
                chunk.push(r);
            }
            None => break,
        }
    }
    Ok(chunk)
}

/// Largest molfile / SD file `scan --mol` and `draw --mol` read whole.
const MAX_MOL_FILE: u64 = 64 << 20;

/// The text of a molfile or SD file (gzip recognised) for `--mol`.
pub fn read_mol_file(path: &Path) -> anyhow::Result<String> {
    use anyhow::Context;
    use std::io::Read;
    let f = std::fs::File::open(path).with_context(|| format!("cannot read {}", path.display()))?;
    let mut raw = Vec::new();
    f.take(MAX_MOL_FILE + 1)
        .read_to_end(&mut raw)
        .with_context(|| format!("cannot read {}", path.display()))?;
    let mut bytes = Vec::new();
    if raw.starts_with(&[0x1f, 0x8b]) {
        flate2::read::MultiGzDecoder::new(raw.as_slice())
            .take(MAX_MOL_FILE + 1)
            .read_to_end(&mut bytes)
            .with_context(|| format!("cannot decompress {}", path.display()))?;
    } else {
        bytes = raw;
    }
    if bytes.len() as u64 > MAX_MOL_FILE {
        anyhow::bail!(
            "{} is larger than {} MiB; use `acidsite annotate` for large SD files",
            path.display(),
            MAX_MOL_FILE >> 20
        );
    }
    if let Some(kind) = binary_kind(&bytes) {
        anyhow::bail!(
            "{}: unsupported format: the file is {kind}, not a molfile or SD file",
            path.display()
        );
    }
    Ok(String::from_utf8_lossy(&bytes).into_owned())
}

/// Every record of a molfile / SD file text, analysed (errors become
/// failure records naming the record and line), with the molecule for
/// drawing when it was read.
pub fn analyze_mol_text(
    text: &str,
    opts: &acidsite::report::Options,
) -> Vec<(acidsite::report::Record, Option<acidsite::mol::Molecule>)> {
    use acidsite::mol::sdf;
    sdf::records(text)
        .map(|r| {
            let id = Some(r.title().to_string()).filter(|s| !s.is_empty());
            let mut rec = acidsite::report::analyze_molfile(
                r.molfile(),
                r.first_line - 1,
                r.first_line,
                id,
                opts,
            );
            if let Some(e) = rec.error.as_mut() {
                e.message = format!("record {}, {}", r.number, e.message);
            }
            let mol = if rec.ok {
                acidsite::mol::molfile::read(r.molfile())
                    .ok()
                    .map(|m| m.molecule)
            } else {
                None
            };
            (rec, mol)
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn table_header_hint_given_csv_header_names_input_format_issue14() {
        let hint = table_header_hint(b"smiles,id\nCCO,a\n").unwrap();
        assert!(hint.contains("--input-format csv"), "{hint}");
        assert!(table_header_hint(b"id\tSMILES\nCCO\n")
            .unwrap()
            .contains("--input-format tsv"));
        assert!(table_header_hint(b"CCO ethanol\nCC(=O)C\n").is_none());
        assert!(table_header_hint(b"name,value\n").is_none());
    }

    #[test]
    fn choose_format_given_names_and_content() {
        let sd = b"x\n\n\n  1  0  0  0  0  0  0  0  0  0999 V2000\n";
        let p = |s: &str| Some(Path::new(s).to_path_buf());
        assert_eq!(
            choose_format(None, p("a.sdf.gz").as_deref(), b"").unwrap(),
            InputFormat::Sdf
        );
        assert_eq!(
            choose_format(None, p("a.txt").as_deref(), sd).unwrap(),
            InputFormat::Sdf
        );
        assert_eq!(choose_format(None, None, sd).unwrap(), InputFormat::Sdf);
        assert_eq!(
            choose_format(None, None, b"CCO x\n").unwrap(),
            InputFormat::Smi
        );
        assert!(choose_format(None, p("a.xlsx").as_deref(), b"PK\x03\x04..")
            .unwrap_err()
            .starts_with("unsupported format"));
        assert!(choose_format(None, p("a.json").as_deref(), b"{}")
            .unwrap_err()
            .contains(".json"));
        assert!(choose_format(None, None, &[0u8, 1, 2, 0x80].repeat(100)).is_err());
        assert!(choose_format(None, None, b"\x00\x01\x02").is_err());
        // A short input with a stray byte (no NUL) is text: its bad line becomes an
        // error record (regression: a lone 0x80 line was refused as binary).
        assert_eq!(
            choose_format(None, None, b"\x80\n").unwrap(),
            InputFormat::Smi
        );
        assert_eq!(
            choose_format(Some(InputFormat::Smi), p("a.json").as_deref(), b"CCO").unwrap(),
            InputFormat::Smi
        );
    }
}
