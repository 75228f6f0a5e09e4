"""Tests of the Python module (python/corax): its answers against the command
line's on the same input (tests/cli data and the demo program, to the
precision the command line prints), and outside checks from
docs/check-values.md.

Run by tests/cli/test_python.sh with Debian's /usr/bin/python3: CORAX names
the command, CORAX_LIBRARY the library, PYTHONPATH holds python/; run once
with numpy (when it can be imported) and once with CORAX_NO_NUMPY=1.
"""

import configparser
import csv
import math
import os
import subprocess
import tempfile
import unittest

import corax

ROOT = os.path.abspath(os.path.join(os.path.dirname(__file__), os.pardir, os.pardir))
DATA = os.path.join(ROOT, "tests", "cli", "data")
CORAX = os.environ.get("CORAX", os.path.join(ROOT, "build", "corax"))

# decimals `corax convert` and `corax trace` print, and the columns that are
# azimuths (compared round the circle: 359.999 prints as 0.00)
DECIMALS = {"x": 3, "y": 3, "z": 3, "hole_azimuth": 2, "hole_plunge": 2, "dip": 2,
            "dip_direction": 2, "strike": 2, "pole_trend": 2, "pole_plunge": 2, "nx": 5,
            "ny": 5, "nz": 5, "trend": 2, "plunge": 2, "dip_sd": 2, "dip_direction_sd": 2,
            "cone95": 2, "kappa": 1, "position_sd": 3}
TRACE_DECIMALS = {"x": 3, "y": 3, "z": 3, "azimuth": 3, "dip": 3}
AZIMUTHS = {"hole_azimuth", "dip_direction", "strike", "pole_trend", "trend", "azimuth"}
CONFIDENCE_ERRORS = {"good": 3.0, "fair": 8.0, "poor": 20.0}  # convert's default map


def run(*args, cwd=ROOT):
    """The command's standard output, as CSV rows (dicts)."""
    done = subprocess.run([CORAX, *args], cwd=cwd, capture_output=True, text=True, check=True)
    return list(csv.DictReader(done.stdout.splitlines()))


def read_csv(path):
    with open(path, newline="") as f:
        return list(csv.DictReader(f))


def number(text):
    """A field as a number; None when it is not one (empty is NaN)."""
    if text is None:
        return None
    if text.strip() == "":
        return math.nan
    try:
        return float(text)
    except ValueError:
        return None


def write(folder, name, text):
    path = os.path.join(folder, name)
    with open(path, "w") as f:
        f.write(text)
    return path


class CoraxCase(unittest.TestCase):
    def assert_printed(self, got, printed, decimals, what, azimuth=False):
        """got rounds to what the command line printed (blank: NaN)."""
        if printed == "":
            self.assertTrue(math.isnan(got), f"{what}: {got} where the command line is blank")
            return
        want = float(printed)
        gap = got - want
        if azimuth:
            gap = (gap + 180.0) % 360.0 - 180.0
        self.assertLessEqual(abs(gap), 0.5 * 10.0 ** -decimals + 1e-9 * max(1.0, abs(want)),
                             f"{what}: {got} prints as {printed}")

    def assert_columns(self, result, rows, index, decimals, what):
        """Each column of result at index[k] against row k of the command line."""
        for name, places in decimals.items():
            if name not in rows[0] or name not in result:
                continue
            for k, row in enumerate(rows):
                self.assert_printed(float(result[name][index[k]]), row[name], places,
                                    f"{what} row {k + 2} {name}", name in AZIMUTHS)

    def assert_result_type(self, result):
        kind = "ndarray" if corax.numpy_used() else "list"
        for name, column in result.items():
            self.assertEqual(type(column).__name__, kind, name)


