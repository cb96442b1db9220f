"""The report for a person: every representation, the conventions, the date and time, where the body axes
point, what a level would read, and the safety caution."""

from __future__ import annotations

from datetime import datetime

from core.format_options import FormatOptions
from core.format_summary import summary, vector_lines
from core.format_text import angle_names, format_number, spelled_sequence
from core.sequences import gimbal_margin


REPORT_DECIMALS = 10          # the report's numbers for a person (its quaternion line is always exact)
SAFETY_CAUTION = ("verify against the governing drawing and procedure; this tool does not replace inspection "
                  "by qualified personnel; local codes and licensed practice govern")


def render_report(orientation, o: FormatOptions) -> str:
    d = o.decimals if o.decimals is not None else REPORT_DECIMALS
    n = lambda v: format_number(v, d)            # noqa: E731 - one short formatter
    s = summary(orientation, o.sequence, o.intrinsic)
    when = o.timestamp
    if isinstance(when, datetime):
        when = when.isoformat(sep=" ", timespec="seconds")
    other_sequence = o.sequence[::-1]
    other = orientation.as_angles(other_sequence, intrinsic=not o.intrinsic)
    kind = "intrinsic" if o.intrinsic else "extrinsic"
    other_kind = "extrinsic" if o.intrinsic else "intrinsic"
    margin = gimbal_margin(orientation, o.sequence, o.intrinsic)
    lines = ["Framewright orientation report"]
    if o.name:
        lines.append(f"Mount: {o.name}")
    lines.append(f"Date and time: {when if when else 'not given'}")
    # the matrix's meaning is stated whatever the decimals: only the last clause depends on them
    precision = (f" the quaternion is printed exactly, other numbers to {d} decimals." if o.decimals is None else
                 f" numbers printed to {d} decimals.")
    lines.append("Conventions: v_ref = R v_body (the columns of R are the body axes in reference coordinates);"
                 " Hamilton quaternion, w first, w not negative; angles in degrees;" + precision)
    lines.append("")
    exact = format_number if o.decimals is None else n      # the quaternion line reads back exactly
    lines.append(f"Quaternion (w, x, y, z): {', '.join(exact(v) for v in s['quaternion_wxyz'])}")
    lines.append("Rotation matrix, body -> reference:")
    lines.extend("    " + "  ".join(n(v).rjust(d + 3) for v in row) for row in s["matrix"])
    if s["axis"] is None:
        lines.append("Axis and angle: no rotation (angle 0; the axis is undefined)")
    else:
        lines.append(f"Axis and angle: axis ({', '.join(n(v) for v in s['axis'])}), angle {n(s['angle_deg'])} deg")
    lines.extend(line[:1].upper() + line[1:] for line in vector_lines(s, n))
    lines.append(f"Angles {spelled_sequence(o.sequence, o.intrinsic)} {kind}"
                 f"{angle_names(o.sequence, o.intrinsic)}, deg: {', '.join(n(v) for v in s['angles_deg'])}")
    lines.append(f"The same spelled {spelled_sequence(other_sequence, not o.intrinsic)} {other_kind}"
                 f"{angle_names(other_sequence, not o.intrinsic)}, deg: {', '.join(n(v) for v in other.angles)}")
    if margin.locked:
        lines.append("Gimbal margin: 0 deg, in gimbal lock: only the sum or difference of the first and third"
                     " angles is determined")
    else:
        lines.append(f"Gimbal margin: {margin.margin_deg:.3f} deg (first and third angles swing about "
                     f"{margin.amplification:.3g} times as much as the orientation)")
    for note in tuple(o.notes) + tuple(orientation.notes):
        lines.append(f"Note: {note}")
    lines.append("")
    lines.extend(_report_words(orientation, o))
    lines.append("")
    lines.extend(_report_level(orientation, o))
    lines.append("")
    lines.append(f"Caution: {(o.caution or SAFETY_CAUTION).rstrip('.')}.")
    return "\n".join(lines) + "\n"


def _report_words(orientation, o: FormatOptions) -> list[str]:
    """Where each body axis points and the nearest right-angle orientation (core/describe.py)."""
    from core import describe

    preset = describe.frame_preset(o.reference_frame)
    return ([f"Where the body axes point (reference directions named as {preset.title}):"]
            + ["    " + line for line in describe.describe_orientation(orientation, preset)])


def _report_level(orientation, o: FormatOptions) -> list[str]:
    """What a level would read on each face and each body axis's elevation (core/level.py)."""
    from core import axes, describe, level

    down = level.DOWN_Z_UP if o.gravity_down is None else o.gravity_down
    report = level.level_readings(orientation, down)
    name = axes.name_of_vector(report.down)
    vertical = {"-Z": " (Z up)", "+Z": " (Z down)"}.get(name, "")
    where = f"reference {name}{vertical}" if name else f"reference ({', '.join(f'{c:.6g}' for c in report.down)})"
    m = lambda text: text.replace("-", describe.MINUS)          # noqa: E731 - signs as printed elsewhere
    lines = [f"Level readings, gravity along {m(where)}; degrees to three decimals:"]
    for r in report.faces:
        lines.append(f"    face {m(r.face)}: tilt from level {r.tilt_deg:.3f}, off plumb {r.off_plumb_deg:.3f}, "
                     f"normal {r.from_up_deg:.3f} from straight up, facing {r.facing}")
    lines.append(f"    up: face {m(report.up_face)}; down: face {m(report.down_face)}")
    lines.append("    elevation above the horizontal: " + ", ".join(
        f"{m(a.axis)} {m(_three_decimals(a.elevation_deg))}" for a in report.axes))
    return lines


def _three_decimals(value: float) -> str:
    """Three decimals, and no minus before a zero: an axis left horizontal by rounding dust (1e-14 below
    the horizontal after a 90° turn) reads 0.000, not −0.000."""
    text = f"{value:.3f}"
    return "0.000" if text == "-0.000" else text
