//! Parsing and validation of the practice data files (`fragments/reactions.tsv`,
//! `modes.tsv`, `systems.tsv`, `practice.tsv`, `side_reactions.tsv`, `regio.tsv`).

use super::*;

impl Practice {
    /// Parse and validate the four files against the base catalogue and the
    /// citation keys (`sources_text`: the text of `fragments/sources.tsv`).
    pub fn parse(texts: &Texts, cat: &Catalogue) -> Result<Practice, CatalogueError> {
        let Texts {
            reactions: reactions_text,
            modes: modes_text,
            systems,
            practice,
            side: side_text,
            regio: regio_text,
            sources: sources_text,
        } = *texts;
        let sources = parse_sources(sources_text)?;
        let key_ok = |k: &str| sources.iter().any(|(s, _)| s == k);
        let err = |file: &str, line: usize, col: &str, msg: String| {
            CatalogueError::new(file, line, Some(col), msg)
        };
        let check_source = |file: &str, line: usize, k: &str| {
            if key_ok(k) {
                Ok(k.to_string())
            } else {
                Err(err(
                    file,
                    line,
                    "source",
                    format!("citation key `{k}` is not in fragments/sources.tsv"),
                ))
            }
        };
        let num = |file: &str, line: usize, col: &str, s: &str| {
            s.trim()
                .parse::<f64>()
                .ok()
                .filter(|v| v.is_finite())
                .ok_or_else(|| err(file, line, col, format!("not a number: {s:?}")))
        };

        // reactions.tsv
        let f = "fragments/reactions.tsv";
        let mut reactions: Vec<ReactionRow> = Vec::new();
        for (line, c) in rows(reactions_text, 5, f)? {
            let reaction =
                Reaction::parse(c[0]).map_err(|e| err(f, line, "name", e.to_string()))?;
            if reactions.iter().any(|r| r.reaction == reaction) {
                return Err(err(f, line, "name", format!("{} listed twice", c[0])));
            }
            reactions.push(ReactionRow {
                reaction,
                name: reaction.name().to_string(),
                mode: Mode::parse(c[1])
                    .ok_or_else(|| err(f, line, "mode", format!("unknown mode {:?}", c[1])))?,
                extra_equivalents: num(f, line, "extra_equiv", c[2])?,
                summary: c[3].to_string(),
                source: check_source(f, line, c[4])?,
            });
        }
        for r in Reaction::ALL {
            if !reactions.iter().any(|x| x.reaction == r) {
                return Err(err(
                    f,
                    0,
                    "name",
                    format!("reaction {} has no row", r.name()),
                ));
            }
        }
        reactions.sort_by_key(|r| Reaction::ALL.iter().position(|x| *x == r.reaction));

        // modes.tsv
        let f = "fragments/modes.tsv";
        let mut modes: Vec<ModeRow> = Vec::new();
        for (line, c) in rows(modes_text, 5, f)? {
            let mode = Mode::parse(c[0])
                .ok_or_else(|| err(f, line, "mode", format!("unknown mode {:?}", c[0])))?;
            let min_fraction = num(f, line, "min_fraction", c[1])?;
            if !(0.0..=1.0).contains(&min_fraction) {
                return Err(err(f, line, "min_fraction", "must lie in 0..=1".into()));
            }
            let equivalents = num(f, line, "equivalents", c[2])?;
            if !(equivalents > 0.0 && equivalents <= 10.0) {
                return Err(err(f, line, "equivalents", "must lie in (0, 10]".into()));
            }
            modes.push(ModeRow {
                mode,
                min_fraction,
                equivalents,
                note: c[3].to_string(),
                source: check_source(f, line, c[4])?,
            });
        }
        for m in Mode::ALL {
            if !modes.iter().any(|x| x.mode == m) {
                return Err(err(f, 0, "mode", format!("mode {} has no row", m.name())));
            }
        }
        modes.sort_by_key(|r| Mode::ALL.iter().position(|x| *x == r.mode));

        // systems.tsv
        let f = "fragments/systems.tsv";
        let mut systems_out: Vec<System> = Vec::new();
        for (line, c) in rows(systems, 8, f)? {
            let base = match c[1] {
                "-" => None,
                b => {
                    let known = cat.get(b).ok_or_else(|| {
                        err(f, line, "base", format!("{b} is not a catalogue base"))
                    })?;
                    Some(known.name.clone())
                }
            };
            if cat.get(c[0]).is_some() || systems_out.iter().any(|s| s.name == c[0]) {
                return Err(err(
                    f,
                    line,
                    "name",
                    format!("{} is already a base or system", c[0]),
                ));
            }
            let lo = num(f, line, "temp_min_c", c[3])?;
            let hi = num(f, line, "temp_max_c", c[4])?;
            if lo > hi {
                return Err(err(f, line, "temp_min_c", "above temp_max_c".into()));
            }
            let hazards = list(c[5])
                .iter()
                .map(|h| {
                    Hazard::parse(h)
                        .ok_or_else(|| err(f, line, "hazards", format!("unknown hazard {h:?}")))
                })
                .collect::<Result<Vec<_>, _>>()?;
            systems_out.push(System {
                name: c[0].to_string(),
                base,
                solvent: c[2].to_string(),
                temp_min_c: lo,
                temp_max_c: hi,
                hazards,
                procedure: c[6].to_string(),
                source: check_source(f, line, c[7])?,
            });
        }

        // practice.tsv
        let f = "fragments/practice.tsv";
        let mut out: Vec<PracticeRow> = Vec::new();
        for (line, c) in rows(practice, 13, f)? {
            if out.iter().any(|r| r.id == c[0]) {
                return Err(err(f, line, "id", format!("id {} used twice", c[0])));
            }
            let reactions = list(c[1])
                .iter()
                .map(|r| Reaction::parse(r).map_err(|e| err(f, line, "reactions", e.to_string())))
                .collect::<Result<Vec<_>, _>>()?;
            if reactions.is_empty() {
                return Err(err(f, line, "reactions", "no reaction named".into()));
            }
            let control = match c[2] {
                "-" => None,
                s => Some(Control::parse(s).map_err(|e| err(f, line, "control", e.to_string()))?),
            };
            let pattern =
                Pattern::parse(c[3]).map_err(|e| err(f, line, "smarts", format!("{e}")))?;
            if pattern.anchor().is_none() {
                return Err(err(f, line, "smarts", "no atom mapped :1".into()));
            }
            let mode = Mode::parse(c[4])
                .ok_or_else(|| err(f, line, "mode", format!("unknown mode {:?}", c[4])))?;
            let known = |n: &str| {
                cat.get(n).map(|b| b.name.clone()).or_else(|| {
                    systems_out
                        .iter()
                        .find(|s| s.name.eq_ignore_ascii_case(n))
                        .map(|s| s.name.clone())
                })
            };
            let mut prefer = Vec::new();
            for n in list(c[5]) {
                prefer.push(known(n).ok_or_else(|| {
                    err(
                        f,
                        line,
                        "prefer",
                        format!("{n} is neither a catalogue base nor a system"),
                    )
                })?);
            }
            let mut exclude = Vec::new();
            for n in list(c[6]) {
                let b = cat.get(n).ok_or_else(|| {
                    err(f, line, "exclude", format!("{n} is not a catalogue base"))
                })?;
                if prefer.iter().any(|p| p == &b.name) {
                    return Err(err(f, line, "exclude", format!("{n} is also preferred")));
                }
                exclude.push(b.name.clone());
            }
            let opt = |s: &str| (s != "-").then(|| s.to_string());
            let exclude_kind = opt(c[7]);
            if let Some(k) = &exclude_kind {
                if !["regio", "side-reaction", "mode"].contains(&k.as_str()) {
                    return Err(err(f, line, "exclude_kind", format!("unknown kind {k:?}")));
                }
            }
            let exclude_reason = opt(c[8]);
            if !exclude.is_empty() && (exclude_kind.is_none() || exclude_reason.is_none()) {
                return Err(err(
                    f,
                    line,
                    "exclude_reason",
                    "excluded bases need a kind and a reason".into(),
                ));
            }
            let equivalents = match c[9] {
                "-" => None,
                s => {
                    let v = num(f, line, "equivalents", s)?;
                    if !(v > 0.0 && v <= 10.0) {
                        return Err(err(f, line, "equivalents", "must lie in (0, 10]".into()));
                    }
                    Some(v)
                }
            };
            let min_fraction = match c[10] {
                "-" => None,
                s => {
                    let v = num(f, line, "min_fraction", s)?;
                    if !(0.0..=1.0).contains(&v) {
                        return Err(err(f, line, "min_fraction", "must lie in 0..=1".into()));
                    }
                    Some(v)
                }
            };
            let rank_by_slot: Vec<usize> = cat
                .bases
                .iter()
                .map(|b| {
                    prefer
                        .iter()
                        .position(|p| *p == b.name)
                        .unwrap_or(usize::MAX)
                })
                .collect();
            let excluded_by_slot: Vec<bool> = cat
                .bases
                .iter()
                .map(|b| exclude.contains(&b.name))
                .collect();
            let exclude_text = format!("{} [{}]", exclude_reason.as_deref().unwrap_or(""), c[0]);
            out.push(PracticeRow {
                rank_by_slot,
                excluded_by_slot,
                exclude_text,
                id: c[0].to_string(),
                reactions,
                control,
                smarts: c[3].to_string(),
                pattern,
                mode,
                prefer,
                exclude,
                exclude_kind,
                exclude_reason,
                equivalents,
                min_fraction,
                note: c[11].to_string(),
                source: check_source(f, line, c[12])?,
            });
        }
        // side_reactions.tsv
        let f = "fragments/side_reactions.tsv";
        let families: Vec<&str> = cat.bases.iter().map(|b| b.family.name()).collect();
        let mut side = Vec::new();
        for (line, c) in rows(side_text, 7, f)? {
            let star = |s: &str| s.trim() == "*";
            let reactions = if star(c[1]) {
                Vec::new()
            } else {
                list(c[1])
                    .iter()
                    .map(|r| {
                        Reaction::parse(r).map_err(|e| err(f, line, "reactions", e.to_string()))
                    })
                    .collect::<Result<Vec<_>, _>>()?
            };
            let modes = if star(c[2]) {
                Vec::new()
            } else {
                list(c[2])
                    .iter()
                    .map(|m| {
                        Mode::parse(m)
                            .ok_or_else(|| err(f, line, "modes", format!("unknown mode {m:?}")))
                    })
                    .collect::<Result<Vec<_>, _>>()?
            };
            let fams = if star(c[3]) {
                Vec::new()
            } else {
                let v: Vec<String> = list(c[3]).iter().map(|x| x.to_string()).collect();
                if let Some(bad) = v.iter().find(|x| !families.contains(&x.as_str())) {
                    return Err(err(
                        f,
                        line,
                        "families",
                        format!("unknown base family {bad:?}"),
                    ));
                }
                v
            };
            let patterns = c[4]
                .split(" & ")
                .map(|p| {
                    Pattern::parse(p.trim()).map_err(|e| err(f, line, "patterns", format!("{e}")))
                })
                .collect::<Result<Vec<_>, _>>()?;
            side.push(SideReaction {
                id: c[0].to_string(),
                reactions,
                modes,
                families: fams,
                patterns,
                message: c[5].to_string(),
                source: check_source(f, line, c[6])?,
            });
        }
        // regio.tsv
        let f = "fragments/regio.tsv";
        let mut regio: Vec<RegioRule> = Vec::new();
        for (line, c) in rows(regio_text, 4, f)? {
            let control =
                Control::parse(c[0]).map_err(|e| err(f, line, "control", e.to_string()))?;
            if regio.iter().any(|r| r.control == control) {
                return Err(err(f, line, "control", format!("{} listed twice", c[0])));
            }
            let fams: Vec<String> = list(c[1]).iter().map(|x| x.to_string()).collect();
            if let Some(bad) = fams.iter().find(|x| !families.contains(&x.as_str())) {
                return Err(err(
                    f,
                    line,
                    "families",
                    format!("unknown base family {bad:?}"),
                ));
            }
            regio.push(RegioRule {
                control,
                families: fams,
                reason: c[2].to_string(),
                source: check_source(f, line, c[3])?,
            });
        }
        Ok(Practice {
            reactions,
            modes,
            systems: systems_out,
            rows: out,
            side_reactions: side,
            regio,
            base_names: cat.bases.iter().map(|b| b.name.clone()).collect(),
        })
    }
}

