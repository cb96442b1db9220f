"""core/operations.py: each edit is a pure Session -> Session function, checked without Qt.

Check values: the documented rules of each operation (worked by hand per case), SciPy's Rotation for the
orientations (composition, the 24-element rotation group of the cube, the weighted mean), and hostile
input refused with a message while the session given stays as it was."""

from dataclasses import replace

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import operations as ops
from core.chain import Chain, ChainStep
from core.check import CheckSettings
from core.measurement import MAX_MEASUREMENTS_PER_MOUNT, Measurement
from core.orientation import Orientation
from core.position import Position
from core.session import Mount, PartProperties, SavedCheck, Session


def _orientation(rotation: Rotation) -> Orientation:
    x, y, z, w = rotation.as_quat()                  # SciPy is scalar-last
    return Orientation.from_quaternion((w, x, y, z))


def _rotation(orientation: Orientation) -> Rotation:
    return Rotation.from_quat(np.roll(orientation.as_quaternion(), -1))


def _angle_between_deg(a: Orientation, b: Rotation) -> float:
    return float(np.degrees((_rotation(a).inv() * b).magnitude()))


def session_of(names, selected=0, checks=()):
    return Session(tuple(Mount(n) for n in names), selected=selected, checks=tuple(checks))


# ---- the list of mounts -------------------------------------------------------------------------

def test_add_appends_a_new_mount_under_an_unused_name_and_selects_it():
    before = session_of(["Mount", "Mount 2", "Camera"], selected=0)
    after = ops.add_mount(before)
    assert [m.name for m in after.mounts] == ["Mount", "Mount 2", "Camera", "Mount 3"]
    assert after.selected == 3 and after.mounts[3].orientation == Orientation.identity()
    assert [m.name for m in before.mounts] == ["Mount", "Mount 2", "Camera"]     # the old value is untouched
    assert ops.describe_edit(before, after) == "Add mount “Mount 3”"


def test_duplicate_puts_the_copy_right_after_its_original_with_its_values():
    turned = Orientation.from_angles("ZYX", (30, 10, -5))
    before = Session((Mount("A"), Mount("B", turned, notes="measured at 30° yaw"), Mount("C")), selected=0)
    after = ops.duplicate_mount(before, 1)
    assert [m.name for m in after.mounts] == ["A", "B", "B copy", "C"] and after.selected == 2
    assert after.mounts[2].orientation == turned
    # the note may state angles the copy will not keep for long: it says where it came from instead
    assert after.mounts[2].notes == "Copy of “B” (its note stays with it)."


@pytest.mark.parametrize("names, selected, index, after_names, after_selected", [
    (["A", "B", "C"], 1, 1, ["A", "C"], 1),      # the selected one: its neighbour takes its place
    (["A", "B", "C"], 2, 2, ["A", "B"], 1),      # the last and selected: the one before it
    (["A", "B", "C"], 2, 0, ["B", "C"], 1),      # one before the selection: the selection stays on C
    (["A", "B", "C"], 0, 2, ["A", "B"], 0),      # one after it: nothing moves
])
def test_delete_keeps_the_selection_on_the_same_mount_or_its_neighbour(names, selected, index, after_names,
                                                                      after_selected):
    before = session_of(names, selected)
    after = ops.delete_mount(before, index)
    assert [m.name for m in after.mounts] == after_names and after.selected == after_selected
    assert ops.describe_edit(before, after) == f"Delete mount “{names[index]}”"


def test_the_last_mount_cannot_be_deleted():
    with pytest.raises(ValueError, match="at least one mount"):
        ops.delete_mount(session_of(["only"]))


def test_rename_renames_the_mount_in_every_check_that_names_it():
    checks = (SavedCheck("A", "B", name="first"), SavedCheck("B", "B", name="twice"), SavedCheck("C", None))
    before = session_of(["A", "B", "C"], checks=checks)
    after = ops.rename_mount(before, 1, "  B renamed  ")
    assert [m.name for m in after.mounts] == ["A", "B renamed", "C"]
    assert [(c.nominal, c.measured) for c in after.checks] == [("A", "B renamed"), ("B renamed", "B renamed"),
                                                              ("C", None)]
    assert [c.name for c in after.checks] == ["first", "twice", "check"]
    assert ops.describe_edit(before, after) == "Rename mount to “B renamed”"
    assert ops.changed_fields(before, after) == {"mounts", "checks"}


@pytest.mark.parametrize("name", ["", "   ", "two\nlines", "erase\x1b[2K", "lone \ud800", "x" * 501, None, 7])
def test_a_name_that_could_not_be_saved_is_refused_and_the_session_stays(name):
    before = session_of(["A", "B"])
    with pytest.raises((ValueError, TypeError), match="name"):
        ops.rename_mount(before, 0, name)
    assert [m.name for m in before.mounts] == ["A", "B"]


