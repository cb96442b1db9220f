"""The inspection record: what a printed or filed report of one check (or of a whole session) says, as plain
data. The app renders it to PDF and HTML (app/report_document.py); the command line writes it and checks
it against the session again (`framewright report`, `framewright verify-report`). Numpy only; no Qt.

Every number a report prints is a `Figure`: a stable key (its place in the session, e.g.
``check[0].pointing_error``), a label for people, the values exactly as printed, and their unit. The
record's canonical JSON holds every figure and the session file's SHA-256; its own SHA-256 is printed on
every page. Rebuilding the record from the same session file gives the same figures, which is what
`verify-report` compares: the date and time, the operator and the other fields filled in by hand are not
figures.

Numbers are printed with the session's significant digits counted from the largest of each group (a
quaternion, a matrix, three angles) and trailing zeros dropped, so a typed −30.4 that came back through
the quaternion as −30.39999999999999 prints −30.4 and a component of 2e-17 prints 0. The decimal point
is '.', the minus sign the plain '-', so a number copied off the page reads back anywhere.
"""

from __future__ import annotations

import numpy as np

from core import describe, level, representations, sequences, units
from core.check import check, check_position
from core.correction import adjustment_angles, correction, read_axes
from core.decision import decide_setup, setup_figure_uncertainties
from core.errors import FramewrightError, InvalidInputError
from core.orientation import Orientation
from core.session import SavedCheck, Session
from core.shims import outward_normal, shims
# The record's values and comparison live in core/record_values.py; callers reach them through this module.
from core.record_values import (CAUTION, DECISION_RULE, DEGREES, DIMENSIONLESS, FREE_FIELDS,  # noqa: F401
                                MILLIMETRES, UNIT_VECTOR, WORDS, Figure, ReportUnits,
                                Picture, Record, RecordError, Section, Table, canonical_json, first_difference,
                                numbers_sha256, printed_numbers, sha256_of_bytes)


