"""draw, the Jupyter representations, bases() and rules()."""

import json
import pickle
import re

import pytest

import acidsite


def test_draw_given_ketone_equals_cli_svg(cli):
    svg = acidsite.draw("CC1CCCCC1=O")
    assert svg.startswith("<svg") and svg.rstrip().endswith("</svg>")
    # Every atom of the 8-atom SMILES is a <g data-atom=...>, 0-based.
    atoms = sorted(int(a) for a in re.findall(r'data-atom="(\d+)"', svg))
    assert atoms == list(range(8))
    assert svg.strip() == cli("draw", "CC1CCCCC1=O").stdout.strip()
    assert acidsite.draw("CCOC(=O)CC(C)=O", base="NaOEt").strip() == (
        cli("draw", "CCOC(=O)CC(C)=O", "--base", "NaOEt").stdout.strip()
    )


def test_draw_given_bad_smiles_raises_value_error():
    with pytest.raises(ValueError, match=r"syntax.*at character 5"):
        acidsite.draw("CC(=O")
    with pytest.raises(ValueError, match="bond_px"):
        acidsite.draw("CCO", bond_px=0)


def test_record_given_jupyter_shows_drawing():
    rec = acidsite.scan("CC1CCCCC1=O")
    assert "data-atom" in rec._repr_svg_()
    html = rec._repr_html_()
    assert "<svg" in html and "ketone" in html
    bad = acidsite.scan("CC(=O")
    assert bad._repr_svg_() is None
    assert "syntax" in bad._repr_html_()


def test_record_given_json_and_pickle_round_trips():
    rec = acidsite.scan("CC1CCCCC1=O", control="kinetic")
    assert json.loads(json.dumps(rec)) == rec
    back = pickle.loads(pickle.dumps(rec))
    assert back == rec and isinstance(back, acidsite.Record)
    assert back.svg() == rec.svg()


def test_bases_given_catalogue_equals_cli_json(cli):
    want = [json.loads(l) for l in cli("bases", "--json").stdout.splitlines()]
    got = acidsite.bases()
    assert got == want
    lda = next(b for b in got if b["name"] == "LDA")
    # LDA's conjugate acid (diisopropylamine) is near 36 in THF/DMSO (common practice).
    assert 30 < lda["pka_dmso"]["value"] < 45


def test_rules_given_rule_set_equals_cli_json(cli):
    want = [json.loads(l) for l in cli("rules", "--json").stdout.splitlines()]
    got = acidsite.rules()
    assert got == want
    assert {r["kind"] for r in got} == {"rule", "increment"}
    assert all(r["rule_set"] == acidsite.rule_set_version for r in got)


def test_reactions_given_cli_help_lists_the_same_names(cli):
    help_text = " ".join(cli("scan", "--help").stdout.split())
    for name in acidsite.REACTIONS:
        assert name in help_text
    assert acidsite.CONTROLS == ("kinetic", "thermodynamic")
