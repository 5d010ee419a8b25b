"""`ferrum check FILE...`: validates without importing and prints what the
receipt would say; with and without a site root; --party applies the party's
permissions. Exit 0 when every file is acceptable, 4 otherwise."""
import json
import os
import shutil
import sys
import tempfile
import unittest

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "ingest_corpus"))
from ingest_fixtures import CORPUS, IngestCase, example  # noqa: E402
from ferrumtest import run  # noqa: E402

GOOD = "unit_id,sample_date,lab_ref,h2_ppm\nT1,2026-03-14,L-1,10\nT2,2026-03-14,L-2,<5\n"
BAD = "# lab\nunit_id,sample_date,lab_ref,h2_ppm\nT1,2026-03-14,L-1,10\nT1,2026-03-15,L-2,-3\n"
STRANGER = "unit_id,sample_date,lab_ref,h2_ppm\nT-999,2026-03-14,L-1,10\n"


def json_documents(text):
    """The JSON documents printed one after another."""
    docs, decoder, i = [], json.JSONDecoder(), 0
    while text[i:].strip():
        i += len(text[i:]) - len(text[i:].lstrip())
        doc, i = decoder.raw_decode(text, i)
        docs.append(doc)
    return docs


class CheckWithSite(IngestCase):
    def setUp(self):
        super().setUp()
        self.files = tempfile.mkdtemp(prefix="ferrum-check-")
        for name, text in (("good.csv", GOOD), ("bad.csv", BAD), ("stranger.csv", STRANGER)):
            with open(os.path.join(self.files, name), "w") as f:
                f.write(text)

    def tearDown(self):
        super().tearDown()
        shutil.rmtree(self.files, ignore_errors=True)

    def f(self, name):
        return os.path.join(self.files, name)

    def check(self, *args, expect):
        before = self.data_rows()
        files_before = self.count("files")
        p = run("check", "--root", self.root, *args, check=False, timeout=60)
        self.assertEqual(p.returncode, expect, p.stdout + p.stderr)
        self.assertEqual(self.data_rows(), before)          # nothing imported
        self.assertEqual(self.count("files"), files_before)  # nothing recorded
        return p

    def test_acceptable_file(self):
        p = self.check(self.f("good.csv"), expect=0)
        self.assertIn("ACCEPTED: 2 rows of oil_lab", p.stdout)
        self.assertTrue(os.path.exists(self.f("good.csv")))  # not moved
        self.assertFalse(os.path.exists(self.path("drop", "planning", "receipts", "good.csv.json")))

    def test_rejected_file_prints_the_receipt_problems(self):
        p = self.check(self.f("bad.csv"), expect=4)
        self.assertIn("REJECTED", p.stdout)
        self.assertIn("line 4, column h2_ppm (4): hydrogen cannot be negative", p.stdout)
        self.assertTrue(os.path.exists(self.f("bad.csv")))
        self.assertEqual(os.listdir(self.path("quarantine")), [])

    def test_units_are_checked_against_the_site_register(self):
        p = self.check(self.f("stranger.csv"), expect=4)
        self.assertIn("T-999 is not in the units register", p.stdout)

    def test_several_files_any_rejected_gives_4_and_json_is_the_receipt(self):
        p = self.check("--json", self.f("good.csv"), self.f("bad.csv"), expect=4)
        docs = json_documents(p.stdout)
        self.assertEqual([d["status"] for d in docs], ["accepted", "rejected"])
        self.assertEqual([p["line"] for p in docs[1]["problems"]], [4])
        for key in ("file", "sha256", "status", "kind", "rows", "warnings", "problems", "problem_count"):
            self.assertIn(key, docs[1])

    def test_same_answer_as_the_real_drop(self):
        p = self.check("--json", self.f("bad.csv"), expect=4)
        checked = json.loads(p.stdout)
        self.drop("bad.csv", BAD)
        self.ingest(expect=4)
        dropped = self.receipt("bad.csv")
        for key in ("sha256", "status", "kind", "problems", "problem_count", "warnings"):
            self.assertEqual(checked[key], dropped[key], key)

    def test_already_imported_content_is_reported_as_duplicate(self):
        self.drop("good.csv", GOOD)
        self.ingest()
        p = self.check(self.f("good.csv"), expect=0)
        self.assertIn("ALREADY IMPORTED", p.stdout)

    def test_party_permissions(self):
        self.add_party("lab", "oil_lab", "Quillmere")
        self.check("--party", "lab", self.f("good.csv"), expect=0)
        register = self.f("units.csv")
        with open(register, "w") as f:
            f.write(example("units_register.csv"))
        p = self.check("--party", "lab", register, expect=4)
        self.assertIn("party 'lab' may not deliver", p.stdout)
        s1 = self.f("s1.csv")
        with open(s1, "w") as f:
            f.write("unit_id,sample_date,h2_ppm\nS1,2026-03-14,10\n")
        p = self.check("--party", "lab", s1, expect=4)
        self.assertIn("does not serve", p.stdout)
        self.check(s1, expect=0)  # without --party no permission applies
        self.check("--party", "nobody", self.f("good.csv"), expect=4)


class CheckWithoutSite(unittest.TestCase):
    def setUp(self):
        self.cwd = tempfile.mkdtemp(prefix="ferrum-check-nosite-")
        self.env = {k: v for k, v in os.environ.items() if k != "FERRUM_ROOT"}

    def tearDown(self):
        shutil.rmtree(self.cwd, ignore_errors=True)

    def check(self, *args, expect):
        p = run("check", *args, check=False, cwd=self.cwd, env=self.env, timeout=60)
        self.assertEqual(p.returncode, expect, p.stdout + p.stderr)
        self.assertEqual(os.listdir(self.cwd), [], "check without a site wrote files")
        return p

    def test_valid_and_invalid_files(self):
        self.check(os.path.join(CORPUS, "..", "..", "..", "schema", "examples", "oil_lab.csv"), expect=0)
        p = self.check(os.path.join(CORPUS, "negative_gas.csv"), expect=4)
        self.assertIn("line 3, column h2_ppm", p.stdout)
        self.assertIn("hydrogen cannot be negative", p.stdout)
        self.assertIn("unit ids were not checked", p.stdout)

    def test_unknown_unit_is_not_a_problem_away_from_a_site(self):
        self.check(os.path.join(CORPUS, "unknown_unit.csv"), expect=0)

    def test_party_needs_a_site(self):
        p = self.check("--party", "lab", os.path.join(CORPUS, "negative_gas.csv"), expect=2)
        self.assertIn("--party", p.stdout + p.stderr)

    def test_missing_file(self):
        p = self.check(os.path.join(self.cwd, "nope.csv"), expect=4)
        self.assertIn("no such file", p.stdout)


if __name__ == "__main__":
    unittest.main()
