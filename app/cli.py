"""The command line over the core: `framewright decode`, `compare`, `fit`, `batch`, `correct`, `average`,
`report`, `verify-report` and `open`. Never imports Qt: the two verbs that need it, `open` (the window)
and `report` (laying out pages), are given it by app/main.py and call it only once their input has read.

Each verb is one pair of functions, `add_<verb>_arguments(parser)` and `run_<verb>(args) -> exit status`,
listed once in VERBS.

Exit status: 0 done (and within tolerance), 1 outside the tolerance, 2 refused input (usage errors
included), with one line on stderr saying what is wrong and where, and nothing on stdout; 3 an internal
error, with one line on stderr naming the log file that holds the traceback; 4 when, with an
uncertainty given, the measurement cannot decide (ISO 14253-1). Never a bare traceback.
"""

from __future__ import annotations

import argparse
import os
import re
import sys

from app.cli_units import add_units_option, angle_argument, as_given, degrees_of, in_unit, shown
from app.display_check import open_display_problem
from app.text import significant
from core import formats, representations, units
from core.check import CheckSettings, check
from core.decode import KINDS, DecodeHints, decode
from core.errors import FramewrightError
from core.printable import printable

EXIT_OK, EXIT_OUTSIDE, EXIT_REFUSED, EXIT_INTERNAL, EXIT_UNDECIDED = 0, 1, 2, 3, 4
MAX_INPUT_BYTES = 1_000_000         # standard input and files are read up to this and refused beyond it
MAX_FILE_BYTES = 200_000_000      # CSV files (a batch of a million mounts is about 150 MB)
MAX_MESSAGE_CHARS = 400             # a refusal is one readable line, however long the input it quotes


class _Refused(Exception):
    """Input we cannot use; the message is the one stderr line."""


# ---------------------------------------------------------------------------------------------------
# Options shared by every verb that reads an orientation from text
# ---------------------------------------------------------------------------------------------------
def _kind(text: str) -> str:
    """The kind a spelling names ('rotation_vector' -> 'rotation-vector'); an unknown one is left for
    argparse to refuse with the list of choices."""
    found = representations.lookup(text)
    return found.kind if found is not None else text


def add_reading_options(parser: argparse.ArgumentParser) -> None:
    group = parser.add_argument_group("how to read the numbers (each one narrows the readings)")
    group.add_argument("--kind", choices=KINDS, type=_kind, help="what the numbers are (any spelling of "
                       "core/representations.py: rotation-vector, rotation_vector, rotvec, ...)")
    group.add_argument("--sequence", metavar="ZYX", help="angle sequence, e.g. ZYX or \"Z-Y'-X''\"")
    turn = group.add_mutually_exclusive_group()
    turn.add_argument("--intrinsic", dest="intrinsic", action="store_const", const=True,
                      help="angles turn about the moving body axes")
    turn.add_argument("--extrinsic", dest="intrinsic", action="store_const", const=False,
                      help="angles turn about the fixed reference axes")
    units = group.add_mutually_exclusive_group()
    units.add_argument("--radians", dest="units", action="store_const", const="rad", help="angles in radians")
    units.add_argument("--degrees", dest="units", action="store_const", const="deg", help="angles in degrees")
    order = group.add_mutually_exclusive_group()
    order.add_argument("--scalar-last", dest="order", action="store_const", const="xyzw",
                       help="quaternion written (x, y, z, w)")
    order.add_argument("--scalar-first", dest="order", action="store_const", const="wxyz",
                       help="quaternion written (w, x, y, z)")
    order.add_argument("--angle-first", dest="order", action="store_const", const="angle-first",
                       help="an angle, then the axis (x, y, z)")
    order.add_argument("--axis-first", dest="order", action="store_const", const="axis-first",
                       help="the axis (x, y, z), then the angle")
    meaning = group.add_mutually_exclusive_group()
    meaning.add_argument("--transposed", dest="transposed", action="store_const", const=True,
                         help="the matrix is reference -> body (rows are the body axes)")
    meaning.add_argument("--as-written", dest="transposed", action="store_const", const=False,
                         help="the matrix is body -> reference (columns are the body axes)")
    group.add_argument("--name", metavar="NAME",
                       help="which transform to read when the text holds several (as decode lists them)")


def hints_from(args) -> DecodeHints:
    return DecodeHints(kind=args.kind, sequence=args.sequence, intrinsic=args.intrinsic, order=args.order,
                       units=args.units, transposed=args.transposed, name=getattr(args, "name", None))


def read_text(argument: str | None, stdin) -> str:
    """The text of an argument, or of standard input for '-': valid UTF-8 and at most MAX_INPUT_BYTES,
    read with the cap before anything parses it (endless input is refused, not held in memory)."""
    if argument is not None and argument != "-":
        return valid_text(argument, "the argument")
    source = getattr(stdin, "buffer", None)
    data = (source or stdin).read(MAX_INPUT_BYTES + 1)
    if len(data) > MAX_INPUT_BYTES:
        raise _Refused(f"standard input is longer than {MAX_INPUT_BYTES} bytes; paste only the orientation")
    if isinstance(data, bytes):
        try:
            data = data.decode("utf-8-sig")
        except UnicodeDecodeError as error:
            raise _Refused(f"standard input is not UTF-8 text (byte {error.start}); expected text") from None
    return valid_text(data, "standard input")


def valid_text(text: str, what: str) -> str:
    """Text as Python received it may hold lone surrogates (bytes of an argument that were not UTF-8):
    refuse them here so they never reach a reading or its JSON."""
    try:
        text.encode("utf-8")
    except UnicodeEncodeError as error:
        raise _Refused(f"{what} is not valid UTF-8 text (character {error.start + 1}); expected text") from None
    return text


def decode_or_refuse(text: str, hints: DecodeHints, what: str = ""):
    try:
        return decode(text, hints)
    except FramewrightError as error:
        raise _Refused(f"{what}{error}") from None


def reading_object(reading, args) -> dict:
    """The JSON object for one reading (keys listed in the README)."""
    conventions = reading.conventions
    sequence = args.sequence or (conventions["sequence"] if reading.kind == "angles" else "ZYX")
    if args.intrinsic is not None:
        intrinsic = args.intrinsic
    else:
        intrinsic = conventions["intrinsic"] if reading.kind == "angles" and not args.sequence else True
    summary = formats.summary(reading.orientation, sequence, intrinsic)
    translation = None if reading.translation is None else [float(v) for v in reading.translation]
    return {"kind": reading.kind, "label": reading.label, "conventions": dict(conventions), **summary,
            "translation": translation, "translation_unit": reading.translation_unit, "name": reading.name,
            "orthogonality_error": reading.orthogonality_error, "notes": list(reading.notes),
            "why": reading.why}


