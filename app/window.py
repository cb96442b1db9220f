"""The main window: Mounts, the Scene, the four editors, the Gimbal margin meter and a side area of
panels (Decode, Measure, Batch, ...) as tabs, with menus, shortcuts and the status bar. The window holds no state of its own: everything is in the SessionModel."""

from __future__ import annotations

import dataclasses
import sys
from pathlib import Path

from PySide6.QtCore import QEvent, QLocale, Qt, QTimer
from PySide6.QtGui import QAction, QColor, QKeySequence
from PySide6.QtWidgets import (QAbstractSpinBox, QApplication, QComboBox, QFrame, QHBoxLayout,
                               QLabel, QLineEdit, QMainWindow, QMessageBox, QPlainTextEdit, QScrollArea,
                               QSpinBox, QSplitter, QTabWidget, QTextEdit, QVBoxLayout, QWidget)

from app import copy_as, dialog_folder, plain_text, recent_files, recovery, settings
from app.editor_rows import EditorRows
from core import atomic_file, units
from app.editors.angles_editor import AnglesEditor
from app.editors.axis_angle_editor import AxisAngleEditor
from app.editors.base import EditorBase
from app.editors.gibbs_editor import GibbsEditor
from app.editors.matrix_editor import MatrixEditor
from app.editors.mrp_editor import MrpEditor
from app.editors.position_editor import PositionEditor
from app.editors.quaternion_editor import QuaternionEditor
from app.model import PREFERENCES, Change, SessionModel
from app.panels.decode_panel import DecodePanel
from app.panels.gimbal_meter import GimbalMeter
from app.panels.mounts_list import MountsList
from app.part_dialog import PartDialog
from app.preferences_dialog import PreferencesDialog
from app.scene import VIEW_MINIMUM_SIZE, palette as scene_palette
from app.scene.model_binding import bind_scene_to_model
from app.side_pages import SidePages, SidePanel
from core.errors import FramewrightError
from core.session import ANGLE_UNITS, FILE_SUFFIX, Session, load_session, save_session

RESOURCES = Path(__file__).resolve().parents[1] / "resources"
DEMO_SESSION = RESOURCES / "demo.fwsession.json"
# What was open when the window last closed, for the next launch: a session file's path, "demo", or "new"
# (an empty session never saved). Not there at all: the first launch, which opens the demo.
LAST_SESSION_KEY = "session/last"
FILE_FILTER = f"Framewright sessions (*{FILE_SUFFIX});;All files (*)"


def _scrollable(panel: QWidget, min_width: int = 300, across: bool = True) -> QScrollArea:
    """A panel in a scroll area, so the window can shrink below the panel's full size on a small screen.
    With across=False it never scrolls sideways: the area is as wide as the panel needs."""
    area = QScrollArea()
    area.setWidget(panel)
    area.setWidgetResizable(True)
    area.setFrameShape(QFrame.Shape.NoFrame)
    area.setMinimumWidth(min_width)
    if not across:
        area.setHorizontalScrollBarPolicy(Qt.ScrollBarPolicy.ScrollBarAlwaysOff)
        # room for the panel and for an up-down scroll bar beside it, so it never needs to scroll sideways
        bar = area.style().pixelMetric(area.style().PixelMetric.PM_ScrollBarExtent)
        area.setMinimumWidth(panel.minimumSizeHint().width() + bar)
        area.setMinimumHeight(min(panel.minimumSizeHint().height(), 160))
    return area


def _scene_placeholder(reference_frame: str) -> QWidget:
    """The Scene's place until it is built, laid out as the Scene is (its toolbar, shown inactive, over
    the dark viewport), so it takes the same room and nothing moves when the Scene replaces it."""
    from app.scene.scene_toolbar import SceneToolbar   # Qt only: no pyqtgraph, no OpenGL
    slot = QWidget()
    layout = QVBoxLayout(slot)
    layout.setContentsMargins(0, 0, 0, 0)
    layout.setSpacing(0)
    toolbar = SceneToolbar(slot)
    toolbar.select(toolbar.preset, reference_frame)
    toolbar.setEnabled(False)
    viewport = QWidget()
    viewport.setMinimumSize(*VIEW_MINIMUM_SIZE)
    viewport.setAutoFillBackground(True)
    colours = viewport.palette()
    colours.setColor(viewport.backgroundRole(), QColor(*scene_palette.BACKGROUND))
    viewport.setPalette(colours)
    layout.addWidget(toolbar)
    layout.addWidget(viewport, 1)
    return slot


