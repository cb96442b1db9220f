"""Chain panel: a mount chain reference -> bracket -> plate -> ... -> body as an ordered list of steps.

Each step holds the orientation of its child frame in its parent frame (core/chain.py), taken from the
editors (the selected mount's orientation, typed there in any representation) or from pasted text read
by the decoder. Steps can be inverted (the value was given parent-in-child), switched off (a part not
fitted), moved and deleted; every edit is one undo step in the model. The panel shows the product and
each intermediate frame in words, and "Make the product a mount" adds the product as a new mount.
"""

from __future__ import annotations

from dataclasses import replace

from PySide6.QtCore import Qt
from PySide6.QtWidgets import (QAbstractItemView, QCheckBox, QGridLayout, QGroupBox, QHBoxLayout,
                               QHeaderView, QLabel, QTableWidget, QTableWidgetItem,
                               QVBoxLayout)

from app.model import CHAIN, SELECTION, ORIENTATION, WORDS, Change, SessionModel
from app.panels.base import Panel
from app.panels.chain_entry import PastedOrientation, axis_angle_summary, full_tooltip
from app.text import compact
from app.widgets.with_tips import button, line_field, reading_label
from core import describe, operations
from core.chain import ChainStep

COLUMNS = ("#", "On", "Step", "Orientation", "Inverted")
ON_COLUMN, NAME_COLUMN, INVERTED_COLUMN = 1, 2, 4


_KEEP = object()        # set_step: leave the step's position as it is


def _position_words(position) -> str:
    """'x 120, y −35.5, z 8.25 mm': a position in its own unit, for a person."""
    x, y, z = (compact(v) for v in position.shown())
    return f"x {x}, y {y}, z {z} {position.unit}"


