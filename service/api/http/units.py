"""Unit handling at the edge of the service: parse inputs to SI, express outputs.

The core works in SI only (K, Pa, kg, J, s). This module turns what a client sends
(a number in the field's default unit, a string such as ``"25 degC"``, or an object
with ``value``/``values`` and ``unit``) into SI numpy arrays, and converts results
into the unit set the client asked for.

Temperatures with an offset (degC, degF) are handled deliberately: a *bare*
temperature unit is an absolute temperature; inside a compound unit
(``kJ/(kg*degC)``) it is a temperature *difference*. pint refuses ``25 * degC``
at default settings, so conversions are built once per unit string from pint
quantities created with ``Quantity(value, unit)`` and cached as (scale, offset).
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass
from enum import Enum, StrEnum
from functools import cache, lru_cache
from typing import Any, overload

import numpy as np
import pint

from service.core.errors import InvalidInputError
from service.core.properties.phase import FloatArray

__all__ = [
    "MAX_QUANTITY_TEXT_LENGTH",
    "MAX_UNIT_LENGTH",
    "QUANTITY_TEXT_PATTERN",
    "Dimension",
    "UnitSet",
    "convert_from_si",
    "convert_to_si",
    "number_to_si",
    "output_unit",
    "parse_quantity_text",
    "si_to_unit",
    "si_unit_label",
]


class Dimension(Enum):
    """Physical kinds of quantity the API exchanges, with their SI unit."""

    TEMPERATURE = ("K", "[temperature]", "absolute")
    TEMPERATURE_DIFFERENCE = ("K", "[temperature]", "difference")
    PRESSURE = ("Pa", "[mass] / [length] / [time] ** 2")
    DENSITY = ("kg/m**3", "[mass] / [length] ** 3")
    SPECIFIC_ENERGY = ("J/kg", "[length] ** 2 / [time] ** 2")
    SPECIFIC_ENTROPY = ("J/(kg*K)", "[length] ** 2 / [temperature] / [time] ** 2")
    MASS = ("kg", "[mass]")
    ENERGY = ("J", "[length] ** 2 * [mass] / [time] ** 2")
    POWER = ("W", "[length] ** 2 * [mass] / [time] ** 3")
    TIME = ("s", "[time]")
    VOLUME = ("m**3", "[length] ** 3")
    MASS_FLOW = ("kg/s", "[mass] / [time]")
    VOLUME_FLOW = ("m**3/s", "[length] ** 3 / [time]")
    AREA = ("m**2", "[length] ** 2")
    MOLAR_MASS = ("kg/mol", "[mass] / [substance]")
    LEAK_RATE = ("Pa*m**3/s", "[length] ** 2 * [mass] / [time] ** 3")
    THERMAL_CONDUCTANCE = ("W/K", "[length] ** 2 * [mass] / [temperature] / [time] ** 3")
    LENGTH = ("m", "[length]")
    RECIPROCAL_LENGTH = ("1/m", "1 / [length]")
    RECIPROCAL_PRESSURE = ("1/Pa", "[length] * [time] ** 2 / [mass]")
    THERMAL_CONDUCTIVITY = ("W/(m*K)", "[length] * [mass] / [temperature] / [time] ** 3")
    HEAT_TRANSFER_COEFFICIENT = ("W/(m**2*K)", "[mass] / [temperature] / [time] ** 3")
    HEAT_TRANSFER_COEFFICIENT_PER_PRESSURE = ("W/(m**2*K*Pa)", "[length] / [temperature] / [time]")
    FLOW_RESISTANCE = ("m**2*Pa*s/kg", "[length] / [time]")
    FLOW_RESISTANCE_PER_LENGTH = ("m*Pa*s/kg", "1 / [time]")
    DIMENSIONLESS = ("", "")

    @property
    def si_unit(self) -> str:
        """The pint spelling of the SI unit."""
        unit: str = self.value[0]
        return unit


class UnitSet(StrEnum):
    """Output unit sets a client can ask for."""

    SI = "SI"
    ENGINEERING = "engineering"
    US = "US"


_SI_LABEL: dict[Dimension, str] = {
    Dimension.TEMPERATURE: "K",
    Dimension.TEMPERATURE_DIFFERENCE: "K",
    Dimension.PRESSURE: "Pa",
    Dimension.DENSITY: "kg/m3",
    Dimension.SPECIFIC_ENERGY: "J/kg",
    Dimension.SPECIFIC_ENTROPY: "J/(kg*K)",
    Dimension.MASS: "kg",
    Dimension.ENERGY: "J",
    Dimension.POWER: "W",
    Dimension.TIME: "s",
    Dimension.VOLUME: "m3",
    Dimension.MASS_FLOW: "kg/s",
    Dimension.VOLUME_FLOW: "m3/s",
    Dimension.AREA: "m2",
    Dimension.MOLAR_MASS: "kg/mol",
    Dimension.LEAK_RATE: "Pa*m3/s",
    Dimension.THERMAL_CONDUCTANCE: "W/K",
    Dimension.LENGTH: "m",
    Dimension.RECIPROCAL_LENGTH: "1/m",
    Dimension.RECIPROCAL_PRESSURE: "1/Pa",
    Dimension.THERMAL_CONDUCTIVITY: "W/(m*K)",
    Dimension.HEAT_TRANSFER_COEFFICIENT: "W/(m2*K)",
    Dimension.HEAT_TRANSFER_COEFFICIENT_PER_PRESSURE: "W/(m2*K*Pa)",
    Dimension.FLOW_RESISTANCE: "m2*Pa*s/kg",
    Dimension.FLOW_RESISTANCE_PER_LENGTH: "m*Pa*s/kg",
    Dimension.DIMENSIONLESS: "1",
}
_KEPT_IN_SI = (
    Dimension.RECIPROCAL_LENGTH,
    Dimension.RECIPROCAL_PRESSURE,
    Dimension.THERMAL_CONDUCTIVITY,
    Dimension.HEAT_TRANSFER_COEFFICIENT,
    Dimension.HEAT_TRANSFER_COEFFICIENT_PER_PRESSURE,
    Dimension.FLOW_RESISTANCE,
    Dimension.FLOW_RESISTANCE_PER_LENGTH,
)
"""Transfer coefficients of the drying model: reported in SI in every unit set."""

_OUTPUT_UNITS: dict[UnitSet, dict[Dimension, str]] = {
    UnitSet.SI: _SI_LABEL,
    UnitSet.ENGINEERING: {
        **_SI_LABEL,
        Dimension.TEMPERATURE: "degC",
        Dimension.PRESSURE: "kPa",
        Dimension.SPECIFIC_ENERGY: "kJ/kg",
        Dimension.SPECIFIC_ENTROPY: "kJ/(kg*K)",
        Dimension.ENERGY: "kJ",
        Dimension.POWER: "kW",
        Dimension.MASS_FLOW: "kg/h",
        Dimension.VOLUME_FLOW: "m3/h",
        Dimension.LEAK_RATE: "mbar*L/s",
        Dimension.LENGTH: "mm",
    },
    UnitSet.US: {
        Dimension.TEMPERATURE: "degF",
        Dimension.TEMPERATURE_DIFFERENCE: "delta_degF",
        Dimension.PRESSURE: "psi",
        Dimension.DENSITY: "lb/ft3",
        Dimension.SPECIFIC_ENERGY: "Btu/lb",
        Dimension.SPECIFIC_ENTROPY: "Btu/(lb*degR)",
        Dimension.MASS: "lb",
        Dimension.ENERGY: "Btu",
        Dimension.POWER: "Btu/h",
        Dimension.TIME: "s",
        Dimension.VOLUME: "ft3",
        Dimension.MASS_FLOW: "lb/h",
        Dimension.VOLUME_FLOW: "ft3/min",
        Dimension.AREA: "ft2",
        Dimension.MOLAR_MASS: "kg/mol",
        Dimension.LEAK_RATE: "torr*L/s",
        Dimension.THERMAL_CONDUCTANCE: "Btu/(h*degF)",
        Dimension.LENGTH: "in",
        **{dimension: _SI_LABEL[dimension] for dimension in _KEPT_IN_SI},
        Dimension.DIMENSIONLESS: "1",
    },
}

_ABSOLUTE_TEMPERATURE_ALIASES = {
    "k": "kelvin",
    "kelvin": "kelvin",
    "degc": "degree_Celsius",
    "°c": "degree_Celsius",
    "celsius": "degree_Celsius",
    "degf": "degree_Fahrenheit",
    "°f": "degree_Fahrenheit",
    "fahrenheit": "degree_Fahrenheit",
    "degr": "degree_Rankine",
    "deg c": "degree_Celsius",
    "deg f": "degree_Fahrenheit",
    "ºc": "degree_Celsius",
    "ºf": "degree_Fahrenheit",
    "℃": "degree_Celsius",
    "℉": "degree_Fahrenheit",
    "°r": "degree_Rankine",
    "rankine": "degree_Rankine",
}

_NUMBER_WITH_UNIT = re.compile(
    r"^ *(?P<number>[-+]?(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)(?:[eE][-+]?[0-9]{1,3})?) *"
    r"(?P<unit>.*?) *\Z"
)
"""A quantity text: an ASCII decimal number (exponent of at most three digits), then
the unit; nothing else."""
_UNIT_CHARACTERS = "A-Za-z0-9µμ°º℃℉% *./^()_-"
_UNIT_TEXT = re.compile(rf"^[{_UNIT_CHARACTERS}]*\Z")
"""The characters a unit may hold (letters, digits, the degree and micro signs, percent,
and the operators ``* / ^ ( ) . _ -``). Refusing the rest (``#`` starts a comment for
pint, control and non-ASCII digit characters) keeps one text to one meaning."""
MAX_UNIT_LENGTH = 64
"""Longest unit text read (longer ones are refused before any parsing)."""
MAX_QUANTITY_TEXT_LENGTH = 96
"""Longest quantity text (number and unit) read."""
QUANTITY_TEXT_PATTERN = (
    r"^ *[-+]?(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)(?:[eE][-+]?[0-9]{1,3})? *"
    rf"(?:[{_UNIT_CHARACTERS.replace(' ', '')}][{_UNIT_CHARACTERS}]{{0,{MAX_UNIT_LENGTH - 1}}})?"
    r" *$"
)
"""The quantity texts read, as a pattern (ECMA 262 and Python alike) for the OpenAPI
document: a number, then at most one unit of the allowed characters. Whether the unit is
known, and of the field's dimension, only the parser says."""
_OFFSET_IN_COMPOUND = re.compile(r"(°C|°F|\bdegC\b|\bdegF\b|\bcelsius\b|\bfahrenheit\b)")
_BTU = re.compile(r"\b(?:Btu|BTU|btu)\b")
"""The International Table Btu (1055.05585 J), the one steam tables use."""
_COMPOUND_REPLACEMENTS = {
    "°C": "delta_degC",
    "°F": "delta_degF",
    "degC": "delta_degC",
    "degF": "delta_degF",
    "celsius": "delta_degC",
    "fahrenheit": "delta_degF",
}


