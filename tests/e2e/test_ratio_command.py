"""`ferrum ratio`: the expected turns ratio per phase and tap, without a site
root or database; wrong arguments give exit status 2 and a message."""
import json
import math
import os
import sys
import tempfile
import unittest

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from ferrumtest import run  # noqa: E402


class RatioCommand(unittest.TestCase):
    def setUp(self):
        # run from an empty folder: no site root, no database
        self.cwd = tempfile.mkdtemp(prefix="ferrum-ratio-")

    def ratio(self, *args, check=True):
        return run("ratio", *args, check=check, cwd=self.cwd)

    def test_dyn_ratio_json(self):
        doc = json.loads(self.ratio("--hv-kv", "132", "--lv-kv", "33", "--vector-group", "Dyn11", "--json").stdout)
        self.assertEqual(len(doc["taps"]), 1)
        self.assertIsNone(doc["taps"][0]["tap"])
        # Dyn phase ratio √3·U_HV/U_LV (winding connections; IEEE C57.152, from memory; verify)
        self.assertAlmostEqual(doc["taps"][0]["phase_ratio"], 4 * math.sqrt(3), places=9)
        # ±0.5 % band, IEEE C57.12.00 (from memory; verify)
        self.assertAlmostEqual(doc["taps"][0]["low"], 4 * math.sqrt(3) * 0.995, places=9)
        self.assertEqual(os.listdir(self.cwd), [])  # nothing written

    def test_every_tap_and_one_tap(self):
        taps = ["--tap-positions", "17", "--tap-nominal", "9", "--tap-step-pct", "1.25"]
        doc = json.loads(self.ratio("--hv-kv", "132", "--lv-kv", "33", "--vector-group", "YNd1", *taps, "--json").stdout)
        self.assertEqual([t["tap"] for t in doc["taps"]], list(range(1, 18)))
        # YNd: U_HV/(√3·U_LV) (winding connections); tap 1 = +10 % (convention stated in turns_ratio.h)
        self.assertAlmostEqual(doc["taps"][0]["phase_ratio"], 1.1 * 4 / math.sqrt(3), places=9)
        text = self.ratio("--hv-kv", "132", "--lv-kv", "33", "--vector-group", "YNd1", *taps, "--tap", "9").stdout
        self.assertIn("2.3094", text)
        self.assertIn("de-energised", text)
        self.assertIn("qualified engineer", text)

    def test_usage_errors(self):
        for args in (["--hv-kv", "132", "--lv-kv", "33"],
                     ["--hv-kv", "x", "--lv-kv", "33", "--vector-group", "Dyn11"],
                     ["--hv-kv", "132", "--lv-kv", "0", "--vector-group", "Dyn11"],
                     ["--hv-kv", "132", "--lv-kv", "33", "--vector-group", "Qq1"],
                     ["--hv-kv", "132", "--lv-kv", "33", "--vector-group", "Dzn0"],
                     ["--hv-kv", "132", "--lv-kv", "33", "--vector-group", "Dyn11", "--tap", "3"],
                     ["--hv-kv", "132", "--lv-kv", "33", "--vector-group", "Dyn11", "--tap-positions", "5",
                      "--tap-nominal", "3", "--tap-step-pct", "2.5", "--tap", "6"]):
            p = self.ratio(*args, check=False)
            self.assertEqual(p.returncode, 2, args)
            self.assertTrue(p.stderr.startswith("ferrum ratio: "), p.stderr)


if __name__ == "__main__":
    unittest.main()