def _is_text_entry(widget) -> bool:
    return isinstance(widget, (QLineEdit, QAbstractSpinBox, QPlainTextEdit, QTextEdit))


class MainWindow(QMainWindow):
    # The side tabs after the first are built when first shown (app/side_pages.py); reading one of these
    # attributes builds that panel too.
    chain_panel = SidePanel()
    check_panel = SidePanel()
    adjust_panel = SidePanel()
    level_panel = SidePanel()
    measure_panel = SidePanel()
    batch_panel = SidePanel()
    _scene_slot = None   # events arrive while __init__ runs: event() reads this before __init__ sets it

    def __init__(self, model: SessionModel, parent=None, scene_later: bool = False):
        """scene_later: the Scene is built just after the window's first paint (build_scene), not now."""
        super().__init__(parent)
        self.model = model
        if model.parent() is None:
            model.setParent(self)  # lives and dies with the window
        self.setWindowTitle("Framewright")
        self.showing_demo = True  # the invented demo session, not a file of the user's (make_window says)
        self._settings = settings.open_settings()
        self.last_copy_format = settings.load_text("copy/last_format", "json", self._settings)
        self.default_copy_format = settings.load_text("copy/default_format", "text", self._settings)
        if self.last_copy_format not in copy_as.FORMATS:
            self.last_copy_format = "json"
        if self.default_copy_format not in copy_as.FORMATS:
            self.default_copy_format = "text"

        # ---- parts ----
        self.mounts = MountsList(model)
        self.axis_angle = AxisAngleEditor(model)
        self.quaternion = QuaternionEditor(model)
        self.matrix = MatrixEditor(model)
        self.angles = AnglesEditor(model)
        self.position = PositionEditor(model)
        self.meter = GimbalMeter(model)
        self.decode_panel = DecodePanel(model)
        self.scene = None              # the SceneWidget, once built (build_scene)
        self._scene_slot = None        # what stands in its place until then
        self._measured_fit = None      # the Measure panel's last fit, for the Scene to draw
        if scene_later:
            self._scene_slot = _scene_placeholder(model.reference_frame)
        else:
            self.build_scene()
        self.editors: list[EditorBase] = [self.axis_angle, self.quaternion, self.matrix, self.angles]
        # The parameter sets, one editor each (one line each); shown from View ▸ Rodrigues parameters, since
        # the editors' row is full at a laptop's width and they would take the Scene's height.
        self.parameter_editors: list[EditorBase] = [
            GibbsEditor(model),
            MrpEditor(model),
        ]
        self.current_editor: EditorBase = self.axis_angle

        editors = QWidget()
        grid = EditorRows(editors)
        grid.setContentsMargins(0, 0, 0, 0)
        grid.setSpacing(4)
        for box in self.editors + self.parameter_editors + [self.meter, self.position]:
            # Tighter than the default frame, so the row stays short and the Scene keeps its height.
            box.layout().setContentsMargins(6, 4, 6, 4)
            box.layout().setSpacing(4)
        # Side by side under the whole window, in as few rows as its width allows: one row from a laptop's
        # 1280 px up; on a narrower window the matrix and the meter (beside the Angles it speaks of) wrap.
        grid.addWidget(self.axis_angle)
        grid.addWidget(self.quaternion)
        grid.addWidget(self.angles)
        grid.addWidget(self.matrix)
        grid.addWidget(self.meter)
        for box in self.parameter_editors:
            box.setVisible(False)
            grid.addWidget(box)
        self._editors_box = editors
        editors.installEventFilter(self)  # a note that wraps to one more line gets its room (_fit_editors)

        # Side area: one tab per panel, in the order of the job: decode, chain, check (and level), then
        # measure and batch. Each scrolls up and down when it is taller than the room, never sideways.
        self.side_tabs = QTabWidget()
        self.side_tabs.addTab(self.decode_panel, "Decode")
        self.side_pages = SidePages(self.side_tabs)
        chain_area = _scrollable(QWidget())
        # Its scroll bar is always there: the result grows with each step, and a bar that appeared then
        # would narrow the panel and shift the step form under the user's next click.
        chain_area.setVerticalScrollBarPolicy(Qt.ScrollBarPolicy.ScrollBarAlwaysOn)
        self.side_pages.add("chain_panel", "Chain", chain_area, self._build_chain_panel)
        for name, title, build in (("check_panel", "Check", self._build_check_panel),
                                   ("adjust_panel", "Adjust", self._build_adjust_panel),
                                   ("level_panel", "Level", self._build_level_panel),
                                   ("measure_panel", "Measure", self._build_measure_panel),
                                   ("batch_panel", "Batch", self._build_batch_panel)):
            self.side_pages.add(name, title, _scrollable(QWidget()), build)
        # The chain's frames are drawn beside any mount only while its tab is in view (model.scene_frames)
        self._chain_area = chain_area
        self.side_tabs.currentChanged.connect(self._chain_tab_shown_or_left)

        # Top: Mounts, the Scene and the side panels side by side; below them, across the whole width,
        # the editors. The Scene takes whatever height the editors leave.
        splitter = QSplitter(Qt.Orientation.Horizontal)
        # The selected mount's position sits under the Mounts list: it belongs to the mount, and the
        # editor row under the Scene keeps its five boxes (and the Scene its height).
        mounts_column = QWidget()
        column = QVBoxLayout(mounts_column)
        column.setContentsMargins(0, 0, 0, 0)
        column.setSpacing(4)
        column.addWidget(self.mounts, 1)
        column.addWidget(self.position, 0)
        splitter.addWidget(mounts_column)
        splitter.addWidget(self.scene if self.scene is not None else self._scene_slot)
        splitter.addWidget(self.side_tabs)
        splitter.setStretchFactor(0, 0)
        splitter.setStretchFactor(1, 1)
        splitter.setStretchFactor(2, 0)
        splitter.setSizes([160, 900, 500])  # the Scene keeps its minimum; the panels get the rest
        # The Mounts list and the side panels fold away (drag their edge, or View ▸ Side panels) to give
        # the Scene a small screen's whole width; the Scene never folds.
        splitter.setChildrenCollapsible(True)
        splitter.setCollapsible(1, False)
        self.splitter = splitter

        centre = QSplitter(Qt.Orientation.Vertical)
        centre.addWidget(splitter)
        centre.addWidget(_scrollable(editors, min_width=0, across=False))
        centre.setStretchFactor(0, 1)
        centre.setStretchFactor(1, 0)
        centre.setChildrenCollapsible(False)
        # The editors keep their full height (stretch 0); the Scene and the panels take what is left.
        centre.setSizes([1000, editors.sizeHint().height()])
        self.centre = centre
        self._editors_dragged = 0  # the editors' height the user dragged the handle to (0: not dragged)
        centre.splitterMoved.connect(lambda *_: setattr(self, "_editors_dragged", centre.sizes()[1]))
        self.setCentralWidget(centre)

        self._build_toolbar()
        self._build_menus()
        self.statusBar().showMessage("Ready. Safety: verify against the governing drawing and procedure.")

        model.changed.connect(self._on_model_changed)
        self.recovery = recovery.Recovery(model, parent=self)  # autosave soon after each change; recovery.py
        self.recovery.failed.connect(self._autosave_failed)
        model.undo_stack.cleanChanged.connect(self._update_title)
        QApplication.instance().focusChanged.connect(self._track_editor)
        self._update_title()

        geometry, state = settings.load_window_state(self._settings)
        if geometry is not None:
            self.restoreGeometry(geometry)
        else:
            self.resize(1600, 1000)
        if state is not None:
            self.restoreState(state)

    # ---- building ------------------------------------------------------------------------------
    def build_scene(self) -> None:
        """The Scene, fed from the model. At launch it comes just after the window's first paint: its
        module loads pyqtgraph and OpenGL, the largest part of the start-up, and the editors, the numbers
        and the menus need not wait for that."""
        if self.scene is not None:
            return
        from app.scene.scene_widget import SceneWidget
        self.scene = SceneWidget(native_view=True)   # composed on its own (scene_widget.py says why)
        self._scene_binding = bind_scene_to_model(self.scene, self.model)
        if self._measured_fit is not None:
            self.scene.set_measured_points(self._measured_fit)
        if self._scene_slot is not None:
            self.splitter.replaceWidget(1, self.scene)   # same place and size; the Scene never folds
            self.splitter.setStretchFactor(1, 1)          # (the stretch lives in the widget's size policy)
            self._scene_slot.deleteLater()
            self._scene_slot = None

    def _chain_tab_shown_or_left(self, _index: int) -> None:
        if self.model.set_chain_in_view(self.side_tabs.currentWidget() is self._chain_area) and \
                self.scene is not None:
            self._scene_binding.refresh()

    def event(self, event) -> bool:
        handled = super().event(event)
        if self._scene_slot is not None and event.type() == QEvent.Type.Paint:
            QTimer.singleShot(0, self, self.build_scene)   # once this first paint is on the screen
        return handled

    def _measured_points_changed(self, fit) -> None:
        self._measured_fit = fit
        if self.scene is not None:
            self.scene.set_measured_points(fit)

    # The side panels, each imported and built when its tab is first shown (or the panel is asked for).
    def _build_chain_panel(self) -> QWidget:
        from app.panels.chain_panel import ChainPanel
        return ChainPanel(self.model)

    def _build_check_panel(self) -> QWidget:
        from app.panels.check_panel import CheckPanel
        return CheckPanel(self.model)

    def _build_adjust_panel(self) -> QWidget:
        from app.panels.adjust_panel import AdjustPanel
        return AdjustPanel(self.model)

    def _build_level_panel(self) -> QWidget:
        from app.panels.level_panel import LevelPanel
        return LevelPanel(self.model)

    def _build_measure_panel(self) -> QWidget:
        from app.panels.measure_panel import MeasurePanel
        panel = MeasurePanel(self.model)
        panel.fit_changed.connect(self._measured_points_changed)
        return panel

    def _build_batch_panel(self) -> QWidget:
        from app.panels.batch_panel import BatchPanel
        return BatchPanel(self.model)

    def _build_toolbar(self) -> None:
        """The angle unit and the digits, in the menu bar's free corner rather than a toolbar row of
        their own: the row's height goes to the Scene."""
        corner = self._display_corner = QWidget(self.menuBar())  # kept: the menu bar does not own it
        row = QHBoxLayout(corner)
        row.setContentsMargins(0, 0, 6, 0)
        row.setSpacing(4)
        self.units_box = QComboBox()
        for key in ANGLE_UNITS:     # the one preference for every angle field
            self.units_box.addItem(units.ANGLE_UNITS[key].name, key)
        self.units_box.setToolTip("Angles in every field and readout in this unit; a field also reads a number "
                                  "with its own mark (0.5 mrad, 30″, 1°30′, 2 gon). NATO mils: 6400 to a turn.")
        self.units_box.setToolTip("Unit of every angle shown and typed (the gimbal margin is always in degrees).")
        self.digits_box = QSpinBox()
        self.digits_box.setRange(3, 17)
        self.digits_box.setToolTip("Significant digits shown in the editors.")
        row.addWidget(QLabel("Angles in"))
        row.addWidget(self.units_box)
        row.addSpacing(8)
        row.addWidget(QLabel("Digits"))
        row.addWidget(self.digits_box)
        self.menuBar().setCornerWidget(corner, Qt.Corner.TopRightCorner)
        corner.show()
        self.units_box.activated.connect(
            lambda i: self.model.set_preferences(origin=self, angle_units=self.units_box.itemData(i)))
        self.digits_box.valueChanged.connect(
            lambda v: self.model.set_preferences(origin=self, significant_digits=v))
        self._render_toolbar()

    def _action(self, text, slot, shortcut=None, tip=None) -> QAction:
        action = QAction(text, self)
        if shortcut is not None:
            action.setShortcut(QKeySequence(shortcut))
        if tip:
            action.setStatusTip(tip)
        action.triggered.connect(slot)
        self.addAction(action)
        return action

    def _build_menus(self) -> None:
        keys = QKeySequence.StandardKey
        file_menu = self.menuBar().addMenu("&File")
        self.new_action = self._action("&New", self.new_session, keys.New,
                                       "Start an empty session: one mount, no file (asks about unsaved changes)")
        self.open_action = self._action("&Open…", self.open_file, keys.Open)
        self.save_action = self._action("&Save", self.save_file, keys.Save)
        self.save_as_action = self._action("Save &as…", self.save_file_as, keys.SaveAs)
        self.quit_action = self._action("&Quit", self.close, keys.Quit)
        file_menu.addAction(self.new_action)
        file_menu.addAction(self.open_action)
        self.recent_menu = file_menu.addMenu("Recent &files")
        self.recent_menu.setToolTipsVisible(True)
        self.recent_menu.aboutToShow.connect(self._fill_recent_menu)
        for action in (self.save_action, self.save_as_action):
            file_menu.addAction(action)
        file_menu.addSeparator()
        self.export_report_action = self._action(
            "Export &report…", self.export_report, None,
            "The inspection record of the check (or of the whole session) as PDF or HTML, previewed first")
        file_menu.addAction(self.export_report_action)
        file_menu.addSeparator()
        file_menu.addAction(self.quit_action)

        edit_menu = self.menuBar().addMenu("&Edit")
        self.undo_action = self._action("&Undo", self.model.undo, keys.Undo)
        self.redo_action = self._action("&Redo", self.model.redo, keys.Redo)
        # Redo on both spellings people use: Ctrl+Shift+Z and Ctrl+Y (whatever the platform's default is).
        redo_keys = QKeySequence.keyBindings(keys.Redo)
        for extra in ("Ctrl+Shift+Z", "Ctrl+Y"):
            if QKeySequence(extra) not in redo_keys:
                redo_keys.append(QKeySequence(extra))
        self.redo_action.setShortcuts(redo_keys)
        self.model.undo_stack.canUndoChanged.connect(self.undo_action.setEnabled)
        self.model.undo_stack.canRedoChanged.connect(self.redo_action.setEnabled)
        self.model.undo_stack.undoTextChanged.connect(self._show_undo_text)
        self.model.undo_stack.redoTextChanged.connect(self._show_redo_text)
        self.undo_action.setEnabled(False)
        self.redo_action.setEnabled(False)
        self.copy_action = self._action("&Copy", self.copy_default, keys.Copy,
                                        "Copy the orientation in the default format (Preferences)")
        self.copy_again_action = self._action("", self.copy_last, "Ctrl+Shift+C")
        self.paste_action = self._action("&Paste", self.paste, keys.Paste,
                                         "Paste into the field in use, or into Decode")
        self.preferences_action = self._action("Pre&ferences…", self.show_preferences, keys.Preferences)
        self.part_action = self._action("&Part of the mount…", self.show_part_dialog, None,
                                        "Box size, face names and boresight face of the selected mount")
        for action in (self.undo_action, self.redo_action):
            edit_menu.addAction(action)
        edit_menu.addSeparator()
        edit_menu.addAction(self.copy_action)
        self.copy_as_menu = edit_menu.addMenu("Copy &as")
        self.copy_as_actions = {}
        for key, label in copy_as.FORMATS.items():
            action = QAction(label, self)
            action.triggered.connect(lambda _=False, k=key: self.copy_as(k))
            self.copy_as_menu.addAction(action)
            self.copy_as_actions[key] = action
        self.copy_as_menu.aboutToShow.connect(self._offer_copy_formats)  # the pose ones need a position
        self._offer_copy_formats()
        edit_menu.addAction(self.copy_again_action)
        edit_menu.addAction(self.paste_action)
        edit_menu.addSeparator()
        self.snap_action = self._action("S&nap to nearest right angle",
                                        lambda: self.model.snap_to_right_angle(origin=self), None,
                                        "Set the selected mount to the nearest of the 24 right-angle "
                                        "orientations (one undo step)")
        edit_menu.addAction(self.snap_action)
        edit_menu.addSeparator()
        edit_menu.addAction(self.part_action)
        edit_menu.addAction(self.preferences_action)
        self._update_copy_again_text()

        view_menu = self.menuBar().addMenu("&View")
        self.side_action = self._action("Side &panels", self.show_side_panels, None,
                                        "Show or fold away the side panels (Decode, Chain, Check, …)")
        self.side_action.setCheckable(True)
        self.side_action.setChecked(True)
        self.splitter.splitterMoved.connect(lambda *_: self.side_action.setChecked(self.splitter.sizes()[2] > 0))
        view_menu.addAction(self.side_action)
        self.parameters_action = self._action(
            "&Gibbs vector and MRP editors", self.show_parameter_editors, None,
            "Show or hide the editors of the Gibbs vector and the modified Rodrigues parameters")
        self.parameters_action.setCheckable(True)
        view_menu.addAction(self.parameters_action)

        help_menu = self.menuBar().addMenu("&Help")
        self.demo_action = self._action("Open the &demo", self.open_demo, None,
                                        "Open the demo session (an invented scenario; asks about unsaved changes)")
        help_menu.addAction(self.demo_action)
        self.about_action = self._action("&About Framewright", self.show_about)
        help_menu.addAction(self.about_action)

    def eventFilter(self, watched, event) -> bool:
        if watched is self._editors_box and event.type() in (QEvent.Type.LayoutRequest, QEvent.Type.Resize):
            QTimer.singleShot(0, self._fit_editors)
        return super().eventFilter(watched, event)

    def _fit_editors(self) -> None:
        """Give the editors the height their text needs at the width they have now (more when a note wraps
        or the row wraps, less when the window widens), so no field or button of theirs is hidden below a
        scroll; never less than the user dragged them to, never the Scene below its minimum."""
        box = self._editors_box
        need = max(box.heightForWidth(box.width()), box.layout().minimumSize().height())
        top_h, editors_h = self.centre.sizes()
        room = top_h + editors_h - self.splitter.minimumSizeHint().height()
        wanted = min(max(need, self._editors_dragged), room)
        if wanted != editors_h and top_h + editors_h > 0:
            self.centre.setSizes([top_h + editors_h - wanted, wanted])

    def show_parameter_editors(self, shown: bool) -> None:
        for box in self.parameter_editors:
            box.setVisible(bool(shown))
            if shown:
                box.render()
        self.parameters_action.setChecked(bool(shown))

    def show_side_panels(self, shown: bool) -> None:
        sizes = self.splitter.sizes()
        if bool(shown) == (sizes[2] > 0):
            return
        if shown:
            width = max(self.side_tabs.minimumSizeHint().width(), getattr(self, "_side_width", 380))
            sizes = [sizes[0], max(sizes[1] - width, 0), width]
        else:
            self._side_width = sizes[2]
            sizes = [sizes[0], sizes[1] + sizes[2], 0]
        self.splitter.setSizes(sizes)

    def _show_undo_text(self, text: str) -> None:
        self.undo_action.setText(f"&Undo {text}".strip())

    def _show_redo_text(self, text: str) -> None:
        self.redo_action.setText(f"&Redo {text}".strip())

    # ---- model -> window -----------------------------------------------------------------------
    def _offer_copy_formats(self) -> None:
        for key, action in self.copy_as_actions.items():
            action.setEnabled(copy_as.offered(self.model, key))

    def _on_model_changed(self, change: Change) -> None:
        self._offer_copy_formats()
        if change.touches(PREFERENCES):
            self._render_toolbar()
            settings.save_preferences(self.model.preferences, self._settings)
        self._update_title()

    def _render_toolbar(self) -> None:
        prefs = self.model.preferences
        self.units_box.setCurrentIndex(max(0, self.units_box.findData(prefs.angle_units)))
        self.digits_box.blockSignals(True)
        self.digits_box.setValue(prefs.significant_digits)
        self.digits_box.blockSignals(False)

    def _update_title(self, *_) -> None:
        if self.model.file_path:
            name = Path(self.model.file_path).name
        else:
            name = "demo session" if self.showing_demo else "new session"
        dirty = "" if self.model.undo_stack.isClean() else " (changed)"
        self.setWindowTitle(f"Framewright — {name}{dirty}")

    def _track_editor(self, _old, new) -> None:
        for editor in self.editors + self.parameter_editors:
            if new is not None and editor.isAncestorOf(new):
                self.current_editor = editor
                return

    # ---- clipboard -----------------------------------------------------------------------------
    def copy_as(self, fmt: str) -> copy_as.CopyResult:
        result = copy_as.copy_to_clipboard(self.model, fmt, self.current_editor)
        if fmt != "text":
            self.last_copy_format = fmt
            settings.save_text("copy/last_format", fmt, self._settings)
            self._update_copy_again_text()
        self.statusBar().showMessage(result.status_message)
        return result

    def copy_default(self) -> None:
        focus = QApplication.focusWidget()
        if _is_text_entry(focus) and self._selected_text(focus):
            self._forward(focus, "copy")
            return
        self.copy_as(self.default_copy_format)

    def copy_last(self) -> None:
        self.copy_as(self.last_copy_format)

    def _update_copy_again_text(self) -> None:
        self.copy_again_action.setText(f"Copy again as {copy_as.FORMATS[self.last_copy_format]}")

    def paste(self) -> None:
        """Ctrl+V in a text field pastes there (the field handles the key itself); from a menu or outside
        a text field the clipboard goes to Decode."""
        focus = QApplication.focusWidget()
        if _is_text_entry(focus):
            self._forward(focus, "paste")
            return
        self.side_tabs.setCurrentWidget(self.decode_panel)
        self.decode_panel.paste_from_clipboard()

    @staticmethod
    def _selected_text(widget) -> str:
        if isinstance(widget, QAbstractSpinBox):
            return widget.lineEdit().selectedText()
        if isinstance(widget, QLineEdit):
            return widget.selectedText()
        return widget.textCursor().selectedText()

    @staticmethod
    def _forward(widget, verb: str) -> None:
        target = widget.lineEdit() if isinstance(widget, QAbstractSpinBox) else widget
        getattr(target, verb)()

    # ---- files ---------------------------------------------------------------------------------
    def _confirm_discard(self) -> bool:
        """True when unsaved edits may be dropped (none, or the user says so)."""
        if self.model.undo_stack.isClean():
            return True
        answer = QMessageBox.question(
            self, "Unsaved changes", "The session has changes that are not saved. Save them first?",
            QMessageBox.StandardButton.Save | QMessageBox.StandardButton.Discard | QMessageBox.StandardButton.Cancel,
            QMessageBox.StandardButton.Save)
        if answer == QMessageBox.StandardButton.Save:
            return self.save_file()
        return answer == QMessageBox.StandardButton.Discard

    def new_session(self) -> bool:
        """An empty session (one mount at the identity, no file); the reference frame and the display
        preferences stay as they are."""
        if not self._confirm_discard():
            return False
        self.model.load_session(dataclasses.replace(Session.single(), reference_frame=self.model.reference_frame))
        self.showing_demo = False
        self._update_title()
        self._remember_session()
        self.statusBar().showMessage("New session: one mount, not saved yet.")
        return True

    def open_demo(self) -> bool:
        """The demo session again (Help ▸ Open the demo), after asking about unsaved changes."""
        if not self._confirm_discard():
            return False
        self.model.load_session(demo_session())
        self.showing_demo = True
        self._update_title()
        self._remember_session()
        self.statusBar().showMessage("Demo session (an invented scenario): verify every value against the "
                                     "governing drawing and procedure.")
        return True

    def _remember_session(self) -> None:
        where = self.model.file_path or ("demo" if self.showing_demo else "new")
        settings.save_text(LAST_SESSION_KEY, str(where), self._settings)

    def reopen_last_session(self) -> str:
        """At launch: the session that was open when the window last closed (its file, an empty session,
        or the demo); the demo on the first launch. Returns what was opened, in words."""
        last = settings.load_text(LAST_SESSION_KEY, "demo", self._settings)
        if last == "new":
            self.model.load_session(dataclasses.replace(Session.single(), reference_frame=self.model.reference_frame))
            self.showing_demo = False
            self._update_title()
            return "A new session (the last one was never saved)"
        if last != "demo":
            if not Path(last).is_file():
                return f"The last session {last} is no longer there: demo session (an invented scenario)"
            if self.open_file(last):
                return f"Reopened {last}"
            return "The last session could not be opened: demo session (an invented scenario)"
        return "Demo session (an invented scenario)"

    def open_file(self, path: str | None = None) -> bool:
        if not self._confirm_discard():
            return False
        if not path:
            path = dialog_folder.open_file_name(self, "Open session", FILE_FILTER)
            if not path:
                return False
        try:
            session = load_session(path)
        except FramewrightError as exc:   # load_session refuses every damaged file with SessionFileError
            self.statusBar().showMessage(f"Not opened: {exc}")
            self._tell("Cannot open session", f"{exc}\n\nThe session you had open is unchanged.")
            return False
        self.model.load_session(session, file_path=str(path))
        self.showing_demo = False
        recent_files.add_recent(str(path), self._settings)
        self._remember_session()
        self.statusBar().showMessage(f"Opened {path}: {len(session.mounts)} mounts.")
        return True

    def _fill_recent_menu(self) -> None:
        menu = self.recent_menu
        menu.clear()
        paths, dropped = recent_files.load_recent(self._settings)
        for number, path in enumerate(paths, 1):
            action = menu.addAction(f"&{number} {Path(path).name}")
            action.setToolTip(path)
            action.setStatusTip(path)
            action.triggered.connect(lambda _=False, p=path: self.open_file(p))
        if not paths:
            menu.addAction("(none yet)").setEnabled(False)
        if dropped:
            names = ", ".join(Path(p).name for p in dropped)
            self.statusBar().showMessage(f"Dropped from Recent files (no longer found): {names}")

    def save_file(self) -> bool:
        if not self.model.file_path:
            return self.save_file_as()
        return self._save_to(self.model.file_path)

    def save_file_as(self, path: str | None = None) -> bool:
        if not path:
            path = dialog_folder.save_file_name(self, "Save session", f"session{FILE_SUFFIX}", FILE_FILTER)
            if not path:
                return False
        if not str(path).endswith(FILE_SUFFIX):
            path = str(path) + FILE_SUFFIX
        return self._save_to(path)

    def _save_to(self, path: str) -> bool:
        try:
            save_session(self.model.session(), path)
        except (OSError, FramewrightError) as exc:
            # The file on disk is as it was; the work stays here and goes to the recovery file now.
            why = f"{path}: {atomic_file.describe(exc)}" if isinstance(exc, OSError) else str(exc)
            kept = "Your changes are still open here"
            if not self.model.undo_stack.isClean():
                kept += (" and in the recovery file" if self.recovery.write_now()
                         else f"; the recovery file could not be written either ({self.recovery.last_error})")
            self.statusBar().showMessage(f"Not saved: {why}")
            self._tell("Cannot save session", f"Not saved: {why}\n\n{kept}. The file on disk is unchanged. "
                       "Choose File ▸ Save as… to save them somewhere else.")
            return False
        self.model.file_path = str(path)
        self.showing_demo = False
        self.model.undo_stack.setClean()  # also removes the recovery file
        recent_files.add_recent(str(path), self._settings)
        self._remember_session()
        self._update_title()
        self.statusBar().showMessage(f"Saved {path}.")
        return True

    def export_report(self) -> str | None:
        from app.report_dialog import export_report   # late: the report modules load only when used

        return export_report(self)

    def _tell(self, title: str, text: str) -> None:
        """A warning the user must acknowledge, as plain text: a file name or a field read from a file
        is never shown as markup."""
        plain_text.warning(self, title, text)

    def _autosave_failed(self, why: str) -> None:
        self.statusBar().showMessage(f"Autosave failed: {why}. Save the session (File ▸ Save as…) to keep "
                                     "your changes.")

    # ---- dialogs and closing -------------------------------------------------------------------
    def show_about(self) -> None:
        from app import about   # late: it reads the package metadata and the export formats' caution
        about.show_about(self)

    def show_part_dialog(self) -> None:
        PartDialog(self.model, self).exec()

    def show_preferences(self) -> None:
        everyday = {k: v for k, v in copy_as.FORMATS.items() if k not in copy_as.POSE_FORMATS}
        dialog = PreferencesDialog(self.model, everyday, self.default_copy_format, self)
        if dialog.exec():
            self.default_copy_format = dialog.chosen_copy_default
            settings.save_text("copy/default_format", self.default_copy_format, self._settings)

    def closeEvent(self, event) -> None:
        if not self._confirm_discard():
            event.ignore()
            return
        settings.save_window_state(self.saveGeometry(), self.saveState(), self._settings)
        self._remember_session()
        settings.save_preferences(self.model.preferences, self._settings)
        self.recovery.discard()  # a clean close: nothing to recover next time
        event.accept()