# ---------------------------------------------------------------------------------------------------
# Building it
# ---------------------------------------------------------------------------------------------------
class _Builder:
    def __init__(self, session: Session, shown: ReportUnits = ReportUnits()):
        self.session = session
        self.units = shown
        self.prefs = session.preferences
        self.digits = self.prefs.significant_digits
        self.preset = describe.frame_preset(session.reference_frame)

    def n(self, values) -> tuple:
        return printed_numbers(values, self.digits)

    def table(self, rows, by_column: bool = False) -> list[tuple]:
        """Rows of numbers printed together: the whole table as one group (the same decimals in every
        row), or each column as its own group when the columns are different quantities."""
        rows = [list(r) for r in rows]
        if not rows:
            return []
        if by_column:
            columns = [self.n([r[c] for r in rows]) for c in range(len(rows[0]))]
            return [tuple(column[i] for column in columns) for i in range(len(rows))]
        flat, width = self.n([v for r in rows for v in r]), len(rows[0])
        return [tuple(flat[i * width:(i + 1) * width]) for i in range(len(rows))]

    def angles(self, degrees):
        """Angles in the record's unit (a number or a list, as given)."""
        if self.units.angle == "deg":
            return degrees
        shown = units.degrees_to(np.asarray(degrees, dtype=float), self.units.angle)
        return shown.tolist() if np.ndim(shown) else float(shown)

    @property
    def angle_unit(self) -> str:
        return DEGREES if self.units.angle == "deg" else self.units.angle

    def fig(self, key, label, values, unit, shape=()) -> Figure:
        if unit == DEGREES:
            values, unit = self.angles(list(values)), self.angle_unit
        return Figure(key, label, self.n(values), unit, shape)

    def words(self, key, label, text) -> Figure:
        return Figure(key, label, (str(text),), WORDS)

    # -- one mount ------------------------------------------------------------------------------------
    def mount_items(self, index: int, role: str = "") -> list:
        mount = self.session.mounts[index]
        o = mount.orientation
        key = f"mount[{index}]"
        seq, intrinsic = self.prefs.sequence, self.prefs.intrinsic
        kind = "intrinsic" if intrinsic else "extrinsic"
        names = sequences.preset_names(seq, intrinsic)
        named = f" ({', '.join(names)})" if names else ""
        axis, angle = o.as_axis_angle()
        angles = o.as_angles(seq, intrinsic=intrinsic)
        margin = sequences.gimbal_margin(o, seq, intrinsic)
        items = [self.words(f"{key}.name", f"{role}mount" if role else "Mount", mount.name),
                 self.fig(f"{key}.quaternion_wxyz", "Quaternion (w, x, y, z), Hamilton, w not negative",
                          o.as_quaternion(), DIMENSIONLESS),
                 self.fig(f"{key}.matrix", "Rotation matrix, body → reference (v_ref = R · v_body; the columns "
                          "are the body axes)", o.as_matrix().ravel(), DIMENSIONLESS, (3, 3))]
        if angle == 0:
            items.append("Axis and angle: no rotation (angle 0; the axis is undefined).")
        else:
            items.append(self.fig(f"{key}.axis", "Rotation axis (x, y, z), in reference axes", axis, UNIT_VECTOR))
        items += [self.fig(f"{key}.angle", "Rotation angle about that axis (right-hand rule)", [angle], DEGREES),
                  self.fig(f"{key}.rotation_vector", "Rotation vector (x, y, z) = angle × axis",
                           o.as_rotation_vector(), DEGREES),
                  *self.parameter_items(key, o),
                  self.fig(f"{key}.angles", f"Angles {sequences.spelled_sequence(seq, intrinsic)} {kind}{named}",
                           angles.angles, DEGREES),
                  self.fig(f"{key}.gimbal_margin", f"Gimbal margin of {seq} {kind}"
                           + (" (in gimbal lock: only the first and third angles together are known)"
                              if margin.locked else ""), [margin.margin_deg], DEGREES)]
        if mount.position is not None:
            unit = mount.position.unit
            shown = mount.position.shown()
            items.append(Figure(f"{key}.position", "Position of the body origin (x, y, z), in reference axes",
                                self.n(shown), unit))
        items.append(self.level_table(key, o))
        if self.units.slope != "deg":
            items.append(self.slope_table(key, o))
        items.append(f"Where the body axes point (directions named as {self.preset.title}):")
        items += ["    " + line for line in describe.describe_orientation(o, self.preset)]
        if mount.notes.strip():
            items.append(f"Notes: {' '.join(mount.notes.split())}")
        return items

    def parameter_items(self, key: str, o: Orientation) -> list:
        """Every pure-number vector of the registry (the Gibbs vector, the modified Rodrigues parameters,
        and any added later), with its formula; where one does not exist (the Gibbs vector at a half turn)
        a line says so in its place."""
        items = []
        for r in representations.VECTORS:
            if r.units != representations.PURE:
                continue                     # the rotation vector is printed in angle units above
            label = f"{r.caption or r.title} (x, y, z) = {r.formula}, n the axis and φ the angle"
            if r is representations.MRP:
                label += ", the set of length at most 1"
            try:
                items.append(self.fig(f"{key}.{r.key}", label, r.values(o), DIMENSIONLESS))
            except InvalidInputError:
                items.append(f"{r.caption or r.title}: {r.half_turn_words or 'does not exist here'}.")
        return items

    def level_table(self, key: str, o: Orientation) -> Table:
        down = describe.gravity_direction(self.session.reference_frame)
        report = level.level_readings(o, down)
        printed = self.table(self.angles([r.tilt_deg, r.off_plumb_deg, r.from_up_deg]) for r in report.faces)
        rows = tuple(Figure(f"{key}.level[{r.face}]", f"face {r.face}, facing {r.facing}", values, self.angle_unit)
                     for r, values in zip(report.faces, printed))
        axis = int(np.argmax(np.abs(down)))
        down_name = describe.signed_axis_name(axis, int(np.sign(down[axis])))
        return Table(f"Level readings: what a level shows on each face (gravity along reference {down_name}, "
                     f"'down' in {self.preset.key.upper()})",
                     ("face", "tilt from level", "off plumb", "normal from straight up"), rows)

    def slope_table(self, key: str, o: Orientation) -> Table:
        """What a level shows on each face as a slope: the tilt of an up or down face from level, the lean
        of a side face from plumb (each at most 45°, so every slope is finite)."""
        report = level.level_readings(o, describe.gravity_direction(self.session.reference_frame))
        unit = units.SLOPE_UNITS[self.units.slope]
        shown = [float(units.tilt_to_slope(r.off_plumb_deg if r.facing == "side" else r.tilt_deg, unit.key))
                 for r in report.faces]
        rows = tuple(Figure(f"{key}.level_slope[{r.face}]", f"face {r.face}, "
                            + ("from plumb" if r.facing == "side" else "from level"), values, unit.symbol)
                     for r, values in zip(report.faces, self.table([v] for v in shown)))
        return Table(f"Level readings as slopes, {unit.name} (an up or down face from level, a side face from "
                     "plumb)", ("face", "slope"), rows)

    # -- one check ------------------------------------------------------------------------------------
    def check_items(self, index: int, saved: SavedCheck) -> tuple[list, str, Picture]:
        names = [m.name for m in self.session.mounts]
        for role, name in (("nominal", saved.nominal), ("measured", saved.measured)):
            if name is None:
                raise RecordError(f"check {saved.name!r} has no {role} mount chosen; choose one before a report")
            if name not in names:
                raise RecordError(f"check {saved.name!r}: its {role} mount {name!r} is not in the session")
        nominal_i, measured_i = names.index(saved.nominal), names.index(saved.measured)
        nominal, measured = self.session.mounts[nominal_i], self.session.mounts[measured_i]
        settings, setup = saved.settings, saved.adjustment
        key = f"check[{index}]"
        result = check(nominal.orientation, measured.orientation, settings)
        items = [self.words(f"{key}.name", "Check", saved.name),
                 self.words(f"{key}.nominal", "Nominal mount", nominal.name),
                 self.words(f"{key}.measured", "Measured mount", measured.name)]
        if settings.mode == "total":
            items.append(self.words(f"{key}.judged", "Judged by", "the total deviation"))
        else:
            axis = settings.body_axis if isinstance(settings.body_axis, str) else \
                "(" + ", ".join(self.n(settings.body_axis)) + ")"
            items.append(self.words(f"{key}.judged", "Judged by", f"the pointing error of body axis {axis} "
                                    "and the roll about it"))
        items.append("Deviation D = Nᵀ · M: the turn from the nominal body frame to the measured one, in "
                     "nominal body axes.")
        items.append(self.fig(f"{key}.total_deviation", "Total deviation (the angle of D)", [result.total_deg],
                              DEGREES))
        if result.total_deg > 0:
            items.append(self.fig(f"{key}.deviation_axis", "Axis of D (x, y, z), in nominal body axes",
                                  result.axis, UNIT_VECTOR))
        if result.pointing_deg is not None:
            items.append(self.fig(f"{key}.pointing_error", "Pointing error of the body axis",
                                  [result.pointing_deg], DEGREES))
            items.append(self.fig(f"{key}.roll", "Roll about the body axis (signed, right-hand rule)"
                                  + ("" if result.roll_defined else "; undefined: the axis points backwards"),
                                  [result.roll_deg], DEGREES))
        printed = self.table(self.angles([c.value_deg, c.tolerance_deg, c.margin_deg]) for c in result.criteria)
        rows = [Figure(f"{key}.criterion[{i}]", f"{c.name}: {'PASS' if c.passed else 'FAIL'}", values,
                       self.angle_unit)
                for i, (c, values) in enumerate(zip(result.criteria, printed))]
        items.append(Table("Figures against their tolerances (a figure equal to its tolerance passes)",
                           ("figure", "value", "tolerance", "margin"), tuple(rows)))
        verdict = "PASS" if result.passed else "FAIL"
        items.append(self.words(f"{key}.verdict", "Verdict", verdict))
        verdict_line = f"{verdict}: {self._criteria_words(result)}"
        items += [f"Note: {note}" for note in result.notes]
        if setup.uncertainty_deg is not None:
            pair = nominal.orientation, measured.orientation
            _, outcome = decide_setup(*pair, settings, result, setup)
            figures = setup_figure_uncertainties(*pair, settings, setup)
            u, k = setup.uncertainty_deg, setup.coverage
            items.append(DECISION_RULE + ".")
            items += [self.fig(f"{key}.uncertainty", "Standard uncertainty u of the measured orientation", [u],
                               DEGREES),
                      self.fig(f"{key}.coverage", "Coverage factor k", [k], DIMENSIONLESS),
                      self.fig(f"{key}.expanded_uncertainty", "Expanded uncertainty U = k·u", [k * u], DEGREES)]
            if figures is not None:        # judged with each figure's own u, propagated from the covariance
                names = [c.name for c in result.criteria]
                items.append(self.fig(f"{key}.figure_uncertainties", "Standard uncertainty of each figure, "
                                      f"propagated from the orientation's covariance ({', '.join(names)})",
                                      [figures[n] for n in names], DEGREES))
            items.append(self.words(f"{key}.decision", "Decision (ISO 14253-1)", outcome))
            verdict_line += (f"; ISO 14253-1 decision: {outcome} (U = {self.n([self.angles(k * u)])[0]} "
                             f"{self.angle_unit}, k = {self.n([k])[0]})")
        else:
            items.append("No measurement uncertainty was given: the verdict is the plain comparison, with no "
                         "guard band (an ISO 14253-1 decision needs U).")
        offset = check_position(nominal.orientation, nominal.position, measured.position,
                                settings.position_tolerance_mm)
        if offset is not None:
            items.append(self.fig(f"{key}.position_offset", "Position offset of the measured origin from the "
                                  "nominal one", [offset.distance_mm], MILLIMETRES))
            items.append(self.fig(f"{key}.position_offset_axes", "The offset along the nominal body axes "
                                  "(x, y, z)", offset.along_nominal_mm, MILLIMETRES))
            if offset.judged:
                items.append(self.words(f"{key}.position_verdict", f"Position against "
                                        f"{self.n([offset.tolerance_mm])[0]} mm", "PASS" if offset.passed else "FAIL"))
        items += self.correction_items(key, nominal.orientation, measured.orientation, setup)
        picture = Picture(measured.orientation, nominal.orientation, f"nominal, {nominal.name}", measured.part,
                          self.session.reference_frame)
        return items, verdict_line, picture

    @staticmethod
    def _criteria_words(result) -> str:
        return "; ".join(f"{c.name} {'within' if c.passed else 'exceeds'} its tolerance" for c in result.criteria)

    def correction_items(self, key, nominal, measured, setup) -> list:
        fix = correction(nominal, measured)
        items = ["Correction C (turns the part from measured to nominal: M · C = N in body axes)."]
        if fix.axis_body is None:
            items.append("No correction needed: the measured orientation is the nominal.")
            return items
        items += [self.fig(f"{key}.correction_angle", "Correction angle", [fix.angle_deg], DEGREES),
                  self.fig(f"{key}.correction_axis_body", "Correction axis (x, y, z), in body axes",
                           fix.axis_body, UNIT_VECTOR),
                  self.fig(f"{key}.correction_axis_reference", "Correction axis (x, y, z), in reference axes",
                           fix.axis_reference, UNIT_VECTOR),
                  self.fig(f"{key}.correction_small_turns", "Small turns about body X, Y, Z",
                           fix.small_angles_body_deg, DEGREES)]
        try:
            if setup.axes:
                target = fix.body if setup.axes_frame == "body" else fix.reference
                adjust = adjustment_angles(target, read_axes(setup.axes))
                printed = self.table([self.angles(a)] for a in adjust.angles_deg)
                rows = tuple(Figure(f"{key}.adjustment[{i}]", f"{i + 1}. about ({', '.join(self.n(axis))})",
                                    values, self.angle_unit)
                             for i, (axis, values) in enumerate(zip(adjust.axes, printed)))
                items.append(Table(f"Adjustment angles about the mount's {setup.axes_frame} axes, in the order "
                                   "they are turned", ("axis", "angle"), rows))
                items.append("These reach the correction exactly." if adjust.exact else
                             self.fig(f"{key}.adjustment_residual", "These axes cannot reach the correction; "
                                      "what remains (least squares)", [adjust.residual_deg], DEGREES))
            if setup.footprint:
                normal = outward_normal(setup.footprint)
                result = shims(fix.body, setup.footprint, normal, pivot=setup.pivot, pitch_mm=setup.pitch_mm)
                columns = ("foot", "shim") + (("screw turns",) if result.turns is not None else ())
                rows = []
                numbers = [[t] + ([] if result.turns is None else [result.turns[i]])
                           for i, t in enumerate(result.shims_mm)]
                for i, (foot, values) in enumerate(zip(setup.footprint, self.table(numbers, by_column=True))):
                    rows.append(Figure(f"{key}.shim[{i}]", f"foot {i + 1} at ({', '.join(self.n(foot))}) mm"
                                       + (" (the pivot)" if i == setup.pivot else ""), values,
                                       MILLIMETRES + ("; turns" if result.turns is not None else "")))
                items.append(Table(f"Shims under the footprint (face normal ({', '.join(self.n(normal))}), body axes)",
                                   columns, tuple(rows)))
                items.append(self.fig(f"{key}.shim_tilt", "Tilt the shims make", [result.tilt_deg], DEGREES))
                items.append(self.fig(f"{key}.shim_twist", "Turn about the face normal left for the slotted holes",
                                      [result.twist_deg], DEGREES))
        except FramewrightError as error:
            items.append(f"The adjustment set up with this check cannot be worked out: {error}")
        return items

    # -- fit residuals --------------------------------------------------------------------------------
    def fit_items(self, key: str, fit, rows=None, unit: str = "mm", source: str | None = None) -> list:
        """The residual table of a point fit (core/fit.PointFit); `rows` are the 1-based row numbers."""
        numbers = rows if rows is not None else list(range(1, len(fit.distances) + 1))
        head = [f"The measured orientation is the best fit of {len(fit.distances)} point pairs "
                "(measured = R · nominal + t, nominal in body axes, measured in reference axes); a residual is "
                "measured − fitted."]
        if source is not None:
            head.insert(0, self.words(f"{key}.fit_points", "Points file", source))
        if fit.flag_threshold is not None:
            head.append(self.fig(f"{key}.fit_flag_threshold",
                                 f"Flag threshold of the residual distance ({fit.flag_rule})", [fit.flag_threshold],
                                 unit))
        flagged = set(fit.flagged)
        table_rows = []
        printed = self.table([*residual, distance] for residual, distance in zip(fit.residuals, fit.distances))
        for i, values in enumerate(printed):
            mark = " (flagged)" if i in flagged else " (worst)" if i == fit.worst_index else ""
            table_rows.append(Figure(f"{key}.fit_residual[{i}]", f"row {numbers[i]}{mark}", values, unit))
        return [*head, self.fig(f"{key}.fit_rms", "RMS residual of the point fit", [fit.rms], unit),
                Table(f"Residuals of the point fit (measured − fitted, reference axes), {unit}",
                      ("point", "x", "y", "z", "distance"), tuple(table_rows))]