class ChainPanel(Panel):
    watches = frozenset({CHAIN, WORDS, SELECTION, ORIENTATION})

    def __init__(self, model: SessionModel, parent=None):
        super().__init__(model, parent)
        self.name_field = line_field("The chain's name; a mount made from its product is named after it.")
        self.table = QTableWidget(0, len(COLUMNS))
        self.table.setHorizontalHeaderLabels(COLUMNS)
        self.table.verticalHeader().setVisible(False)
        self.table.setSelectionBehavior(QAbstractItemView.SelectionBehavior.SelectRows)
        self.table.setSelectionMode(QAbstractItemView.SelectionMode.SingleSelection)
        self.table.setToolTip("The steps from the reference (top) to the body (bottom). Each is the orientation "
                              "of its part in the part before it (v_parent = R · v_child). Double-click a name "
                              "to rename; tick On to use a step, Inverted when its value was given the other "
                              "way round (parent in child).")
        header = self.table.horizontalHeader()
        header.setSectionResizeMode(QHeaderView.ResizeMode.ResizeToContents)
        header.setSectionResizeMode(3, QHeaderView.ResizeMode.Stretch)
        self.table.setFixedHeight(180)  # never squeezed by a growing result below, so the form stays put
        self.table.setWordWrap(False)
        self.table.horizontalHeaderItem(3).setToolTip("The step's orientation in its parent (child -> parent), "
                                                      "as axis and angle; hover a cell for every representation.")

        self.up_button = button("Move up", "Move the step one place towards the reference.")
        self.down_button = button("Move down", "Move the step one place towards the body.")
        self.invert_button = button("Invert", "Use the step's inverse (its value was given parent in child); again "
                                              "to undo.")
        self.enable_button = button("Switch off", "Leave the step out of the product (e.g. a spacer not fitted); "
                                                  "again to switch it back on.")
        self.delete_button = button("Delete", "Delete the step (undo brings it back).")

        entry = QGroupBox("Step orientation")
        self.step_name = line_field("Name of a new step, e.g. the part it stands for (bracket, plate, shim).",
                                    placeholder="bracket")
        self.add_from_editors = button("Add from the editors", "Add a step at the body end holding the orientation "
                                                               "the editors show (the selected mount's), typed there "
                                                               "in any representation, and its position when it has "
                                                               "one.")
        self.set_from_editors = button("Set from the editors", "Give the chosen step the orientation (and position) "
                                                               "the editors show.")
        self.pasted = PastedOrientation()
        self.add_from_text = button("Add from the text", "Add a step at the body end holding the chosen reading of "
                                                         "the pasted text.")
        self.set_from_text = button("Set from the text", "Give the chosen step the chosen reading of the pasted text.")
        grid = QGridLayout(entry)
        name_row = QHBoxLayout()
        name_row.addWidget(QLabel("New step's name"))
        name_row.addWidget(self.step_name, 1)
        grid.addLayout(name_row, 0, 0, 1, 2)
        grid.addWidget(self.add_from_editors, 1, 0)
        grid.addWidget(self.set_from_editors, 1, 1)
        grid.addWidget(self.pasted, 2, 0, 1, 2)
        grid.addWidget(self.add_from_text, 3, 0)
        grid.addWidget(self.set_from_text, 3, 1)

        result = QGroupBox("Result")
        self.product_label = reading_label("The product body -> reference of every step that is on, R = R1 · R2 · …, "
                                           "and each intermediate frame: where its axes point in the reference "
                                           "(names of the directions as chosen in the Level panel).")
        self.frames_box = QCheckBox("Show the frames in the Scene")
        self.frames_box.setToolTip("Draw each intermediate frame small and labelled in a row beside the part "
                                   "(the last one is the product).")
        self.make_mount_button = button("Make the product a mount", "Add the product to the session as a new mount, "
                                                                    "named after the chain, and select it (undo "
                                                                    "removes it).")
        result_layout = QVBoxLayout(result)
        result_layout.addWidget(self.product_label)
        result_layout.addWidget(self.frames_box)
        result_layout.addWidget(self.make_mount_button)

        layout = QVBoxLayout(self)
        name_row = QHBoxLayout()
        name_row.addWidget(QLabel("Chain"))
        name_row.addWidget(self.name_field, 1)
        layout.addLayout(name_row)
        # The table keeps its height and the spare room sits at the bottom, so the step form below never
        # moves when a step is added (the result above the spare room grows instead).
        layout.addWidget(self.table)
        buttons = QGridLayout()
        for k, b in enumerate((self.up_button, self.down_button, self.invert_button, self.enable_button,
                               self.delete_button)):
            buttons.addWidget(b, k // 3, k % 3)
        layout.addLayout(buttons)
        layout.addWidget(entry)
        layout.addWidget(result)
        layout.addStretch(1)

        self.name_field.editingFinished.connect(self._rename_chain)
        self.table.itemChanged.connect(self._on_item_changed)
        self.table.itemSelectionChanged.connect(self._update_buttons)
        self.up_button.clicked.connect(lambda: self.move_step(-1))
        self.down_button.clicked.connect(lambda: self.move_step(1))
        self.invert_button.clicked.connect(self.invert_step)
        self.enable_button.clicked.connect(self.toggle_step)
        self.delete_button.clicked.connect(self.delete_step)
        # the editors show a pose when the mount has a position: a step from them keeps it (a rigid transform)
        self.add_from_editors.clicked.connect(lambda: self.add_step(self.model.current_orientation(), "editors",
                                                                    self.model.current_mount().position))
        self.set_from_editors.clicked.connect(lambda: self.set_step(self.model.current_orientation(),
                                                                    self.model.current_mount().position))
        self.add_from_text.clicked.connect(self._add_from_text)
        self.set_from_text.clicked.connect(self._set_from_text)
        self.pasted.reading_changed.connect(self._update_buttons)
        self.frames_box.toggled.connect(lambda on: self.model.set_show_chain_frames(on, origin=self))
        self.make_mount_button.clicked.connect(lambda: self.model.make_chain_mount(origin=self))
        self.render()

    # ---- reading -----------------------------------------------------------------------------------
    def selected_row(self) -> int | None:
        rows = self.table.selectionModel().selectedRows()
        return rows[0].row() if rows else None

    def select_row(self, row: int) -> None:
        if 0 <= row < self.table.rowCount():
            self.table.selectRow(row)

    # ---- edits (each one undo step) ------------------------------------------------------------------
    def _add_from_text(self) -> None:
        """A pose read from the text keeps its translation when the text states the unit."""
        position, words = self.pasted.position()
        self.add_step(self.pasted.orientation(), "text", position)
        if words:
            self.pasted.message.say(words, problem=position is None)

    def _set_from_text(self) -> None:
        position, words = self.pasted.position()
        self.set_step(self.pasted.orientation(), _KEEP if position is None else position)
        if words:
            self.pasted.message.say(words, problem=position is None)

    def add_step(self, orientation, source: str, position=None) -> None:
        if orientation is None:
            return
        chain = self.model.chain
        name = self.step_name.text().strip() or f"step {len(chain) + 1}"
        step = ChainStep(name, orientation, position=position)
        self.model.apply(operations.set_chain, chain.with_step(step), origin=self,
                         text=f"Add chain step “{name}”")
        self.step_name.clear()
        self.select_row(len(self.model.chain) - 1)

    def set_step(self, orientation, position=_KEEP) -> None:
        """The chosen step's orientation; from the editors also their position (the mount's, or none), from
        the text the step keeps its own."""
        row = self.selected_row()
        if orientation is None or row is None:
            return
        chain = self.model.chain
        step = chain.steps[row]
        changed = replace(step, orientation=orientation) if position is _KEEP else \
            replace(step, orientation=orientation, position=position)
        self.model.apply(operations.set_chain, chain.with_step_replaced(row, changed),
                         origin=self, text=f"Set chain step “{step.name}”")
        self.select_row(row)

    def move_step(self, by: int) -> None:
        row = self.selected_row()
        chain = self.model.chain
        if row is None or not 0 <= row + by < len(chain):
            return
        self.model.apply(operations.set_chain, chain.moved(row, row + by), origin=self,
                         text=f"Move chain step “{chain.steps[row].name}” {'up' if by < 0 else 'down'}")
        self.select_row(row + by)

    def invert_step(self) -> None:
        row = self.selected_row()
        if row is not None:
            self._set_flag(row, "inverted", not self.model.chain.steps[row].inverted)

    def toggle_step(self) -> None:
        row = self.selected_row()
        if row is not None:
            self._set_flag(row, "enabled", not self.model.chain.steps[row].enabled)

    def delete_step(self) -> None:
        row = self.selected_row()
        if row is None:
            return
        chain = self.model.chain
        self.model.apply(operations.set_chain, chain.without_step(row), origin=self,
                         text=f"Delete chain step “{chain.steps[row].name}”")
        self.select_row(min(row, len(self.model.chain) - 1))

    def _set_flag(self, row: int, flag: str, value: bool) -> None:
        chain = self.model.chain
        name = chain.steps[row].name
        if flag == "inverted":
            new, text = chain.with_inverted(row, value), f"{'Invert' if value else 'Un-invert'} chain step “{name}”"
        else:
            new, text = chain.with_enabled(row, value), f"Switch {'on' if value else 'off'} chain step “{name}”"
        self.model.apply(operations.set_chain, new, origin=self, text=text)
        self.select_row(row)

    def _rename_chain(self) -> None:
        name = self.name_field.text().strip()
        chain = self.model.chain
        if not name:
            self.name_field.setText(chain.name)  # a chain needs a name: keep the old one
            return
        if name != chain.name:
            self.model.apply(operations.set_chain, chain.renamed(name),
                             origin=self, text=f"Rename chain to “{name}”")

    def _on_item_changed(self, item: QTableWidgetItem) -> None:
        if self._rendering:
            return
        row, column = item.row(), item.column()
        chain = self.model.chain
        if not 0 <= row < len(chain):
            return
        step = chain.steps[row]
        if column == ON_COLUMN:
            self._set_flag(row, "enabled", item.checkState() == Qt.CheckState.Checked)
        elif column == INVERTED_COLUMN:
            self._set_flag(row, "inverted", item.checkState() == Qt.CheckState.Checked)
        elif column == NAME_COLUMN:
            name = item.text().strip()
            if name and name != step.name:
                self.model.apply(operations.set_chain, chain.with_step_replaced(row, replace(step, name=name)),
                                 origin=self, text=f"Rename chain step to “{name}”")
            else:
                self.render()  # an empty name: show the kept one

    # ---- model -> view -------------------------------------------------------------------------------
    def render_change(self, change: Change) -> None:
        if change.touches(CHAIN, WORDS):
            self.render()
        else:                          # the editors' orientation: what "from the editors" would take
            self._update_buttons()

    def render(self) -> None:
        chain = self.model.chain
        row = self.selected_row()
        with self.rendering():
            if self.name_field.text() != chain.name and not self.name_field.hasFocus():
                self.name_field.setText(chain.name)
            self.table.setRowCount(len(chain))
            for i, step in enumerate(chain.steps):
                number = QTableWidgetItem(str(i + 1))
                number.setFlags(Qt.ItemFlag.ItemIsEnabled | Qt.ItemFlag.ItemIsSelectable)
                on = QTableWidgetItem("")
                on.setFlags(Qt.ItemFlag.ItemIsEnabled | Qt.ItemFlag.ItemIsSelectable | Qt.ItemFlag.ItemIsUserCheckable)
                on.setCheckState(Qt.CheckState.Checked if step.enabled else Qt.CheckState.Unchecked)
                on.setToolTip("Ticked: the step is used in the product. Unticked: left out (identity).")
                name = QTableWidgetItem(step.name)
                name.setFlags(Qt.ItemFlag.ItemIsEnabled | Qt.ItemFlag.ItemIsSelectable | Qt.ItemFlag.ItemIsEditable)
                summary = axis_angle_summary(step.orientation)
                if step.position is not None:
                    summary += f"; origin {_position_words(step.position)}"
                if step.inverted:
                    summary += ", used inverted"
                value = QTableWidgetItem(summary)
                value.setFlags(Qt.ItemFlag.ItemIsEnabled | Qt.ItemFlag.ItemIsSelectable)
                where = "" if step.position is None else \
                    f"\nOrigin of the child frame in the parent: {_position_words(step.position)}"
                value.setToolTip("As entered (child in parent):\n" + full_tooltip(step.orientation) + where)
                inverted = QTableWidgetItem("")
                inverted.setFlags(Qt.ItemFlag.ItemIsEnabled | Qt.ItemFlag.ItemIsSelectable
                                  | Qt.ItemFlag.ItemIsUserCheckable)
                inverted.setCheckState(Qt.CheckState.Checked if step.inverted else Qt.CheckState.Unchecked)
                inverted.setToolTip("Ticked: the value was given parent in child; the chain uses its inverse.")
                for column, item in enumerate((number, on, name, value, inverted)):
                    if not step.enabled and column != ON_COLUMN:
                        item.setForeground(Qt.GlobalColor.gray)
                    self.table.setItem(i, column, item)
            if row is not None and row < len(chain):
                self.table.selectRow(row)
            self.frames_box.setChecked(self.model.show_chain_frames)
        self.product_label.setText(self._result_text())
        self._update_buttons()

    def _result_text(self) -> str:
        chain = self.model.chain
        preset = self.model.reference_frame
        frames = chain.frames()
        if not chain.steps:
            return "No steps yet. Add the first step (the one fixed to the reference) from the editors or from " \
                   "pasted text."
        if not frames:
            return "Every step is switched off: the product is the identity (the body is the reference)."
        product, position = chain.pose_product()
        lines = [f"Product body {describe.ARROW} reference: {axis_angle_summary(product)}"]
        if position is not None:     # some step has a position: the chain is a full rigid transform
            lines.append(f"Product position (body origin in the reference): {_position_words(position)}")
        lines.extend(f"    {w}" for w in describe.describe_orientation(product, preset))
        for k, frame in enumerate(frames, start=1):   # plain text: step names are shown as typed
            lines.append(f"Frame {k}, after “{frame.name}”: {axis_angle_summary(frame.orientation)}")
            if frame.position is not None:
                lines.append(f"    origin at {_position_words(frame.position)}")
            lines.append("    " + "; ".join(describe.describe_axes(frame.orientation, preset)))
        return "\n".join(lines)

    def _update_buttons(self) -> None:
        row = self.selected_row()
        count = len(self.model.chain)
        has_row = row is not None
        self.up_button.setEnabled(has_row and row > 0)
        self.down_button.setEnabled(has_row and row < count - 1)
        self.invert_button.setEnabled(has_row)
        self.delete_button.setEnabled(has_row)
        self.enable_button.setEnabled(has_row)
        if has_row:
            self.enable_button.setText("Switch off" if self.model.chain.steps[row].enabled else "Switch on")
        self.set_from_editors.setEnabled(has_row)
        has_text = self.pasted.orientation() is not None
        self.add_from_text.setEnabled(has_text)
        self.set_from_text.setEnabled(has_text and has_row)
        self.make_mount_button.setEnabled(count > 0)
