"""Throughput of saturation states: tripoint's fast path against other libraries.

Run ``python bench/bench_saturation.py``. One saturation state is the full set of
saturated-liquid and saturated-vapor properties at one temperature: pressure, both
densities, enthalpies, internal energies, entropies and isobaric heat capacities.

Compared, on the same 10,000 temperatures between the triple and the critical
point, in one run:

- tripoint ``saturation_by_temperature`` (IAPWS-95 tables), whole array per call;
- tripoint ``saturation_by_temperature(formulation="IAPWS-IF97")``;
- CoolProp ``PropsSI`` with numpy arrays (IAPWS-95 via its Helmholtz backend), one
  vectorized call per output property;
- iapws ``IAPWS95`` and ``IAPWS97`` classes, one object per point (timed on a
  subsample and scaled to 10,000 points).

States per second are wall-clock over the best of a few repeats (single process).
"""

from __future__ import annotations

import time
import warnings
from collections.abc import Callable

import numpy as np

from service.core.properties.phase import FloatArray
from service.core.properties.saturation import saturation_by_temperature

POINTS = 10_000


def _best_time(function: Callable[[], object], repeats: int) -> float:
    best = float("inf")
    for _ in range(repeats):
        start = time.perf_counter()
        function()
        best = min(best, time.perf_counter() - start)
    return best


def _tripoint(temperature: FloatArray) -> float:
    saturation_by_temperature(temperature[:10])  # build the tables outside the timing
    return _best_time(lambda: saturation_by_temperature(temperature), repeats=20)


def _tripoint_if97(temperature: FloatArray) -> float:
    limited = np.clip(temperature, 273.15, 623.15)
    return _best_time(
        lambda: saturation_by_temperature(limited, formulation="IAPWS-IF97"), repeats=10
    )


def _coolprop(temperature: FloatArray) -> float | None:
    try:
        from CoolProp.CoolProp import PropsSI
    except ImportError:
        return None
    inside = np.minimum(temperature, 647.09)  # CoolProp's two-phase calls stop short of T_c

    def run() -> None:
        PropsSI("P", "T", inside, "Q", 0.0, "Water")
        for quality in (0.0, 1.0):
            for output in ("D", "H", "U", "S", "C"):
                PropsSI(output, "T", inside, "Q", quality, "Water")

    return _best_time(run, repeats=3)


def _iapws_per_point(temperature: FloatArray, which: str, sample: int) -> float | None:
    try:
        import iapws
    except ImportError:
        return None
    subset = temperature[:: max(1, temperature.size // sample)][:sample]
    if which == "IAPWS97":
        subset = np.clip(subset, 273.15, 623.15)

    def run() -> None:
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            for value in subset:
                if which == "IAPWS95":
                    iapws.IAPWS95(T=float(value), x=0.5)
                else:
                    iapws.IAPWS97(T=float(value), x=0.0)
                    iapws.IAPWS97(T=float(value), x=1.0)

    return _best_time(run, repeats=1) * POINTS / subset.size


def main() -> None:
    rng = np.random.default_rng(20240601)
    temperature = np.sort(rng.uniform(273.16, 647.096, POINTS))
    start = time.perf_counter()
    rows: list[tuple[str, float | None]] = [
        ("tripoint IAPWS-95 (tables), vectorized", _tripoint(temperature)),
        ("tripoint IAPWS-IF97, vectorized", _tripoint_if97(temperature)),
        ("CoolProp PropsSI, numpy arrays (11 calls)", _coolprop(temperature)),
        (
            "iapws IAPWS95, per point (100 pts, scaled)",
            _iapws_per_point(temperature, "IAPWS95", 100),
        ),
        (
            "iapws IAPWS97, per point (500 pts, scaled)",
            _iapws_per_point(temperature, "IAPWS97", 500),
        ),
    ]
    reference = rows[0][1]
    assert reference is not None
    print(f"Saturation states for {POINTS:,} temperatures, 273.16-647.096 K")
    print(f"{'method':<46} {'time for 10k [s]':>16} {'states/s':>12} {'tripoint is x faster':>21}")
    for name, seconds in rows:
        if seconds is None:
            print(f"{name:<46} {'not installed':>16}")
            continue
        print(f"{name:<46} {seconds:>16.4g} {POINTS / seconds:>12.3g} {seconds / reference:>21.3g}")
    print(f"(whole run {time.perf_counter() - start:.1f} s)")


if __name__ == "__main__":
    main()
