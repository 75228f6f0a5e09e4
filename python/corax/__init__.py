"""corax from Python: oriented drill core, from survey to structure.

A thin layer (ctypes, the standard library only) over the corax shared
library's array calls (include/corax/arrays.h). Load a drill program from its
collar and survey tables, then desurvey depths, convert core readings (alpha,
beta, gamma) into true dip, dip direction, trend and plunge at real
coordinates, and carry the survey and reading errors to each answer by Monte
Carlo:

    import corax
    program = corax.Program.load("surveys/collars.csv", "surveys/surveys.csv",
                                 declination=6.2)
    points = program.desurvey("QC001", [0, 50, 100])
    planes = program.convert(["QC001", "QC001"], [6.65, 6.99], alpha=[65, 59],
                             beta=[309, 318])
    spread = program.monte_carlo(["QC001", "QC001"], [6.65, 6.99], alpha=[65, 59],
                                 beta=[309, 318], draws=500)

Results are dicts of columns named as `corax convert` and `corax trace` name
them: lists, or numpy arrays when numpy can be imported (set the environment
variable CORAX_NO_NUMPY=1 to have lists anyway). Angles are degrees, lengths
metres, an absent value NaN. Options are the project file's keys, as keyword
arguments: declination=6.2, dip_convention="from-vertical",
beta_sense="anticlockwise", units="feet", collar_station=True, ...

Results feed decisions about slopes, ground support and drilling: a competent
person reviews them, and local codes and licensed practice prevail.
"""

import collections
import ctypes
import math
import numbers
import os

from . import _native

__version__ = "0.1.0"
__all__ = ["CoraxError", "Finding", "Program", "library_path", "numpy_used"]

if os.environ.get("CORAX_NO_NUMPY", "") not in ("", "0"):
    _np = None
else:
    try:
        import numpy as _np
    except ImportError:
        _np = None

_lib = _native.lib

# The keys that shape a call rather than the program: the core's conventions,
# the uncertainty and the units of the depths given.
_CALL_KEYS = frozenset(
    """units structures_units reference_line beta_end beta_sense gamma_zero gamma_sense
    near_parallel near_perpendicular vertical_limit draws seed alpha_error beta_error
    line_error gravity_error depth_error azimuth_error dip_error azimuth_error_per_hole
    dip_error_per_hole""".split()
)


def library_path():
    """The path of the corax library this module loaded."""
    return _native.path


def numpy_used():
    """True when results come as numpy arrays, False when as lists."""
    return _np is not None


class CoraxError(Exception):
    """An error the corax library reported.

    Attributes: status (the library's word for the kind of error, such as
    "bad value" or "malformed table"), file and line (where, when known: ""
    and 0 otherwise), message (the library's message), and findings (for a
    program refused for its rows: the Finding list).
    """

    def __init__(self, status, message, file="", line=0, findings=None):
        self.status, self.message, self.file, self.line = status, message, file, line
        self.findings = findings or []
        where = f"{file}:{line}: " if file and line > 0 else f"{file}: " if file else ""
        super().__init__(where + message)


Finding = collections.namedtuple("Finding", "severity file line hole message")
Finding.__doc__ = """A problem the load found in a row of the tables.

severity is "note", "warning" or "error" (the row or hole could not be used);
file and line place it ("" and 0 when not tied to a row), hole names the
hole ("" when none)."""


def _raise(status, err):
    text = err.message.decode(errors="replace")
    word = _lib.corax_strerror(status).decode()
    raise CoraxError(word, text or word, err.file.decode(errors="replace"), err.line)


def _word(key, value):
    """An option's value as the project file writes it."""
    if isinstance(value, bool):
        return "yes" if value else "no"
    if isinstance(value, str):
        return value
    if isinstance(value, numbers.Integral):
        return str(int(value))
    if isinstance(value, numbers.Real):
        return repr(float(value))
    if isinstance(value, dict):  # columns: {"hole": "HOLE_ID", ...}
        return ",".join(f"{k}={v}" for k, v in value.items())
    if isinstance(value, (list, tuple)):  # reject: [("QC003", 120), ...]
        return ",".join(item if isinstance(item, str) else f"{item[0]}@{item[1]!r}"
                        for item in value)
    raise TypeError(f"{key}: {value!r} is not a value corax takes")


