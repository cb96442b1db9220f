"""Orientation: one immutable value for a 3D orientation, built and read through symmetric pairs
(from_matrix / as_matrix, from_quaternion / as_quaternion, ...).

Inside is a canonical unit quaternion (Hamilton, w-first, w >= 0). The orientation is the rotation R with
v_ref = R · v_body: the columns of R are the body axes written in reference coordinates. Every angle a
person reads or types is in degrees unless `degrees=False` says otherwise.
"""

from dataclasses import dataclass

import numpy as np

from core import kernels
from core.kernels import rodrigues
from core.errors import InvalidInputError, MatrixRefusedError
from core.kernels import check_flag
from core.nearest import checked_orthogonality_report
from core.sequences import parse_sequence

# A quaternion or axis whose length is off by more than this was not meant to be unit length: say so.
_UNIT_NOTICE = 1e-9
# Angles beyond a million turns are not orientations anyone meant (a lost decimal point, a unit mix-up),
# and cos/sin of such arguments have lost their low digits: refuse them.
_LARGEST_ANGLE_DEG = 3.6e8


def _check_angle_size(values, degrees, what):
    largest = float(np.abs(values).max()) * (1.0 if degrees else 180.0 / np.pi)
    if largest > _LARGEST_ANGLE_DEG:
        raise InvalidInputError(
            f"{what}: {largest:.3g}° is more than a million turns; expected an angle in "
            f"{'degrees' if degrees else 'radians'} (is a decimal point missing?)")


def _unit_range(q, what):
    """`q` scaled by its largest component when that lies outside 1e-150..1e150, so the squares of its
    components neither overflow nor underflow; a zero vector is refused. In range it is left exactly as
    it is (a saved unit quaternion must read back bit for bit)."""
    scale = float(np.abs(q).max())
    if scale == 0:
        raise InvalidInputError(f"{what} of zero length; expected a non-zero (w, x, y, z)")
    return q / scale if not 1e-150 < scale < 1e150 else q


def _vector_length(v):
    """Euclidean length that neither overflows nor underflows (the vector is scaled first)."""
    scale = float(np.abs(v).max())
    return 0.0 if scale == 0 else scale * float(np.linalg.norm(v / scale))


@dataclass(frozen=True)
class AngleSet:
    """Three angles of a sequence, as returned by Orientation.as_angles.

    locked: the orientation is in gimbal lock for this sequence; then the third angle is zero and the
    first carries the whole coupled angle (only their sum or difference is determined)."""

    sequence: str
    intrinsic: bool
    degrees: bool
    angles: np.ndarray
    locked: bool

    def __iter__(self):
        return iter(self.angles)


def _angle_in(value, degrees):
    return np.radians(value) if degrees else value


def _angle_out(value, degrees):
    return np.degrees(value) if degrees else value


_IDENTITIES = {}


