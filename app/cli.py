"""The command line over the core: `framewright decode`, `compare`, `fit`, `batch` and `open`. Imports no
Qt (`open` hands over to the window through app/main.py, which loads Qt only then).

Each verb is one pair of functions, `add_<verb>_arguments(parser)` and `run_<verb>(args) -> exit status`,
listed once in VERBS.

Exit status: 0 done (and within tolerance), 1 outside the tolerance, 2 refused input, with one line on
stderr saying what is wrong and where, and nothing on stdout.
"""

from __future__ import annotations

import argparse
import os
import re
import sys

from core import formats
from core.check import CheckSettings, check
from core.decode import KINDS, DecodeHints, decode
from core.errors import FramewrightError

EXIT_OK, EXIT_OUTSIDE, EXIT_REFUSED = 0, 1, 2


class _Refused(Exception):
    """Input we cannot use; the message is the one stderr line."""


# ---------------------------------------------------------------------------------------------------
# Options shared by every verb that reads an orientation from text
# ---------------------------------------------------------------------------------------------------
def add_reading_options(parser: argparse.ArgumentParser) -> None:
    group = parser.add_argument_group("how to read the numbers (each one narrows the readings)")
    group.add_argument("--kind", choices=KINDS, help="what the numbers are")
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
    meaning = group.add_mutually_exclusive_group()
    meaning.add_argument("--transposed", dest="transposed", action="store_const", const=True,
                         help="the matrix is reference -> body (rows are the body axes)")
    meaning.add_argument("--as-written", dest="transposed", action="store_const", const=False,
                         help="the matrix is body -> reference (columns are the body axes)")


def hints_from(args) -> DecodeHints:
    return DecodeHints(kind=args.kind, sequence=args.sequence, intrinsic=args.intrinsic, order=args.order,
                       units=args.units, transposed=args.transposed)


def read_text(argument: str | None, stdin) -> str:
    if argument is None or argument == "-":
        return stdin.read()
    return argument


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
    return {"kind": reading.kind, "label": reading.label, "conventions": dict(conventions), **summary,
            "orthogonality_error": reading.orthogonality_error, "notes": list(reading.notes),
            "why": reading.why}


def _n(value: float) -> str:
    """Ten significant digits for reading; round-off dust below 5e-13 shows as 0."""
    value = float(value)
    text = f"{(0.0 if abs(value) < 5e-13 else value) + 0.0:.10g}"
    return "0" if text == "-0" else text


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
    lines.append(f"  rotation vector (deg): {', '.join(_n(v) for v in data['rotation_vector_deg'])}")
    lines.append(f"  angles {formats.spelled_sequence(data['sequence'], data['intrinsic'])} {kind} (deg): "
                 f"{', '.join(_n(v) for v in data['angles_deg'])}; gimbal margin {_n(data['gimbal_margin_deg'])} deg")
    return lines


def _n4(value: float) -> str:
    """Four significant digits, for residuals (their own uncertainty makes more digits noise)."""
    text = f"{float(value) + 0.0:.4g}"
    return "0" if text == "-0" else text


def reading_text(reading, args, rank: int, total: int) -> str:
    data = reading_object(reading, args)
    lines = [f"Reading {rank} of {total}: {reading.label}"] + orientation_lines(data)
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
    if args.json:
        data = reading_object(readings[0], args)
        if args.all:
            data["readings"] = [reading_object(r, args) for r in readings]
        stdout.write(formats.json_object_text(data))
        return EXIT_OK
    shown = readings if args.all else readings[:1]
    stdout.write("\n\n".join(reading_text(r, args, i, len(readings)) for i, r in enumerate(shown, 1)) + "\n")
    if not args.all and len(readings) > 1:
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
    parser.add_argument("--tolerance", type=float, metavar="DEG", help="allowed total deviation in degrees")
    parser.add_argument("--json", action="store_true", help="print one JSON object")


