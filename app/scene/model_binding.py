"""bind_scene_to_model: feeds a SceneWidget from the session model, so the scene stays a plain view.

The model is duck-typed. Required: a Qt signal ``changed(change)`` and the methods
``current_orientation()`` and ``ghost_orientation()`` (None = no second orientation: the scene then shows
the reference orientation as its ghost). Used when present: ``ghost_label()``; ``current_mount()`` with
``.name`` and ``.part`` (``box_size_mm``, ``face_names``, ``boresight``); ``preferences`` with
``sequence`` and ``intrinsic`` (the sequence the overlay writes angles in); ``scene_frames()`` with
[(orientation, label), ...] (a mount chain's intermediate frames). The scene never writes back.
"""

from __future__ import annotations

from app.changes import ORIENTATION
from core.orientation import Orientation

# An edit of the selected mount's orientation changes only that and (when the mount is the chain's
# product, or stops being it) the chain's frames: the ghost is another mount, and nothing else moved.
_ORIENTATION_ONLY = frozenset({ORIENTATION})


class SceneBinding:
    def __init__(self, scene, model):
        self.scene = scene
        self.model = model
        self._part = None
        self._ghost = ()
        self._frames = []
        model.changed.connect(self.refresh)
        if hasattr(model, "set_reference_frame"):
            # the scene's own "Direction names" choice is the model's: one name for the reference axes
            scene.toolbar.preset_chosen.connect(lambda key: model.set_reference_frame(key, origin=scene))
        self.refresh()

    def refresh(self, change=None):
        model, scene = self.model, self.scene
        orientation = model.current_orientation()
        if orientation != scene.orientation():
            scene.set_orientation(orientation)
        if change is not None and getattr(change, "what", None) == _ORIENTATION_ONLY:
            self._refresh_frames()
            return
        ghost = model.ghost_orientation()
        label = model.ghost_label() if hasattr(model, "ghost_label") else None
        if ghost is None:
            ghost, label = Orientation.identity(), "reference"
        if (ghost, label) != self._ghost:
            self._ghost = (ghost, label)
            scene.set_ghost(ghost, label or "second orientation")
        mount = model.current_mount() if hasattr(model, "current_mount") else None
        part = getattr(mount, "part", None)
        if part is not None and part != self._part:
            self._part = part
            scene.set_part(part.box_size_mm, part.face_names, part.boresight)
        self._refresh_frames()
        preset = getattr(model, "reference_frame", None)
        if preset is not None and preset != scene.frame_preset():
            scene.set_frame_preset(preset)
        prefs = getattr(model, "preferences", None)
        if prefs is not None:
            kind, sequence, intrinsic = scene.overlay_representation()
            if (prefs.sequence, prefs.intrinsic) != (sequence, intrinsic):
                scene.set_overlay_representation(kind, prefs.sequence, prefs.intrinsic)
            if prefs.angle_units != scene.angle_unit():
                scene.set_angle_unit(prefs.angle_units)

    def _refresh_frames(self):
        model = self.model
        frames = model.scene_frames() if hasattr(model, "scene_frames") else []
        if frames != self._frames:
            self._frames = list(frames)
            self.scene.set_extra_frames(self._frames)

    def disconnect(self):
        self.model.changed.disconnect(self.refresh)


def bind_scene_to_model(scene, model) -> SceneBinding:
    """Connect the scene to the model's change signal and show the model's state now. Keep the returned
    binding (or call its disconnect()) for as long as the scene should follow the model."""
    return SceneBinding(scene, model)