@cache
def _registry() -> pint.UnitRegistry[float]:
    """Build the unit registry once per process, on first use."""
    registry: pint.UnitRegistry[float] = pint.UnitRegistry()
    registry.define("Torr = torr")  # the spelling of the trade; mTorr follows
    registry.define("psia = psi")
    # A micron of mercury (micrometre of mercury), the freeze-drying chamber's unit:
    # 1e-3 mmHg = 0.133322387415 Pa (1 mTorr is 0.133322368 Pa, 1.4e-7 apart).
    registry.define("micron_Hg = 1e-3 * millimeter_Hg")
    return registry


@dataclass(frozen=True)
class _Linear:
    """``si = value * scale + offset``."""

    scale: float
    offset: float


_PRESSURE_WORDS = {
    "torr": "torr",
    "mtorr": "millitorr",
    "millitorr": "millitorr",
    "micron": "micron_Hg",
    "microns": "micron_Hg",
    "micronhg": "micron_Hg",
    "µmhg": "micron_Hg",
    "μmhg": "micron_Hg",
    "umhg": "micron_Hg",
    "mbar": "millibar",
    "mbara": "millibar",
    "millibar": "millibar",
    "bara": "bar",
    "kpaa": "kPa",
    "psia": "psi",
}
"""Vacuum and absolute-pressure spellings, matched without regard to case (the README's
unit table lists them). ``mbar`` is never a megabar here."""
_PRESSURE_WORD = re.compile(
    r"(?<![A-Za-z_µμ])(" + "|".join(sorted(_PRESSURE_WORDS, key=len, reverse=True)) + r")"
    r"(?![A-Za-z_])",
    re.IGNORECASE,
)
_GAUGE = re.compile(
    r"(?<![A-Za-z_])(?:k?pag|m?barg|psig|inhgg|bar\s*\(g\)|psi\s*\(g\)|"
    r"(?:k?pa|m?bar|psi)\s+(?:g|gauge))(?![A-Za-z_])",
    re.IGNORECASE,
)
_TEMPERATURE_LETTERS = {
    "c": ("degC", "coulomb"),
    "f": ("degF", "farad"),
    "r": ("degR", "roentgen"),
}
_PRESSURE_DIMENSIONS = frozenset({"PRESSURE", "LEAK_RATE"})


