//! Base catalogue: embedded data loads, and bad rows give typed errors with
//! file and line (issue 5).

use acidsite::advice::{catalogue, Catalogue, Hazard, Nucleophilicity, Scale};

const SOURCES: &str = "key\treference\nfrom-memory\tx\nbordwell1988\ty\n";

fn header() -> String {
    "# version: 9\nname\tfull_name\tfamily\tconjugate_acid\tpka_dmso\tsrc_dmso\tpka_water\tsrc_water\tpka_thf\tsrc_thf\tcounter_ion\tnucleophilic\thindered\tsolvents\ttemp_min_c\ttemp_max_c\tacid_solvent\thazards\tnotes\trarity\n".to_string()
}

const GOOD_ROW: &str = "NaOEt\tsodium ethoxide\talkoxide\tCCO\t29.8\tbordwell1988\t15.9\tfrom-memory\t-\t-\tNa\tweak\tno\tEtOH\t0\t78\tEtOH@17.1\tcorrosive\t-\t0";

#[test]
fn catalogue_given_embedded_file_loads_at_least_25_bases() {
    let cat = catalogue().expect("embedded catalogue must validate");
    assert!(cat.bases.len() >= 25, "{} bases", cat.bases.len());
    // The issue names these explicitly.
    for name in [
        "LDA",
        "LiTMP",
        "LiHMDS",
        "NaHMDS",
        "KHMDS",
        "n-BuLi",
        "s-BuLi",
        "t-BuLi",
        "NaH",
        "KH",
        "NaNH2",
        "KOtBu",
        "NaOEt",
        "NaOMe",
        "NaOH",
        "KOH",
        "LiOH",
        "K2CO3",
        "Cs2CO3",
        "DBU",
        "Et3N",
        "DIPEA",
        "pyridine",
        "DMAP",
        "piperidine",
        "NaOAc",
        "P4-tBu",
    ] {
        assert!(cat.get(name).is_some(), "missing {name}");
    }
    assert_eq!(cat.version, "2");
}

#[test]
fn catalogue_given_values_every_pka_has_a_known_source() {
    let cat = catalogue().unwrap();
    for b in &cat.bases {
        for sc in [Scale::Dmso, Scale::Water, Scale::Thf] {
            if let Some(src) = b.pka_source(sc) {
                assert!(cat.reference(src).is_some(), "{}: {src}", b.name);
            }
        }
    }
}

#[test]
fn catalogue_given_known_entries_has_expected_properties() {
    let cat = catalogue().unwrap();
    // Bordwell 1988 Acc. Chem. Res. 21, 456: EtOH 29.8, t-BuOH 32.2 in DMSO.
    assert_eq!(cat.get("NaOEt").unwrap().pka(Scale::Dmso), Some(29.8));
    assert_eq!(cat.get("KOtBu").unwrap().pka(Scale::Dmso), Some(32.2));
    // Diisopropylamine 36 in THF (common practice).
    assert_eq!(cat.get("lda").unwrap().pka(Scale::Thf), Some(36.0));
    let nbuli = cat.get("nBuLi").unwrap();
    assert!(nbuli.has_hazard(Hazard::Pyrophoric));
    assert_eq!(nbuli.nucleophilic, Nucleophilicity::Yes);
    let naoet = cat.get("NaOEt").unwrap();
    let p = naoet.acid_solvent.as_ref().unwrap();
    assert_eq!(p.name, "EtOH");
    // 0.789 g/mL / 46.07 g/mol = 17.1 M (density from memory).
    assert!((p.molar - 17.1).abs() < 0.05);
    assert!(cat
        .get("NaH")
        .unwrap()
        .has_hazard(Hazard::HydrogenEvolution));
}

#[test]
fn parse_given_good_row_accepts_it() {
    let text = header() + GOOD_ROW + "\n";
    let cat = Catalogue::parse(&text, "t.tsv", SOURCES).unwrap();
    assert_eq!(cat.bases.len(), 1);
    assert_eq!(cat.bases[0].line, 3);
}

#[test]
fn parse_given_bad_number_reports_file_line_and_column() {
    let text = header() + &GOOD_ROW.replace("29.8", "2x9") + "\n";
    let e = Catalogue::parse(&text, "t.tsv", SOURCES).unwrap_err();
    assert_eq!((e.file.as_str(), e.line), ("t.tsv", 3));
    assert_eq!(e.column.as_deref(), Some("pka_dmso"));
    assert!(e.to_string().contains("t.tsv line 3"));
}