def demo_session() -> Session:
    return load_session(DEMO_SESSION)


def make_window(session: Session | None = None, scene_later: bool = False) -> MainWindow:
    """The window on a session (the demo by default), with the user's stored preferences; scene_later as
    in MainWindow."""
    QLocale.setDefault(QLocale.c())  # '.' as the decimal point in every Qt number widget
    model = SessionModel(session or demo_session())
    model.set_preferences(**settings.load_preferences().to_dict())
    window = MainWindow(model, scene_later=scene_later)
    window.showing_demo = session is None
    window._update_title()
    return window


def run_window(path: str | None = None) -> int:
    """Show the window on the session file `path` (or else the session open when it last closed; the demo
    on the first launch) and run until it closes. A recovery file left by a run that crashed is offered
    first."""
    from app.start_clock import seconds_since_start   # the clock starts with the process, not the imports
    app = QApplication.instance() or QApplication(sys.argv)
    app.setOrganizationName(settings.ORGANISATION)
    app.setApplicationName(settings.APPLICATION)
    window = make_window(scene_later=True)   # the window paints first; the Scene follows at once
    window.show()
    if path is None:
        opened = window.reopen_last_session()
    elif window.open_file(path):
        opened = f"Opened {path}"
    else:
        opened = "Demo session (an invented scenario)"
    # Read once the event loop runs (the window is shown and its first frame is on the way), from the
    # process's own start: the figure is what the person waited, interpreter and imports included.
    QTimer.singleShot(0, lambda: window.statusBar().showMessage(
        f"{opened} in {seconds_since_start():.2f} s. Verify every value against the governing drawing and "
        "procedure."))
    QTimer.singleShot(0, lambda: recovery.offer_recovery(window))
    return app.exec()
