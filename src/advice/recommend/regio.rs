//! Kinetic and thermodynamic conditions for a ketone with two sides, from the practice table.

use super::*;

/// Kinetic and thermodynamic conditions for a target with two enolate
/// sides, from the practice rows for each control (fragments/practice.tsv).
pub(super) fn regio_advice(ctx: &Ctx, rows: [Option<&PracticeRow>; 2]) -> Option<RegioAdvice> {
    let (cat, data) = (ctx.cat, ctx.data);
    if !ctx.target_carbonyl {
        return None;
    }
    let find = |r: Regio| {
        ctx.target_unit
            .iter()
            .copied()
            .find(|&i| ctx.sites.sites.get(i).and_then(|s| s.regio) == Some(r))
    };
    let (k, th) = (find(Regio::Kinetic), find(Regio::Thermodynamic));
    if k.is_none() && th.is_none() {
        return None;
    }
    let atoms = |i: Option<usize>| {
        i.and_then(|i| ctx.sites.sites.get(i))
            .map(|s| s.atoms.clone())
            .unwrap_or_default()
    };
    let side = |row: &PracticeRow, fav: Option<usize>| -> RegioConditions {
        let first = row.prefer.first().map(String::as_str).unwrap_or("");
        let (solvent, temperature) = match (cat.get(first), data.system(first)) {
            (Some(b), _) => (b.usual_solvent().to_string(), temperature(b)),
            (None, Some(sy)) => (
                sy.solvent.clone(),
                Temperature {
                    low_c: sy.temp_min_c,
                    high_c: sy.temp_max_c,
                },
            ),
            _ => (
                String::new(),
                Temperature {
                    low_c: 0.0,
                    high_c: 0.0,
                },
            ),
        };
        RegioConditions {
            base: row
                .prefer
                .iter()
                .take(2)
                .cloned()
                .collect::<Vec<_>>()
                .join(" or "),
            equivalents: row.equivalents.unwrap_or(1.0) + PRACTICAL_EXCESS,
            solvent,
            temperature,
            procedure: format!("{} [{}]", row.note, row.id),
            favours_site: fav,
            favours_atoms: atoms(fav),
        }
    };
    Some(RegioAdvice {
        kinetic: side(rows[0]?, k),
        thermodynamic: side(rows[1]?, th),
    })
}
