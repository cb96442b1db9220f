"""Error types of the core. Every message says what was wrong and what was expected."""


class FramewrightError(ValueError):
    """Base of every error Framewright raises on bad input."""


class InvalidInputError(FramewrightError):
    """NaN or infinity, a wrong shape, or a zero-length axis or quaternion."""


class SequenceError(FramewrightError):
    """An unknown or malformed angle-sequence name."""


class MatrixRefusedError(FramewrightError):
    """A 3x3 matrix that is not a rotation (too far from orthonormal, or a reflection)."""

    def __init__(self, message, report=None):
        super().__init__(message)
        self.report = report


class DecodeError(FramewrightError):
    """Pasted text that cannot be read as an orientation."""


class FlagTypeError(InvalidInputError, TypeError):
    """A keyword flag (degrees, intrinsic, scalar_last, transposed, ...) given something other than
    True or False: None, 1 or "yes" would otherwise be read by their truth value and could silently mean
    the other convention."""
