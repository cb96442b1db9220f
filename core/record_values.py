"""The inspection record's values: the figures, tables and sections a report prints, the record that
holds them, its canonical JSON and hashes, and the comparison verify-report makes between two figure
lists. How a record is built from a session is in core/inspection_record.py. Numpy only; no Qt."""

from __future__ import annotations

import hashlib
import json
import math
from dataclasses import dataclass
from typing import Iterable

from core import units
from core.errors import FramewrightError
from core.formats import SAFETY_CAUTION
from core.number_text import format_number
from core.orientation import Orientation

RECORD_FORMAT = "framewright inspection record"
RECORD_VERSION = 2
# The figures each version added, by how their keys end: a report of an earlier version is compared with
# the session without them, so a record filed before stays verifiable.
ADDED_IN_VERSION = {2: (".gibbs", ".mrp")}
DEGREES, MILLIMETRES, DIMENSIONLESS, UNIT_VECTOR, WORDS = "deg", "mm", "dimensionless", "unit vector", ""
CAUTION = ("A wrong orientation can point a safety-relevant sensor the wrong way. "
           f"{SAFETY_CAUTION[0].upper()}{SAFETY_CAUTION[1:].rstrip('.')}.")
# Filled in by hand on the printed page (or typed in before export); never part of the canonical numbers.
FREE_FIELDS = ("Operator", "Instrument", "Instrument calibration due", "Signature")
DECISION_RULE = ("ISO 14253-1: with the expanded uncertainty U = k·u, a figure conforms when it is at most "
                 "T − U, does not conform when it exceeds T + U, and otherwise the measurement cannot decide")


class RecordError(FramewrightError):
    """A record that cannot be made: an unknown check, a check without both mounts, a bad setup."""


# ---------------------------------------------------------------------------------------------------
# Numbers as printed
# ---------------------------------------------------------------------------------------------------
def printed_numbers(values: Iterable[float], digits: int) -> tuple[str, ...]:
    """The values of one group printed with `digits` significant digits counted from the group's largest,
    trailing zeros dropped, never '-0' (core/number_text.format_number does the rounding)."""
    numbers = [float(v) for v in values]
    if not all(math.isfinite(v) for v in numbers):
        raise RecordError("a figure is not a finite number; the record is not made")
    largest = max((abs(v) for v in numbers), default=0.0)
    if largest == 0:
        return tuple("0" for _ in numbers)
    decimals = min(17, max(0, digits - 1 - math.floor(math.log10(largest))))
    out = []
    for v in numbers:
        text = format_number(v, decimals)
        if "." in text:
            text = text.rstrip("0").rstrip(".")
        out.append("0" if float(text) == 0 else text)
    return tuple(out)


# ---------------------------------------------------------------------------------------------------
# The record's parts
# ---------------------------------------------------------------------------------------------------
@dataclass(frozen=True)
class Figure:
    """One printed figure: key (its place, stable for the same session), label, values as printed, unit
    (DEGREES, MILLIMETRES, DIMENSIONLESS, UNIT_VECTOR, or WORDS for names and verdicts)."""
    key: str
    label: str
    values: tuple
    unit: str
    shape: tuple = ()          # (3, 3) for a matrix: printed as rows


@dataclass(frozen=True)
class Table:
    """Figures printed as the rows of a table: each row a Figure whose values fill the columns."""
    title: str
    columns: tuple
    rows: tuple


@dataclass(frozen=True)
class Picture:
    """What the Scene picture of a part shows: the part at `orientation`, `ghost` as the faint outline."""
    orientation: Orientation
    ghost: Orientation
    ghost_label: str
    part: object
    preset: str


@dataclass(frozen=True)
class Section:
    title: str
    items: tuple               # Figure, Table or str (a line of words), in print order
    picture: Picture | None = None


@dataclass(frozen=True)
class ReportUnits:
    """The units a record prints angles and level tilts in (degrees unless asked; core/units.py keys).
    Degrees-minutes-seconds is a way of showing, not a number, so a record takes decimal units only."""

    angle: str = "deg"
    slope: str = "deg"

    def __post_init__(self):
        if not isinstance(self.angle, str) or not isinstance(self.slope, str):
            raise RecordError(f"units must be named by text, got {self.angle!r} and {self.slope!r}")
        try:
            units.angle_unit(self.angle)
            units.slope_unit(self.slope)
        except FramewrightError as error:
            raise RecordError(str(error)) from None
        if self.angle == "dms":
            raise RecordError("a record prints decimal numbers; choose deg, arcmin or arcsec rather than "
                              "degrees-minutes-seconds")

    @property
    def default(self) -> bool:
        return self == ReportUnits()


    @classmethod
    def from_numbers(cls, numbers: dict) -> "ReportUnits":
        """The units a record's numbers name (absent: degrees, as every record before units were chosen)."""
        given = numbers.get("units", {}) if isinstance(numbers, dict) else {}
        if not isinstance(given, dict) or set(given) - {"angle", "slope"}:
            raise RecordError(f"the report's units are not readable: {given!r}")
        return cls(**given)


