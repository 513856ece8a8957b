"""acidsite.scan against `acidsite scan --json`: the same record, key for key."""

import json

import pytest

import acidsite
from conftest import real_smiles


def cli_scan_records(cli, smiles, *opts):
    p = cli("scan", "--json", *opts, *smiles)
    return [json.loads(l) for l in p.stdout.splitlines()]


def test_scan_given_corpus_sample_equals_cli_records(cli):
    # 600 real molecules (MOSES, Tox21, HIV; corpus/bulk/README.md), every
    # eighth line, failures included.
    sample = [s for s, _ in real_smiles()][::8]
    assert len(sample) == 625
    expected = cli_scan_records(cli, sample)
    assert len(expected) == len(sample)
    for i, (smi, want) in enumerate(zip(sample, expected)):
        got = acidsite.scan(smi)
        # `scan --json` numbers its arguments; one call is line 1.
        want["line"] = 1
        assert got == want, smi
        assert json.dumps(got, sort_keys=True) == json.dumps(want, sort_keys=True)


@pytest.mark.parametrize(
    "smiles,kwargs,args",
    [
        ("CC1CCCCC1=O", dict(control="kinetic"), ["--control", "kinetic"]),
        ("CC1CCCCC1=O", dict(control="thermodynamic", reaction="alkylation"),
         ["--control", "thermodynamic", "--reaction", "alkylation"]),
        ("CCOC(=O)CC(=O)OCC", dict(base="NaOEt"), ["--base", "NaOEt"]),
        ("CCOC(=O)CC(=O)OCC", dict(reaction="acylation"), ["--reaction", "acylation"]),
        ("OCCC(=O)C", dict(site=0, scale="water"), ["--site", "0", "--scale", "water"]),
        ("CC(=O)c1ccccc1", dict(reaction="aldol"), ["--reaction", "aldol"]),
        ("OCCNC(=O)Cc1ccccc1", dict(flags={"free_OH": "[OX2H][CX4]"}), ["--flag", "free_OH=[OX2H][CX4]"]),
    ],
)
def test_scan_given_options_equals_cli_record(cli, smiles, kwargs, args):
    (want,) = cli_scan_records(cli, [smiles], *args)
    assert acidsite.scan(smiles, **kwargs) == want


def test_scan_given_bad_smiles_gives_error_record():
    rec = acidsite.scan("CC(=O")
    assert rec["ok"] is False
    assert rec["schema"] == acidsite.SCHEMA
    assert rec["error"]["kind"] == "syntax"
    # The branch opened at character 2 is never closed: the input ends at 5.
    assert rec["error"]["position"] == 5
    assert "sites" not in rec
    for bad in ["", "C1CC", "[Xx]", "C" * 200_000, "CC\x00C"]:
        r = acidsite.scan(bad)
        assert r["ok"] is False and r["error"]["message"], bad


@pytest.mark.parametrize(
    "kwargs,exc,words",
    [
        (dict(base="NoSuchBase"), ValueError, "no base named"),
        (dict(scale="thf"), ValueError, "scale must be"),
        (dict(reaction="ozonolysis"), ValueError, "alkylation"),
        (dict(control="fast"), ValueError, "kinetic"),
        (dict(site=-1), ValueError, "0-based atom index"),
        (dict(site="3"), TypeError, "site must be an int"),
        (dict(flags=["no_equals_sign"]), ValueError, "NAME=SMARTS"),
        (dict(flags={"x": "[C"}), ValueError, "flag pattern"),
    ],
)
def test_scan_given_bad_argument_raises_clear_error(kwargs, exc, words):
    with pytest.raises(exc) as e:
        acidsite.scan("CCO", **kwargs)
    assert words in str(e.value)


def test_scan_given_not_a_string_raises_type_error():
    with pytest.raises(TypeError):
        acidsite.scan(42)


def test_scan_given_site_outside_molecule_raises_as_cli_refuses(cli):
    # The command line refuses `--site 99` for a 3-atom molecule (exit 2);
    # scan raises with the same words.
    p = cli("scan", "--json", "--site", "99", "CCO", check_codes=(2,))
    assert "has 3 atoms" in p.stderr
    with pytest.raises(ValueError, match="has 3 atoms"):
        acidsite.scan("CCO", site=99)
    # A SMILES that does not read still gives its error record.
    assert acidsite.scan("CC(", site=99)["ok"] is False


def test_version_given_cli_equals_package_version(cli):
    out = cli("--version").stdout.split()
    assert out[-1] == acidsite.__version__
    rec = acidsite.scan("CC(C)=O")
    assert rec["rule_set"] == acidsite.rule_set_version