@pytest.mark.parametrize("index", [-1, 2, 10 ** 12, True, 1.0])
def test_a_mount_index_outside_the_list_is_refused(index):
    with pytest.raises(IndexError, match="outside 0..1"):
        ops.delete_mount(session_of(["A", "B"]), index)
    with pytest.raises(IndexError):
        ops.select(session_of(["A", "B"]), index)


def test_unused_name_counts_up_from_two():
    assert ops.unused_name(session_of(["X"]), "Y") == "Y"
    assert ops.unused_name(session_of(["X", "X 2", "X 4"]), "X") == "X 3"


# ---- one mount's values ---------------------------------------------------------------------------

def test_set_orientation_changes_only_that_mount():
    target = Orientation.from_angles("ZYX", (12.5, -3.25, 170.0))
    before = session_of(["A", "B"], selected=1)
    after = ops.set_orientation(before, target)
    assert after.mounts[1].orientation == target and after.mounts[0] == before.mounts[0]
    assert ops.describe_edit(before, after) == "Edit orientation"
    with pytest.raises(TypeError, match="Orientation"):
        ops.set_orientation(before, (1, 0, 0, 0))


def test_position_set_edit_and_clear_are_named_as_such():
    before = session_of(["Mast"])
    placed = ops.set_position(before, Position.from_shown((12.5, 0, -3), "mm"))
    assert placed.mounts[0].position.metres == pytest.approx((0.0125, 0.0, -0.003))
    assert ops.describe_edit(before, placed) == "Set the position of “Mast”"
    moved = ops.set_position(placed, Position.from_shown((13, 0, -3), "mm"))
    assert ops.describe_edit(placed, moved) == "Edit the position of “Mast”"
    assert ops.describe_edit(moved, ops.set_position(moved, None)) == "Clear the position of “Mast”"
    with pytest.raises(TypeError, match="Position"):
        ops.set_position(before, (1, 2, 3))


def test_set_pose_sets_both_in_one_edit():
    before = session_of(["A"])
    pose = ops.set_pose(before, Orientation.from_angles("ZYX", (5, 0, 0)), Position((1.0, 2.0, 3.0)))
    assert ops.changed_mount_fields(before.mounts[0], pose.mounts[0]) == {"orientation", "position"}
    assert ops.describe_edit(before, pose) == "Edit the pose of “A”"


def test_set_part_replaces_the_part():
    part = PartProperties((10, 20, 30), {"+Z": "lens"}, "+Z")
    before = session_of(["Cam"])
    after = ops.set_part(before, part)
    assert after.mounts[0].part == part and ops.describe_edit(before, after) == "Edit the part of “Cam”"
    with pytest.raises(TypeError, match="PartProperties"):
        ops.set_part(before, {"box_size_mm": (1, 2, 3)})


@pytest.mark.parametrize("yaw_pitch_roll", [(93, 2, -1), (-178, 44, 3), (0.4, -89.0, 0.2), (45.1, 0, 0)])
def test_snap_goes_to_the_nearest_of_scipys_24_rotations_of_the_cube(yaw_pitch_roll):
    # SciPy: Rotation.create_group("O") is the octahedral group, the 24 right-angle orientations.
    start = Rotation.from_euler("ZYX", yaw_pitch_roll, degrees=True)
    group = Rotation.create_group("O")
    nearest = min(range(len(group)), key=lambda k: (start.inv() * group[k]).magnitude())
    after = ops.snap_to_right_angle(Session((Mount("A", _orientation(start)),)))
    assert _angle_between_deg(after.mounts[0].orientation, group[nearest]) < 1e-9


# ---- repeated measurements ------------------------------------------------------------------------

def test_measurements_add_remove_clear_and_their_words():
    first = Orientation.from_angles("ZYX", (1, 2, 3))
    session = Session((Mount("Radar", first),))
    one = ops.add_measurement(session, "fit")
    assert one.mounts[0].measurements == (Measurement(first, 1.0, "fit"),)
    assert ops.describe_edit(session, one) == "Add measurement 1 to “Radar”"
    two = ops.add_measurement(ops.set_orientation(one, Orientation.from_angles("ZYX", (1, 2, 4))))
    removed = ops.remove_measurement(two, 0)
    assert removed.mounts[0].measurements == two.mounts[0].measurements[1:]
    assert ops.describe_edit(two, removed) == "Remove measurement 1 of “Radar”"
    assert ops.describe_edit(two, ops.clear_measurements(two)) == "Clear the measurements of “Radar”"
    with pytest.raises(IndexError, match="measurement 3 is not one of the 2 kept"):
        ops.remove_measurement(two, 2)