def _refuse_common_mistakes(unit: str, dimension: Dimension) -> None:
    """Refuse, with what to write instead, units that are near misses."""
    kind = dimension.name
    if kind in _PRESSURE_DIMENSIONS and _GAUGE.search(unit):
        raise ValueError(
            f"{unit!r} is a gauge pressure; tripoint takes absolute pressures: add the "
            "local atmospheric pressure (101.325 kPa standard, or the local barometer "
            "reading) and send the result in an absolute unit, e.g. -0.95 barg is about "
            "0.063 bar"
        )
    if dimension is Dimension.TEMPERATURE and "delta" in unit.lower():
        raise ValueError(
            f"{unit!r} is a temperature difference; this field is a temperature: write "
            "degC, degF or K"
        )
    letter = _TEMPERATURE_LETTERS.get(unit.strip().lower())
    if kind.startswith("TEMPERATURE") and letter is not None:
        spelling, reading = letter
        raise ValueError(
            f"{unit!r} is not a temperature unit (it reads as {reading}): write {spelling}"
        )


def _pint_spelling(unit: str, dimension: Dimension) -> str:
    text = unit.strip()
    if dimension.name in _PRESSURE_DIMENSIONS:
        text = _PRESSURE_WORD.sub(lambda match: _PRESSURE_WORDS[match.group(1).lower()], text)
    text = text.replace("m3", "m**3").replace("m2", "m**2").replace("ft3", "ft**3")
    text = _BTU.sub("Btu_it", text.replace("ft2", "ft**2"))
    alias = _ABSOLUTE_TEMPERATURE_ALIASES.get(text.lower())
    if alias is not None:
        if dimension is Dimension.TEMPERATURE_DIFFERENCE and alias != "kelvin":
            return "delta_" + alias
        return alias
    return _OFFSET_IN_COMPOUND.sub(lambda match: _COMPOUND_REPLACEMENTS[match.group(1)], text)