def _n(value: float) -> str:
    """Ten significant digits for reading; round-off dust below 5e-13 shows as 0."""
    return significant(value, 10, dust=5e-13)


def orientation_lines(data: dict) -> list[str]:
    """Every representation of a `formats.summary` dict, one indented line (or block) each."""
    kind = "intrinsic" if data["intrinsic"] else "extrinsic"
    lines = [f"  quaternion (w, x, y, z): {', '.join(_n(v) for v in data['quaternion_wxyz'])}",
             "  matrix (body -> reference):"]
    lines += ["      " + "  ".join(_n(v).rjust(13) for v in row) for row in data["matrix"]]
    if data["axis"] is None:
        lines.append("  axis and angle: no rotation (the axis is undefined at angle 0)")
    else:
        lines.append(f"  axis ({', '.join(_n(v) for v in data['axis'])}), angle {_n(data['angle_deg'])} deg")
    lines += ["  " + line for line in formats.vector_lines(data, _n)]
    lines.append(f"  angles {formats.spelled_sequence(data['sequence'], data['intrinsic'])} {kind} (deg): "
                 f"{', '.join(_n(v) for v in data['angles_deg'])}; gimbal margin {_n(data['gimbal_margin_deg'])} deg")
    return lines


def _n4(value: float) -> str:
    """Four significant digits, for residuals (their own uncertainty makes more digits noise)."""
    return significant(value, 4, dust=0.0)


def reading_text(reading, args, rank: int, total: int, best=None) -> str:
    data = reading_object(reading, args)
    lines = [f"Reading {rank} of {total}: {reading.label}"]
    if reading.name is not None:
        lines.append(f"  transform: {reading.name}")
    if reading.translation is not None:
        unit = f"in {reading.translation_unit}" if reading.translation_unit else "unit not stated in the text"
        lines.append(f"  translation (x, y, z): {', '.join(_n(v) for v in reading.translation)} ({unit})")
    lines += orientation_lines(data)
    if best is not None and best is not reading and best.name == reading.name:
        lines.append(f"  differs from reading 1 by {_n(best.orientation.angle_to(reading.orientation))} deg")
    if data["orthogonality_error"] is not None:
        lines.append(f"  orthogonality error of the numbers as given: {data['orthogonality_error']:.2g}")
    lines.append(f"  why: {reading.why}")
    lines += [f"  note: {note}" for note in reading.notes]
    return "\n".join(lines)


# ---------------------------------------------------------------------------------------------------
# decode
# ---------------------------------------------------------------------------------------------------
def add_decode_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("text", nargs="?", default="-", metavar="TEXT",
                        help="the pasted text; '-' or nothing reads standard input")
    add_reading_options(parser)
    parser.add_argument("--all", action="store_true", help="show every reading, most plausible first")
    parser.add_argument("--json", action="store_true", help="print one JSON object")


def run_decode(args, stdin, stdout) -> int:
    readings = decode_or_refuse(read_text(args.text, stdin), hints_from(args))
    # the best reading of each transform when the text holds several named ones (in the text's order)
    firsts = list({r.name: r for r in reversed(readings)}.values())[::-1] if readings[0].name is not None else []
    transforms = firsts if len(firsts) > 1 else []
    if args.json:
        data = reading_object(readings[0], args)
        if transforms:
            data["transforms"] = [reading_object(r, args) for r in transforms]
        if args.all:
            data["readings"] = [reading_object(r, args) for r in readings]
        stdout.write(formats.json_object_text(data))
        return EXIT_OK
    shown = readings if args.all else (transforms or readings[:1])
    best = {}
    for r in readings:
        best.setdefault(r.name, r)
    stdout.write("\n\n".join(reading_text(r, args, readings.index(r) + 1, len(readings), best[r.name])
                             for r in shown) + "\n")
    if transforms and not args.all:
        stdout.write(f"(the text holds {len(transforms)} transforms; --name picks one, --all shows every"
                     " reading)\n")
    elif not args.all and len(readings) > 1:
        stdout.write(f"({len(readings) - 1} more reading{'s' if len(readings) > 2 else ''}: --all shows them,"
                     " options such as --kind narrow them)\n")
    return EXIT_OK


# ---------------------------------------------------------------------------------------------------
# compare
# ---------------------------------------------------------------------------------------------------
def add_compare_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("nominal", metavar="NOMINAL", help="the nominal orientation as text ('-': standard input)")
    parser.add_argument("measured", metavar="MEASURED", help="the measured orientation as text ('-': standard input)")
    add_reading_options(parser)
    parser.add_argument("--tolerance", type=angle_argument, metavar="ANGLE",
                        help="allowed total deviation: degrees, or a number with its unit (0.5mrad, 30″, 1′30″, "
                             "2gon)")
    parser.add_argument("--uncertainty", type=angle_argument, metavar="ANGLE",
                        help="standard uncertainty of the measured orientation (degrees, or with its unit): the "
                             "verdict then follows ISO 14253-1 (conforms / does not conform / cannot decide)")
    add_units_option(parser)
    parser.add_argument("--coverage", type=float, default=2.0, metavar="K",
                        help="coverage factor k of the expanded uncertainty U = k u (default 2)")
    parser.add_argument("--json", action="store_true", help="print one JSON object")