@dataclass(frozen=True)
class Record:
    title: str
    scope: str                 # "check" or "all"
    check_name: str | None
    session_name: str
    session_sha256: str
    reference_frame: str       # the preset's title
    digits: int
    conventions: tuple
    sections: tuple
    verdict: str | None        # the check's verdict line (a check record), else None
    caution: str = CAUTION
    free_fields: tuple = FREE_FIELDS
    fit_source: str | None = None   # the points file of a fit's residuals, when the record holds one
    units: ReportUnits = ReportUnits()

    def figures(self) -> list[Figure]:
        out = []
        for section in self.sections:
            for item in section.items:
                if isinstance(item, Figure):
                    out.append(item)
                elif isinstance(item, Table):
                    out.extend(item.rows)
        return out

    def numbers(self) -> dict:
        """The record's numbers as plain JSON-ready data (what the canonical JSON and its hash hold)."""
        return {"format": RECORD_FORMAT, "version": RECORD_VERSION, "scope": self.scope,
                "check": self.check_name, "session_sha256": self.session_sha256, "digits": self.digits,
                "figures": [{"key": f.key, "label": f.label, "values": list(f.values), "unit": f.unit}
                            for f in self.figures()],
                # only when not degrees, so a record made before units could be chosen keeps its hash
                **({} if self.units.default else {"units": {"angle": self.units.angle, "slope": self.units.slope}})}

    def canonical_json(self) -> str:
        return canonical_json(self.numbers())

    def sha256(self) -> str:
        return hashlib.sha256(self.canonical_json().encode("utf-8")).hexdigest()

    def embedded(self) -> dict:
        """The numbers with the record's own hash beside them: what a report file embeds."""
        return {**self.numbers(), "record_sha256": self.sha256()}


def canonical_json(numbers: dict) -> str:
    """One spelling of the numbers: keys sorted, no spaces, UTF-8 text as it is."""
    return json.dumps(numbers, sort_keys=True, separators=(",", ":"), ensure_ascii=False, allow_nan=False)


def numbers_sha256(numbers: dict) -> str:
    return hashlib.sha256(canonical_json(numbers).encode("utf-8")).hexdigest()


def sha256_of_bytes(raw: bytes) -> str:
    return hashlib.sha256(raw).hexdigest()


# ---------------------------------------------------------------------------------------------------
# Comparing
# ---------------------------------------------------------------------------------------------------
def first_difference(reported: list, expected: list) -> str | None:
    """The first figure that differs between two figure lists (as in `Record.numbers()['figures']`), in
    words; None when they are the same. Figures from a point fit are compared only when both hold them."""
    by_key = {f["key"]: f for f in expected}
    for figure in reported:
        key = figure.get("key") if isinstance(figure, dict) else None
        if key is None:
            return "a figure without a key"
        other = by_key.pop(key, None)
        if other is None:
            if ".fit_" in key:
                continue
            return f"{key} ({figure.get('label')}) is not a figure of this session"
        for what in ("values", "unit"):
            if figure.get(what) != other[what]:
                return (f"{key} ({other['label']}): the report says {_shown(figure.get(what))}, the session gives "
                        f"{_shown(other[what])}")
    if by_key:
        key, figure = next(iter(by_key.items()))
        return f"{key} ({figure['label']}) is missing from the report"
    return None


def expected_figures(figures: list, version) -> list:
    """The figures (as in `Record.numbers()['figures']`) a report of record `version` holds: those of this
    version less the ones added after it. A version this program does not know is refused."""
    if isinstance(version, bool) or not isinstance(version, int) or not 1 <= version <= RECORD_VERSION:
        raise RecordError(f"the report is record version {version!r}; this program reads versions 1 to "
                          f"{RECORD_VERSION} (a newer report needs a newer Framewright)")
    later = tuple(end for added, ends in ADDED_IN_VERSION.items() if added > version for end in ends)
    return [f for f in figures if not (later and str(f.get("key", "")).endswith(later))]


def _shown(values) -> str:
    if isinstance(values, list):
        return ", ".join(str(v) for v in values)
    return str(values)