class _Setup:
    """A corax_setup holding the given options; frees itself."""

    def __init__(self, options):
        self.handle = _lib.corax_setup_new()
        if not self.handle:
            raise MemoryError("corax: out of memory")
        err = _native.Error()
        for key, value in options.items():
            if value is None:
                continue
            st = _lib.corax_setup_set(self.handle, key.encode(), _word(key, value).encode(),
                                      ctypes.byref(err))
            if st != 0:
                _raise(st, err)

    def __del__(self):
        if getattr(self, "handle", None):
            _lib.corax_setup_free(self.handle)
            self.handle = None


def _length(values):
    if values is None or isinstance(values, (str, bytes, numbers.Number)):
        return None
    return len(values)


def _count(named):
    """The number of rows: the length of every sequence given (one number or
    name stands for all)."""
    lengths = {name: _length(v) for name, v in named.items() if _length(v) is not None}
    if len(set(lengths.values())) > 1:
        raise ValueError("sequences of different lengths: " +
                         ", ".join(f"{name} {n}" for name, n in lengths.items()))
    return next(iter(lengths.values()), 1)


def _floats(name, values, n):
    """A column of n floats: a sequence (None for absent), a scalar for all, or
    None for none."""
    if values is None:
        return [math.nan] * n
    if isinstance(values, numbers.Number):
        return [float(values)] * n
    if _np is not None and isinstance(values, _np.ndarray) and values.dtype.kind in "fiub":
        return values.astype(float)
    return [math.nan if v is None else float(v) for v in values]


def _holes(holes, n):
    """The hole names as C strings (kept alive by the returned array)."""
    if isinstance(holes, (str, bytes)):
        one = holes.encode() if isinstance(holes, str) else holes
        return (ctypes.c_char_p * max(n, 1))(*([one] * n))
    return (ctypes.c_char_p * max(n, 1))(*[str(h).encode() for h in holes])


def _matrix(columns, n):
    """Rows of the given columns, for C: (the buffer, a double pointer to it)."""
    k = len(columns)
    if _np is not None:
        m = _np.empty((n, k), dtype=_np.float64)
        for j, col in enumerate(columns):
            m[:, j] = col
        return m, m.ctypes.data_as(ctypes.POINTER(ctypes.c_double))
    flat = (ctypes.c_double * max(n * k, 1))()
    for j, col in enumerate(columns):
        flat[j : n * k : k] = list(col)
    return flat, ctypes.cast(flat, ctypes.POINTER(ctypes.c_double))


def _output(n, k):
    if _np is not None:
        m = _np.empty((n, k), dtype=_np.float64)
        return m, m.ctypes.data_as(ctypes.POINTER(ctypes.c_double))
    flat = (ctypes.c_double * max(n * k, 1))()
    return flat, ctypes.cast(flat, ctypes.POINTER(ctypes.c_double))


def _columns(names, out, n):
    """The output rows as a dict of columns."""
    k = len(names)
    if _np is not None:
        return {name: out[:, j].copy() for j, name in enumerate(names)}
    return {name: list(out[j : n * k : k]) for j, name in enumerate(names)}


def _words(words):
    return _np.array(words, dtype=object) if _np is not None else words


