"""Candidate readings for four numbers: a quaternion (w first or last, Hamilton or JPL) or an axis and an
angle (axis first, or angle first when the text or the values say so)."""

from __future__ import annotations

import numpy as np

from core.decode.candidates import NAMED_NUMBERS, POINTS, TEXT_NAMES_KIND, _Candidate, _unit_choices, _unit_word
from core.decode.hints import AXIS_ANGLE_ORDERS, QUATERNION_ORDERS
from core.representations import AXIS_ANGLE


def _angle_first_by_values(v, unit_like: bool) -> bool:
    """'0.785398 0 0 1' (angle then axis, as some libraries print it): read axis first, the axis would be
    (0.785, 0, 0) and the angle 1; the last three numbers are the unit axis."""
    unit = lambda part: abs(float(np.linalg.norm(part)) - 1.0) < 1e-3
    return not unit_like and unit(v[1:]) and not unit(v[:3])


def _four_candidates(values, parsed, hints, clues, keyed):
    from core.orientation import Orientation
    v = np.array(values, dtype=float)
    out = []
    norm = float(np.linalg.norm(v))
    unit_like = abs(norm - 1.0) < 1e-3
    mags = np.abs(v)
    first_largest = mags[0] > mags[1:].max()
    last_largest = mags[3] > mags[:3].max()
    fixed_order = keyed.order if keyed and keyed.kind == "quaternion" else None
    orders = (("wxyz", "Hamilton"), ("xyzw", "Hamilton"), ("xyzw", "JPL"))
    if fixed_order:   # the names said which is w; the values are already in w, x, y, z order
        orders = (("wxyz", "Hamilton"), ("wxyz", "JPL"))
    for order, convention in orders:
        jpl = convention == "JPL"
        if jpl:
            # named components are already in w, x, y, z order; bare numbers are read scalar last
            make = lambda: Orientation.from_quaternion(v, scalar_last=not fixed_order).inverse()
            label = "quaternion (x, y, z, w), JPL convention: the inverse of the Hamilton reading"
        else:
            make = lambda s=(order == "xyzw"): Orientation.from_quaternion(v, scalar_last=s)
            label = f"quaternion ({', '.join(order)}), Hamilton"
        conventions = {"order": fixed_order or order, "convention": convention}
        if fixed_order:
            conventions["named"] = True
            label = "quaternion by named components, " + (
                "JPL convention: the inverse of the Hamilton reading" if jpl else "Hamilton")
        c = _Candidate("quaternion", conventions, make, label)
        if unit_like:
            c.plus(POINTS["unit quaternion"], f"norm {norm:.6g}: a unit quaternion")
        elif abs(norm - 1.0) < 0.05:
            c.plus(POINTS["near unit quaternion"], f"norm {norm:.6g}: close to 1")
        else:
            c.plus(POINTS["far from unit"], f"norm {norm:.6g} is far from 1")
        if fixed_order:
            c.plus(0.0 if jpl else NAMED_NUMBERS["quaternion"], keyed.note)
        elif not jpl:
            if order == "wxyz" and first_largest:
                c.plus(POINTS["largest first or last"], "the first number is the largest in magnitude: likely w first")
            elif order == "xyzw" and last_largest:
                c.plus(POINTS["largest first or last"], "the last number is the largest in magnitude: likely w last")
            elif order == "wxyz" and not last_largest:
                c.plus(POINTS["w first by default"], "w first is the default order")
        if jpl:
            c.plus(POINTS["jpl offered last"], "the JPL convention is offered last, never assumed")
        tag = "jpl" if jpl else order
        if clues.order == tag:
            c.plus(POINTS["jpl named"] if jpl else POINTS["order named"], "the text names this order")
        if "quaternion" in clues.kinds:
            c.plus(TEXT_NAMES_KIND["quaternion"], "the text says quaternion")
        out.append(c)
    if hints.order in AXIS_ANGLE_ORDERS:      # the hint says an axis and an angle, in this order
        out = []
    elif hints.order:
        if fixed_order:   # names decide the order; the hint can still choose Hamilton or JPL
            out = [c for c in out if (c.conventions["convention"] == "JPL") == (hints.order == "jpl")]
        else:
            out = [c for c in out if ("jpl" if c.conventions["convention"] == "JPL" else c.conventions["order"])
                   == hints.order]
    # axis and angle: axis first, angle last; and angle first when the text writes it so, when the values
    # say so (the last three are a unit axis and the first three are not), or when the hint asks for it
    layouts = [("axis, angle", v[:3], float(v[3]))]
    by_values = _angle_first_by_values(v, unit_like)
    angle_first_offered = clues.angle_first or by_values or hints.order == "angle-first"
    if angle_first_offered and not (keyed and keyed.kind == AXIS_ANGLE.kind):
        layouts.append(("angle, axis", v[1:], float(v[0])))
    if hints.order in AXIS_ANGLE_ORDERS:
        layouts = [layout for layout in layouts if AXIS_ANGLE_ORDERS[hints.order] == layout[0]]
    for order, axis, angle in layouts:
        out += _axis_angle_candidates(order, axis, angle, hints, clues, keyed, unit_like)
        if order == "angle, axis" and by_values and not clues.angle_first:
            for c in out[-2:]:
                if c.conventions.get("order") == order:
                    c.plus(POINTS["angle first by the values"], "the last three numbers have unit length and the"
                           " first three do not: likely the angle, then the axis")
    if keyed and keyed.kind == "quaternion":
        out = [c for c in out if c.kind == "quaternion"]
    if keyed and keyed.kind == AXIS_ANGLE.kind:
        out = [c for c in out if c.kind == AXIS_ANGLE.kind]
    return out


