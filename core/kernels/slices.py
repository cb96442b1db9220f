"""How every kernel serves one orientation and a million alike: the slicing decorator, and the
components of an array as floats (one orientation) or views (a batch)."""

import functools
import math

import numpy as np


# Batches are processed in slices of this many orientations, so that every temporary array stays in the
# processor's cache: for a million orientations this is several times faster than whole-array passes.
_CHUNK = 4096


def _in_slices(*trailing_ndims, fills=None):
    """Run a kernel slice by slice over the leading dimension of its array arguments.

    `trailing_ndims` gives, for each leading positional array argument, how many of its last dimensions
    belong to one orientation (1 for a quaternion, 2 for a matrix, 0 for an angle). Small inputs, and
    inputs whose leading shapes differ (broadcasting), go straight through. A kernel that takes `out=`
    says the shape of one result with `fills`, and then writes each slice straight into the result."""

    def wrap(kernel):
        count = len(trailing_ndims)

        @functools.wraps(kernel)
        def run(*args, **kwargs):
            first = args[0]
            if type(first) is not np.ndarray:
                first = np.asarray(first, dtype=np.float64)
            lead = first.shape[:first.ndim - trailing_ndims[0]]
            n = math.prod(lead)
            if n <= _CHUNK:   # the common case of one orientation: straight through, nothing to slice
                return kernel(first, *args[1:], **kwargs)
            arrays = [first] + [np.asarray(a, dtype=np.float64) for a in args[1:count]]
            rest = args[count:]
            if any(a.shape[:a.ndim - t] != lead for a, t in zip(arrays[1:], trailing_ndims[1:])):
                return kernel(*arrays, *rest, **kwargs)
            flat = [a.reshape((n,) + a.shape[a.ndim - t:]) for a, t in zip(arrays, trailing_ndims)]
            if fills is not None:
                result = np.empty((n,) + fills, dtype=np.float64)
                for start in range(0, n, _CHUNK):
                    stop = min(start + _CHUNK, n)
                    kernel(*[f[start:stop] for f in flat], *rest, out=result[start:stop], **kwargs)
                return result.reshape(lead + fills)
            outputs, single = None, True
            for start in range(0, n, _CHUNK):
                stop = min(start + _CHUNK, n)
                part = kernel(*[f[start:stop] for f in flat], *rest, **kwargs)
                single = not isinstance(part, tuple)
                parts = (part,) if single else part
                if outputs is None:
                    outputs = [np.empty((n,) + p.shape[1:], dtype=p.dtype) for p in parts]
                for out, p in zip(outputs, parts):
                    out[start:stop] = p
            outputs = [out.reshape(lead + out.shape[1:]) for out in outputs]
            return outputs[0] if single else tuple(outputs)

        return run

    return wrap



def _parts(a):
    """The components along the last axis: views for a batch, Python floats for a single value. Same
    IEEE arithmetic either way for + - * / and sqrt; atan2 comes from the math library on floats and from
    numpy on arrays, which may round the last bit differently (about 5 percent of angles on this machine's
    CPU), far below any tolerance shown. On floats it costs a fraction of numpy scalar arithmetic (and a tenth of
    0-d arrays), which matters on the path of every edit. Divisions that may meet a zero use np.divide,
    so a float never raises where an array would give inf."""
    if a.ndim == 1:
        return tuple(a.tolist())
    return tuple(a[..., i] for i in range(a.shape[-1]))


def _on_floats_or_arrays(array_function, float_function):
    """One function for both kinds of _parts: the math module's on Python floats (one orientation),
    numpy's on arrays."""
    return lambda *args: float_function(*args) if type(args[0]) is float else array_function(*args)


_sqrt = _on_floats_or_arrays(np.sqrt, math.sqrt)
_arctan2 = _on_floats_or_arrays(np.arctan2, math.atan2)
_minimum = _on_floats_or_arrays(np.minimum, min)
_maximum = _on_floats_or_arrays(np.maximum, max)