@lru_cache(maxsize=1024)
def _linear_map(unit: str, dimension: Dimension) -> _Linear:
    """Return the cached (scale, offset) that takes ``unit`` to SI for ``dimension``.

    The cache holds the 1024 most recently used units: bounded whatever clients send.
    """
    if len(unit) > MAX_UNIT_LENGTH:
        raise ValueError(
            f"a unit of {len(unit)} characters is longer than the {MAX_UNIT_LENGTH} "
            "characters a unit may have"
        )
    if not _UNIT_TEXT.match(unit):
        raise ValueError(
            "a unit holds letters, digits, the degree and micro signs, percent and "
            "* / ^ ( ) . _ - only"
        )
    registry = _registry()
    _refuse_common_mistakes(unit, dimension)
    spelling = _pint_spelling(unit, dimension)
    if dimension is Dimension.DIMENSIONLESS and spelling in ("", "1"):
        return _Linear(1.0, 0.0)
    try:
        parsed = registry.parse_units(spelling)
    except (pint.errors.UndefinedUnitError, pint.errors.DefinitionSyntaxError) as error:
        raise ValueError(f"unknown unit {unit!r}") from error
    except Exception as error:  # pint raises several parser errors for garbage text
        raise ValueError(f"cannot read unit {unit!r}") from error
    target = registry.parse_units(dimension.si_unit) if dimension.si_unit else None
    expected = registry.get_dimensionality(target) if target is not None else {}
    if registry.get_dimensionality(parsed) != expected:
        raise ValueError(
            f"unit {unit!r} is not a unit of {dimension.name.lower().replace('_', ' ')} "
            f"(expected something convertible to {_SI_LABEL[dimension]})"
        )
    zero = registry.Quantity(0.0, parsed).to(target or "").magnitude
    # A wide span keeps the scale exact to rounding even with a large offset.
    span = 1.0e6
    far = registry.Quantity(span, parsed).to(target or "").magnitude
    return _Linear(scale=float((far - zero) / span), offset=float(zero))


def convert_to_si(
    values: FloatArray | float, unit: str | None, dimension: Dimension, *, field: str
) -> FloatArray:
    """Convert ``values`` given in ``unit`` (None = SI default) to SI.

    Raises
    ------
    InvalidInputError
        If the unit is unknown or of the wrong dimension; names ``field``.
    """
    array = np.asarray(values, dtype=np.float64)
    linear = _input_map(unit, dimension, field=field)
    if linear is None:
        return array
    result: FloatArray = array * linear.scale + linear.offset
    return result


