"""The same estimate_frame as a map over partitions on a dask.distributed LocalCluster
(2 worker processes, a Parquet data set in 6 partitions) equals the single-process run row for row."""

import polars as pl
import pytest

import ebullio
from conftest import ROOT

dd = pytest.importorskip("dask.dataframe")
distributed = pytest.importorskip("dask.distributed")
pytest.importorskip("pyarrow")


def structures(n: int) -> pl.DataFrame:
    """n rows cycling through the dev set's SMILES plus two unreadable ones (rows must fail alone)."""
    dev = pl.read_csv(ROOT / "reference-data" / "normal-boiling-points-dev.csv")
    smiles = dev["smiles"].to_list() + ["C1CC1(", ""]
    return pl.DataFrame({"id": list(range(n)), "smiles": [smiles[i % len(smiles)] for i in range(n)]})


def test_dask_map_partitions_equals_single_process(tmp_path):
    data = structures(3000)
    folder = tmp_path / "structures"
    folder.mkdir()
    for k in range(6):  # six partitions, one file each
        data.slice(k * 500, 500).write_parquet(folder / f"part-{k}.parquet")
    single = ebullio.estimate_frame(pl.read_parquet(folder / "*.parquet"), at="20 mbar")

    with distributed.LocalCluster(n_workers=2, threads_per_worker=1, processes=True,
                                  dashboard_address=None) as cluster, distributed.Client(cluster) as client:
        assert len(client.scheduler_info()["workers"]) == 2
        ddf = dd.read_parquet(str(folder))
        assert ddf.npartitions >= 4
        meta = ebullio.estimate_frame(ddf._meta, at="20 mbar")
        out = ddf.map_partitions(ebullio.estimate_frame, at="20 mbar", meta=meta).compute()
        # Which processes did the work: more than one.
        pids = client.run(lambda: __import__("os").getpid())
        assert len(set(pids.values())) == 2

    got = pl.from_pandas(out.reset_index(drop=True)).sort("id")
    want = single.sort("id")
    assert got.columns == want.columns
    # Row for row, value for value (floats bit for bit; pandas' null string comes back as None).
    for c in want.columns:
        assert got[c].to_list() == want[c].to_list(), c
