//! insta snapshots of the SVG drawing (issue 12) for a ketone, a
//! 1,3-dicarbonyl, fused aromatics, a macrocycle, a salt and a stereo centre,
//! drawn through `acidsite draw` with the real site marks, so that any change
//! of drawing is reviewed. Re-record with
//! `INSTA_UPDATE=always cargo test --release --test depict -- depict_snapshots::`, render
//! the SVGs and look at them before committing.

use std::process::Command;

fn draw(smiles: &str) -> String {
    let out = Command::new(env!("CARGO_BIN_EXE_acidsite"))
        .args(["draw", smiles])
        .output()
        .unwrap();
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    String::from_utf8(out.stdout).unwrap().replace("><", ">\n<")
}

#[test]
fn draw_given_ketone_2_methylcyclohexanone() {
    insta::assert_snapshot!(draw("CC1CCCCC1=O"));
}

#[test]
fn draw_given_dicarbonyl_ethyl_acetoacetate() {
    insta::assert_snapshot!(draw("CCOC(=O)CC(C)=O"));
}

#[test]
fn draw_given_fused_aromatic_naphthalene() {
    insta::assert_snapshot!(draw("c1ccc2ccccc2c1"));
}

#[test]
fn draw_given_steroid_testosterone() {
    insta::assert_snapshot!(draw(
        "C[C@]12CC[C@H]3[C@@H](CCC4=CC(=O)CC[C@@]34C)[C@@H]1CC[C@@H]2O"
    ));
}

#[test]
fn draw_given_macrocycle_14_membered_lactone() {
    insta::assert_snapshot!(draw("O=C1CCCCCCCCCCCCO1"));
}

#[test]
fn draw_given_salt_sodium_phenylacetate() {
    insta::assert_snapshot!(draw("[O-]C(=O)Cc1ccccc1.[Na+]"));
}

#[test]
fn draw_given_ammonium_chloride_salt() {
    insta::assert_snapshot!(draw("[Cl-].COC(=O)CC1CC[NH2+]CC1"));
}

#[test]
fn draw_given_stereo_centre_ibuprofen() {
    insta::assert_snapshot!(draw("C[C@H](C(=O)O)c1ccc(CC(C)C)cc1"));
}

#[test]
fn draw_given_two_stereocentres_and_e_double_bond_issue12() {
    // (E)-alkene next to two centres: one wedge or hash per centre and the
    // methyl and the centre on opposite sides of the double bond.
    insta::assert_snapshot!(draw("C/C=C/[C@@H](O)[C@H](C)N"));
}