/// Comma-separated list; '-' is empty.
pub(super) fn list(s: &str) -> Vec<&str> {
    if s.trim() == "-" {
        return Vec::new();
    }
    s.split(',')
        .map(str::trim)
        .filter(|x| !x.is_empty())
        .collect()
}

/// Data rows (1-based line, cells) after the comment lines and the header;
/// every row must have `n` cells.
pub(super) fn rows<'t>(
    text: &'t str,
    n: usize,
    file: &str,
) -> Result<Vec<(usize, Vec<&'t str>)>, CatalogueError> {
    let mut out = Vec::new();
    let mut header = false;
    for (i, raw) in text.lines().enumerate() {
        let line = raw.trim_end_matches('\r');
        if line.trim().is_empty() || line.starts_with('#') {
            continue;
        }
        let cells: Vec<&str> = line.split('\t').map(str::trim).collect();
        if cells.len() != n {
            return Err(CatalogueError::new(
                file,
                i + 1,
                None,
                format!("expected {n} tab-separated cells, found {}", cells.len()),
            ));
        }
        if !header {
            header = true;
            continue;
        }
        if cells.iter().any(|c| c.is_empty()) {
            return Err(CatalogueError::new(
                file,
                i + 1,
                None,
                "empty cell (write '-' for none)".into(),
            ));
        }
        out.push((i + 1, cells));
    }
    Ok(out)
}