def run_compare(args, stdin, stdout) -> int:
    if args.nominal == "-" and args.measured == "-":
        raise _Refused("only one of NOMINAL and MEASURED can be read from standard input")
    tolerance, uncertainty, unit = degrees_of(args.tolerance), degrees_of(args.uncertainty), args.show_units
    try:
        settings = CheckSettings(mode="total",
                                 total_tolerance_deg=180.0 if tolerance is None else tolerance)
    except FramewrightError as error:
        raise _Refused(f"--tolerance: {error}") from None
    hints = hints_from(args)
    nominal_readings = decode_or_refuse(read_text(args.nominal, stdin), hints, "nominal: ")
    measured_readings = decode_or_refuse(read_text(args.measured, stdin), hints, "measured: ")
    nominal, measured = nominal_readings[0], measured_readings[0]
    # D = Nᵀ M in the nominal body frame, judged by the same rule as the Check panel and batch files
    result = check(nominal.orientation, measured.orientation, settings)
    angle, axis = result.total_deg, result.axis
    within = None if tolerance is None else result.passed
    decision = None
    if uncertainty is not None:
        if tolerance is None:
            raise _Refused("--uncertainty needs --tolerance: the decision compares the deviation with a tolerance")
        from core.decision import decide
        try:
            decision = decide(angle, tolerance, uncertainty, args.coverage)
        except FramewrightError as error:
            raise _Refused(str(error)) from None
    warnings = []
    for name, readings in (("nominal", nominal_readings), ("measured", measured_readings)):
        if len(readings) > 1:
            warnings.append(f"{name} read as {readings[0].label} (the most plausible of {len(readings)} "
                            "readings; options such as --kind make it unique)")
    if args.json:
        data = {"deviation_deg": angle, "axis": None if angle == 0 else [float(v) for v in axis],
                "axis_frame": "nominal body", "within_tolerance": within, "tolerance_deg": tolerance,
                "margin_deg": None if tolerance is None else tolerance - angle,
                "uncertainty_deg": uncertainty, "coverage": args.coverage if decision else None,
                "decision": decision.outcome if decision else None,
                "warnings": warnings, "nominal": reading_object(nominal, args),
                "measured": reading_object(measured, args),
                # the same angles in the unit chosen with --units, and the options as they were typed
                "units": unit, "in_units": {"deviation": in_unit(angle, unit), "tolerance": in_unit(tolerance, unit),
                                            "margin": in_unit(None if tolerance is None else tolerance - angle, unit),
                                            "uncertainty": in_unit(uncertainty, unit)},
                "tolerance_given": as_given(args.tolerance), "uncertainty_given": as_given(args.uncertainty)}
        stdout.write(formats.json_object_text(data))
    else:
        where = "no rotation" if angle == 0 else f"about ({', '.join(_n(v) for v in axis)}) in nominal body axes"
        lines = [f"deviation: {shown(angle, unit, _n)} {where}"]
        if tolerance is not None:
            margin = tolerance - angle
            lines.append(f"within tolerance {shown(tolerance, unit, _n)} (margin {shown(margin, unit, _n)})" if within
                         else f"OUTSIDE tolerance {shown(tolerance, unit, _n)} (by {shown(-margin, unit, _n)})")
        if decision is not None:
            lines.append(f"decision (ISO 14253-1): {decision.words()}")
        lines += [f"nominal: {nominal.label}", f"measured: {measured.label}"]
        lines += [f"warning: {w}" for w in warnings]
        stdout.write("\n".join(lines) + "\n")
    if decision is not None:
        return {"conforms": EXIT_OK, "does not conform": EXIT_OUTSIDE}.get(decision.outcome, EXIT_UNDECIDED)
    return EXIT_OUTSIDE if within is False else EXIT_OK


# ---------------------------------------------------------------------------------------------------
# Files
# ---------------------------------------------------------------------------------------------------
def read_file_text(path: str) -> str:
    """The text of a CSV file (UTF-8, a leading byte-order mark allowed), or a refusal naming the file."""
    try:
        with open(path, "rb") as handle:
            data = handle.read(MAX_FILE_BYTES + 1)
        if len(data) > MAX_FILE_BYTES:
            raise _Refused(f"{path}: larger than {MAX_FILE_BYTES // 1_000_000} MB; expected a CSV file")
        return valid_text(data.decode("utf-8-sig"), path)
    except IsADirectoryError:
        raise _Refused(f"{path}: is a folder; expected a CSV file") from None
    except OSError as error:
        raise _Refused(f"{path}: cannot be read ({error.strerror or error})") from None
    except UnicodeDecodeError as error:
        raise _Refused(f"{path}: not a text file in UTF-8 (byte {error.start}); expected a CSV file") from None


