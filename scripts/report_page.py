"""The first page of the demo's check report as a PNG for the README (docs/screenshots/report-page1.png),
drawn by the same page painting as the PDF (app/report_pdf.page_image), with the Scene picture rendered
on software OpenGL under Xvfb (a virtual display is started when none is set).

    .venv/bin/python scripts/report_page.py [output.png] [PAGE] [ANGLE_UNIT SLOPE_UNIT]

e.g. `scripts/report_page.py /tmp/p2.png 2 arcsec mm/m` for page 2 of the record in arcseconds and mm/m.
"""

from __future__ import annotations

import os
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))
os.environ.setdefault("LIBGL_ALWAYS_SOFTWARE", "1")

sys.path.insert(0, str(ROOT / "scripts"))
from screenshots import _virtual_display  # noqa: E402 - after the path is set


def main(argv: list[str]) -> int:
    out = Path(argv[1]) if len(argv) > 1 else ROOT / "docs" / "screenshots" / "report-page1.png"
    page = int(argv[2]) if len(argv) > 2 else 1
    chosen = argv[3:5] if len(argv) > 4 else ["deg", "deg"]
    display = _virtual_display()
    try:
        os.environ.setdefault("QT_QPA_PLATFORM", "xcb")
        import app.scene  # noqa: F401 - the GL sharing flag, before the QApplication
        from PySide6.QtWidgets import QApplication

        from app.report_pdf import page_image
        from app.report_writer import now_text, pictures_for
        from core import inspection_record as records
        from core.session import load_session_and_bytes

        application = QApplication.instance() or QApplication(sys.argv)  # noqa: F841
        path = ROOT / "resources" / "demo_check.fwsession.json"
        session, raw = load_session_and_bytes(path)
        record = records.check_record(session, "Radar antenna after remount", path.name,
                                      records.sha256_of_bytes(raw), shown=records.ReportUnits(*chosen))
        pngs, missing, problem = pictures_for(record)
        if problem:
            print(f"note: the Scene picture is left out: {problem}", file=sys.stderr)
        image = page_image(record, now_text(), pngs, missing, page, width=1240,
                           free_values={"Operator": "A. Technician (invented)"})
        if not image.save(str(out)):
            print(f"could not write {out}", file=sys.stderr)
            return 1
        print(f"wrote {out} ({image.width()}x{image.height()})")
        return 0
    finally:
        if display is not None:
            display.stop()


if __name__ == "__main__":
    sys.exit(main(sys.argv))
