"""The Adjust tab's "Repeated measurements" box: the selected mount's kept measurements, each with its
angle to their mean (those far from the others marked, as core/average.py flags them), the mean, the
scatter and the standard uncertainty of the mean; buttons to keep the current orientation as one more,
remove one, clear them, set the mount to their mean, and take the scatter as the check's uncertainty.

It renders from the model only (its panel calls render()); every button is one undo step in the model."""

from __future__ import annotations

import math
from dataclasses import replace

from PySide6.QtWidgets import (QComboBox, QGridLayout, QGroupBox, QLineEdit, QListWidget, QPushButton, QSizePolicy,
                               QVBoxLayout)

from app.plain_text import plain_label
from app.widgets.message_line import MessageLine
from app.text import numbers, significant
from app.model import SessionModel
from core import operations
from core.average import OUTLIER_SCATTERS
from core.errors import FramewrightError
from core.measurement import SOURCES
from core.number_text import parse_number

# The mount counts as being at the mean this close to it (degrees): then its uncertainty is the mean's.
AT_THE_MEAN_DEG = 1e-9
LIST_ROWS_SHOWN = 6                 # more rows scroll inside the list


class RepeatedMeasurementsBox(QGroupBox):
    def __init__(self, model: SessionModel, parent=None):
        super().__init__("Repeated measurements", parent)
        self.model = model
        self.mount_label = plain_label()
        self.mount_label.setWordWrap(True)
        self.list = QListWidget()
        self.list.setSizePolicy(QSizePolicy.Policy.Expanding, QSizePolicy.Policy.Fixed)
        self.list.setToolTip("Each kept measurement with its angle to the mean of them all.")
        self.summary_label = plain_label()
        self.summary_label.setWordWrap(True)
        self.source_box = QComboBox()
        for source in SOURCES:
            self.source_box.addItem(source)
        self.source_box.setToolTip("Where the orientation being kept came from; saved beside it.")
        self.weight_field = QLineEdit()
        self.weight_field.setPlaceholderText("weight 1")
        self.weight_field.setToolTip("How much the next measurement kept counts in the average against the others "
                                     "(empty: 1; 0 keeps it without counting it).")
        self.add_button = QPushButton("Add current")
        self.add_button.setToolTip("Keep the mount's orientation as the editors show it as one more measurement.")
        self.remove_button = QPushButton("Remove")
        self.remove_button.setToolTip("Remove the measurement chosen in the list.")
        self.clear_button = QPushButton("Clear")
        self.average_button = QPushButton("Use the average")
        self.average_button.setToolTip("Set the mount's orientation to the mean of its measurements.")
        self.scatter_button = QPushButton("Use the scatter as the uncertainty")
        self.scatter_button.setToolTip(
            "Fill the standard uncertainty u below from the scatter: the uncertainty of the mean while the "
            "mount is at the average, of one measurement otherwise. The check's measured mount must be the "
            "selected one.")
        self.message = MessageLine()

        buttons = QGridLayout()
        buttons.addWidget(plain_label("From"), 0, 0)
        buttons.addWidget(self.source_box, 0, 1)
        buttons.addWidget(self.add_button, 0, 2)
        buttons.addWidget(self.weight_field, 1, 0)
        buttons.addWidget(self.remove_button, 1, 1)
        buttons.addWidget(self.clear_button, 1, 2)
        layout = QVBoxLayout(self)
        layout.addWidget(self.mount_label)
        layout.addWidget(self.list)
        layout.addLayout(buttons)
        layout.addWidget(self.summary_label)
        layout.addWidget(self.average_button)
        layout.addWidget(self.scatter_button)
        layout.addWidget(self.message)

        self.add_button.clicked.connect(self._add)
        self.remove_button.clicked.connect(self._remove)
        self.clear_button.clicked.connect(lambda: self._run(lambda: self.model.clear_measurements(origin=self)))
        self.average_button.clicked.connect(lambda: self._run(lambda: self.model.use_average(origin=self)))
        self.scatter_button.clicked.connect(self._use_scatter)
        self.list.currentRowChanged.connect(lambda row: self.remove_button.setEnabled(row >= 0))
        self.render()

    def forget_message(self) -> None:
        self.message.say("")

    # ---- edits -------------------------------------------------------------------------------------
    def _run(self, edit) -> None:
        try:
            edit()
        except (ValueError, IndexError) as error:      # FramewrightError is a ValueError
            self.message.say(f"{error}", problem=True)
            return
        self.message.say("")

    def _add(self) -> None:
        text = self.weight_field.text().strip()
        try:
            weight = 1.0 if not text else parse_number(text)
        except ValueError as error:
            self.message.say(f"weight: {error} (nothing kept)", problem=True)
            return
        self._run(lambda: self.model.add_measurement(self.source_box.currentText(), origin=self, weight=weight))

    def _remove(self) -> None:
        row = self.list.currentRow()
        if row >= 0:
            self._run(lambda: self.model.remove_measurement(row, origin=self))

    def _use_scatter(self) -> None:
        result = self.model.current_average()
        if result is None or result.standard_uncertainty_deg is None:
            self.message.say("Keep two or more measurements to have a scatter.", problem=True)
            return
        _, measured = self.model.check_mount_indices()
        mount = self.model.current_mount()
        if measured is None:
            self.message.say("Choose a measured mount in the Check panel first.", problem=True)
            return
        if measured != self.model.selected_index:
            self.message.say(f"The check's measured mount is “{self.model.mounts[measured].name}”, not "
                              f"“{mount.name}”: select it to use its scatter.", problem=True)
            return
        at_mean = mount.orientation.angle_to(result.mean) <= AT_THE_MEAN_DEG
        # the mean's covariance is one measurement's over n (core/average.py), n counting the measurements of
        # weight above 0, so one measurement's u is √n times
        scale = 1.0 if at_mean else float(result.counted)
        u = result.standard_uncertainty_deg * math.sqrt(scale)
        # the covariance too, so each figure the check judges gets its own u (a scatter is seldom round)
        covariance = result.covariance_rad2 * scale * (180 / math.pi) ** 2
        check = self.model.check
        try:
            adjustment = replace(check.adjustment, uncertainty_deg=u, covariance_deg2=covariance.tolist())
        except FramewrightError as error:
            self.message.say(f"{error} (kept the last good value)", problem=True)
            return
        what = "of the mean (the mount is at the average)" if at_mean else \
            "of one measurement (the mount is not at the average)"
        self.model.apply(operations.set_check, replace(check, adjustment=adjustment), origin=self,
                         text=f"Use the scatter of {result.counted} measurements as the uncertainty")
        digits = self.model.preferences.significant_digits
        self.message.say(f"u = {significant(u, digits)}°, the standard uncertainty {what}.")

    # ---- model -> view -----------------------------------------------------------------------------
    def render(self) -> None:
        mount = self.model.current_mount()
        measured = mount.measurements
        result = self.model.current_average()
        row = self.list.currentRow()
        digits = self.model.preferences.significant_digits
        self.list.clear()
        flagged = set(result.flagged) if result is not None else set()
        for i, measurement in enumerate(measured):
            facts = []
            if measurement.weight != 1:
                facts.append(f"weight {significant(measurement.weight, digits)}")
            if result is not None:
                facts.append(f"{significant(result.angles_deg[i], digits)}° from the mean")
            if i in flagged:
                facts.append(f"FAR: over {OUTLIER_SCATTERS:g} scatters from the others")
            head = f"{i + 1}. {measurement.source or 'no source'}"
            self.list.addItem(head + (": " + ", ".join(facts) if facts else ""))
        # as tall as its rows, two to six of them: the tab keeps room for the decision below
        rows = min(max(self.list.count(), 2), LIST_ROWS_SHOWN)
        self.list.setFixedHeight(rows * self.list.fontMetrics().height() + 2 * self.list.frameWidth() + 6)
        if row >= 0 and self.list.count():              # keep the choice (the one before it after a removal)
            self.list.setCurrentRow(min(row, self.list.count() - 1))
        self.remove_button.setEnabled(self.list.currentRow() >= 0)
        self.clear_button.setEnabled(bool(measured))
        self.average_button.setEnabled(result is not None)
        self.scatter_button.setEnabled(result is not None and result.standard_uncertainty_deg is not None)
        count = len(measured)
        self.mount_label.setText(f"Of “{mount.name}”: " + (
            "none kept yet. Set the orientation in the editors (type, decode or fit it), then Add current."
            if not count else f"{count} kept" + (f", {len(flagged)} marked FAR" if flagged else "") + "."))
        self.summary_label.setText(self._summary(mount, result) if result is not None else
                                   "" if not count else "No average: every weight is 0.")

    def _summary(self, mount, result) -> str:
        prefs = self.model.preferences
        q = result.mean.as_quaternion(scalar_last=prefs.quaternion_order == "xyzw")
        order = "(x, y, z, w)" if prefs.quaternion_order == "xyzw" else "(w, x, y, z)"
        angles = result.mean.as_angles(prefs.sequence, intrinsic=prefs.intrinsic).angles
        kind = "intrinsic" if prefs.intrinsic else "extrinsic"
        digits = prefs.significant_digits
        lines = [f"Mean quaternion {order}: ({numbers(q, digits)})",
                 f"Mean, {kind} {prefs.sequence}: ({numbers(angles, digits)})°",
                 f"RMS scatter: {significant(result.rms_deg, digits)}°",
                 f"Largest angle to the mean: {significant(result.max_deg, digits)}°"]
        if result.standard_uncertainty_deg is None:
            lines.append("Standard uncertainty of the mean: needs two or more measurements")
        else:
            lines.append(f"Standard uncertainty of the mean: {significant(result.standard_uncertainty_deg, digits)}° per axis")
        off = mount.orientation.angle_to(result.mean)
        lines.append(f"The mount's orientation is {significant(off, digits)}° from the mean.")
        return "\n".join(lines)
