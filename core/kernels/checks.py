"""Validation of users' arrays, flags and sequence names, for the callers that face people; the kernels
themselves trust their input."""

import numpy as np

from core.errors import FlagTypeError, InvalidInputError, SequenceError


TAIT_BRYAN = ("XYZ", "XZY", "YXZ", "YZX", "ZXY", "ZYX")
PROPER_EULER = ("XYX", "XZX", "YXY", "YZY", "ZXZ", "ZYZ")
ALL_SEQUENCES = TAIT_BRYAN + PROPER_EULER


def float_array(values, what):
    """`values` as a float64 array; text, None, complex numbers, ragged rows and integers beyond a double
    are refused by name instead of escaping as a bare conversion error."""
    try:
        return np.asarray(values, dtype=np.float64)
    except OverflowError as exc:   # an integer of hundreds of digits
        raise InvalidInputError(f"{what}: a number is beyond the range of a double (about 1.8e308); "
                                f"expected finite numbers") from exc
    except (TypeError, ValueError) as exc:
        raise InvalidInputError(f"{what}: expected numbers, got {shortened_repr(values)}") from exc


def check_array(values, trailing_shape, what):
    """Return `values` as a float64 array whose last dimensions are `trailing_shape`, all finite."""
    array = float_array(values, what)
    n = len(trailing_shape)
    if array.ndim < n or array.shape[array.ndim - n:] != tuple(trailing_shape):
        expected = "(..., " + ", ".join(str(s) for s in trailing_shape) + ")"
        raise InvalidInputError(f"{what}: expected shape {expected}, got {array.shape}")
    if not np.isfinite(array).all():
        raise InvalidInputError(f"{what}: contains NaN or infinity; expected finite numbers")
    return array


def check_flag(value, name):
    """`value` as a Python bool; anything but True or False (numpy's booleans included) is refused, so
    None, 0, 1 or "yes" never stand for a convention by their truth value."""
    if isinstance(value, (bool, np.bool_)):
        return bool(value)
    raise FlagTypeError(f"{name}={value!r}: expected True or False")


def unit_vectors(v, what="direction"):
    """Unit vectors of `v` (..., n) and their lengths, scaled by the largest component first so that
    components of 1e200 or 1e-200 neither overflow nor underflow. A length beyond the largest double
    comes back as inf (the direction is still right); a zero vector is refused, naming its number
    (counted from 1)."""
    v = np.asarray(v, dtype=np.float64)
    scale = np.abs(v).max(axis=-1, keepdims=True)
    zero = scale[..., 0] == 0
    if np.any(zero):
        at = f" {int(np.argmax(zero.ravel())) + 1}" if v.ndim > 1 else ""   # counted from 1, as rows are
        raise InvalidInputError(f"{what}{at} has zero length; expected a non-zero (x, y, z)")
    scaled = v / scale
    norms = np.sqrt(np.einsum("...i,...i->...", scaled, scaled))[..., None]
    with np.errstate(over="ignore"):
        lengths = (scale * norms)[..., 0]
    return scaled / norms, lengths


def shortened_repr(values, limit=80):
    """repr of user input for a message, cut to `limit` characters (input can be of any length)."""
    text = repr(values)
    return text if len(text) <= limit else text[:limit] + "…"


def check_sequence_name(sequence):
    """Accept exactly one of the twelve canonical names ('ZYX', 'ZXZ', ...)."""
    if sequence not in ALL_SEQUENCES:
        raise SequenceError(
            f"unknown angle sequence {sequence!r}; expected one of {', '.join(ALL_SEQUENCES)}"
        )
    return sequence
