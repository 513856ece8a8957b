"""acidsite.annotate_frame against `acidsite annotate --format csv`."""

import io

import pytest

import acidsite
from conftest import real_smiles

pd = pytest.importorskip("pandas")


def sample_frame(n=1500):
    pairs = real_smiles()[:n]
    df = pd.DataFrame(
        {
            "name": [i for _, i in pairs],
            "batch": [k % 7 for k in range(len(pairs))],
            "smiles": [s for s, _ in pairs],
        }
    )
    # An index that is not 0..n-1, to see it kept.
    df.index = pd.Index([f"row{k * 3}" for k in range(len(df))], name="key")
    return df


def cli_frame(cli, tmp_path, df, *args):
    path = tmp_path / "in.csv"
    df.to_csv(path, index=False)
    out = cli("annotate", path, "--format", "csv", "--quiet", *args).stdout
    return acidsite.read_csv_output(io.StringIO(out))


@pytest.mark.parametrize("per_site", [False, True])
def test_annotate_frame_given_corpus_equals_cli_csv(cli, tmp_path, per_site):
    df = sample_frame()
    args = ["--per-site"] if per_site else []
    want = cli_frame(cli, tmp_path, df, *args)
    got = acidsite.annotate_frame(df, per_site=per_site)
    assert list(got.columns) == list(want.columns)
    # The command line counts file lines (the header is line 1); the frame
    # counts rows.
    assert (got["line"].to_numpy() + 1 == want["line"].to_numpy()).all()
    # Carried columns come back as text from the CSV and keep their dtype here.
    want["batch"] = want["batch"].astype("int64")
    cols = [c for c in got.columns if c != "line"]
    pd.testing.assert_frame_equal(
        got[cols].reset_index(drop=True), want[cols].reset_index(drop=True), check_dtype=True
    )


def test_annotate_frame_given_failures_keeps_index_and_row_count():
    df = sample_frame(300)
    df.iloc[5, df.columns.get_loc("smiles")] = "CC(="
    df.iloc[9, df.columns.get_loc("smiles")] = None
    got = acidsite.annotate_frame(df)
    assert len(got) == len(df)
    assert list(got.index) == list(df.index)
    assert got.index.name == "key"
    assert not got["ok"].iloc[5] and got["error"].iloc[5].startswith("syntax")
    assert not got["ok"].iloc[9]
    per_site = acidsite.annotate_frame(df, per_site=True)
    # Every input row appears, in order, once or once per site.
    assert list(dict.fromkeys(per_site.index)) == list(df.index)


def test_annotate_frame_given_header_equals_cli_header(cli, tmp_path):
    path = tmp_path / "x.smi"
    path.write_text("CCO\n")
    for args, per_site in [([], False), (["--per-site"], True)]:
        header = cli("annotate", path, "--format", "csv", "--quiet", *args).stdout.splitlines()[0]
        assert [c for c, _ in acidsite.frame_columns(per_site)] == header.split(",")
        got = acidsite.annotate_frame(pd.DataFrame({"smiles": ["CCO"]}), per_site=per_site)
        assert list(got.columns) == header.split(",")


def test_annotate_frame_given_with_record_equals_annotate():
    df = sample_frame(200)
    got = acidsite.annotate_frame(df, with_record=True, threads=2)
    recs = list(acidsite.annotate(df["smiles"], ids=df["name"], as_json=True))
    assert got["record"].tolist() == recs


def test_annotate_frame_given_bad_arguments_raises():
    df = pd.DataFrame({"smi": ["CCO"]})
    with pytest.raises(ValueError, match="no column 'smiles'"):
        acidsite.annotate_frame(df)
    with pytest.raises(ValueError, match="no column 'nope'"):
        acidsite.annotate_frame(df, smiles_column="smi", id_column="nope")
    with pytest.raises(TypeError):
        acidsite.annotate_frame([["CCO"]])
    with pytest.raises(ValueError, match="reaction"):
        acidsite.annotate_frame(df, smiles_column="smi", reaction="pyrolysis")
