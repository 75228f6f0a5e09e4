"""The README's Python session on the demo program, run as it is written
(doctest), so that the README shows what the module answers."""

import doctest
import os
import re
import unittest

ROOT = os.path.abspath(os.path.join(os.path.dirname(__file__), os.pardir, os.pardir))


def session():
    """The README's ```python blocks, in order, as one doctest text."""
    with open(os.path.join(ROOT, "README.md")) as f:
        text = f.read()
    return "\n".join(re.findall(r"```python\n(.*?)```", text, re.S))


class Readme(unittest.TestCase):
    def test_python_session(self):
        text = session()
        self.assertIn("corax.Program.load(", text)
        here = os.getcwd()
        os.chdir(ROOT)  # the README's paths are the source tree's
        try:
            test = doctest.DocTestParser().get_doctest(text, {}, "README.md", "README.md", 0)
            runner = doctest.DocTestRunner(optionflags=doctest.ELLIPSIS |
                                           doctest.NORMALIZE_WHITESPACE)
            runner.run(test)
            self.assertGreater(runner.tries, 8)
            self.assertEqual(runner.failures, 0, "the README's Python session differs (above)")
        finally:
            os.chdir(here)


if __name__ == "__main__":
    unittest.main()