def number_to_si(value: float, unit: str | None, dimension: Dimension, *, field: str) -> float:
    """:func:`convert_to_si` for one Python float (same arithmetic, no array)."""
    linear = _input_map(unit, dimension, field=field)
    return value if linear is None else value * linear.scale + linear.offset


def _input_map(unit: str | None, dimension: Dimension, *, field: str) -> _Linear | None:
    """The (scale, offset) taking ``unit`` to SI; ``None`` where it is SI already."""
    if unit is None or unit.strip() == _SI_LABEL[dimension]:
        return None
    try:
        linear = _linear_map(unit.strip(), dimension)
    except ValueError as error:
        echoed = unit if len(unit) <= MAX_UNIT_LENGTH else None
        raise InvalidInputError(field, str(error), echoed) from None
    if linear.scale == 1.0 and linear.offset == 0.0:
        return None
    return linear


OFFSET_DECIMALS = 10
"""Decimals kept in a value converted to a unit with an offset (degC, degF)."""


def si_unit_label(dimension: Dimension) -> str:
    """The SI label of ``dimension`` as the API writes it (``"m3"``, ``"1"``)."""
    return _SI_LABEL[dimension]


def si_to_unit(value: float, unit: str, dimension: Dimension) -> float:
    """Express one SI ``value`` in ``unit`` (a unit already read for ``dimension``)."""
    linear = _linear_map(unit.strip(), dimension)
    converted = (value - linear.offset) / linear.scale
    return round(converted, OFFSET_DECIMALS) + 0.0 if linear.offset != 0.0 else converted


def output_unit(dimension: Dimension, unit_set: UnitSet) -> str:
    """Label of the unit ``dimension`` is reported in for ``unit_set``."""
    return _OUTPUT_UNITS[unit_set][dimension]


@overload
def convert_from_si(values: float, dimension: Dimension, unit_set: UnitSet) -> float: ...


@overload
def convert_from_si(values: FloatArray, dimension: Dimension, unit_set: UnitSet) -> FloatArray: ...


def convert_from_si(
    values: FloatArray | float, dimension: Dimension, unit_set: UnitSet
) -> FloatArray | float:
    """Express SI ``values`` (an array, or one float) in the unit ``unit_set`` uses for
    ``dimension``."""
    if unit_set is UnitSet.SI:
        return values
    linear = _linear_map(_OUTPUT_UNITS[unit_set][dimension], dimension)
    if linear.scale == 1.0 and linear.offset == 0.0:
        return values
    converted = (values - linear.offset) / linear.scale
    if linear.offset != 0.0:
        # Subtracting an offset of about 273 leaves noise near 1e-13 (273.16 K is
        # 0.010000000000047748 degC): answers carry 1e-10 degree resolution, far below any
        # formulation's uncertainty (adding 0.0 turns -0.0 into 0.0).
        if isinstance(converted, float):
            return round(converted, OFFSET_DECIMALS) + 0.0
        return np.round(converted, OFFSET_DECIMALS) + 0.0
    return converted


def parse_quantity_text(text: str, *, field: str) -> tuple[float, str | None]:
    """Split ``"25 degC"`` into ``(25.0, "degC")``; a bare number gives ``(x, None)``.

    Raises
    ------
    InvalidInputError
        If the text does not start with a finite number.
    """
    if len(text) > MAX_QUANTITY_TEXT_LENGTH:
        raise InvalidInputError(
            field,
            f"a quantity text of {len(text)} characters is longer than the "
            f"{MAX_QUANTITY_TEXT_LENGTH} characters one may have",
            None,
        )
    match = _NUMBER_WITH_UNIT.match(text)
    if match is None:
        raise InvalidInputError(
            field,
            f"{text!r} is not an ASCII decimal number optionally followed by a unit",
            text,
        )
    number = float(match.group("number"))
    if not math.isfinite(number):  # e.g. 1e999, which the pattern admits
        raise InvalidInputError(field, "value must be finite", text)
    unit = match.group("unit") or None
    return number, unit


def describe_units(unit_set: UnitSet) -> dict[str, Any]:
    """Map of dimension name to unit label, for documentation and responses."""
    return {dimension.name.lower(): label for dimension, label in _OUTPUT_UNITS[unit_set].items()}
