"""EditorRows: a layout that sets the editors and the meter side by side, in as few rows as the width
allows. On a laptop's 1280 px they all fit one row, so they take one box's height from the Scene instead
of two; on a narrower window the last ones move to a second row, and so on. Each box gets at least its
minimum width; spare width goes first to the boxes below their preferred width, then to all alike."""

from __future__ import annotations

from PySide6.QtCore import QPoint, QRect, QSize, Qt
from PySide6.QtWidgets import QLayout, QLayoutItem


class EditorRows(QLayout):
    def __init__(self, parent=None):
        super().__init__(parent)
        self._items: list[QLayoutItem] = []

    # ---- QLayout's bookkeeping ---------------------------------------------------------------------
    def addItem(self, item: QLayoutItem) -> None:
        self._items.append(item)

    def count(self) -> int:
        return len(self._items)

    def itemAt(self, index: int):
        return self._items[index] if 0 <= index < len(self._items) else None

    def takeAt(self, index: int):
        return self._items.pop(index) if 0 <= index < len(self._items) else None

    def expandingDirections(self):
        return Qt.Orientation(0)

    def hasHeightForWidth(self) -> bool:
        return True

    def heightForWidth(self, width: int) -> int:
        return self._arrange(QRect(0, 0, width, 0), place=False)

    def setGeometry(self, rect: QRect) -> None:
        super().setGeometry(rect)
        self._arrange(rect, place=True)

    def sizeHint(self) -> QSize:
        """All in one row at their preferred widths."""
        shown = self._shown()
        left, top, right, bottom = self.getContentsMargins()
        width = sum(i.sizeHint().width() for i in shown) + self.spacing() * max(len(shown) - 1, 0)
        height = max((i.sizeHint().height() for i in shown), default=0)
        return QSize(width + left + right, height + top + bottom)

    def minimumSize(self) -> QSize:
        """As narrow as the widest box (then one box a row), as tall as the tallest."""
        shown = self._shown()
        left, top, right, bottom = self.getContentsMargins()
        width = max((i.minimumSize().width() for i in shown), default=0)
        height = max((i.minimumSize().height() for i in shown), default=0)
        return QSize(width + left + right, height + top + bottom)

    # ---- the arrangement -------------------------------------------------------------------------------
    def _shown(self) -> list[QLayoutItem]:
        return [i for i in self._items if not i.isEmpty()]

    def rows(self, width: int) -> list[list[QLayoutItem]]:
        """The boxes row by row for a given inner width: each row takes boxes while their minimum widths
        fit."""
        rows: list[list[QLayoutItem]] = []
        used = 0
        for item in self._shown():
            need = item.minimumSize().width()
            if rows and used + self.spacing() + need <= width:
                rows[-1].append(item)
                used += self.spacing() + need
            else:
                rows.append([item])
                used = need
        return rows

    def _widths(self, row: list[QLayoutItem], width: int) -> list[int]:
        mins = [i.minimumSize().width() for i in row]
        hints = [max(i.sizeHint().width(), m) for i, m in zip(row, mins)]
        spare = max(width - self.spacing() * (len(row) - 1) - sum(mins), 0)
        short = sum(h - m for h, m in zip(hints, mins))
        if spare <= short:  # not enough for every preferred width: share it by how far each falls short
            return [m + (spare * (h - m)) // short if short else m for h, m in zip(hints, mins)]
        extra = (spare - short) // len(row)
        widths = [h + extra for h in hints]
        widths[-1] += spare - short - extra * len(row)  # the rounding's last pixels: the row ends flush
        return widths

    def _arrange(self, rect: QRect, place: bool) -> int:
        left, top, right, bottom = self.getContentsMargins()
        inner = rect.adjusted(left, top, -right, -bottom)
        y = inner.y()
        for row in self.rows(inner.width()):
            widths = self._widths(row, inner.width())
            height = max(max(i.minimumSize().height(),
                             i.heightForWidth(w) if i.hasHeightForWidth() else i.sizeHint().height())
                         for i, w in zip(row, widths))
            x = inner.x()
            for item, w in zip(row, widths):
                if place:
                    item.setGeometry(QRect(QPoint(x, y), QSize(w, height)))
                x += w + self.spacing()
            y += height + self.spacing()
        return y - self.spacing() - inner.y() + top + bottom if self._shown() else top + bottom
