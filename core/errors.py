"""Error types of the core. Every message says what was wrong and what was expected."""


# Messages quote what was given, and what was given can be a pasted file of a megabyte. Past this length the
# middle of a message is left out: its start names the field, its end says what was expected.
MESSAGE_LIMIT = 600
_HEAD, _TAIL = 360, 200


def bounded_message(message):
    """`message` itself when short; else its start and end around a note of how much was left out."""
    if not isinstance(message, str) or len(message) <= MESSAGE_LIMIT:
        return message
    left_out = len(message) - _HEAD - _TAIL
    return f"{message[:_HEAD]} … [{left_out:,} characters left out] … {message[-_TAIL:]}"


class FramewrightError(ValueError):
    """Base of every error Framewright raises on bad input."""

    def __init__(self, *args):
        super().__init__(*(bounded_message(a) for a in args))


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
