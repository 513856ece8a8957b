//! One input record (a SMILES line, a CSV/TSV row or an SD record) to one
//! output [`Record`]: reading the fields, the id and carried columns, the
//! per-row reaction, and the error record when any of it fails.

use super::*;

pub(super) fn split_fields(format: InputFormat, line: &str) -> Option<Vec<String>> {
    match format {
        InputFormat::Csv => split_csv_line(line),
        InputFormat::Tsv => Some(line.split('\t').map(str::to_string).collect()),
        InputFormat::Smi | InputFormat::Sdf => Some(vec![line.to_string()]),
    }
}

pub(super) fn record_for(raw: &RawLine, ctx: &Job) -> Record {
    let fail = |input: String,
                id: Option<String>,
                kind: &str,
                message: String,
                position: Option<usize>| {
        Record::failure(
            raw.line,
            id,
            input,
            ErrorOut {
                kind: kind.into(),
                message,
                position,
            },
        )
    };
    if ctx.format == InputFormat::Sdf && !raw.truncated {
        // Data items in other encodings (Latin-1 names) should not lose the
        // molecule: bad bytes become U+FFFD.
        return sd_record(raw, &String::from_utf8_lossy(&raw.bytes), ctx);
    }
    let text = match std::str::from_utf8(&raw.bytes) {
        Ok(t) => t,
        Err(e) => {
            let valid = e.valid_up_to();
            let pos = String::from_utf8_lossy(&raw.bytes[..valid]).chars().count();
            return fail(
                String::from_utf8_lossy(&raw.bytes).into_owned(),
                None,
                "encoding",
                format!("line is not valid UTF-8 (bad byte at byte offset {valid})"),
                Some(pos),
            );
        }
    };
    if raw.truncated {
        let sd = ctx.format == InputFormat::Sdf;
        let what = if sd {
            format!("SD record {}", raw.record)
        } else {
            "line".to_string()
        };
        return fail(
            if sd { String::new() } else { text.to_string() },
            None,
            "too_large",
            format!(
                "{what} is longer than {} MiB; it was cut and not analysed",
                MAX_LINE_BYTES >> 20
            ),
            None,
        );
    }
    match ctx.format {
        InputFormat::Sdf => sd_record(raw, text, ctx),
        InputFormat::Smi => {
            let t = text.trim_start();
            let (smiles, rest) = match t.find(char::is_whitespace) {
                Some(i) => (&t[..i], t[i..].trim()),
                None => (t, ""),
            };
            let id = (!rest.is_empty()).then(|| rest.to_string());
            analyze(smiles, raw.line, id, &ctx.opts)
        }
        InputFormat::Csv | InputFormat::Tsv => {
            let Some(fields) = split_fields(ctx.format, text) else {
                return fail(
                    text.to_string(),
                    None,
                    "columns",
                    "unterminated quote in this row".into(),
                    None,
                );
            };
            let id = ctx
                .id_col
                .and_then(|i| fields.get(i))
                .map(|s| s.trim().to_string())
                .filter(|s| !s.is_empty());
            let columns = Pairs(
                ctx.header
                    .iter()
                    .enumerate()
                    .filter(|(i, _)| *i != ctx.smiles_col && Some(*i) != ctx.id_col)
                    .map(|(i, h)| (h.clone(), fields.get(i).cloned().unwrap_or_default()))
                    .collect(),
            );
            let row_reaction = ctx
                .reaction_col
                .and_then(|i| fields.get(i))
                .map(|s| s.trim())
                .filter(|s| !s.is_empty());
            let row_opts;
            let opts = match row_reaction {
                None => &ctx.opts,
                Some(name) => match acidsite::advice::practice::Reaction::parse(name) {
                    Ok(r) => {
                        row_opts = Options {
                            reaction: Some(r),
                            ..ctx.opts.clone()
                        };
                        &row_opts
                    }
                    Err(e) => {
                        let mut rec = fail(
                            fields.get(ctx.smiles_col).cloned().unwrap_or_default(),
                            id,
                            "reaction",
                            format!(
                                "column {:?}: {e}",
                                ctx.header[ctx.reaction_col.unwrap_or(0)]
                            ),
                            None,
                        );
                        rec.columns = Some(columns);
                        return rec;
                    }
                },
            };
            let mut rec = match fields.get(ctx.smiles_col) {
                Some(smiles) => analyze(smiles.trim(), raw.line, id, opts),
                None => fail(
                    String::new(),
                    id,
                    "columns",
                    format!(
                        "row has {} fields; the SMILES column {:?} is field {}",
                        fields.len(),
                        ctx.header
                            .get(ctx.smiles_col)
                            .map(String::as_str)
                            .unwrap_or(""),
                        ctx.smiles_col + 1
                    ),
                    None,
                ),
            };
            rec.columns = Some(columns);
            rec
        }
    }
}

/// One SD record to its record: id from the title line or `--id-field`,
/// the other data items carried as columns, errors naming the record
/// number and the file line.
fn sd_record(raw: &RawLine, text: &str, ctx: &Job) -> Record {
    let sd = SdRecord::new(text, raw.record, raw.line);
    let fields = sd.fields();
    let id = match &ctx.id_field {
        Some(name) => fields
            .iter()
            .find(|(n, _)| n == name)
            .map(|(_, v)| v.trim().to_string()),
        None => Some(sd.title().to_string()),
    }
    .filter(|s| !s.is_empty());
    let mut rec = analyze_molfile(
        sd.molfile(),
        raw.line.saturating_sub(1),
        raw.line,
        id,
        &ctx.opts,
    );
    if let Some(e) = rec.error.as_mut() {
        e.message = format!("SD record {}, {}", raw.record, e.message);
    }
    rec.columns = Some(Pairs(
        fields
            .into_iter()
            .filter(|(n, _)| Some(n) != ctx.id_field.as_ref())
            .collect(),
    ));
    rec
}
