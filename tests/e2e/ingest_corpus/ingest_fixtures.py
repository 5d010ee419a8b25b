"""Fixtures shared by the drop-folder ingestion tests (tests/e2e/test_ingest_*.py):
a units register whose units the broken corpus and the contract examples use,
and small helpers to read what a file left behind."""
import glob
import hashlib
import os
import re
import sys

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, os.path.dirname(HERE))  # ferrumtest

from ferrumtest import SOURCE, SiteTestCase, run  # noqa: E402

EXAMPLES = os.path.join(SOURCE, "schema", "examples")
CORPUS = os.path.join(SOURCE, "tests", "corpus", "broken")

# T1/T2: 40 MVA 132/33 kV three-phase (what tests/ingest/ingest_test_support.h
# assumes for the corpus); S1: 10 MVA 66 kV single-phase at another site;
# T3: a unit at a third site, for party permissions.
REGISTER = """# units register for the ingestion tests
unit_id,site,rated_mva,hv_kv,lv_kv,cooling,year_built,phases,vector_group,criticality
T1,Quillmere,40,132,33,ONAN/ONAF,1998,3,Dyn11,4
T2,Quillmere,40,132,33,ONAF,1998,3,Dyn11,3
S1,Ostrand Yard,10,66,11,ONAN,2011,1,Ii0,2
T3,Southgate,20,66,11,ONAN,2005,3,Dyn11,2
"""

ORIGINAL_SITE_OFFSET = "utc_offset = +00:00"


def sha256_bytes(data):
    return hashlib.sha256(data).hexdigest()


def example(name):
    with open(os.path.join(EXAMPLES, name)) as f:
        return f.read()


class IngestCase(SiteTestCase):
    """A site root with the test register already imported."""

    with_register = True

    def setUp(self):
        super().setUp()
        if self.with_register:
            self.drop("units.csv", REGISTER)
            self.ingest()
            self.assertEqual(self.receipt("units.csv")["status"], "accepted")

    def set_config(self, old, new):
        """Replaces one line of ferrum.ini (keys may not be repeated)."""
        path = self.path("ferrum.ini")
        with open(path) as f:
            text = f.read()
        self.assertIn(old, text)
        with open(path, "w") as f:
            f.write(text.replace(old, new, 1))

    def add_party(self, name, kinds, sites):
        self.write_config(f"[party.{name}]\nkinds = {kinds}\nsites = {sites}\n")
        os.makedirs(self.path("drop", name), exist_ok=True)

    def data_rows(self):
        """Every stored data row, for 'nothing changed' checks."""
        with self.db() as c:
            return {t: c.execute(f"SELECT * FROM {t} ORDER BY 1, 2").fetchall()
                    for t in ("units", "unit_history", "oil_samples", "oil_values", "load_points",
                              "infrared_scans", "inspections", "conversions", "electrical_tests")}

    def measurement_count(self):
        return sum(self.count(t) for t in ("oil_samples", "oil_values", "load_points", "infrared_scans",
                                           "inspections", "electrical_tests"))

    def quarantined(self):
        return sorted(os.path.basename(p) for p in glob.glob(self.path("quarantine", "*"))
                      if not os.path.isdir(p))

    def archived(self):
        return sorted(os.path.relpath(p, self.path("archive"))
                      for p in glob.glob(self.path("archive", "*", "*", "*")))

    def assert_problem(self, receipt, line, reason_part, column=None):
        """The receipt lists a problem at `line` whose reason contains `reason_part`."""
        for p in receipt["problems"]:
            if p["line"] == line and reason_part in p["reason"] and (column is None or p["column"] == column):
                return p
        self.fail(f"no problem at line {line} with '{reason_part}' in {receipt['problems']!r} "
                  f"(reason: {receipt.get('reason')!r})")


def stored_name_re(stem, ext, sha):
    return re.compile(re.escape(stem) + r"\." + sha[:8] + re.escape(ext) + r"$")