class OutsideChecks(CoraxCase):
    """Outside values (docs/check-values.md) through the module."""

    def setUp(self):
        self.tmp = tempfile.TemporaryDirectory()

    def tearDown(self):
        self.tmp.cleanup()

    def test_alpha_beta_derived_table(self):
        # docs/check-values.md, "Alpha/beta to dip and dip direction" (derived):
        # straight holes of the given azimuth and dip, no survey.
        collars = write(self.tmp.name, "collars.csv", "hole,x,y,z,azimuth,dip\n"
                        "A,0,0,0,0,-60\nB,100,0,0,90,-45\nC,200,0,0,200,-70\n"
                        "D,300,0,0,45,20\nE,400,0,0,135,-30\nV,500,0,0,0,-90\n")
        surveys = write(self.tmp.name, "surveys.csv", "hole,depth,azimuth,dip\n")
        program = corax.Program.load(collars, surveys)
        self.assertEqual(program.holes, ["A", "B", "C", "D", "E", "V"])
        result = program.convert(["A", "A", "B", "C", "D", "E", "V"], 10,
                                 alpha=[30, 30, 45, 55, 60, 15, 60],
                                 beta=[180, 90, 270, 120, 300, 45, 40])
        self.assert_result_type(result)
        want = [(30.00, 0.00), (64.34, 253.90), (60.00, 215.26), (29.79, 108.77),
                (57.92, 14.27), (62.48, 185.37)]
        for i, (dip, dd) in enumerate(want):
            self.assert_printed(float(result["dip"][i]), f"{dip:.2f}", 2,
                                f"docs/check-values.md dip, row {i + 1}")
            self.assert_printed(float(result["dip_direction"][i]), f"{dd:.2f}", 2,
                                f"docs/check-values.md dip direction, row {i + 1}", True)
            self.assertEqual(result["status"][i], "collar-only")
        # common practice (same section): in a vertical hole the dip is
        # 90 - alpha, and its direction cannot be known
        self.assertEqual(result["status"][6], "dip-only")
        self.assertAlmostEqual(float(result["dip"][6]), 30.0, places=9)
        self.assertTrue(math.isnan(float(result["dip_direction"][6])))

    def test_minimum_curvature_published_example(self):
        # docs/check-values.md, "Minimum curvature": Lapeyrouse's two-station
        # example in feet, inclination from vertical (published: dN 27.22,
        # dE 19.45, dTVD 94.01 ft)
        collars = write(self.tmp.name, "collars.csv", "hole,x,y,z\nW,0,0,0\n")
        surveys = write(self.tmp.name, "surveys.csv",
                        "hole,depth,azimuth,dip\nW,3500,20,15\nW,3600,45,25\n")
        program = corax.Program.load(collars, surveys, units="feet",
                                     dip_convention="from-vertical")
        p = program.desurvey("W", [3500, 3600])
        foot = 0.3048
        self.assertAlmostEqual((p["y"][1] - p["y"][0]) / foot, 27.22, delta=0.006)
        self.assertAlmostEqual((p["x"][1] - p["x"][0]) / foot, 19.45, delta=0.006)
        self.assertAlmostEqual((p["z"][0] - p["z"][1]) / foot, 94.01, delta=0.006)
        self.assertAlmostEqual(float(p["dip"][1]), 25.0, places=9)  # from vertical, as given
        self.assertEqual(list(p["status"]), ["ok", "ok"])
        self.assertAlmostEqual(program.length("W"), 3600 * foot, places=9)


