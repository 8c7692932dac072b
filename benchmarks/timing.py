"""Timing helper shared by the benchmark scripts (run them as ``python benchmarks/bench_*.py``)."""
from __future__ import annotations

import time


def best_of(fn, repeat: int = 5) -> float:
    """Shortest wall time of ``repeat`` calls of ``fn`` [s]: the least disturbed measurement."""
    times = []
    for _ in range(repeat):
        start = time.perf_counter()
        fn()
        times.append(time.perf_counter() - start)
    return min(times)