def run_compare(args, stdin, stdout) -> int:
    if args.nominal == "-" and args.measured == "-":
        raise _Refused("only one of NOMINAL and MEASURED can be read from standard input")
    if args.tolerance is not None and not (args.tolerance >= 0 and args.tolerance != float("inf")):
        raise _Refused(f"--tolerance must be a finite number of degrees, 0 or more; got {args.tolerance}")
    hints = hints_from(args)
    nominal_readings = decode_or_refuse(read_text(args.nominal, stdin), hints, "nominal: ")
    measured_readings = decode_or_refuse(read_text(args.measured, stdin), hints, "measured: ")
    nominal, measured = nominal_readings[0], measured_readings[0]
    # D = Nᵀ M in the nominal body frame, judged by the same rule as the Check panel and batch files
    result = check(nominal.orientation, measured.orientation,
                   CheckSettings(mode="total", total_tolerance_deg=180.0 if args.tolerance is None else args.tolerance))
    angle, axis = result.total_deg, result.axis
    within = None if args.tolerance is None else result.passed
    warnings = []
    for name, readings in (("nominal", nominal_readings), ("measured", measured_readings)):
        if len(readings) > 1:
            warnings.append(f"{name} read as {readings[0].label} (the most plausible of {len(readings)} "
                            "readings; options such as --kind make it unique)")
    if args.json:
        data = {"deviation_deg": angle, "axis": None if angle == 0 else [float(v) for v in axis],
                "axis_frame": "nominal body", "within_tolerance": within, "tolerance_deg": args.tolerance,
                "margin_deg": None if args.tolerance is None else args.tolerance - angle,
                "warnings": warnings, "nominal": reading_object(nominal, args),
                "measured": reading_object(measured, args)}
        stdout.write(formats.json_object_text(data))
    else:
        where = "no rotation" if angle == 0 else f"about ({', '.join(_n(v) for v in axis)}) in nominal body axes"
        lines = [f"deviation: {_n(angle)} deg {where}"]
        if args.tolerance is not None:
            margin = args.tolerance - angle
            lines.append(f"within tolerance {_n(args.tolerance)} deg (margin {_n(margin)} deg)" if within else
                         f"OUTSIDE tolerance {_n(args.tolerance)} deg (by {_n(-margin)} deg)")
        lines += [f"nominal: {nominal.label}", f"measured: {measured.label}"]
        lines += [f"warning: {w}" for w in warnings]
        stdout.write("\n".join(lines) + "\n")
    return EXIT_OUTSIDE if within is False else EXIT_OK


# ---------------------------------------------------------------------------------------------------
# Files
# ---------------------------------------------------------------------------------------------------
def read_file_text(path: str) -> str:
    """The text of a CSV file (UTF-8, a leading byte-order mark allowed), or a refusal naming the file."""
    try:
        with open(path, encoding="utf-8-sig", newline="") as handle:
            return handle.read()
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
    parser.add_argument("--unit", default="mm", help="length unit of the points, for the printout (default mm)")
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
    flagged = set(fit.flagged)
    worst = fit.worst_index
    points = [{"row": i + 1, "distance": float(fit.distances[i]), "residual": [float(v) for v in fit.residuals[i]],
               "flagged": i in flagged} for i in range(len(fit.distances))]
    if args.json:
        data = {"points": len(points), "unit": args.unit, **summary,
                "translation": [float(v) for v in fit.translation], "rms": fit.rms,
                "worst_row": worst + 1, "flag_threshold": fit.flag_threshold,
                "flagged_rows": [i + 1 for i in fit.flagged], "residuals": points,
                "residual_meaning": "measured - (R nominal + t), reference frame",
                "notes": list(pairs.notes) + list(fit.notes)}
        stdout.write(formats.json_object_text(data))
        return EXIT_OK
    unit = args.unit
    lines = [f"best fit of {len(points)} point pairs (measured = R nominal + t)"] + orientation_lines(summary)
    lines.append(f"  translation t (reference frame, {unit}): {', '.join(_n(v) for v in fit.translation)}")
    lines.append(f"  RMS residual {_n4(fit.rms)} {unit}; worst: row {worst + 1} at {_n4(fit.distances[worst])} {unit}")
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
    parser.add_argument("--tolerance", type=float, required=True, metavar="DEG",
                        help="allowed total deviation of each mount, in degrees")
    parser.add_argument("--out", metavar="RESULT.csv", help="also write the table of deviations as CSV")


def run_batch(args, stdin, stdout) -> int:
    from core.batch import run_batch as batch_check
    from core.check import CheckSettings

    try:
        settings = CheckSettings(total_tolerance_deg=args.tolerance)
    except FramewrightError as error:
        raise _Refused(f"--tolerance: {error}") from None
    text = read_file_text(args.file)
    try:
        result, table = batch_check(text, settings)
    except FramewrightError as error:
        raise _Refused(f"{args.file}: {error}") from None
    if args.out:
        if os.path.abspath(args.out) == os.path.abspath(args.file):
            raise _Refused(f"--out {args.out}: that is the input file; expected another file name")
        try:
            with open(args.out, "w", encoding="utf-8", newline="") as handle:
                handle.write(table)
        except OSError as error:
            raise _Refused(f"--out {args.out}: cannot be written ({error.strerror or error})") from None
    width = max(len("mount"), *(len(name) for name in result.names))
    lines = [f"{'mount'.ljust(width)}  deviation (deg)  result   margin (deg)"]
    for name, total, passed, margin in zip(result.names, result.total_deg, result.passed, result.margin_deg):
        lines.append(f"{name.ljust(width)}  {total:15.4f}  {'pass' if passed else 'FAIL':<6} {margin + 0.0:13.4f}")
    failed = result.failed_count
    lines.append(f"{len(result.names)} mounts, {failed} outside the tolerance of {_n(args.tolerance)} deg"
                 + (f"; results written to {args.out}" if args.out else ""))
    lines += [f"note: {note}" for note in result.notes]
    stdout.write("\n".join(lines) + "\n")
    return EXIT_OUTSIDE if failed else EXIT_OK