# A fit's residuals are printed only for the orientation they belong to: the measured mount must be the
# fit itself (a session file keeps the quaternion to the last digit, so a saved fit is far closer).
FIT_AGREEMENT_DEG = 1e-6


def _conventions(session: Session, digits: int, shown: ReportUnits) -> tuple:
    angles = units.ANGLE_UNITS[shown.angle].name
    return ("An orientation R maps body to reference: v_ref = R · v_body, so the columns of R are the body "
            "axes in reference coordinates.",
            "Quaternions are Hamilton (i j = k), written w first, with w not negative; q and −q are the same "
            "orientation.",
            f"Angles are in {angles}. Intrinsic angles turn about the moving body axes, extrinsic about the fixed "
            "reference axes.",
            f"Numbers are printed to {digits} significant digits counted from the largest of each group, "
            "trailing zeros dropped; '.' is the decimal point.",
            f"Reference frame: {describe.frame_preset(session.reference_frame).title}. It names directions and "
            "sets where gravity points; it never changes R.")


def find_check(session: Session, name: str) -> tuple[int, SavedCheck]:
    checks = session.checks
    for i, saved in enumerate(checks):
        if saved.name == name:
            return i, saved
    known = ", ".join(repr(c.name) for c in checks[:10]) or "none"
    raise RecordError(f"no check named {name!r} in the session; its checks: {known}")