class AgainstCommandLine(CoraxCase):
    """The module and the command line on the same tables."""

    program_tables = ("--collars", "data/collars.csv", "--surveys", "data/surveys.csv")

    @classmethod
    def setUpClass(cls):
        cls.program = corax.Program.load(os.path.join(DATA, "collars.csv"),
                                         os.path.join(DATA, "surveys.csv"))

    def convert_log(self, log, cli_options=(), **options):
        """Convert a log both ways; compare every row whose fields are all
        numbers (the command line's own parse errors have no twin here)."""
        cli_folder = os.path.join(ROOT, "tests", "cli")
        rows = read_csv(os.path.join(cli_folder, log))
        width = len(rows[0])
        clean = [i for i, r in enumerate(rows)
                 if None not in r and all(number(r.get(c, "")) is not None
                                          for c in ("depth", "alpha", "beta", "gamma",
                                                    "line_alpha", "line_beta") if c in r)]
        cli = run("convert", *self.program_tables, *cli_options, log, cwd=cli_folder)
        self.assertEqual(len(cli), len(rows))
        pick = [rows[i] for i in clean]
        values = {c: [number(r[c]) for r in pick] for c in ("alpha", "beta", "gamma",
                                                            "line_alpha", "line_beta")
                  if c in rows[0]}
        result = self.program.convert([r["hole"] for r in pick], [number(r["depth"]) for r in pick],
                                      **values, **options)
        self.assert_result_type(result)
        cli_clean = [cli[i] for i in clean]
        self.assert_columns(result, cli_clean, range(len(clean)), DECIMALS, log)
        for k, row in enumerate(cli_clean):
            self.assertEqual(result["status"][k], row["status"], f"{log} row {clean[k] + 2}")
            if len(rows[clean[k]]) == width:
                self.assertEqual(result["note"][k], row["note"], f"{log} row {clean[k] + 2}")
        return len(clean)

    def test_convert_log(self):
        self.assertGreaterEqual(self.convert_log("data/log.csv"), 10)

    def test_convert_conventions(self):
        # the core conventions by their words, as the command line's options
        cli = ("--reference-line", "top", "--beta-sense", "anticlockwise", "--gamma-zero",
               "up-hole", "--near-parallel", "20")
        self.convert_log("data/log.csv", cli, reference_line="top", beta_sense="anticlockwise",
                         gamma_zero="up-hole", near_parallel=20)

    def test_convert_lines(self):
        with tempfile.TemporaryDirectory() as tmp:
            log = write(tmp, "lines.csv", "hole,depth,alpha,beta,line_alpha,line_beta,kind\n"
                        "T1,12,,,35,80,lineation\nT1,44,,,70,300,lineation\n"
                        "UP1,20,,,20,10,lineation\nT2,30,40,100,,,bedding\n"
                        "T1,55,,,95,10,lineation\n")
            self.assertEqual(self.convert_log(log), 5)

    def test_convert_feet(self):
        # every table in feet, the depths given too
        program = corax.Program.load(os.path.join(DATA, "collars.csv"),
                                     os.path.join(DATA, "surveys.csv"), units="feet")
        cli = run("convert", *self.program_tables, "--units", "feet", "data/log2.csv",
                  cwd=os.path.join(ROOT, "tests", "cli"))
        rows = read_csv(os.path.join(DATA, "log2.csv"))
        result = program.convert([r["hole"] for r in rows], [number(r["depth"]) for r in rows],
                                 alpha=[number(r["alpha"]) for r in rows],
                                 beta=[number(r["beta"]) for r in rows])
        self.assert_columns(result, cli, range(len(rows)), DECIMALS, "log2.csv in feet")

    def test_trace_at(self):
        rows = read_csv(os.path.join(DATA, "at.csv"))
        cli = run("trace", *self.program_tables, "--at", "data/at.csv",
                  cwd=os.path.join(ROOT, "tests", "cli"))
        depths = [number(r["depth"]) for r in rows]
        depths = [math.nan if d is None else d for d in depths]  # "abc": not a depth
        result = self.program.desurvey([r["hole"] or "" for r in rows], depths)
        self.assert_result_type(result)
        self.assert_columns(result, cli, range(len(rows)), TRACE_DECIMALS, "trace --at")
        self.assertEqual(list(result["status"]), [r["status"] for r in cli])

    def test_monte_carlo(self):
        # log_mc.csv with its own beta_error column and confidence words
        log = os.path.join(DATA, "log_mc.csv")
        rows = read_csv(log)
        cli = run("convert", *self.program_tables, "--draws", "500", "--seed", "7",
                  "data/log_mc.csv", cwd=os.path.join(ROOT, "tests", "cli"))
        # the rows the command line draws: a known confidence and a usable error
        drawn = [i for i, r in enumerate(rows)
                 if r["confidence"] in ("", *CONFIDENCE_ERRORS)
                 and number(r["beta_error"]) is not None
                 and not number(r["beta_error"]) < 0]
        pick = [rows[i] for i in drawn]
        spread = self.program.monte_carlo(
            [r["hole"] for r in pick], [number(r["depth"]) for r in pick],
            alpha=[number(r["alpha"]) for r in pick], beta=[number(r["beta"]) for r in pick],
            line_error=[CONFIDENCE_ERRORS.get(r["confidence"]) for r in pick],
            beta_error=[number(r["beta_error"]) for r in pick], draws=500, seed=7)
        self.assert_result_type(spread)
        self.assert_columns(spread, [cli[i] for i in drawn], range(len(drawn)), DECIMALS,
                            "log_mc.csv")
        for i, row in enumerate(cli):
            if i not in drawn:
                self.assertEqual(row["dip_sd"], "", f"log_mc.csv row {i + 2} is not drawn")
        self.assertGreaterEqual(sum(1 for r in cli if r["dip_sd"]), 5)

    def test_errors_carry_the_librarys_message(self):
        with self.assertRaises(corax.CoraxError) as e:
            self.program.convert("T1", 10, alpha=30, beta=90, beta_sense="widdershins")
        self.assertEqual(str(e.exception),
                         "beta_sense: 'widdershins' is not clockwise or anticlockwise")
        self.assertEqual(e.exception.status, "bad value")
        with self.assertRaises(corax.CoraxError) as e:
            corax.Program.load(os.path.join(DATA, "nosuch.csv"), os.path.join(DATA, "surveys.csv"))
        self.assertIn("nosuch.csv", str(e.exception))
        with self.assertRaises(corax.CoraxError) as e:
            corax.Program.load(os.path.join(DATA, "bad_collars.csv"),
                               os.path.join(DATA, "surveys.csv"))
        self.assertTrue(any(f.severity == "error" for f in e.exception.findings))
        self.assertIn("bad_collars.csv:", str(e.exception))
        loose = corax.Program.load(os.path.join(DATA, "bad_collars.csv"),
                                   os.path.join(DATA, "surveys.csv"), strict=False)
        self.assertTrue(any(f.severity == "error" for f in loose.findings))
        with self.assertRaises(TypeError):
            self.program.convert("T1", 10, alpha=30, declination=5)
        with self.assertRaises(corax.CoraxError) as e:
            self.program.monte_carlo("T1", [10, 20], alpha=30, beta=90, alpha_error=[1, -1])
        self.assertIn("alpha_error -1 is not an error", str(e.exception))
        with self.assertRaises(ValueError):
            self.program.convert(["T1"], [10, 20], alpha=30)


