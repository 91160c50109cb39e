"""Case fields by dotted path: read, replace, the pump speed factor, refusals."""

from __future__ import annotations

import dataclasses

import pytest

from service.core.errors import InvalidInputError
from service.core.simulation import (
    Chamber,
    Condenser,
    HeatGainRate,
    Product,
    ProductInterior,
    Pump,
    VacuumChamberCase,
)
from service.core.simulation.case_fields import CASE_FIELDS, case_field_value, with_case_field

CASE = VacuumChamberCase(
    chamber=Chamber(free_volume=2.0, initial_pressure=1.0e5, temperature=293.15, leak_rate=0.1),
    pump=Pump(
        nominal_speed=0.05,
        speed_curve_pressures=(100.0, 1.0e5),
        speed_curve_speeds=(0.02, 0.06),
    ),
    product=Product(mass=10.0, initial_temperature=300.0),
    end_time=600.0,
)


def test_every_scalar_field_of_the_case_is_listed() -> None:
    # The table must follow the dataclasses: every float field of each part has a row.
    parts = {
        "chamber": Chamber,
        "pump": Pump,
        "condenser": Condenser,
        "product": Product,
        "heat_gain": HeatGainRate,
        "product.interior": ProductInterior,
    }
    expected = {
        f"{head}.{field.name}"
        for head, cls in parts.items()
        for field in dataclasses.fields(cls)
        if field.type in ("float", "float | None")
    } | {"end_time", "target_temperature", "pump.speed_scale"}
    assert set(CASE_FIELDS) == expected


def test_read_and_replace_round_trip() -> None:
    changed = with_case_field(CASE, "chamber.leak_rate", 0.7)
    assert case_field_value(changed, "chamber.leak_rate") == 0.7
    assert case_field_value(CASE, "chamber.leak_rate") == 0.1  # the original is untouched
    assert with_case_field(CASE, "end_time", 60.0).end_time == 60.0


def test_speed_scale_multiplies_the_whole_pump_curve() -> None:
    scaled = with_case_field(CASE, "pump.speed_scale", 2.0)
    assert scaled.pump.nominal_speed == pytest.approx(0.1)
    assert scaled.pump.speed_curve_speeds == pytest.approx((0.04, 0.12))
    assert scaled.pump.speed_curve_pressures == CASE.pump.speed_curve_pressures
    assert case_field_value(CASE, "pump.speed_scale") == 1.0


def test_unset_parents() -> None:
    assert case_field_value(CASE, "condenser.vapor_conductance") is None
    assert case_field_value(CASE, "target_temperature") is None
    gained = with_case_field(CASE, "heat_gain.power", 150.0)
    assert gained.heat_gain == HeatGainRate(power=150.0)
    with pytest.raises(InvalidInputError, match="no condenser"):
        with_case_field(CASE, "condenser.vapor_conductance", 1.0)


def test_unknown_path_lists_the_known_ones() -> None:
    with pytest.raises(InvalidInputError, match=r"known fields: chamber\.free_volume"):
        case_field_value(CASE, "pump.colour")
    with pytest.raises(InvalidInputError):
        with_case_field(CASE, "product.solute", 1.0)


def test_nested_interior_fields_read_and_replace() -> None:
    assert case_field_value(CASE, "product.interior.pore_venting_time") is None
    with pytest.raises(InvalidInputError, match=r"no product\.interior"):
        with_case_field(CASE, "product.interior.density", 500.0)
    porous = dataclasses.replace(
        CASE,
        product=dataclasses.replace(
            CASE.product, interior=ProductInterior("sphere", 0.05, 0.4, 450.0)
        ),
    )
    vented = with_case_field(porous, "product.interior.pore_venting_time", 12.0)
    assert case_field_value(vented, "product.interior.pore_venting_time") == 12.0
    assert vented.product.interior == ProductInterior("sphere", 0.05, 0.4, 450.0, 20, "core", 12.0)
    assert vented.product.mass == CASE.product.mass
