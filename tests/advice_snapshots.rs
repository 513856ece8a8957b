//! insta snapshots of the advice for ten molecules (issue 5). The snapshot is
//! a compact JSON summary (rounded numbers) so a change in ranking, a new
//! rejection or a changed warning shows up in review.

use acidsite::advice::{advise, Advice, AdviceOptions, Purpose};
use acidsite::mol::Molecule;
use acidsite::sites::find_sites;
use serde_json::{json, Value};

fn r4(x: f64) -> Value {
    if x.abs() < 1e-3 && x != 0.0 {
        json!(format!("{x:.2e}"))
    } else {
        json!((x * 1e4).round() / 1e4)
    }
}

fn summary(a: &Advice) -> Value {
    json!({
        "target": {
            "atoms": a.target.site.atoms,
            "class": a.target.site.class,
            "pka_dmso": a.target.site.pka_dmso,
            "pka_water": a.target.site.pka_water,
            "chosen_by": a.target.chosen_by,
        },
        "base": a.base,
        "equivalents": r4(a.equivalents),
        "equivalents_note": a.equivalents_note,
        "conversion": a.conversion.map(r4),
        "solvent": a.solvent,
        "temperature_c": a.temperature.map(|t| [t.low_c, t.high_c]),
        "scale": a.scale.map(|s| s.name()),
        "scale_note": a.scale_note,
        "counted": a.counted.iter().map(|c| json!({"atoms": c.atoms, "protons": c.protons, "reason": c.reason})).collect::<Vec<_>>(),
        "alternatives": a.alternatives.iter().map(|x| json!([x.base, r4(x.conversion)])).collect::<Vec<_>>(),
        "rejected": a.rejected.iter().map(|r| json!([r.base, r.kinds.iter().map(|k| k.name()).collect::<Vec<_>>()])).collect::<Vec<_>>(),
        "warnings": a.warnings.iter().map(|w| w.kind.name()).collect::<Vec<_>>(),
        "cautions": a.cautions.iter().map(|c| c.reagent.clone()).collect::<Vec<_>>(),
        "regio": a.regio.as_ref().map(|r| json!({
            "kinetic": {"base": r.kinetic.base, "atoms": r.kinetic.favours_atoms},
            "thermodynamic": {"base": r.thermodynamic.base, "atoms": r.thermodynamic.favours_atoms},
        })),
    })
}

fn snap(name: &str, smiles: &str, opts: AdviceOptions) {
    let mol = Molecule::from_smiles(smiles).unwrap();
    let sites = find_sites(&mol);
    let a = advise(&mol, &sites, &opts).unwrap();
    let mut v = summary(&a);
    v["smiles"] = json!(smiles);
    insta::assert_json_snapshot!(name, v);
}

#[test]
fn advise_given_ten_molecules_matches_snapshots() {
    let d = AdviceOptions::default;
    snap("2_methylcyclohexanone", "CC1CCCCC1=O", d());
    snap("diethyl_malonate", "CCOC(=O)CC(=O)OCC", d());
    snap("ethyl_acetate", "CC(=O)OCC", d());
    snap(
        "propanoic_acid_dianion",
        "CCC(=O)O",
        AdviceOptions {
            site: Some(1),
            ..d()
        },
    );
    snap("hydroxy_ketone", "CC(=O)CCCO", d());
    snap("phenylacetonitrile", "N#CCc1ccccc1", d());
    snap("propanal", "CCC=O", d());
    snap(
        "nitroethane_catalytic",
        "CC[N+](=O)[O-]",
        AdviceOptions {
            purpose: Purpose::Catalytic,
            ..d()
        },
    );
    snap("ethyl_acetoacetate", "CCOC(=O)CC(C)=O", d());
    snap("dimethylacetamide", "CC(=O)N(C)C", d());
}