class Demo(CoraxCase):
    """The demo program (Quillon Creek, invented), as its project file sets it."""

    @classmethod
    def setUpClass(cls):
        ini = os.path.join(ROOT, "examples", "quillon_creek.ini")
        project = configparser.ConfigParser(inline_comment_prefixes=(";",),
                                            comment_prefixes=(";", "#"))
        project.read(ini)
        # the project file's keys are the module's options
        cls.options = {k: v for s in ("tables", "survey") for k, v in project[s].items()}
        cls.core = dict(project["core"])
        folder = os.path.dirname(ini)
        cls.program = corax.Program.load(
            os.path.join(folder, project["inputs"]["collars"]),
            os.path.join(folder, project["inputs"]["surveys"]), **cls.options)
        cls.log = read_csv(os.path.join(ROOT, "examples", "core_log.csv"))

    def readings(self):
        log = self.log

        def numbers(column):  # not a number (n/a): absent here, a note there
            return [math.nan if number(r[column]) is None else number(r[column]) for r in log]

        return dict(holes=[r["hole"] for r in log], depths=numbers("depth"),
                    alpha=numbers("alpha"), beta=numbers("beta"), gamma=numbers("gamma"),
                    arbitrary_line=[r["confidence"] == "unoriented" for r in log])

    def test_demo_convert_and_monte_carlo(self):
        cli = run("convert", "-p", "examples/quillon_creek.ini", "--draws", "500", "--seed",
                  "2026", "-o", "-")
        self.assertEqual(len(cli), len(self.log))
        given = self.readings()
        result = self.program.convert(**given, **self.core)
        everything = range(len(cli))
        self.assert_columns(result, cli, everything, {k: v for k, v in DECIMALS.items()
                                                      if "sd" not in k and k not in
                                                      ("cone95", "kappa")}, "demo convert")
        self.assertEqual(list(result["status"]), [r["status"] for r in cli])
        clean = [i for i, r in enumerate(self.log)
                 if all(number(r[c]) is not None for c in ("depth", "alpha", "beta", "gamma"))]
        self.assertGreater(len(clean), 4900)
        self.assertEqual([result["note"][i] for i in clean], [cli[i]["note"] for i in clean])
        spread = self.program.monte_carlo(
            **given, line_error=[CONFIDENCE_ERRORS.get(r["confidence"]) for r in self.log],
            draws=500, seed=2026, **self.core)
        self.assert_columns(spread, cli, everything, {k: DECIMALS[k] for k in
                                                      ("dip_sd", "dip_direction_sd", "cone95",
                                                       "kappa", "position_sd")}, "demo spread")
        self.assertGreater(sum(1 for r in cli if r["cone95"]), 3000)

    def test_demo_trace(self):
        cli = run("trace", "-p", "examples/quillon_creek.ini", "--step", "5")
        result = self.program.desurvey([r["hole"] for r in cli], [float(r["depth"]) for r in cli])
        self.assert_columns(result, cli, range(len(cli)), TRACE_DECIMALS, "demo trace")
        self.assertEqual(list(result["status"]), [r["status"] for r in cli])
        self.assertEqual(sorted(set(r["hole"] for r in cli)), sorted(self.program.holes))


if __name__ == "__main__":
    unittest.main()
