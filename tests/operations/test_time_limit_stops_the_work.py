"""At the time limit the computation itself stops, not only its answer.

The core's loops check the deadline the route sets (service.core.deadline); a sweep
abandoned at the limit ends within one case, its worker thread is free again, and the
service answers the next small request at once. The seconds here are wide upper bounds of
a correctness check (the stop is one loop step, milliseconds), not speed goals.
"""

from __future__ import annotations

import time
from pathlib import Path

import pytest
from fastapi.testclient import TestClient

from service.api.app import create_app
from service.core.deadline import DeadlineExceededError, check_deadline, computation_deadline
from service.settings import Settings

_SWEEP = {
    "initial_temperature": {
        "values": [280.0 + 0.05 * step for step in range(1000)],
        "unit": "K",
        "uncertainty": 0.5,
    },
    "water_mass": "1 kg",
    "final_ice_temperature": "-20 degC",
}


def test_a_sweep_past_the_limit_stops_and_the_service_answers_within_a_second(
    tmp_path: Path,
) -> None:
    app = create_app(
        Settings(database_url=f"sqlite:///{tmp_path / 'records.db'}", max_request_seconds=0.3)
    )
    with TestClient(app) as client:
        refused = client.post("/v1/balances/flash-freeze", json=_SWEEP)
        assert refused.status_code == 503
        assert refused.headers["content-type"].startswith("application/problem+json")
        stopped_by = time.monotonic() + 1.0
        while app.state.pending_computations and time.monotonic() < stopped_by:
            time.sleep(0.01)
        assert not app.state.pending_computations, "the abandoned sweep is still running"
        started = time.monotonic()
        small = client.post("/v1/balances/flash-freeze", json={"initial_temperature": 293.15})
        assert small.status_code == 200
        assert time.monotonic() - started < 1.0
        # Nothing was stored for the refused sweep.
        kinds = [item["kind"] for item in client.get("/v1/calculations").json()["items"]]
        assert kinds == ["balances.flash_freeze"]


def test_deadline_check_raises_only_after_the_deadline() -> None:
    check_deadline()  # no deadline set: nothing happens
    with computation_deadline(60.0):
        check_deadline()
    with computation_deadline(0.0), pytest.raises(DeadlineExceededError, match="0 s"):
        time.sleep(0.001)
        check_deadline()
    check_deadline()  # the previous (no) deadline is back


def test_a_lost_worker_is_a_503_to_retry(
    client: TestClient, monkeypatch: pytest.MonkeyPatch
) -> None:
    # A worker of the simulation pool killed mid-sweep (e.g. out of memory): the caller is
    # told to retry (RFC 9110 15.6.4 503 with Retry-After), not handed a 500.
    from service.api.simulations import router
    from service.core.errors import WorkerLostError

    def lost(*_: object) -> None:
        raise WorkerLostError("simulation sweep")

    monkeypatch.setattr(router, "simulate_vacuum_chambers", lost)
    body = {
        "chamber": {"free_volume": "1 m3"},
        "pump": {"nominal_speed": "200 m3/h"},
        "product": {"mass": "10 kg", "initial_temperature": "20 degC"},
        "end_time": "10 min",
    }
    response = client.post("/v1/simulations/vacuum-chamber", json=body)
    assert response.status_code == 503, response.text
    assert response.headers["retry-after"] == "1"
    assert response.headers["content-type"].startswith("application/problem+json")
    assert response.json()["type"].endswith(":worker-lost")