class Orientation:
    # _matrix and _axis_angle: derived values kept once computed (the value is immutable, and the Scene and
    # the editors ask for the same ones on every edit).
    __slots__ = ("_q", "_notes", "_matrix", "_axis_angle")

    def __init__(self, quaternion_wxyz, notes=()):
        """Prefer the from_* constructors; this one takes a finite, non-zero w-first quaternion."""
        q = kernels.check_array(quaternion_wxyz, (4,), "quaternion")
        if q.shape != (4,):
            raise InvalidInputError(f"quaternion: expected 4 numbers, got shape {q.shape}")
        q, _ = kernels.normalize_quaternions(_unit_range(q, "quaternion"))
        q = kernels.canonical_quaternions(q)
        q.setflags(write=False)
        object.__setattr__(self, "_q", q)
        object.__setattr__(self, "_notes", tuple(notes))
        object.__setattr__(self, "_matrix", None)
        object.__setattr__(self, "_axis_angle", None)

    @classmethod
    def _from_kernel(cls, q, notes=()):
        """Wrap a quaternion a kernel returned (already unit and canonical) without checking it again:
        the constructor's checks cost more than the conversions on the path of every edit."""
        self = object.__new__(cls)
        q = np.array(q, dtype=np.float64)
        q.setflags(write=False)
        object.__setattr__(self, "_q", q)
        object.__setattr__(self, "_notes", tuple(notes))
        object.__setattr__(self, "_matrix", None)
        object.__setattr__(self, "_axis_angle", None)
        return self

    def __setattr__(self, name, value):
        raise AttributeError("Orientation is immutable")

    # --- identity and quaternion --------------------------------------------------------------------

    @classmethod
    def identity(cls):
        # An Orientation is immutable, so one value serves every caller (the model and the Scene ask for
        # it on every edit, and the constructor's checks cost more than sharing it).
        value = _IDENTITIES.get(cls)
        if value is None:
            value = _IDENTITIES[cls] = cls((1.0, 0.0, 0.0, 0.0))
        return value

    @classmethod
    def from_quaternion(cls, quaternion, scalar_last=False):
        """From four numbers, (w, x, y, z) by default or (x, y, z, w) with scalar_last=True. Non-unit
        input is normalised and the result's notes say so."""
        q = kernels.check_array(quaternion, (4,), "quaternion")
        if q.shape != (4,):
            raise InvalidInputError(f"quaternion: expected 4 numbers, got shape {q.shape}")
        if check_flag(scalar_last, "scalar_last"):
            q = np.roll(q, 1)
        norm = _vector_length(q)
        if norm == 0:
            raise InvalidInputError("quaternion of zero length; expected a non-zero (w, x, y, z)")
        notes = (f"normalised from norm {norm:.10g}",) if abs(norm - 1.0) > _UNIT_NOTICE else ()
        return cls(q, notes)

    def as_quaternion(self, scalar_last=False):
        """Canonical unit quaternion: (w, x, y, z), or (x, y, z, w) with scalar_last=True."""
        return np.roll(self._q, -1) if check_flag(scalar_last, "scalar_last") else self._q.copy()

    @property
    def quaternion(self):
        """The canonical w-first quaternion (read-only view)."""
        return self._q

    @property
    def notes(self):
        """How this value was made from its input (normalised, corrected); empty when exact."""
        return self._notes

    # --- matrix -------------------------------------------------------------------------------------

    @classmethod
    def from_matrix(cls, matrix, transposed=False):
        """From a 3x3 matrix, body -> reference (columns are the body axes). transposed=True reads the
        nine numbers as reference -> body (rows are the body axes), as many drawings print them.

        Not-quite-orthonormal input is replaced by its nearest rotation with a note; input too far from
        a rotation, or a reflection, raises MatrixRefusedError with the report attached."""
        m = kernels.check_array(matrix, (3, 3), "matrix")
        if m.shape != (3, 3):
            raise InvalidInputError(f"matrix: expected 3x3, got shape {m.shape}")
        if check_flag(transposed, "transposed"):
            m = m.T
        report = checked_orthogonality_report(m)
        if not report.accepted:
            raise MatrixRefusedError(report.message, report)
        notes = () if report.band == "exact" else (report.message,)
        return cls._from_kernel(kernels.matrices_to_quaternions(report.nearest), notes)

    def as_matrix(self, transposed=False):
        """3x3 body -> reference matrix, or its transpose (reference -> body) with transposed=True."""
        transposed = check_flag(transposed, "transposed")
        if self._matrix is None:
            m = kernels.quaternions_to_matrices(self._q)
            m.setflags(write=False)
            object.__setattr__(self, "_matrix", m)
        return (self._matrix.T if transposed else self._matrix).copy()

    # --- axis-angle and rotation vector -------------------------------------------------------------

    @classmethod
    def from_axis_angle(cls, axis, angle, degrees=True):
        """Rotation by `angle` about `axis` (right-hand rule). A non-unit axis is normalised, noted."""
        degrees = check_flag(degrees, "degrees")
        axis = kernels.check_array(axis, (3,), "axis")
        if axis.shape != (3,):
            raise InvalidInputError(f"axis: expected 3 numbers, got shape {axis.shape}")
        angle = kernels.check_array(angle, (), "angle")
        if angle.shape != ():                   # float() of an array of two would raise a bare TypeError
            raise InvalidInputError(f"angle: expected one number, got shape {angle.shape}")
        angle = float(angle)
        _check_angle_size(angle, degrees, "angle")
        length = _vector_length(axis)
        if length == 0 and angle != 0:
            raise InvalidInputError("rotation axis of zero length; expected a non-zero direction (x, y, z)")
        notes = ()
        if length > 0 and abs(length - 1.0) > _UNIT_NOTICE:
            notes = (f"axis normalised from length {length:.10g}",)
        return cls._from_kernel(kernels.axis_angles_to_quaternions(axis, _angle_in(angle, degrees)), notes)

    def as_axis_angle(self, degrees=True):
        """(unit axis, angle) with the angle in [0, 180] degrees; the axis is (0, 0, 0) at angle 0."""
        degrees = check_flag(degrees, "degrees")
        if self._axis_angle is None:
            axis, angle = kernels.quaternions_to_axis_angles(self._q, assume_canonical=True)
            axis.setflags(write=False)
            object.__setattr__(self, "_axis_angle", (axis, float(angle)))
        axis, angle = self._axis_angle
        return axis.copy(), float(_angle_out(angle, degrees))

    @classmethod
    def from_rotation_vector(cls, rotation_vector, degrees=True):
        degrees = check_flag(degrees, "degrees")
        rv = kernels.check_array(rotation_vector, (3,), "rotation vector")
        if rv.shape != (3,):
            raise InvalidInputError(f"rotation vector: expected 3 numbers, got shape {rv.shape}")
        _check_angle_size(_vector_length(rv), degrees, "rotation vector")
        return cls._from_kernel(kernels.rotation_vectors_to_quaternions(_angle_in(rv, degrees)))

    def as_rotation_vector(self, degrees=True):
        degrees = check_flag(degrees, "degrees")
        return _angle_out(kernels.quaternions_to_rotation_vectors(self._q, assume_canonical=True), degrees)

    # --- Rodrigues parameters -----------------------------------------------------------------------

    @classmethod
    def from_gibbs(cls, gibbs):
        """From a Gibbs vector (classical Rodrigues parameters) g = n·tan(φ/2). Any finite vector is an
        orientation; a very long one is close to a half turn."""
        g = kernels.check_array(gibbs, (3,), "Gibbs vector")
        if g.shape != (3,):
            raise InvalidInputError(f"Gibbs vector: expected 3 numbers, got shape {g.shape}")
        return cls._from_kernel(rodrigues.gibbs_to_quaternions(g))

    def as_gibbs(self):
        """The Gibbs vector g = n·tan(φ/2). It does not exist at a half turn (180°): refused there."""
        if self._q[0] == 0:
            raise InvalidInputError("the Gibbs vector is infinite at a half turn (180°); use another "
                                    "representation (the modified Rodrigues parameters are 1 long there)")
        return rodrigues.quaternions_to_gibbs(self._q)

    @classmethod
    def from_mrp(cls, mrp):
        """From modified Rodrigues parameters p = n·tan(φ/4), either set (|p| <= 1, or its shadow
        −p / |p|² beyond, which spells the same orientation the long way round)."""
        p = kernels.check_array(mrp, (3,), "modified Rodrigues parameters")
        if p.shape != (3,):
            raise InvalidInputError(f"modified Rodrigues parameters: expected 3 numbers, got shape {p.shape}")
        return cls._from_kernel(rodrigues.mrps_to_quaternions(p))

    def as_mrp(self, shadow=False):
        """Modified Rodrigues parameters p = n·tan(φ/4) with |p| <= 1, or with shadow=True the shadow set
        −p / |p|² (|p_s| >= 1), which does not exist for no rotation."""
        p = rodrigues.quaternions_to_mrps(self._q)
        if not check_flag(shadow, "shadow"):
            return p
        if not p.any():
            raise InvalidInputError("the shadow set of no rotation is infinite; the modified Rodrigues "
                                    "parameters of no rotation are (0, 0, 0)")
        return rodrigues.mrp_shadows(p)

    # --- angle sequences ----------------------------------------------------------------------------

    @classmethod
    def from_angles(cls, sequence, angles, intrinsic=True, degrees=True):
        """From three angles about the axes of `sequence` ('ZYX', "Z-Y'-X''", ...). Intrinsic turns about
        the moving body axes; extrinsic about the fixed reference axes in the order written."""
        sequence = parse_sequence(sequence)
        intrinsic, degrees = check_flag(intrinsic, "intrinsic"), check_flag(degrees, "degrees")
        values = kernels.check_array(angles, (3,), "angles")
        if values.shape != (3,):
            raise InvalidInputError(f"angles: expected 3 numbers, got shape {values.shape}")
        _check_angle_size(values, degrees, "angles")
        return cls._from_kernel(kernels.angles_to_quaternions(_angle_in(values, degrees), sequence, intrinsic))

    def as_angles(self, sequence, intrinsic=True, degrees=True):
        sequence = parse_sequence(sequence)
        intrinsic, degrees = check_flag(intrinsic, "intrinsic"), check_flag(degrees, "degrees")
        angles, locked = kernels.quaternions_to_angles(self._q, sequence, intrinsic)
        angles = _angle_out(angles, degrees)
        angles.setflags(write=False)
        return AngleSet(sequence, intrinsic, degrees, angles, bool(locked))

    # --- algebra ------------------------------------------------------------------------------------

    def __matmul__(self, other):
        """Composition with the meaning of the matrix product: (a @ b).as_matrix() == A @ B."""
        if not isinstance(other, Orientation):
            return NotImplemented
        return Orientation(kernels.multiply_quaternions(self._q, other._q))

    def inverse(self):
        return Orientation(kernels.conjugate_quaternions(self._q))

    def apply(self, vectors):
        """Body-frame vectors, shape (3,) or (N, 3), written in the reference frame: R · v."""
        v = kernels.check_array(vectors, (3,), "vectors")
        scale = float(np.abs(v).max()) if v.size else 0.0
        if scale <= 1e150:
            return kernels.rotate_vectors(self._q, v)
        # Rotated at unit scale, so the products inside cannot overflow; only a length beyond the largest
        # double (the rotated vector is as long as the given one) is refused.
        with np.errstate(over="ignore"):
            rotated = kernels.rotate_vectors(self._q, v / scale) * scale
        if not np.isfinite(rotated).all():
            raise InvalidInputError("vectors: a vector is too long to rotate (its length exceeds the largest "
                                    "number a double holds); expected components below about 1e308")
        return rotated

    @property
    def angle(self):
        """Rotation angle from the reference, degrees in [0, 180]."""
        return float(np.degrees(kernels.angles_between(np.array([1.0, 0, 0, 0]), self._q)))

    def angle_to(self, other, degrees=True):
        """Angle of the rotation that takes this orientation onto `other`."""
        degrees = check_flag(degrees, "degrees")
        if not isinstance(other, Orientation):
            raise InvalidInputError(f"angle_to: expected an Orientation, got {type(other).__name__}")
        return float(_angle_out(kernels.angles_between(self._q, other._q), degrees))

    def isclose(self, other, atol=1e-12):
        """Same orientation within `atol` radians (q and −q are the same orientation)."""
        if isinstance(atol, bool) or not isinstance(atol, (int, float, np.integer, np.floating)) \
                or not (np.isfinite(atol) and atol >= 0):
            raise InvalidInputError(f"atol={atol!r}: expected a finite number of radians >= 0")
        return self.angle_to(other, degrees=False) <= atol

    def with_notes(self, notes):
        """The same orientation carrying other notes."""
        return Orientation(self._q, notes)

    def __eq__(self, other):
        if not isinstance(other, Orientation):
            return NotImplemented
        return bool(np.array_equal(self._q, other._q))

    def __hash__(self):
        return hash(self._q.tobytes())

    def __repr__(self):
        w, x, y, z = (float(v) for v in self._q)
        return f"Orientation.from_quaternion([{w!r}, {x!r}, {y!r}, {z!r}])"

    def __str__(self):
        axis, angle = self.as_axis_angle()
        if angle == 0:
            return "Orientation(identity)"
        shown = np.where(np.abs(axis) < 1e-12, 0.0, axis) + 0.0   # rounding dust reads as 0 here
        return f"Orientation({angle:.6g}° about [{shown[0]:.6g}, {shown[1]:.6g}, {shown[2]:.6g}])"