def _axis_angle_candidates(order, axis, angle, hints, clues, keyed, unit_like):
    from core.orientation import Orientation
    out = []
    axis_length = float(np.linalg.norm(axis))
    if not (axis_length > 0 or angle == 0) or (hints.order in QUATERNION_ORDERS and not hints.kind):
        return out
    fixed_units = keyed.units if keyed and keyed.kind == AXIS_ANGLE.kind else None
    angle_first = order == "angle, axis"
    for units, points, unit_reason in _unit_choices([angle], hints, clues, fixed_units):
        c = _Candidate(AXIS_ANGLE.kind, {"order": order, "units": units},
                       lambda u=units, n=axis, a=angle: Orientation.from_axis_angle(n, a, degrees=(u == "deg")),
                       f"angle in {_unit_word(units)}, then axis (x, y, z)" if angle_first
                       else f"axis (x, y, z) and angle in {_unit_word(units)}")
        c.plus(points, unit_reason)
        if abs(axis_length - 1.0) < 1e-3:
            c.plus(POINTS["unit axis"], "the axis numbers have unit length, as an axis has")
        else:
            c.plus(POINTS["near unit axis"] if 0.5 < axis_length < 2 else POINTS["far from unit axis"],
                   f"the axis has length {axis_length:.6g}, not 1")
            if angle_first:
                c.notes.append(f"the axis (length {axis_length:.6g}) was scaled to unit length")
        if abs(angle) > 1.0 + 1e-9:
            c.plus(POINTS["angle beyond one"], f"the angle ({angle:g}) is beyond ±1: an angle, not a quaternion part")
        elif unit_like:
            c.plus(POINTS["four numbers of unit norm"], "the four numbers have unit norm, as a quaternion has")
        if keyed and keyed.kind == AXIS_ANGLE.kind:
            c.plus(NAMED_NUMBERS[AXIS_ANGLE.kind], keyed.note)
        if AXIS_ANGLE.kind in clues.kinds:
            c.plus(TEXT_NAMES_KIND[AXIS_ANGLE.kind], "the text says axis and angle")
        if angle_first and clues.angle_first:
            c.plus(POINTS["angle written first"], "the text writes the angle before the axis")
        out.append(c)
    return out
