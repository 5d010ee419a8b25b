"""The broken-file corpus (tests/corpus/broken, expected problems in
expected.tsv) through `ferrum ingest` on a site whose register knows T1 and
T2 (40 MVA, 132/33 kV, as tests/ingest/ingest_test_support.h assumes): every
file (CSV or spreadsheet) is rejected, quarantined, and its receipt names
the expected line (a workbook's row), column and reason."""
import csv
import os
import shutil
import sys
import unittest

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "ingest_corpus"))
from ingest_fixtures import CORPUS, IngestCase, sha256_bytes  # noqa: E402


def expected():
    out = {}
    with open(os.path.join(CORPUS, "expected.tsv"), newline="") as f:
        for row in csv.DictReader(f, delimiter="\t"):
            out.setdefault(row["file"], []).append((int(row["line"]), row["column"], row["reason"]))
    return out


class BrokenCorpus(IngestCase):
    def test_every_corpus_file_is_rejected_with_the_expected_problem(self):
        exp = expected()
        files = sorted(n for n in os.listdir(CORPUS) if n != "expected.tsv")
        self.assertEqual(sorted(exp), files, "expected.tsv and the corpus disagree")
        before = self.data_rows()
        folder = self.path("drop", "planning")
        for name in files:
            shutil.copyfile(os.path.join(CORPUS, name), os.path.join(folder, "." + name))
            os.rename(os.path.join(folder, "." + name), os.path.join(folder, name))
        self.ingest(expect=4)
        self.assertEqual(self.data_rows(), before)
        quarantine = set(self.quarantined())
        for name in files:
            with self.subTest(file=name):
                r = self.receipt(name)
                self.assertEqual(r["status"], "rejected")
                with open(os.path.join(CORPUS, name), "rb") as f:
                    sha = sha256_bytes(f.read())
                stem, ext = os.path.splitext(name)
                self.assertEqual(r["stored_as"], f"quarantine/{stem}.{sha[:8]}{ext}")
                self.assertIn(f"{stem}.{sha[:8]}{ext}", quarantine)
                self.assertFalse(os.path.exists(os.path.join(folder, name)))
                for line, column, reason in exp[name]:
                    self.assert_problem(r, line, reason, column=column)
                self.assertEqual(r["problem_count"], len(exp[name]), r["problems"])
                with open(os.path.join(folder, "receipts", name + ".txt")) as f:
                    # A workbook's problems are located by row (and cell).
                    where = "row" if r["problems"][0].get("location") else "line"
                    self.assertIn(f"{where} {exp[name][0][0]}", f.read())


if __name__ == "__main__":
    unittest.main()
