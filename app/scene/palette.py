"""Colours of the scene, in one place. Axis colours X red, Y green, Z blue follow the trade's general habit;
they are lightened enough to read on the dark background. Everything else is our own plain choice:
warm amber for the rotation axis and its angle, cyan for the tracked vector and the cone it sweeps."""

BACKGROUND = (24, 27, 33)

AXIS_RGB = ((255, 72, 72), (64, 214, 96), (84, 150, 255))  # body X, Y, Z
REFERENCE_RGB = (150, 156, 168)  # faint reference axes and their labels
GRID_RGBA = (90, 96, 108, 110)

ROTATION_AXIS_RGB = (255, 196, 64)  # n, the arc of the angle φ
TRACKED_RGB = (64, 220, 230)  # r and the cone it sweeps
TRACKED_START_RGB = (40, 150, 160)  # r at the reference orientation
PARALLEL_RGB = (214, 140, 255)  # r∥, fixed during the rotation
ALPHA_RGB = (240, 240, 240)  # the half-angle α between n and r

PART_RGB = (120, 128, 142)
BORESIGHT_RGB = (255, 150, 40)
GHOST_RGB = (200, 200, 210)

LABEL_TEXT_RGB = (236, 238, 242)
LABEL_BOX_RGBA = (12, 14, 18, 190)
OVERLAY_BOX_RGBA = (12, 14, 18, 215)


def rgba_float(rgb, alpha=1.0):
    """(r, g, b) in 0..255 to the (r, g, b, a) floats pyqtgraph.opengl wants."""
    return (rgb[0] / 255.0, rgb[1] / 255.0, rgb[2] / 255.0, alpha)
