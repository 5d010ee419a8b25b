"""The same ingestion through the daemon: `ferrum serve` takes a valid and an
invalid file renamed into a party folder and answers both with receipts."""
import os
import sys
import unittest

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "ingest_corpus"))
from ingest_fixtures import IngestCase  # noqa: E402

GOOD = "unit_id,sample_date,lab_ref,h2_ppm,c2h2_ppm\nT1,2026-03-14,L-1,10,ND\n"
BAD = "unit_id,sample_date,lab_ref,h2_ppm\nT1,2026-03-14,L-2,10\nT1,2026-03-15,L-3,-3\n"


class ServeIngests(IngestCase):
    def test_daemon_takes_renamed_files_and_answers_both(self):
        self.set_config("settle_seconds = 5", "settle_seconds = 1")
        self.start_daemon()
        self.drop("good.csv", GOOD)   # written as .good.csv.part, then renamed
        self.drop("bad.csv", BAD)
        receipts = self.path("drop", "planning", "receipts")
        self.wait_for(lambda: all(os.path.exists(os.path.join(receipts, n + ".json")) for n in ("good.csv", "bad.csv")),
                      timeout=25, what="both receipts")
        good, bad = self.receipt("good.csv"), self.receipt("bad.csv")
        self.assertEqual((good["status"], good["rows"]), ("accepted", 1))
        self.assertTrue(good["stored_as"].startswith("archive/"))
        self.assertEqual(bad["status"], "rejected")
        self.assertEqual([(p["line"], p["column"]) for p in bad["problems"]], [(3, "h2_ppm")])
        self.assertTrue(bad["stored_as"].startswith("quarantine/"))
        self.assertTrue(os.path.exists(self.path(good["stored_as"])))
        self.assertTrue(os.path.exists(self.path(bad["stored_as"])))
        with self.db() as c:
            self.assertEqual(c.execute("SELECT lab_ref FROM oil_samples").fetchall(), [("L-1",)])
            self.assertEqual(c.execute("SELECT state FROM oil_values WHERE test='c2h2_ppm'").fetchone()[0], 2)
        # The same content again, while the daemon runs: a duplicate.
        self.drop("good-again.csv", GOOD)
        self.wait_for(lambda: os.path.exists(os.path.join(receipts, "good-again.csv.json")), timeout=25,
                      what="duplicate receipt")
        self.assertEqual(self.receipt("good-again.csv")["status"], "duplicate")
        # Refusals work in the daemon too: a file directly in drop/, a symbolic link.
        with open(self.path("drop", "stray.csv"), "w") as f:
            f.write(GOOD.replace("L-1", "L-7"))
        target = self.path("outside.csv")
        with open(target, "w") as f:
            f.write(GOOD.replace("L-1", "L-8"))
        os.symlink(target, self.path("drop", "planning", "link.csv"))
        self.wait_for(lambda: os.path.exists(self.path("quarantine", "receipts", "stray.csv.json")) and
                      os.path.exists(os.path.join(receipts, "link.csv.json")), timeout=25, what="refusals")
        self.assertIn("symbolic link", self.receipt("link.csv")["reason"])
        self.assertTrue(os.path.exists(target))
        code, _, err = self.stop_daemon()
        self.assertEqual(code, 0, err)
        self.assertEqual(self.count("oil_samples"), 1)


if __name__ == "__main__":
    unittest.main()