def add_orientation_options(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("--sequence", default="ZYX", metavar="ZYX", help="angle sequence to show (default ZYX)")
    turn = parser.add_mutually_exclusive_group()
    turn.add_argument("--intrinsic", dest="intrinsic", action="store_const", const=True, default=True,
                      help="angles about the moving body axes (default)")
    turn.add_argument("--extrinsic", dest="intrinsic", action="store_const", const=False,
                      help="angles about the fixed reference axes")


def orientation_summary(orientation, args) -> dict:
    try:
        return formats.summary(orientation, args.sequence, args.intrinsic)
    except FramewrightError as error:
        raise _Refused(f"--sequence: {error}") from None


# ---------------------------------------------------------------------------------------------------
# fit
# ---------------------------------------------------------------------------------------------------
def add_fit_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("points", metavar="POINTS.csv",
                        help="CSV with a header row: nominal_x, nominal_y, nominal_z (body frame, from the "
                             "drawing), measured_x, measured_y, measured_z (reference frame), optional weight; "
                             "the same headers the Measure panel imports")
    parser.add_argument("--unit", default="mm", choices=tuple(units.LENGTH_UNITS),
                        help="length unit of the points, for the printout (default mm; thou: a thousandth of an "
                             "inch)")
    add_orientation_options(parser)
    parser.add_argument("--json", action="store_true", help="print one JSON object")


def run_fit(args, stdin, stdout) -> int:
    from core.fit import fit_points
    from core.point_rows import RowsError, read_point_pairs

    text = read_file_text(args.points)
    try:
        pairs = read_point_pairs(text)
        fit = fit_points(pairs.nominal, pairs.measured, pairs.weights)
    except RowsError as error:
        raise _Refused(f"{args.points}: {error}") from None
    except FramewrightError as error:
        raise _Refused(f"{args.points}: not fitted: {error}") from None
    summary = orientation_summary(fit.orientation, args)
    from core.uncertainty import point_fit_standard_uncertainty
    try:
        largest_u, axis_u = point_fit_standard_uncertainty(pairs.nominal, fit.orientation, fit.residuals, pairs.weights)
    except FramewrightError:
        largest_u, axis_u = None, None      # too few points (or collinear) for a covariance: said below
    flagged = set(fit.flagged)
    worst = fit.worst_index
    points = [{"row": i + 1, "distance": float(fit.distances[i]), "residual": [float(v) for v in fit.residuals[i]],
               "flagged": i in flagged} for i in range(len(fit.distances))]
    if args.json:
        data = {"points": len(points), "unit": args.unit, **summary,
                "translation": [float(v) for v in fit.translation], "rms": fit.rms,
                "worst_row": worst + 1, "flag_threshold": fit.flag_threshold,
                "flagged_rows": [i + 1 for i in fit.flagged], "residuals": points,
                "uncertainty_deg": largest_u, "uncertainty_axes_deg": list(axis_u) if axis_u else None,
                "residual_meaning": "measured - (R nominal + t), reference frame",
                "notes": list(pairs.notes) + list(fit.notes)}
        stdout.write(formats.json_object_text(data))
        return EXIT_OK
    unit = args.unit
    lines = [f"best fit of {len(points)} point pairs (measured = R nominal + t)"] + orientation_lines(summary)
    lines.append(f"  translation t (reference frame, {unit}): {', '.join(_n(v) for v in fit.translation)}")
    lines.append(f"  RMS residual {_n4(fit.rms)} {unit}; worst: row {worst + 1} at {_n4(fit.distances[worst])} {unit}")
    if largest_u is None:
        lines.append("  standard uncertainty of the orientation: not estimated (needs 3 or more spread points)")
    else:
        lines.append(f"  standard uncertainty of the orientation (from the residuals): {_n4(largest_u)} deg at most;"
                     f" about reference X, Y, Z: {', '.join(_n4(v) for v in axis_u)} deg")
    if fit.flag_threshold is not None:
        lines.append(f"  flagged (residual above {_n4(fit.flag_threshold)} {unit}): "
                     + (", ".join(f"row {i + 1}" for i in fit.flagged) or "none"))
    lines.append(f"residuals (measured - fitted, reference frame, {unit}; row 1 is the line after the header):")
    lines.append("   row   distance         dx         dy         dz")
    for point in points:
        mark = "  flagged" if point["flagged"] else ("  worst" if point["row"] == worst + 1 else "")
        lines.append(f"  {point['row']:>4}" + "".join(f"{_n4(v):>11}" for v in [point["distance"], *point["residual"]])
                     + mark)
    lines += [f"note: {note}" for note in (*pairs.notes, *fit.notes)]
    stdout.write("\n".join(lines) + "\n")
    return EXIT_OK


# ---------------------------------------------------------------------------------------------------
# batch
# ---------------------------------------------------------------------------------------------------
def add_batch_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("file", metavar="FILE.csv",
                        help="CSV of mounts: name, then nominal_... and measured_... column sets "
                             "(e.g. nominal_qw..qz, measured_yaw/pitch/roll[deg]; see the README)")
    parser.add_argument("--tolerance", type=angle_argument, required=True, metavar="ANGLE",
                        help="allowed total deviation of each mount: degrees, or a number with its unit (0.5mrad, "
                             "30″, 1′30″, 2gon)")
    add_units_option(parser)
    parser.add_argument("--out", metavar="RESULT.csv", help="also write the table of deviations as CSV")
    parser.add_argument("--skip-errors", action="store_true",
                        help="list rows that cannot be checked as errors and judge the others (exit 0 or 1 by "
                             "them); without it any such row refuses the file (exit 2)")
    parser.add_argument("--coverage", type=float, default=2.0, metavar="K",
                        help="coverage factor k of the expanded uncertainty U = k u for files with an "
                             "uncertainty_deg column (default 2)")


def _same_file(one: str, other: str) -> bool:
    """True when both paths name one file (device and inode: a symlink or hard link counts)."""
    try:
        return os.path.samefile(one, other)
    except OSError:
        return False


def run_batch(args, stdin, stdout) -> int:
    from core.atomic_file import write_atomically
    from core.batch import run_batch as batch_check
    from core.check import CheckSettings
    from core.printable import printable

    tolerance, unit = args.tolerance.degrees, args.show_units
    try:
        settings = CheckSettings(total_tolerance_deg=tolerance)
    except FramewrightError as error:
        raise _Refused(f"--tolerance: {error}") from None
    if args.out and _same_file(args.out, args.file):
        raise _Refused(f"--out {printable(args.out)}: that is the input file {printable(args.file)} (the same "
                       f"file by another name or link); expected another file")
    text = read_file_text(args.file)
    try:
        result, table = batch_check(text, settings, coverage=args.coverage)
    except FramewrightError as error:
        raise _Refused(f"{printable(args.file)}: {printable(error)}") from None
    errors = result.error_count
    if errors and not getattr(args, "skip_errors", False):
        first = result.problems[0].message
        more = f" (and {errors - 1} more)" if errors > 1 else ""
        raise _Refused(f"{printable(args.file)}: {errors} of {len(result.names)} rows cannot be checked: "
                       f"{printable(first)}{more}; expected every row readable, or --skip-errors to list them "
                       f"as errors and judge the others")
    if errors == len(result.names):
        raise _Refused(f"{printable(args.file)}: none of the {errors} rows can be checked: "
                       f"{printable(result.problems[0].message)}; expected at least one readable row")
    if args.out:
        try:
            write_atomically(args.out, table.encode("utf-8"))
        except OSError as error:
            raise _Refused(f"--out {printable(args.out)}: cannot be written ({error.strerror or error}); "
                           f"nothing was written") from None
    names = [printable(name) for name in result.names]
    width = max(len("mount"), *(len(name) for name in names))
    problems = result.problem_texts()
    decided = result.decision is not None
    symbol = "deg" if unit in ("deg", "dms") else units.ANGLE_UNITS[unit].symbol
    per = units.ANGLE_UNITS[unit].per_base if unit != "dms" else 1.0     # the table's numbers in that unit
    column = f"deviation ({symbol})"
    lines = [f"{'mount'.ljust(width)}  {column:>15}  result   {f'margin ({symbol})':>13}"
             + (f"  {f'u ({symbol})':>7}  decision (ISO 14253-1)" if decided else "")]
    for row, (name, total, passed, margin) in enumerate(zip(names, result.total_deg, result.passed,
                                                             result.margin_deg)):
        if row in problems:
            lines.append(f"{name.ljust(width)}  {'-':>15}  {'ERROR':<6} {'-':>13}  {printable(problems[row])}")
        else:
            line = f"{name.ljust(width)}  {total * per:15.4f}  {'pass' if passed else 'FAIL':<6} {margin * per + 0.0:13.4f}"
            if decided:
                line += f"  {result.uncertainty_deg[row] * per:7.4f}  {result.decision[row]}"
            lines.append(line)
    failed = result.failed_count
    lines.append(f"{len(names)} mounts, {failed} outside the tolerance of {shown(tolerance, unit, _n)}, "
                 f"{result.passed_count} within, {errors} in error (not checked)"
                 + (f"; results written to {printable(args.out)}" if args.out else ""))
    counts = result.decision_counts()
    if decided:
        lines.append(f"with U = {_n(result.coverage)} u: {counts['conforms']} conform, {counts['does not conform']}"
                     f" do not conform, {counts['cannot decide']} cannot be decided within the uncertainty")
    lines += [f"note: {printable(note)}" for note in result.notes]
    stdout.write("\n".join(lines) + "\n")
    if decided:     # ISO 14253-1: a proven non-conformity first, then an undecided row
        return EXIT_OUTSIDE if counts["does not conform"] else EXIT_UNDECIDED if counts["cannot decide"] else EXIT_OK
    return EXIT_OUTSIDE if failed else EXIT_OK


# ---------------------------------------------------------------------------------------------------
# correct
# ---------------------------------------------------------------------------------------------------
def add_correct_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("nominal", metavar="NOMINAL", help="the nominal orientation as text ('-': standard input)")
    parser.add_argument("measured", metavar="MEASURED", help="the measured orientation as text ('-': standard input)")
    add_reading_options(parser)
    parser.add_argument("--axes", metavar="A1;A2[;A3]",
                        help="the mount's adjustment axes in the order they are turned, each +X/-Y/Z or three "
                             "numbers, e.g. \"+Z; 0.2 1 0\"")
    parser.add_argument("--frame", choices=("body", "reference"), default="body",
                        help="the frame the adjustment axes are written in (default body)")
    parser.add_argument("--footprint", metavar="FILE",
                        help="the feet (or bolt points) in body coordinates, in --lengths (mm by default): one "
                             "'x y z' a line")
    parser.add_argument("--face-normal", metavar="AXIS",
                        help="outward normal of the mounting face (+X/-Z or three numbers); default: the feet's "
                             "plane, on the side away from the body origin")
    parser.add_argument("--pivot", type=int, default=1, metavar="N", help="the foot that stays put (default 1)")
    parser.add_argument("--pitch", type=float, metavar="P", help="thread pitch of levelling screws per turn, in "
                                                                 "--lengths (mm by default)")
    parser.add_argument("--lengths", choices=("mm", "in", "thou"), default="mm",
                        help="the unit of the feet, the pitch and the printed shims (thou: a thousandth of an "
                             "inch, not an angular mil); the JSON keeps millimetres and names it")
    parser.add_argument("--json", action="store_true", help="print one JSON object")


def _floats(values) -> list:
    return [float(v) + 0.0 for v in values]


def run_correct(args, stdin, stdout) -> int:
    from core.correction import adjustment_angles, correction, read_axes
    from core.shims import outward_normal, read_footprint, shims

    if args.nominal == "-" and args.measured == "-":
        raise _Refused("only one of NOMINAL and MEASURED can be read from standard input")
    hints = hints_from(args)
    nominal = decode_or_refuse(read_text(args.nominal, stdin), hints, "nominal: ")[0]
    measured = decode_or_refuse(read_text(args.measured, stdin), hints, "measured: ")[0]
    fix = correction(nominal.orientation, measured.orientation)
    data = {"correction_body": {"angle_deg": fix.angle_deg, "axis": None if fix.axis_body is None else
                                _floats(fix.axis_body), "small_angles_deg": _floats(fix.small_angles_body_deg)},
            "correction_reference": {"angle_deg": fix.angle_deg, "axis": None if fix.axis_reference is None else
                                     _floats(fix.axis_reference),
                                     "small_angles_deg": _floats(fix.small_angles_reference_deg)},
            "meaning": "measured @ correction_body = nominal; correction_reference @ measured = nominal",
            "adjustment": None, "shims": None}
    try:
        if args.axes is not None:
            target = fix.body if args.frame == "body" else fix.reference
            adjust = adjustment_angles(target, read_axes(args.axes))
            data["adjustment"] = {"frame": args.frame, "axes": [list(a) for a in adjust.axes],
                                  "angles_deg": list(adjust.angles_deg), "residual_deg": adjust.residual_deg,
                                  "exact": adjust.exact}
        if args.footprint is not None:
            feet = units.to_millimetres(read_footprint(read_file_text(args.footprint)), args.lengths)
            pitch_mm = None if args.pitch is None else float(units.to_millimetres(args.pitch, args.lengths))
            if args.face_normal is None:
                normal = outward_normal(feet)
            else:
                from core.check import axis_vector
                from core.correction import read_axes as read_directions
                normal = axis_vector(tuple(read_directions(args.face_normal)[0]), "face normal")
            result = shims(fix.body, feet, normal, pivot=args.pivot - 1, pitch_mm=pitch_mm)
            data["shims"] = {"face_normal": _floats(normal), "pivot_foot": args.pivot,
                             "feet_mm": [_floats(f) for f in feet], "shims_mm": _floats(result.shims_mm),
                             "screw_turns": None if result.turns is None else _floats(result.turns),
                             "pitch_mm": pitch_mm, "length_unit": args.lengths, "tilt_deg": result.tilt_deg,
                             "twist_deg": result.twist_deg, "pivot_lifted_mm": result.pivot_lifted_mm}
    except FramewrightError as error:
        raise _Refused(str(error)) from None
    if args.json:
        stdout.write(formats.json_object_text(data))
        return EXIT_OK
    stdout.write("\n".join(_correction_lines(fix, data)) + "\n")
    return EXIT_OK


def _about_words(angle, axis, frame) -> str:
    return "no correction needed" if axis is None else \
        f"{_n(angle)} deg about ({', '.join(_n(v) for v in axis)}) in {frame} axes"


def _correction_lines(fix, data) -> list[str]:
    lines = ["correction (turns the part from measured to nominal):",
             f"  {_about_words(fix.angle_deg, fix.axis_body, 'body')}",
             f"  {_about_words(fix.angle_deg, fix.axis_reference, 'reference')}",
             f"  small turns about body X, Y, Z (deg): {', '.join(_n(v) for v in fix.small_angles_body_deg)}"]
    adjust = data["adjustment"]
    if adjust:
        lines.append(f"adjustment angles about the given {adjust['frame']} axes, in order:")
        for i, (axis, angle) in enumerate(zip(adjust["axes"], adjust["angles_deg"]), start=1):
            lines.append(f"  {i}. about ({', '.join(_n(v) for v in axis)}): {_n(angle)} deg")
        lines.append("  these reach the correction exactly" if adjust["exact"] else
                     f"  these axes cannot reach the correction: {_n(adjust['residual_deg'])} deg remains "
                     "(the least-squares answer)")
    shim = data["shims"]
    if shim:
        length = shim["length_unit"]
        in_length = lambda mm: units.millimetres_to(mm, length)      # noqa: E731  (mm kept, the unit shown)
        lines.append(f"shims under the footprint (face normal ({', '.join(_n(v) for v in shim['face_normal'])}), "
                     f"foot {shim['pivot_foot']} the pivot), {length}:")
        turns = shim["screw_turns"]
        decimals = {"mm": 4, "in": 5, "thou": 2}[length]
        for i, (foot, thickness) in enumerate(zip(shim["feet_mm"], shim["shims_mm"]), start=1):
            extra = "" if turns is None else f"   {turns[i - 1]:.3f} turns"
            lines.append(f"  foot {i} at ({', '.join(_n(float(v)) for v in in_length(foot))}): "
                         f"{float(in_length(thickness)):.{decimals}f}{extra}")
        lines.append(f"  tilt the shims make: {_n(shim['tilt_deg'])} deg; turn about the face normal left for the "
                     f"slotted holes: {_n(shim['twist_deg'])} deg")
        if shim["pivot_lifted_mm"] > 0:
            lines.append(f"  the pivot foot needs a shim too ({float(in_length(shim['pivot_lifted_mm'])):.{decimals}f} "
                         f"{length}): no shim can be "
                         "negative, so the thinnest set lifts every foot by that much")
    return lines


# ---------------------------------------------------------------------------------------------------
# average
# ---------------------------------------------------------------------------------------------------
def add_average_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("file", metavar="FILE",
                        help="repeated measurements of one mount: one orientation a line, or blocks separated by "
                             "blank lines (a matrix on three lines); '-' reads standard input")
    add_reading_options(parser)
    parser.add_argument("--weights", metavar="W1,W2,...",
                        help="how much each measurement counts, in the file's order (commas or spaces between; "
                             "0 or more, not all 0); default: all alike")
    parser.add_argument("--json", action="store_true", help="print one JSON object")


def _average_weights(text, count: int):
    """The --weights list, one number a measurement, or a refusal that says which is wrong."""
    from core.number_text import parse_number
    if text is None:
        return None
    cells = text.replace(",", " ").split()
    if len(cells) != count:
        raise _Refused(f"--weights: {len(cells)} weight(s) for {count} measurements; expected one for each")
    try:
        return [parse_number(cell) for cell in cells]
    except ValueError as error:
        raise _Refused(f"--weights: {error}") from None


def measurement_blocks(text: str) -> tuple[list[tuple[int, str]], bool]:
    """(first line number, text) of each measurement, and whether they are the lines of one block.
    Blocks between blank lines are measurements (a matrix on three lines); a file without blank lines
    holds one measurement a line. '#' lines are comments."""
    blocks, current = [], []
    for number, line in enumerate(text.replace("\r\n", "\n").replace("\r", "\n").split("\n"), start=1):
        if line.strip().startswith("#"):
            continue
        if line.strip():
            current.append((number, line))
        elif current:
            blocks.append(current)
            current = []
    if current:
        blocks.append(current)
    if len(blocks) == 1:
        return [(number, line) for number, line in blocks[0]], True
    return [(block[0][0], "\n".join(line for _, line in block)) for block in blocks], False


def run_average(args, stdin, stdout) -> int:
    from core.average import average

    text = read_text(args.file, stdin) if args.file == "-" else read_file_text(args.file)
    blocks, one_block = measurement_blocks(text)
    if not blocks:
        raise _Refused(f"{args.file}: holds no measurements; expected one orientation a line")
    hints = hints_from(args)
    if one_block and len(blocks) > 1:
        # Three lines of three numbers may be one matrix or three measurements: never guess which.
        try:
            whole = decode("\n".join(line for _, line in blocks), hints)
        except FramewrightError:
            whole = None
        if whole:
            raise _Refused(f"{args.file}: its lines read together as one orientation ({whole[0].label}); put one "
                           "measurement a line, or separate measurements by blank lines")
    readings = []
    for line, block in blocks:
        found = decode_or_refuse(block, hints, f"{args.file} line {line}: ")
        readings.append((line, found))
    first_label = readings[0][1][0].label
    for line, found in readings:
        if found[0].label != first_label:
            raise _Refused(f"{args.file} line {line}: read as {found[0].label} but the first measurement as "
                           f"{first_label}; options such as --kind make them read alike")
    weights = _average_weights(args.weights, len(readings))
    try:
        result = average([found[0].orientation for _, found in readings], weights)
    except FramewrightError as error:
        raise _Refused(f"{args.file}: {error}") from None
    summary = formats.summary(result.mean, args.sequence or "ZYX", True if args.intrinsic is None else args.intrinsic)
    ambiguous = sum(len(found) > 1 for _, found in readings)
    notes = [f"{ambiguous} measurement(s) had more than one reading; each was read as {first_label} (options such "
             "as --kind make it unique)"] if ambiguous else []
    table = [{"line": line, "angle_to_average_deg": float(angle), "flagged": i in result.flagged}
             for i, ((line, _), angle) in enumerate(zip(readings, result.angles_deg))]
    if args.json:
        stdout.write(formats.json_object_text({
            "measurements": result.count, "read_as": first_label, "weights": weights, **summary,
            "rms_deg": result.rms_deg,
            "max_deg": result.max_deg, "standard_uncertainty_deg": result.standard_uncertainty_deg,
            "flagged_lines": [readings[i][0] for i in result.flagged], "scatter": table, "notes": notes}))
        return EXIT_OK
    lines = [f"average of {result.count} measurements (read as {first_label})"] + orientation_lines(summary)
    lines.append(f"  scatter: RMS {_n4(result.rms_deg)} deg, largest {_n4(result.max_deg)} deg")
    if result.standard_uncertainty_deg is not None:
        lines.append(f"  standard uncertainty of the average: {_n4(result.standard_uncertainty_deg)} deg per axis "
                     "(from the scatter, over sqrt(n))")
    lines.append("   line   angle to the average (deg)")
    for row in table:
        lines.append(f"  {row['line']:>5}   {_n4(row['angle_to_average_deg']):>10}"
                     + ("   flagged: more than 3 scatters from the others" if row["flagged"] else ""))
    lines += [f"note: {note}" for note in notes]
    stdout.write("\n".join(lines) + "\n")
    return EXIT_OK


# ---------------------------------------------------------------------------------------------------
# open
# ---------------------------------------------------------------------------------------------------
def add_open_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("session", metavar="FILE", help="a session file (*.fwsession.json) to open in the window")


def run_open(args, stdin, stdout) -> int:
    """Read the file here first, so a damaged one is one line on stderr and no window; then check that
    there is a display (Qt would abort the process without one); then hand over to the window through
    the opener app/main.py gives (the command line never imports the window, so it never loads Qt)."""
    from core.session import load_session

    try:
        load_session(args.session)
    except FramewrightError as error:
        raise _Refused(str(error)) from None
    problem = open_display_problem()
    if problem is not None:
        raise _Refused(problem)
    if args.open_window is None:
        raise _Refused("opening a window needs the program's entry point (framewright open FILE)")
    return args.open_window(args.session)


# ---------------------------------------------------------------------------------------------------
# report, verify-report
# ---------------------------------------------------------------------------------------------------
def add_report_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("session", metavar="SESSION", help="a session file (*.fwsession.json)")
    which = parser.add_mutually_exclusive_group()
    which.add_argument("--check", metavar="NAME", help="the record of one check of the session, by its name")
    which.add_argument("--all", action="store_true", help="every mount and every check (the default)")
    parser.add_argument("-o", "--out", metavar="OUT.pdf|OUT.html", required=True,
                        help="the report to write; its suffix says PDF or HTML (written whole or not at all)")
    for flag, field in (("--operator", "Operator"), ("--instrument", "Instrument"),
                        ("--calibration-due", "Instrument calibration due")):
        parser.add_argument(flag, metavar="TEXT", help=f"fills the report's '{field}' line (blank to fill by hand)")
    parser.add_argument("--points", metavar="POINTS.csv",
                        help="with --check: the point pairs the check's measured orientation was fitted from (the "
                             "columns 'framewright fit' reads); the record adds the fit's residual table")
    parser.add_argument("--points-unit", default="mm", choices=POINT_UNITS,
                        help="the length unit of the points (default mm)")
    parser.add_argument("--units", dest="show_units", default="deg", metavar="UNIT",
                        choices=tuple(k for k in units.ANGLE_UNITS if k != "dms"),
                        help="print the report's angles in this unit: " + ", ".join(
                            f"{u.key} ({u.name})" for u in units.ANGLE_UNITS.values() if u.key != "dms"))
    parser.add_argument("--slope-units", dest="slope_units", default="deg", metavar="UNIT",
                        choices=tuple(units.SLOPE_UNITS),
                        help="also print the level readings as slopes in this unit: " + ", ".join(
                            f"{u.key} ({u.name})" for u in units.SLOPE_UNITS.values() if u.key != "deg"))


POINT_UNITS = ("mm", "cm", "m", "um", "in", "ft")


def _report_fit(args):
    """The point fit of --points (None without it), refused by name when it cannot be made."""
    if args.points is None:
        return None
    if args.check is None:
        raise _Refused("--points goes with --check NAME: the residuals belong to one check's measured mount")
    from core.fit import fit_points
    from core.point_rows import RowsError, read_point_pairs

    text = read_file_text(args.points)
    try:
        pairs = read_point_pairs(text)
        return fit_points(pairs.nominal, pairs.measured, pairs.weights)
    except RowsError as error:
        raise _Refused(f"{printable(args.points)}: {error}") from None
    except FramewrightError as error:
        raise _Refused(f"{printable(args.points)}: not fitted: {error}") from None


def _report_target(out: str, session_path: str) -> str:
    from pathlib import Path

    if Path(out).suffix.lower() not in (".pdf", ".html", ".htm"):
        raise _Refused(f"{printable(out)}: expected an output file name ending in .pdf or .html")
    folder = Path(out).parent
    if not folder.is_dir():
        raise _Refused(f"{printable(out)}: the folder {printable(str(folder))} does not exist")
    if Path(out).is_dir():
        raise _Refused(f"{printable(out)} is a folder; expected a file name ending in .pdf or .html")
    if _same_file(out, session_path):
        raise _Refused(f"{printable(out)} is the session file itself; choose another name for the report")
    return out


def run_report(args, stdin, stdout) -> int:
    """Read the session and build the record first (a refusal loads no Qt); then hand it to the writer
    (app/report_with_qt.py), which draws the pictures and writes the file."""
    from pathlib import Path

    from core import inspection_record as records
    from core.session import load_session_and_bytes, name_problem

    try:
        session, raw = load_session_and_bytes(args.session)
    except FramewrightError as error:
        raise _Refused(str(error)) from None
    out = _report_target(args.out, args.session)
    free = {}
    for field, value in (("Operator", args.operator), ("Instrument", args.instrument),
                         ("Instrument calibration due", args.calibration_due)):
        if value is not None:
            problem = name_problem(value)
            if problem:
                raise _Refused(f"{field.lower()}: {problem}")
            free[field] = value
    name, digest = Path(args.session).name, records.sha256_of_bytes(raw)
    fit = _report_fit(args)
    try:
        shown = records.ReportUnits(args.show_units, args.slope_units)
        record = (records.check_record(session, args.check, name, digest, fit=fit, fit_unit=args.points_unit,
                                       fit_source=None if fit is None else Path(args.points).name, shown=shown)
                  if args.check is not None else records.session_record(session, name, digest, shown))
    except FramewrightError as error:
        raise _Refused(str(error)) from None
    if args.write_report is None:
        raise _Refused("writing a report needs the program's entry point (framewright report ...)")
    try:
        written = args.write_report(out, record, free)
    except OSError as error:
        raise _Refused(f"{printable(out)}: cannot be written ({error.strerror or error})") from None
    lines = [f"wrote {printable(written.path)}" + (f" ({written.pages} pages)" if written.pages else ""),
             f"record SHA-256 {record.sha256()}; session file SHA-256 {digest}"]
    if record.verdict:
        lines.append(f"verdict: {record.verdict}")
    if written.picture_problem:
        lines.append(f"note: the Scene picture is left out: {written.picture_problem}")
    stdout.write("\n".join(lines) + "\n")
    return EXIT_OK


def add_verify_report_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("report", metavar="REPORT", help="a report written by 'framewright report' (PDF or HTML)")
    parser.add_argument("session", metavar="SESSION", help="the session file it should be the record of")


def run_verify_report(args, stdin, stdout) -> int:
    """0 when every figure of the report is the session's (and, for HTML, the page prints what its numbers
    say); 1 naming the first figure that is not; 2 when either file cannot be read."""
    from pathlib import Path

    from core import inspection_record as records
    from core.record_files import first_printed_difference, read_report
    from core.record_values import expected_figures
    from core.session import load_session_and_bytes

    try:
        data, printed, kind = read_report(args.report)
        session, raw = load_session_and_bytes(args.session)
    except FramewrightError as error:
        raise _Refused(str(error)) from None
    try:
        record = records.record_for(session, data.get("scope"), data.get("check"), Path(args.session).name,
                                    records.sha256_of_bytes(raw), records.ReportUnits.from_numbers(data))
    except FramewrightError as error:     # e.g. the check the report names is not in this session
        stdout.write(f"NOT the record of this session: {printable(error)}\n")
        return EXIT_OUTSIDE
    embedded = {k: v for k, v in data.items() if k != "record_sha256"}
    try:
        expected = expected_figures(record.numbers()["figures"], data.get("version"))
    except FramewrightError as error:
        raise _Refused(f"{printable(args.report)}: {error}") from None
    problems = []
    difference = records.first_difference(data["figures"], expected)
    if difference:
        problems.append(f"a figure differs from the session: {difference}")
    if printed is not None:
        shown = first_printed_difference(data, printed)
        if shown:
            problems.append(f"the page does not print its own numbers: {shown}")
    if data.get("record_sha256") != records.numbers_sha256(embedded):
        problems.append("the report's numbers do not match the record SHA-256 it carries (they were edited)")
    if problems:
        stdout.write(f"NOT the record of this session: {printable(problems[0])}\n")
        return EXIT_OUTSIDE
    lines = [f"the {kind.upper()} report's {len(data['figures'])} figures are this session's numbers "
             f"(record SHA-256 {data['record_sha256']})"]
    fitted = sum(1 for f in data["figures"] if ".fit_" in str(f.get("key")))
    if fitted:
        lines[0] = (f"the {kind.upper()} report's {len(data['figures']) - fitted} figures of the session are "
                    f"this session's numbers (record SHA-256 {data['record_sha256']})")
        lines.append(f"note: its {fitted} figures of the point fit are as the report wrote them, not compared: "
                     "the session file does not keep the points")
    if data.get("session_sha256") != records.sha256_of_bytes(raw):
        lines.append("note: the session file is not byte for byte the one the report names (its SHA-256 "
                     "differs), but every figure is the same")
    stdout.write("\n".join(lines) + "\n")
    return EXIT_OK


# ---------------------------------------------------------------------------------------------------
# The verbs and the entry point
# ---------------------------------------------------------------------------------------------------
VERBS = {
    "decode": ("read pasted text as an orientation and show its readings", add_decode_arguments, run_decode),
    "compare": ("deviation of a measured orientation from the nominal", add_compare_arguments, run_compare),
    "fit": ("best-fit orientation from point pairs in a CSV file, with residuals", add_fit_arguments, run_fit),
    "batch": ("deviations of many mounts in a CSV file against a tolerance", add_batch_arguments, run_batch),
    "correct": ("what to turn, and the shims, to bring a measured mount to its nominal", add_correct_arguments,
                run_correct),
    "average": ("the average of repeated measurements of one mount, with their scatter", add_average_arguments,
                run_average),
    "report": ("write the inspection record of a session or of one check, as PDF or HTML", add_report_arguments,
               run_report),
    "verify-report": ("say whether a report's numbers are those of a session file", add_verify_report_arguments,
                      run_verify_report),
    "open": ("open a session file in the window", add_open_arguments, run_open),
}


class _UsageError(Exception):
    """argparse found the command line itself wrong; reported as one line like any refusal."""


class _Parser(argparse.ArgumentParser):
    """argparse, except that a usage error is one line on stderr and exit 2, not a usage block."""

    def error(self, message):
        raise _UsageError(f"{message} (see '{self.prog} --help')")


def build_parser() -> argparse.ArgumentParser:
    parser = _Parser(
        prog="framewright",
        description="Decode, compare and hand on 3D orientations. With no command, opens the window.",
        epilog=f"Caution: {formats.SAFETY_CAUTION}.")
    commands = parser.add_subparsers(dest="verb", metavar="COMMAND", required=True, parser_class=_Parser)
    for name, (help_text, add_arguments, run) in VERBS.items():
        sub = commands.add_parser(name, help=help_text, description=help_text[0].upper() + help_text[1:] + ".")
        add_arguments(sub)
        sub.set_defaults(run=run)
    return parser


def one_line(text: str) -> str:
    """A message as one readable line: whitespace folded, control characters shown as escapes (a name
    holding terminal codes must not rewrite the screen), and cut to MAX_MESSAGE_CHARS."""
    text = " ".join(str(text).split())
    text = "".join(c if c.isprintable() else f"\\u{ord(c):04x}" for c in text)
    if len(text) > MAX_MESSAGE_CHARS:
        text = text[:MAX_MESSAGE_CHARS - 1] + "…"
    return text


def write_internal_error_log(error: BaseException) -> str:
    """The traceback of an internal error, in a file of its own; returns its path (or why it failed)."""
    import tempfile
    import time
    import traceback
    text = "".join(traceback.format_exception(type(error), error, error.__traceback__))
    try:
        directory = os.environ.get("FRAMEWRIGHT_LOG_DIR") or tempfile.gettempdir()
        stamp = time.strftime("%Y%m%d-%H%M%S")
        handle, path = tempfile.mkstemp(prefix=f"framewright-error-{stamp}-", suffix=".log", dir=directory)
        with os.fdopen(handle, "w", encoding="utf-8", errors="backslashreplace") as log:
            log.write(text)
        return path
    except OSError as log_error:
        return f"(no log written: {log_error.strerror or log_error})"


class _ReaderMayLeave:
    """Standard output whose reader may stop reading (`framewright decode … | head`): the rest of the
    output is dropped and the verb still ends with its own exit status (a FAIL stays 1)."""

    def __init__(self, stream):
        self.stream, self.left = stream, False

    def write(self, text: str) -> int:
        if not self.left:
            try:
                self.stream.write(text)
                self.stream.flush()
            except BrokenPipeError:
                self.left = True
                _quiet_stdout()
        return len(text)

    def flush(self) -> None:
        pass

    def __getattr__(self, name):
        return getattr(self.stream, name)


def _quiet_stdout() -> None:
    """After the reader has gone, point fd 1 at /dev/null so the interpreter's last flush is silent."""
    try:
        devnull = os.open(os.devnull, os.O_WRONLY)
        os.dup2(devnull, sys.stdout.fileno())
    except (OSError, ValueError, AttributeError):
        pass


def main(argv=None, stdin=None, stdout=None, stderr=None, open_window=None, write_report=None) -> int:
    """Run one verb. Every outcome is an exit status and at most one line on stderr: 0 / 1 as the verb
    says, 2 for refused input and usage errors, 3 for an internal error (the traceback goes to a log).
    The two verbs that need Qt get it from app/main.py, so this module never imports Qt: `open_window(path)
    -> status` starts the window, `write_report(out, record, free) -> written` lays out and writes a report."""
    import warnings

    stdin, stdout, stderr = stdin or sys.stdin, _ReaderMayLeave(stdout or sys.stdout), stderr or sys.stderr
    argv = sys.argv[1:] if argv is None else list(argv)
    # Pasted text such as "-0.5,0,0,0.866" would look like an option to argparse: a leading space keeps
    # it text (the decoder ignores the space).
    argv = [" " + a if re.match(r"-\.?\d", a) else a for a in argv]
    verb = next((a for a in argv if a in VERBS), None)
    prefix = f"framewright {verb}" if verb else "framewright"
    try:
        args = build_parser().parse_args(argv)
        args.open_window, args.write_report = open_window, write_report
        with warnings.catch_warnings():
            # A floating-point warning means a number that cannot be trusted: an error, never a line
            # of noise on stderr beside an exit status of 0.
            warnings.simplefilter("error", RuntimeWarning)
            return args.run(args, stdin, stdout)
    except _UsageError as usage:
        stderr.write(f"{prefix}: usage: {one_line(usage)}\n")
        return EXIT_REFUSED
    except _Refused as refused:
        stderr.write(f"{prefix}: {one_line(refused)}\n")
        return EXIT_REFUSED
    except SystemExit:
        raise                       # --help and --version print and leave as argparse intends
    except KeyboardInterrupt:
        stderr.write(f"{prefix}: interrupted\n")
        return 130
    except BaseException as error:  # noqa: BLE001 - the contract: no bare traceback, ever
        log = write_internal_error_log(error)
        stderr.write(f"{prefix}: internal error ({one_line(type(error).__name__)}: "
                     f"{one_line(error)[:120]}); please report it with the traceback in {log}\n")
        return EXIT_INTERNAL


if __name__ == "__main__":
    sys.exit(main())