class Program:
    """A drill program: holes desurveyed from their collar and survey tables.

    Make one with Program.load(). Holes are named as in the tables; depths are
    measured along the hole from the collar, in metres unless units="feet".
    """

    def __init__(self, handle, options):
        self._handle = handle
        self._options = {k: v for k, v in options.items() if k in _CALL_KEYS}
        program = _lib.corax_arrays_program(handle)
        self.holes = [_lib.corax_hole_name(_lib.corax_program_hole(program, i)).decode()
                      for i in range(_lib.corax_program_size(program))]
        self.findings = [self._finding(i) for i in range(_lib.corax_arrays_finding_count(handle))]

    @classmethod
    def load(cls, collars, surveys, strict=True, **options):
        """Load a drill program from a collar table and a survey table (CSV).

        collars holds hole, x, y, z, and optionally azimuth, dip, length, date,
        latitude, longitude; surveys holds hole, depth, azimuth, dip, and
        optionally reference (magnetic, true, grid), date, total_field,
        field_dip, azimuth_error, dip_error, use. Options, by the project
        file's keys (also per table, as collars_units or surveys_dip_convention):

          dip_convention   "negative-down" (default), "positive-down",
                           "from-vertical"
          units            "metres" (default) or "feet": the tables' lengths
                           and coordinates, and the depths given to calls
          declination      degrees east (added to magnetic azimuths), or
                           "model": the World Magnetic Model at each station's
                           date and place (needs crs, or latitude/longitude)
          convergence      degrees, or "projection" (from crs at each collar)
          crs              "EPSG:32608", ...: the CRS of the collars
          local_grid       "x1,y1,E1,N1,x2,y2,E2,N2" or
                           "origin=E,N,rotation=DEG,scale=S"
          survey_date      "YYYY-MM-DD" for stations without a date
          magnetic_model   "WMM" (default), "WMM2020", ..., or a COF file
          reference        the north of stations without one: "magnetic",
                           "true" or "grid"
          collar_station   True: the collar's set-up is a station at 0 m
          reject           stations left out: [("QC003", 120.0), ...]
          columns          header names: {"hole": "HOLE_ID", ...}
          delimiter, decimal_mark   "comma", "semicolon", "tab"; "point",
                           "comma" (found from the table by default)

        The core conventions and uncertainty options (see convert() and
        monte_carlo()) may be given here too, as the program's defaults.

        Raises CoraxError when a table cannot be read, or (strict, the
        default) when a row or hole could not be used: the error's findings
        list them all. With strict=False such holes are left out and listed
        in the program's findings, with the notes and warnings.
        """
        setup = _Setup(options)
        handle = ctypes.c_void_p()
        err = _native.Error()
        st = _lib.corax_arrays_load(setup.handle, os.fsencode(collars), os.fsencode(surveys),
                                    ctypes.byref(handle), ctypes.byref(err))
        if st != 0:
            _raise(st, err)
        program = cls(handle.value, options)
        errors = [f for f in program.findings if f.severity == "error"]
        if strict and errors:
            shown = "; ".join(_placed(f) for f in errors[:5])
            more = f" (and {len(errors) - 5} more)" if len(errors) > 5 else ""
            program.close()
            raise CoraxError("bad value", f"{len(errors)} problem{'s' * (len(errors) != 1)} "
                             f"in the collar and survey tables: {shown}{more}",
                             findings=program.findings)
        return program

    def _finding(self, i):
        file, hole, message = ctypes.c_char_p(), ctypes.c_char_p(), ctypes.c_char_p()
        line = ctypes.c_long()
        sev = _lib.corax_arrays_finding(self._handle, i, ctypes.byref(file), ctypes.byref(line),
                                        ctypes.byref(hole), ctypes.byref(message))
        return Finding(_lib.corax_severity_name(sev).decode(), file.value.decode(), line.value,
                       hole.value.decode(), message.value.decode())

    def close(self):
        """Free the program (also done when it is no longer referenced)."""
        if self._handle:
            _lib.corax_arrays_free(self._handle)
            self._handle = None

    def __del__(self):
        self.close()

    def __enter__(self):
        return self

    def __exit__(self, *exc):
        self.close()

    def __repr__(self):
        return f"<corax.Program of {len(self.holes)} holes>"

    def _live(self):
        if not self._handle:
            raise ValueError("the program is closed")
        return self._handle

    def _setup(self, call, options):
        for key in options:
            if key not in _CALL_KEYS:
                raise TypeError(f"{key}: not an option of {call} (the program's own "
                                "options go to Program.load)")
        return _Setup({**self._options, **options})

    def length(self, hole):
        """The hole's length in metres: the collar's, else its deepest station."""
        program = _lib.corax_arrays_program(self._live())
        name = hole.encode()
        h = _lib.corax_program_find(program, name, len(name))
        if not h:
            raise KeyError(f"no hole {hole} in the program")
        return _lib.corax_hole_length(h)

    def desurvey(self, holes, depths, **options):
        """Where each hole is, and which way it points, at the given depths.

        holes is one hole's name or a name per depth; depths are measured
        along the hole (metres, or units="feet"). Returns the columns x, y, z
        (metres), azimuth and dip (degrees, dip in the surveys' dip
        convention), plunge (degrees, positive down) and status: "ok",
        "extrapolated" (below the last station), "collar-only" (no survey),
        "beyond-end", "no-survey", "unknown-hole" or "bad-depth" (as `corax
        trace --at`). Positions and angles are NaN where the status gives none.
        """
        n = _count({"holes": holes, "depths": depths})
        setup = self._setup("desurvey", options)
        names = _holes(holes, n)
        d = _floats("depths", depths, n)
        dbuf, dptr = _matrix([d], n)
        out, optr = _output(n, len(_POINT))
        place = (ctypes.c_int * max(n, 1))()
        _lib.corax_arrays_desurvey(self._live(), setup.handle, n, names, dptr, optr, place)
        result = _columns(_POINT, out, n)
        result["status"] = _words([_place_word(p) for p in place[:n]])
        return result

    def _readings(self, holes, depths, given, errors=None):
        values = dict(given, depth=depths)
        n = _count({"holes": holes, **values, **(errors or {})})
        cols = [_floats(name, values.get(name), n) for name in _READING]
        return n, _holes(holes, n), _matrix(cols, n)

    def convert(self, holes, depths, alpha, beta=None, gamma=None, line_alpha=None,
                line_beta=None, turn=None, arbitrary_line=None, notes=True, **options):
        """Convert core readings into true orientations at real coordinates.

        holes is one hole's name or a name per reading; depths, alpha, beta,
        gamma (a line on the plane), line_alpha and line_beta (a line measured
        on its own) are sequences of degrees (None or NaN where absent) or one
        number for all. arbitrary_line marks readings whose betas run from a
        line drawn anywhere on the piece (a run without an orientation mark);
        turn (degrees) is the turn that orients such a run. Options: the core
        conventions, as the project file's [core] keys:

          reference_line "bottom" (default) or "top"
          beta_end       "down-hole" (default) or "up-hole"
          beta_sense     "clockwise" (default) or "anticlockwise"
          gamma_zero     "down-hole" (default) or "up-hole"
          gamma_sense    "clockwise" (default) or "anticlockwise"
          near_parallel, near_perpendicular, vertical_limit   degrees (10, 80, 5)

        Returns the columns of `corax convert`: x, y, z, hole_azimuth,
        hole_plunge, dip, dip_direction, strike, pole_trend, pole_plunge, nx,
        ny, nz (the upward unit normal), trend, plunge (the line), status and
        (when notes) note. Every reading gives a row, in order; NaN where
        `corax convert` leaves a blank.
        """
        given = {"alpha": alpha, "beta": beta, "gamma": gamma, "line_alpha": line_alpha,
                 "line_beta": line_beta, "turn": turn, "arbitrary_line": arbitrary_line}
        setup = self._setup("convert", options)
        n, names, (rbuf, rptr) = self._readings(holes, depths, given)
        out, optr = _output(n, len(_RESULT))
        cond = (ctypes.c_uint * max(n, 1))()
        _lib.corax_arrays_convert(self._live(), setup.handle, n, names, rptr, optr, cond)
        result = _columns(_RESULT, out, n)
        result["status"] = _words([_status_word(c) for c in cond[:n]])
        if notes:
            result["note"] = _words([self._note(setup, names[i], rbuf, i) if cond[i] else ""
                                     for i in range(n)])
        return result

    def _note(self, setup, hole, rbuf, i):
        k = len(_READING)
        row = (ctypes.c_double * k)(*[float(v) for v in _row(rbuf, i, k)])
        buf = ctypes.create_string_buffer(1200)
        _lib.corax_arrays_note(self._handle, setup.handle, hole, row, buf, len(buf))
        return buf.value.decode()

    def monte_carlo(self, holes, depths, alpha, beta=None, gamma=None, line_alpha=None,
                    line_beta=None, turn=None, arbitrary_line=None, alpha_error=None,
                    beta_error=None, line_error=None, depth_error=None, draws=1000, seed=1,
                    **options):
        """The spread of each reading's answer over random draws of its errors.

        Readings as for convert(). Each draw perturbs each hole's survey (an
        error per station and one shared by the hole), desurveys it again,
        and converts the hole's readings with their own perturbed depth,
        alpha, beta and orientation line. Errors are one sigma in degrees
        (depth in metres, or feet with units="feet"): alpha_error,
        beta_error, line_error and depth_error are one number for all or a
        sequence, one per reading (None or NaN for the default); the survey's
        are options: azimuth_error, dip_error, azimuth_error_per_hole,
        dip_error_per_hole, and gravity_error (the marking tool's sense of
        down). Defaults are the command line's (alpha 2, beta 5, line 5, depth
        0.05 m, azimuth 1, dip 0.5, per hole 0.5 and 0.25, gravity 1).

        Each hole draws from its own stream, seeded from seed and the hole's
        name, and a hole's readings share its draws in their order: give all
        of a hole's readings at once to have `corax convert --draws`'s answer.

        Returns the columns dip_sd, dip_direction_sd, cone95 (degrees: the
        half-angle about the mean pole holding 95% of the draws), kappa,
        position_sd (metres) and draws; NaN for a reading that gives no
        orientation (and, for a dip alone, for its direction's columns).
        """
        given = {"alpha": alpha, "beta": beta, "gamma": gamma, "line_alpha": line_alpha,
                 "line_beta": line_beta, "turn": turn, "arbitrary_line": arbitrary_line}
        own = {"alpha_error": alpha_error, "beta_error": beta_error, "line_error": line_error,
               "depth_error": depth_error}
        for key, value in own.items():  # one number for all is the option itself
            if isinstance(value, numbers.Number):
                options[key], own[key] = value, None
        setup = self._setup("monte_carlo", dict(options, draws=draws, seed=seed))
        n, names, (rbuf, rptr) = self._readings(holes, depths, given, own)
        ebuf, eptr = None, None
        if any(v is not None for v in own.values()):
            ebuf, eptr = _matrix([_floats(name, own[name], n) for name in _ERRORS], n)
        out, optr = _output(n, len(_SPREAD))
        err = _native.Error()
        st = _lib.corax_arrays_spread(self._live(), setup.handle, n, names, rptr, eptr, optr,
                                      ctypes.byref(err))
        if st != 0:
            _raise(st, err)
        return _columns(_SPREAD, out, n)


def _row(buf, i, k):
    return buf[i] if _np is not None else buf[i * k : (i + 1) * k]


def _placed(f):
    return f"{f.file}:{f.line}: {f.message}" if f.line else f.message


_POINT = _native.columns(_native.POINT)
_READING = _native.columns(_native.READING)
_RESULT = _native.columns(_native.RESULT)
_ERRORS = _native.columns(_native.ERRORS)
_SPREAD = _native.columns(_native.SPREAD)

_place_words = {}
_status_words = {}


def _place_word(place):
    if place not in _place_words:
        _place_words[place] = _lib.corax_arrays_place_name(place).decode()
    return _place_words[place]


def _status_word(conditions):
    if conditions not in _status_words:
        _status_words[conditions] = _lib.corax_condition_status(conditions).decode()
    return _status_words[conditions]
