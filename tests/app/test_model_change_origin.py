"""A change says which view made it, so that view alone ignores it (and keeps the user's own spelling):
every other view, and a change with no origin, must still redraw."""

from app.changes import ORIENTATION, Change


class _View:
    pass


def test_only_the_view_that_made_a_change_is_its_maker():
    editor, scene = _View(), _View()
    change = Change(frozenset({ORIENTATION}), origin=editor)
    assert change.made_by(editor) is True
    assert change.made_by(scene) is False         # another view must redraw
    assert change.made_by(None) is False


def test_a_change_with_no_origin_was_made_by_no_view():
    change = Change(frozenset({ORIENTATION}))
    assert change.made_by(_View()) is False
    assert change.made_by(None) is False           # "no view" is not a view that made it