# ---------------------------------------------------------------------------------------------------
# open
# ---------------------------------------------------------------------------------------------------
def add_open_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("session", metavar="FILE", help="a session file (*.fwsession.json) to open in the window")


# Qt platforms that draw on a display server, and the variable that names the server of each. Qt aborts
# the whole process when the one it tries cannot connect, so `open` looks before Qt is ever loaded.
_DISPLAY_PLATFORMS = {"xcb": ("DISPLAY",), "wayland": ("WAYLAND_DISPLAY",), "wayland-egl": ("WAYLAND_DISPLAY",)}


def open_display_problem(environ=None, platform: str | None = None) -> str | None:
    """Why the window cannot be shown here (None: it can, as far as the environment tells)."""
    environ = os.environ if environ is None else environ
    if (platform or sys.platform) in ("win32", "darwin", "cygwin"):
        return None                       # the native platform needs no display variable
    requested = [p.split(":")[0].strip() for p in environ.get("QT_QPA_PLATFORM", "").split(";") if p.strip()]
    if any(p not in _DISPLAY_PLATFORMS for p in requested):
        return None                       # e.g. offscreen or vnc, chosen on purpose: no display needed
    candidates = requested or ["wayland", "xcb"]
    if any(environ.get(var) for p in candidates for var in _DISPLAY_PLATFORMS[p]):
        return None
    names = " and ".join(sorted({v for p in candidates for v in _DISPLAY_PLATFORMS[p]}))
    return (f"no display found ({names} not set); the window needs a desktop session "
            "(the other commands work without one)")


def run_open(args, stdin, stdout) -> int:
    """Read the file here first, so a damaged one is one line on stderr and no window; then check that
    there is a display (Qt would abort the process without one); then hand over to the window (the only
    verb that loads Qt, and only at this point)."""
    from core.session import load_session

    try:
        load_session(args.session)
    except FramewrightError as error:
        raise _Refused(str(error)) from None
    problem = open_display_problem()
    if problem is not None:
        raise _Refused(problem)
    from app.main import open_window
    return open_window(args.session)


# ---------------------------------------------------------------------------------------------------
# The verbs and the entry point
# ---------------------------------------------------------------------------------------------------
VERBS = {
    "decode": ("read pasted text as an orientation and show its readings", add_decode_arguments, run_decode),
    "compare": ("deviation of a measured orientation from the nominal", add_compare_arguments, run_compare),
    "fit": ("best-fit orientation from point pairs in a CSV file, with residuals", add_fit_arguments, run_fit),
    "batch": ("deviations of many mounts in a CSV file against a tolerance", add_batch_arguments, run_batch),
    "open": ("open a session file in the window", add_open_arguments, run_open),
}


def build_parser() -> argparse.ArgumentParser:
    parser = argparse.ArgumentParser(
        prog="framewright",
        description="Decode, compare and hand on 3D orientations. With no command, opens the window.",
        epilog=f"Caution: {formats.SAFETY_CAUTION}.")
    commands = parser.add_subparsers(dest="verb", metavar="COMMAND", required=True)
    for name, (help_text, add_arguments, run) in VERBS.items():
        sub = commands.add_parser(name, help=help_text, description=help_text[0].upper() + help_text[1:] + ".")
        add_arguments(sub)
        sub.set_defaults(run=run)
    return parser


def main(argv=None, stdin=None, stdout=None, stderr=None) -> int:
    stdin, stdout, stderr = stdin or sys.stdin, stdout or sys.stdout, stderr or sys.stderr
    argv = sys.argv[1:] if argv is None else list(argv)
    # Pasted text such as "-0.5,0,0,0.866" would look like an option to argparse: a leading space keeps
    # it text (the decoder ignores the space).
    argv = [" " + a if re.match(r"-\.?\d", a) else a for a in argv]
    args = build_parser().parse_args(argv)
    try:
        return args.run(args, stdin, stdout)
    except _Refused as refused:
        stderr.write(f"framewright {args.verb}: {' '.join(str(refused).split())}\n")
        return EXIT_REFUSED


if __name__ == "__main__":
    sys.exit(main())