def test_a_mount_keeps_at_most_the_limit_of_measurements():
    full = ops.set_measurements(session_of(["A"]), (Measurement(Orientation.identity()),) * MAX_MEASUREMENTS_PER_MOUNT)
    with pytest.raises(ValueError, match="already keeps 1,000 measurements"):
        ops.add_measurement(full)


def test_use_average_is_scipys_weighted_mean():
    rotations = Rotation.from_euler("XYZ", [[1, 2, 3], [1.5, 2.2, 2.6], [0.7, 1.9, 3.3]], degrees=True)
    weights = [1.0, 3.0, 0.5]
    kept = tuple(Measurement(_orientation(r), w, "fit") for r, w in zip(rotations, weights))
    after = ops.use_average(ops.set_measurements(session_of(["A"]), kept))
    # SciPy: Rotation.mean with weights (Markley's weighted mean)
    assert _angle_between_deg(after.mounts[0].orientation, rotations.mean(weights=weights)) < 1e-9
    with pytest.raises(ValueError, match="no average"):
        ops.use_average(session_of(["A"]))
    with pytest.raises(ValueError, match="no average"):
        ops.use_average(ops.set_measurements(session_of(["A"]), (Measurement(Orientation.identity(), 0.0),)))


# ---- chain and check --------------------------------------------------------------------------------

def test_set_chain_and_set_check_replace_the_first_and_keep_the_others():
    spare = Chain(name="spare")
    before = Session((Mount("A"),), chains=(Chain(name="main"), spare), checks=(SavedCheck(), SavedCheck(name="b")))
    chain = Chain((ChainStep("bracket", Orientation.from_axis_angle((0, 0, 1), 90)),), name="mast")
    after = ops.set_chain(before, chain)
    assert after.chains == (chain, spare) and ops.describe_edit(before, after) == "Edit chain"
    check = SavedCheck("A", "A", CheckSettings(total_tolerance_deg=0.25))
    checked = ops.set_check(after, check)
    assert checked.checks == (check, SavedCheck(name="b")) and ops.describe_edit(after, checked) == "Edit check"
    with pytest.raises(TypeError, match="Chain"):
        ops.set_chain(before, "bracket")
    with pytest.raises(TypeError, match="SavedCheck"):
        ops.set_check(before, {"nominal": "A"})
    assert ops.set_chain(Session.single(), Chain()).chains == (Chain(),)     # a session without one gets one


def test_chain_to_mount_adds_the_chains_pose_as_a_selected_mount_named_after_it():
    steps = (ChainStep("bracket", _orientation(Rotation.from_euler("z", 90, degrees=True)),
                       position=Position((0.1, 0.0, 0.0))),
             ChainStep("plate", _orientation(Rotation.from_euler("x", 30, degrees=True)), inverted=True,
                       position=Position((0.0, 0.2, 0.0))))
    before = Session((Mount("A"),), chains=(Chain(steps, "mast"),))
    after = ops.chain_to_mount(before)
    mount = after.mounts[-1]
    assert mount.name == "mast product" and after.selected == 1
    # R = R_1 · R_2ᵀ (the second step inverted), t = t_1 + R_1 · (−R_2ᵀ · t_2)   (core/chain.py, CONVENTIONS.md)
    r1, r2 = Rotation.from_euler("z", 90, degrees=True), Rotation.from_euler("x", 30, degrees=True)
    assert _angle_between_deg(mount.orientation, r1 * r2.inv()) < 1e-9
    expected = np.array([0.1, 0, 0]) + r1.apply(-r2.inv().apply([0, 0.2, 0]))
    assert np.allclose(mount.position.metres, expected, atol=1e-15)
    assert ops.chain_to_mount(after).mounts[-1].name == "mast product 2"
    assert ops.chain_to_mount(Session.single()).mounts[-1].name == "Chain product"


# ---- settings that are not data -----------------------------------------------------------------------

def test_reference_frame_and_preferences():
    before = Session.single()
    assert ops.set_reference_frame(before, " NED ").reference_frame == "ned"
    with pytest.raises(ValueError, match="unknown frame preset"):
        ops.set_reference_frame(before, "up-is-down")
    assert ops.set_preferences(before, angle_units="rad").preferences.angle_units == "rad"
    with pytest.raises(ValueError, match="sequence"):
        ops.set_preferences(before, sequence="XXY")
    assert ops.changed_fields(before, ops.select(session_of(["A", "B"]), 1)) >= {"selected"}


def test_describe_edit_says_when_nothing_changed_or_several_things_did():
    session = session_of(["A", "B"])
    assert ops.describe_edit(session, session) == "No change"
    both = replace(session, mounts=tuple(m.with_orientation(Orientation.from_axis_angle((1, 0, 0), 3))
                                         for m in session.mounts))
    assert ops.describe_edit(session, both) == "Edit mounts"
