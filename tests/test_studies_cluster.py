"""A sweep through a Dask distributed cluster gives the numbers of a serial sweep.

The test starts a real LocalCluster (a scheduler and two workers with their own task
queues, talking over Dask's in-process transport) and closes it after. The workers
are threads of this process: worker processes would each load the property library
again (several seconds each), and rating in worker processes is already checked with
the process pool in test_studies.py.
"""
from __future__ import annotations

from pathlib import Path

import distributed

import rating
from rating.studies import InlineExecutor, parse_variation, sweep
from rating.studies.execution import PER_WORKER, window_of

SAMPLES = Path(__file__).parent.parent / "samples"


def test_sweep_on_a_dask_cluster_equals_serial():
    case = rating.load_project(SAMPLES / "pentane-vaporiser.ebullio").case(
        "C5 vaporiser V-12 performance")
    lengths = parse_variation("tubes.length=1:4:20")
    serial = sweep(case, [lengths], executor=InlineExecutor())
    with distributed.LocalCluster(n_workers=2, threads_per_worker=1, processes=False,
                                  dashboard_address=":0") as cluster, \
            distributed.Client(cluster) as client:
        workers = list(client.scheduler_info()["workers"])
        assert len(workers) == 2
        # two single-thread workers: PER_WORKER points each in flight at a time
        assert window_of(client.get_executor()) == 2 * PER_WORKER
        with distributed.get_task_stream(client) as tasks:
            on_cluster = sweep(case, [lengths], executor=client.get_executor())
    ran = [t for t in tasks.data if t["key"].startswith("rate_one")]
    assert len(ran) == 20 and {t["worker"] for t in ran} <= set(workers)
    assert [p.inputs for p in on_cluster.points] == [p.inputs for p in serial.points]
    assert [p.result.summary for p in on_cluster.points] == \
        [p.result.summary for p in serial.points]
