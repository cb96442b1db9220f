"""Measured points in the Scene, checked by pixels on software OpenGL: the residual vectors are drawn
where the scene's own projection puts them, scaled by the factor the legend states, and flagged points
are ringed. Fits come from the Measure panel's own fitting function (app/panels/measure_fit.py)."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from app.panels.measure_fit import fit_point_rows
from app.scene.measured_points import FLAGGED_RGB, residual_factor
from tests.app.test_scene import H, W, scene  # noqa: F401  (the shown scene fixture)


def _fit(with_bad_point=False, rotation=Rotation.identity()):
    # A 120 x 80 x 50 mm box's corners (the scene's default part) and a few face centres, measured with
    # small invented offsets; one row can be given a large offset so it is flagged.
    corners = np.array([[x, y, z] for x in (-60, 60) for y in (-40, 40) for z in (-25, 25)], float)
    nominal = np.vstack([corners, [[60, 0, 0], [0, 0, 25]]])
    rng = np.random.default_rng(11)
    offsets = rng.normal(0, 0.02, nominal.shape)
    if with_bad_point:
        offsets[2] += [0.0, 0.0, 0.4]
    measured = rotation.apply(nominal) + [500.0, 200.0, -100.0] + offsets
    values = np.hstack([nominal, measured])
    return fit_point_rows(values, None, list(range(len(values))), "mm")


def _bright_white(image, pixel, radius=2):
    x, y = int(round(pixel[0])), int(round(pixel[1]))
    patch = image[max(0, y - radius): y + radius + 1, max(0, x - radius): x + radius + 1, :3].astype(int)
    return bool(np.any(np.min(patch, axis=-1) > 200))


def _magenta(image, pixel, radius=9):
    x, y = int(round(pixel[0])), int(round(pixel[1]))
    patch = image[max(0, y - radius): y + radius + 1, max(0, x - radius): x + radius + 1, :3].astype(int)
    r, g, b = patch[..., 0], patch[..., 1], patch[..., 2]
    return bool(np.any((r > 200) & (b > 180) & (g < 140)))


def test_residual_factor_is_a_1_2_5_step_that_keeps_the_largest_vector_short():
    assert residual_factor(0.18 / 250) == 200      # wants 250: the step at or below it
    assert residual_factor(0.18 / 1000) == 1000
    assert residual_factor(0.18 / 640) == 500
    assert residual_factor(1.0) == 1.0              # large residuals are drawn true to scale
    assert residual_factor(0.0) == 1.0


def test_fitted_points_are_drawn_in_the_part_scale_around_the_fitted_origin(scene):
    rotation = Rotation.from_euler("z", 20, degrees=True)
    fit = _fit(rotation=rotation)
    scene.set_measured_points(fit)
    item = scene.measured_points
    # 1 mm = part scale: 0.45 / 60 (the default part's largest half-dimension) scene units
    assert item.scale == pytest.approx(0.45 / 60)
    largest = np.max(np.linalg.norm(fit.residuals, axis=1))
    assert 0.18 / 10 < item.factor * item.scale * largest <= 0.18
    assert any("residuals \u00d7" + f"{item.factor:g}" in text for text, _ in item.legend_lines())
    base, tips = item.to_scene(fit.fitted), item.residual_tips()
    np.testing.assert_allclose(tips - base, item.factor * item.scale * fit.residuals, atol=1e-12)
    # the fitted nominal corner (60, 40, 25) lands where R · p puts it on the drawn part (SciPy's R)
    np.testing.assert_allclose(base[7], rotation.apply([60, 40, 25]) * item.scale, atol=1e-3)


def test_a_residual_vector_is_drawn_where_the_scene_projects_it(scene):
    # A made-up fit record with one known residual, placed in a corner of the top view that holds no
    # label: fitted point at (80, -80, 0) mm from the fitted origin, residual (0.1, 0.05, 0) mm.
    from types import SimpleNamespace

    t = np.array([500.0, 200.0, -100.0])
    fitted = np.array([[80.0, -80.0, 0.0], [-80.0, 80.0, 0.0], [80.0, 80.0, 0.0]]) + t
    residuals = np.array([[0.1, 0.05, 0.0], [0.0, 0.0, 0.0], [0.0, 0.0, 0.0]])
    fit = SimpleNamespace(method="points", translation=t, fitted=fitted, measured=fitted + residuals,
                          residuals=residuals, flagged=(), rows=(0, 1, 2), unit="mm")
    scene.set_view("-Z")   # from above: the vector lies across the screen
    empty = scene.render_image(W, H)
    scene.set_measured_points(fit)
    image = scene.render_image(W, H)
    item = scene.measured_points
    assert item.factor == 200     # 0.18 / (0.0075 · 0.112) = 215 -> the 1-2-5 step below it
    base = item.to_scene(fitted[0])
    tip = base + 200 * 0.0075 * residuals[0]
    np.testing.assert_allclose(item.residual_tips()[0], tip, atol=1e-12)
    start, end = scene.project(base, (W, H)), scene.project(tip, (W, H))
    assert np.linalg.norm(end - start) > 25            # long enough on screen to see
    for f in (0.4, 0.6):
        along = scene.project(base + f * (tip - base), (W, H))
        assert _bright_white(image, along)              # the white residual vector passes there
        assert not _bright_white(empty, along)          # ...and nothing white was there before
    beside = scene.project(base + 0.5 * (tip - base) + np.array([0.0, -0.08, 0.0]), (W, H))
    assert not _bright_white(image, beside)             # and not a blob: off the line it is dark
    assert any("residuals \u00d7200 to the measured points (largest 0.112 mm)" in text
               for text, _ in item.legend_lines())


def test_flagged_point_is_ringed_and_none_hides_everything(scene):
    scene.set_view("-Z")
    fit = _fit(with_bad_point=True)
    assert fit.flagged[0] == 2   # the point given the large offset (a neighbour may be flagged too)
    scene.set_measured_points(fit)
    image = scene.render_image(W, H)
    flagged = scene.measured_points.to_scene(fit.fitted[2])
    assert _magenta(image, scene.project(flagged, (W, H)))
    assert scene.labels.labels["flag0"].visible and scene.labels.labels["flag0"].text == "row 3 flagged"
    assert tuple(scene.labels.labels["flag0"].rgb) == FLAGGED_RGB
    scene.set_measured_points(None)
    image = scene.render_image(W, H)
    assert not _magenta(image, scene.project(flagged, (W, H)))
    assert not scene.labels.labels["flag0"].visible
    assert not scene.labels.panels["measured"].visible


def test_points_far_from_the_part_are_drawn_smaller_to_stay_in_view(scene):
    nominal = np.array([[0, 0, 0], [2000, 0, 0], [0, 1500, 0], [0, 0, 900.0]])
    values = np.hstack([nominal, nominal + 10.0])
    fit = fit_point_rows(values, None, [0, 1, 2, 3], "mm")
    scene.set_measured_points(fit)
    item = scene.measured_points
    assert item.scale < 0.45 / 60
    assert np.max(np.linalg.norm(item.to_scene(fit.fitted), axis=1)) == pytest.approx(1.25)
    assert any("(1 mm = " in text and "axis lengths)" in text for text, _ in item.legend_lines())