#[test]
fn parse_given_unknown_source_key_is_an_error() {
    let text = header() + &GOOD_ROW.replace("bordwell1988", "nobody-2020") + "\n";
    let e = Catalogue::parse(&text, "t.tsv", SOURCES).unwrap_err();
    assert_eq!(e.column.as_deref(), Some("src_dmso"));
}

#[test]
fn parse_given_wrong_cell_count_or_enum_is_an_error() {
    let short = header() + "NaOEt\tsodium ethoxide\n";
    assert_eq!(
        Catalogue::parse(&short, "t.tsv", SOURCES).unwrap_err().line,
        3
    );
    let bad = header() + &GOOD_ROW.replace("\tweak\t", "\tmaybe\t") + "\n";
    assert_eq!(
        Catalogue::parse(&bad, "t.tsv", SOURCES)
            .unwrap_err()
            .column
            .as_deref(),
        Some("nucleophilic")
    );
    let smi = header() + &GOOD_ROW.replace("\tCCO\t", "\tC(C\t") + "\n";
    assert_eq!(
        Catalogue::parse(&smi, "t.tsv", SOURCES)
            .unwrap_err()
            .column
            .as_deref(),
        Some("conjugate_acid")
    );
    let hz = header() + &GOOD_ROW.replace("corrosive", "spicy") + "\n";
    assert_eq!(
        Catalogue::parse(&hz, "t.tsv", SOURCES)
            .unwrap_err()
            .column
            .as_deref(),
        Some("hazards")
    );
    let dup = header() + GOOD_ROW + "\n" + GOOD_ROW + "\n";
    assert_eq!(
        Catalogue::parse(&dup, "t.tsv", SOURCES).unwrap_err().line,
        4
    );
}

#[test]
fn parse_given_missing_version_or_header_is_an_error() {
    let no_version = header().replace("# version: 9\n", "") + GOOD_ROW + "\n";
    assert!(Catalogue::parse(&no_version, "t.tsv", SOURCES).is_err());
    let bad_header = "# version: 1\nname\tfull\n".to_string() + GOOD_ROW + "\n";
    assert_eq!(
        Catalogue::parse(&bad_header, "t.tsv", SOURCES)
            .unwrap_err()
            .line,
        2
    );
}

#[test]
fn catalogue_given_iupac_water_values_agrees_with_the_corpus_subset() {
    // corpus/advice/base_water_iupac.tsv: medians of the IUPAC Digitized pKa
    // Dataset v1.0 rows at 25 C (Perrin; Serjeant & Dempsey).
    let text = include_str!("../corpus/advice/base_water_iupac.tsv");
    let cat = catalogue().unwrap();
    let mut checked = 0;
    for line in text.lines().filter(|l| !l.starts_with('#')).skip(1) {
        let cells: Vec<&str> = line.split('\t').collect();
        let (name, median): (&str, f64) = (cells[0], cells[1].parse().unwrap());
        let base = cat.get(name).unwrap();
        let water = base.pka_water.as_ref().unwrap();
        assert!(
            water.source.starts_with("iupac-"),
            "{name}: {}",
            water.source
        );
        assert!(
            (water.value - median).abs() <= 0.05,
            "{name}: {} vs {median}",
            water.value
        );
        checked += 1;
    }
    assert_eq!(checked, 9);
}

#[test]
fn parse_given_rarity_reads_it_and_refuses_a_bad_value() {
    // The ranking penalty of a reagent lives in the data (column `rarity`):
    // everyday LDA 0, a phosphazene superbase 2.5 (common practice).
    let cat = catalogue().unwrap();
    assert_eq!(cat.get("LDA").unwrap().rarity, 0.0);
    assert_eq!(cat.get("P4-tBu").unwrap().rarity, 2.5);
    let bad = header() + &GOOD_ROW.replace("\t-\t0", "\t-\tlots") + "\n";
    let e = Catalogue::parse(&bad, "t.tsv", SOURCES).unwrap_err();
    assert_eq!(e.column.as_deref(), Some("rarity"));
}
