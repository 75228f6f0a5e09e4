"""The corax shared library, found and declared for ctypes (internal).

The library is looked for, in order: the file named by the environment
variable CORAX_LIBRARY; libcorax.so.0 next to this package; the build folder
of a corax source tree this package sits in (python/../build); then the
system's loader (libcorax.so.0 where ld.so finds it, as after `make install`).
"""

import ctypes
import ctypes.util
import os

SONAME = "libcorax.so.0"


class Error(ctypes.Structure):
    """corax_error (include/corax/status.h): where and why a call failed."""

    _fields_ = [
        ("file", ctypes.c_char * 256),
        ("line", ctypes.c_long),
        ("message", ctypes.c_char * 320),
    ]


def _candidates():
    here = os.path.dirname(os.path.abspath(__file__))
    named = os.environ.get("CORAX_LIBRARY")
    if named:
        yield named, True  # named: it must load
    yield os.path.join(here, SONAME), False
    yield os.path.join(here, os.pardir, os.pardir, "build", SONAME), False
    yield SONAME, False
    found = ctypes.util.find_library("corax")
    if found:
        yield found, False


def _load():
    tried = []
    for path, must in _candidates():
        if os.sep in path and not os.path.exists(path):
            if must:
                raise OSError(f"CORAX_LIBRARY names {path}, which does not exist")
            continue
        try:
            return ctypes.CDLL(path), path
        except OSError as e:
            if must:
                raise
            tried.append(f"{path}: {e}")
    raise OSError(
        "corax: cannot find the corax library (libcorax.so.0): build it with `make`, "
        "install it with `make install`, or name it in CORAX_LIBRARY; tried: "
        + "; ".join(tried)
    )


lib, path = _load()

_c = ctypes
_vp, _cp, _sz, _dp = _c.c_void_p, _c.c_char_p, _c.c_size_t, _c.POINTER(_c.c_double)
_ep = _c.POINTER(Error)
_names = _c.POINTER(_c.c_char_p)

_SIGNATURES = {
    "corax_strerror": (_cp, [_c.c_int]),
    "corax_setup_new": (_vp, []),
    "corax_setup_free": (None, [_vp]),
    "corax_setup_set": (_c.c_int, [_vp, _cp, _cp, _ep]),
    "corax_arrays_load": (_c.c_int, [_vp, _cp, _cp, _c.POINTER(_vp), _ep]),
    "corax_arrays_free": (None, [_vp]),
    "corax_arrays_program": (_vp, [_vp]),
    "corax_arrays_finding_count": (_sz, [_vp]),
    "corax_arrays_finding": (
        _c.c_int,
        [_vp, _sz, _c.POINTER(_cp), _c.POINTER(_c.c_long), _c.POINTER(_cp), _c.POINTER(_cp)],
    ),
    "corax_arrays_column": (_cp, [_c.c_int, _sz]),
    "corax_arrays_place_name": (_cp, [_c.c_int]),
    "corax_arrays_desurvey": (None, [_vp, _vp, _sz, _names, _dp, _dp, _c.POINTER(_c.c_int)]),
    "corax_arrays_convert": (None, [_vp, _vp, _sz, _names, _dp, _dp, _c.POINTER(_c.c_uint)]),
    "corax_arrays_note": (_sz, [_vp, _vp, _cp, _dp, _c.c_char_p, _sz]),
    "corax_arrays_spread": (_c.c_int, [_vp, _vp, _sz, _names, _dp, _dp, _dp, _ep]),
    "corax_condition_status": (_cp, [_c.c_uint]),
    "corax_severity_name": (_cp, [_c.c_int]),
    "corax_program_size": (_sz, [_vp]),
    "corax_program_hole": (_vp, [_vp, _sz]),
    "corax_program_find": (_vp, [_vp, _cp, _sz]),
    "corax_hole_name": (_cp, [_vp]),
    "corax_hole_length": (_c.c_double, [_vp]),
}

for _name, (_restype, _argtypes) in _SIGNATURES.items():
    _f = getattr(lib, _name)
    _f.restype = _restype
    _f.argtypes = _argtypes

# corax_arrays_kind, in its order (include/corax/arrays.h)
POINT, READING, RESULT, ERRORS, SPREAD = range(5)


def columns(kind):
    """The names of an array's columns, from the library."""
    names = []
    while True:
        name = lib.corax_arrays_column(kind, len(names))
        if name is None:
            return names
        names.append(name.decode())
