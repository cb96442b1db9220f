"""A column set's numbers to unit quaternions, all rows at once with the kernels, and {row: what is wrong}
for rows whose numbers fall outside the range their meaning allows."""

from __future__ import annotations

import numpy as np

from core import kernels, representations
from core.batch_cells import MAX_ANGLE_DEG, MAX_MATRIX_ENTRY, QUATERNION_LENGTHS
from core.nearest import WARNING_LIMIT, orthogonality_report


_QUATERNION_NOTICE = 1e-6


def scaled_lengths(v):
    """Euclidean length of each row of v (N, k), scaled first (divided by its largest magnitude), so a
    component of 1e200 neither overflows nor one of 1e-200 underflows."""
    scale = np.abs(v).max(axis=1)
    safe = np.where(scale > 0, scale, 1.0)
    with np.errstate(over="ignore"):   # only a length beyond the largest float becomes inf (then refused)
        return scale * np.sqrt(np.einsum("ij,ij->i", v / safe[:, None], v / safe[:, None]))


def _first_bad(bad, usable):
    return np.flatnonzero(bad & usable)


def _to_quaternions(column_set, values, usable, notes):
    """Unit quaternions (N, 4) of the rows marked usable (identity elsewhere) and {row: what is wrong}
    for usable rows whose numbers fall outside the range their meaning allows."""
    rep = column_set.representation
    n = len(values)
    out = np.tile([1.0, 0.0, 0.0, 0.0], (n, 1))
    problems = {}
    limit = MAX_ANGLE_DEG if column_set.degrees else np.radians(MAX_ANGLE_DEG)
    unit = "deg" if column_set.degrees else "rad"
    columns = ", ".join(column_set.columns)
    safe = np.where(usable[:, None], values, 0.0)

    def refuse(bad, what):
        for row in _first_bad(bad, usable):
            problems.setdefault(int(row), what(int(row)))
        return usable & ~bad

    scale = np.pi / 180.0 if column_set.degrees else 1.0
    if rep == "quaternion":
        norms = scaled_lengths(safe)
        low, high = QUATERNION_LENGTHS
        ok = refuse((norms < low) | (norms > high),
                    lambda r: f"columns {columns}: quaternion of length {norms[r]:.3g}; expected a unit "
                              f"quaternion (length about 1, w x y z not all zero)")
        off = np.abs(norms - 1.0)[ok]
        if off.size and off.max() > _QUATERNION_NOTICE:
            notes.append(f"{column_set.role}: {int(np.count_nonzero(off > _QUATERNION_NOTICE))} quaternion(s) "
                         f"normalised (largest norm departure {off.max():.2g})")
        if ok.any():
            out[ok] = kernels.canonical_quaternions(safe[ok] / norms[ok, None])
        return out, problems, ok
    if rep == "matrix":
        big = np.abs(safe).max(axis=1) > MAX_MATRIX_ENTRY
        ok = refuse(big, lambda r: f"columns {columns}: an entry of {np.abs(safe[r]).max():.3g} cannot belong "
                                   f"to a rotation matrix; expected entries between -1 and 1")
        if not ok.any():
            return out, problems, ok
        m = safe[ok].reshape(-1, 3, 3)
        if column_set.matrix_meaning == "reference_to_body":
            m = np.swapaxes(m, 1, 2)
        rotations, error, det = kernels.nearest_rotations(m)
        rows = np.flatnonzero(ok)
        bad_rows = (det <= 0) | (error > WARNING_LIMIT)
        for k in np.flatnonzero(bad_rows):
            problems[int(rows[k])] = f"columns {columns}: {orthogonality_report(m[k]).message}"
        good = ~bad_rows
        corrected = (error > 1e-9) & good
        if corrected.any():
            notes.append(f"{column_set.role}: {int(np.count_nonzero(corrected))} matrix(es) not exactly "
                         f"orthonormal were replaced by their nearest rotation (largest orthogonality error "
                         f"{error[corrected].max():.2g})")
        ok = ok.copy()
        ok[rows[bad_rows]] = False
        if good.any():
            out[rows[good]] = kernels.matrices_to_quaternions(rotations[good])
        return out, problems, ok
    if rep == "axis_angle":
        axis, angle = safe[:, :3], safe[:, 3]
        ok = refuse(np.abs(angle) > limit, lambda r: f"column {column_set.columns[3]!r}: angle "
                    f"{angle[r]:.6g} {unit}; expected at most {limit:g} {unit} either way")
        ok = refuse((np.abs(axis).max(axis=1) == 0) & (angle != 0),
                    lambda r: f"columns {columns}: rotation axis of zero length; expected a non-zero "
                              f"direction (x, y, z)") & ok
        if ok.any():
            out[ok] = kernels.axis_angles_to_quaternions(axis[ok], angle[ok] * scale)
        return out, problems, ok
    vector = representations.BY_KEY.get(rep)
    if vector is not None and vector.vector:
        ok = usable
        if vector.units == representations.ANGLE:
            lengths = scaled_lengths(safe)
            ok = refuse(lengths > limit, lambda r: f"columns {columns}: {vector.name} of length "
                        f"{lengths[r]:.6g} {unit}; expected at most {limit:g} {unit}")
        else:
            scale = 1.0                 # pure numbers: any finite vector is an orientation
        if ok.any():
            out[ok] = vector.to_quaternions(safe[ok] * scale)
        return out, problems, ok
    big = np.abs(safe).max(axis=1) > limit
    ok = refuse(big, lambda r: f"columns {columns}: an angle of {np.abs(safe[r]).max():.6g} {unit}; "
                               f"expected at most {limit:g} {unit} either way")
    if ok.any():
        out[ok] = kernels.angles_to_quaternions(safe[ok] * scale, column_set.sequence, column_set.intrinsic)
    return out, problems, ok
