"""`rank` reuses the ranking inputs of the last whole-fleet `assess`
(ROOT/cache/ranking-inputs.json) only while nothing changed: the ranking
from the cache equals a fresh one, a new import makes it stale, and a broken
cache file is ignored."""
import json
import os
import unittest

from ferrumtest import REGISTER, SiteTestCase, run

AS_OF = "2026-11-30"
LAB = """unit_id,sample_date,h2_ppm,ch4_ppm,c2h6_ppm,c2h4_ppm,c2h2_ppm,co_ppm,co2_ppm,lab_ref
T1,2026-03-14,120,50,30,40,<0.5,400,3000,L-1
T2,2026-03-14,20,5,3,4,<0.5,200,1500,L-2
"""
# A second sample: T2 now shows acetylene and ethylene (arcing) and has a
# furan result: with the paper factor it has enough data for an index.
LAB_LATER = """unit_id,sample_date,h2_ppm,ch4_ppm,c2h6_ppm,c2h4_ppm,c2h2_ppm,co_ppm,co2_ppm,furan_2fal_ppb,lab_ref
T2,2026-10-01,900,300,40,500,120,300,2000,1500,L-3
"""


class RankCache(SiteTestCase):
    def rank(self, *extra):
        return json.loads(run("rank", "--root", self.root, "--as-of", AS_OF, "--json", *extra).stdout)

    def cache(self):
        return self.path("cache", "ranking-inputs.json")

    def test_cache_reused_only_while_nothing_changed(self):
        self.drop("units.csv", REGISTER)
        self.ingest()
        self.drop("lab.csv", LAB)
        self.ingest()
        run("assess", "--root", self.root, "--as-of", AS_OF, "--json")
        self.assertTrue(os.path.exists(self.cache()))
        with open(self.cache()) as f:
            key = json.load(f)["key"]
        self.assertEqual(self.rank(), self.rank("--fresh"))

        # Only a whole-fleet assess writes it; one unit's does not replace it.
        run("assess", "--root", self.root, "--as-of", AS_OF, "T1")
        with open(self.cache()) as f:
            self.assertEqual(json.load(f)["key"], key)

        before = self.rank()
        self.drop("lab-later.csv", LAB_LATER)
        self.ingest()
        after = self.rank()
        self.assertEqual(after, self.rank("--fresh"))
        t2 = lambda r: next(u for u in r["units"] if u["unit_id"] == "T2")
        self.assertIsNone(t2(before)["health_index"])
        self.assertIsNotNone(t2(after)["health_index"])
        with open(self.cache()) as f:
            self.assertNotEqual(json.load(f)["key"], key)

        # Another as-of day is another key.
        other = json.loads(run("rank", "--root", self.root, "--as-of", "2026-12-31", "--json").stdout)
        self.assertEqual(other["as_of"], "2026-12-31")

    def test_broken_cache_is_ignored(self):
        self.drop("units.csv", REGISTER)
        self.ingest()
        fresh = self.rank("--fresh")
        for content in ["{not json", '{"key": 5}', '{"key": "x", "units": []}']:
            with open(self.cache(), "w") as f:
                f.write(content)
            self.assertEqual(self.rank(), fresh)
        # A good cache cut short, at a line's end or inside a line, or with a
        # unit line missing, is not read as a smaller fleet (one unit a line).
        self.rank("--fresh")
        with open(self.cache()) as f:
            lines = f.read().split("\n")
        self.assertEqual(lines[-2:], ["]}", ""])
        units = [line for line in lines[1:] if line.startswith('{"')]  # after the head line
        self.assertEqual(len(units), 2, lines)
        for cut in ["\n".join(lines[:-2]) + "\n",                    # no closing line
                    "\n".join(lines[:-3]) + "\n]}\n",               # the last unit gone
                    "\n".join(lines)[:-40],                          # inside the last unit
                    "\n".join(lines) + "{}\n"]:                      # something after the end
            with open(self.cache(), "w") as f:
                f.write(cut)
            self.assertEqual(self.rank(), fresh)


if __name__ == "__main__":
    unittest.main()