def check_record(session: Session, check_name: str, session_name: str, session_sha256: str,
                 fit=None, fit_rows=None, fit_unit: str = "mm", fit_source: str | None = None,
                 shown: ReportUnits = ReportUnits()) -> Record:
    """The record of one check: its nominal and measured mounts and everything the check works out.
    `fit`: the point fit the measured orientation came from (core/fit.PointFit), when there is one.
    `shown`: the units angles and level slopes are printed in."""
    b = _Builder(session, shown)
    index, saved = find_check(session, check_name)
    items, verdict, picture = b.check_items(index, saved)
    names = [m.name for m in session.mounts]
    nominal_i, measured_i = names.index(saved.nominal), names.index(saved.measured)
    sections = [Section(f"Check “{saved.name}”: {verdict.split(':')[0]}", tuple(items), picture),
                Section("Nominal", tuple(_clean(b.mount_items(nominal_i, "Nominal ")))),
                Section("Measured", tuple(_clean(b.mount_items(measured_i, "Measured "))))]
    if fit is not None:
        apart = fit.orientation.angle_to(session.mounts[measured_i].orientation)
        if apart > FIT_AGREEMENT_DEG:
            raise RecordError(f"the measured mount {saved.measured!r} is not the fit of "
                              f"{fit_source or 'the points'}: they are {apart:.6g}° apart (at most "
                              f"{FIT_AGREEMENT_DEG:g}° expected), so the residuals would describe another "
                              "orientation")
        sections.append(Section("The measured orientation's point fit", tuple(b.fit_items(
            f"check[{index}]", fit, fit_rows, fit_unit, fit_source))))
    return Record(f"Inspection record: {session.mounts[measured_i].name}", "check", saved.name, session_name,
                  session_sha256, b.preset.title, b.digits, _conventions(session, b.digits, shown), tuple(sections),
                  verdict, fit_source=fit_source, units=shown)


def session_record(session: Session, session_name: str, session_sha256: str,
                   shown: ReportUnits = ReportUnits()) -> Record:
    """The record of a whole session: every mount, then every check that names both its mounts (a check
    that does not is listed as not judged)."""
    b = _Builder(session, shown)
    sections = []
    for i, mount in enumerate(session.mounts):
        picture = Picture(mount.orientation, Orientation.identity(), "reference", mount.part, session.reference_frame)
        sections.append(Section(f"Mount {i + 1}: {mount.name}", tuple(_clean(b.mount_items(i))), picture))
    for i, saved in enumerate(session.checks):
        try:
            items, verdict, picture = b.check_items(i, saved)
        except RecordError as why:
            sections.append(Section(f"Check “{saved.name}”: not judged", (f"Not judged: {why}",)))
            continue
        sections.append(Section(f"Check “{saved.name}”: {verdict.split(':')[0]}", tuple(items), picture))
    return Record(f"Inspection record: {session_name}", "all", None, session_name, session_sha256, b.preset.title,
                  b.digits, _conventions(session, b.digits, shown), tuple(sections), None, units=shown)


def _clean(items) -> list:
    return [item for item in items if item is not None]


def record_for(session: Session, scope: str, check_name: str | None, session_name: str,
               session_sha256: str, shown: ReportUnits = ReportUnits()) -> Record:
    """The record a report file names (its scope, check and units): what verify-report rebuilds."""
    if scope == "check":
        if not isinstance(check_name, str):
            raise RecordError("the report names no check")
        return check_record(session, check_name, session_name, session_sha256, shown=shown)
    if scope == "all":
        return session_record(session, session_name, session_sha256, shown)
    raise RecordError(f"unknown report scope {scope!r}; expected check or all")


__all__ = ["CAUTION", "DECISION_RULE", "FREE_FIELDS", "Figure", "Picture", "Record", "RecordError", "ReportUnits",
           "Section",
           "Table", "canonical_json", "check_record", "find_check", "first_difference", "numbers_sha256",
           "printed_numbers", "record_for", "session_record", "sha256_of_bytes"]
