"""Malformed CSV gets a rejection with a reason, never a crash or a hang:
unbalanced quotes, ragged rows, binary garbage, invalid UTF-8, UTF-16 and a
very long line without a newline."""
import os
import random
import sys
import time
import unittest

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "ingest_corpus"))
from ingest_fixtures import IngestCase  # noqa: E402
from ferrumtest import run  # noqa: E402

HEADER = b"unit_id,sample_date,lab_ref,h2_ppm,note\n"


class Malformed(IngestCase):
    def drop_bytes(self, name, data):
        folder = self.path("drop", "planning")
        with open(os.path.join(folder, "." + name), "wb") as f:
            f.write(data)
        os.rename(os.path.join(folder, "." + name), os.path.join(folder, name))

    def ingest_one(self, name, data):
        self.drop_bytes(name, data)
        p = run("ingest", "--root", self.root, check=False, timeout=60)
        self.assertEqual(p.returncode, 4, p.stdout + p.stderr)  # rejected, not a crash (no signal, no 1)
        r = self.receipt(name)
        self.assertEqual(r["status"], "rejected")
        self.assertTrue(r["stored_as"].startswith("quarantine/"))
        self.assertEqual(self.count("oil_samples") + self.count("load_points"), 0)
        return r

    def test_unbalanced_quote(self):
        r = self.ingest_one("q.csv", HEADER + b'T1,2026-03-01,L-1,12,ok\nT1,2026-03-02,"L-2,12,n\nT1,2026-03-03,L-3,1,x\n')
        self.assert_problem(r, 3, "never closed")

    def test_ragged_rows_are_each_reported(self):
        r = self.ingest_one("r.csv", HEADER + b"T1,2026-03-01,L-1,12,ok,extra\nT1,2026-03-02,L-2\n"
                                              b"T1,2026-03-03,L-3,1,x\n")
        self.assert_problem(r, 2, "6 values but the header has 5")
        self.assert_problem(r, 3, "3 values but the header has 5")
        self.assertEqual(r["problem_count"], 2)

    def test_binary_garbage(self):
        rng = random.Random(7)
        r = self.ingest_one("garbage.csv", bytes(rng.randrange(256) for _ in range(200_000)))
        self.assertGreaterEqual(r["problem_count"] + (1 if r["reason"] else 0), 1)

    def test_binary_garbage_after_a_good_header(self):
        rng = random.Random(11)
        r = self.ingest_one("tail.csv", HEADER + b"T1,2026-03-01,L-1,12,ok\n" +
                            bytes(rng.randrange(256) for _ in range(100_000)))
        self.assertGreaterEqual(r["problem_count"], 1)
        self.assertLessEqual(len(r["problems"]), 100)

    def test_invalid_utf8(self):
        r = self.ingest_one("u.csv", HEADER + b"T1,2026-03-01,L-1,12,caf\xe9 cr\xe8me\n")
        p = self.assert_problem(r, 2, "invalid UTF-8", column="note")
        self.assertIn("\\xE9".lower(), p["value"].lower())

    def test_utf16_is_refused(self):
        r = self.ingest_one("w.csv", (HEADER + b"T1,2026-03-01,L-1,12,ok\n").decode().encode("utf-16"))
        self.assert_problem(r, 1, "UTF-16")

    def test_fifty_megabytes_without_a_newline(self):
        folder = self.path("drop", "planning")
        tmp = os.path.join(folder, ".long.part")
        chunk = b"x" * (1 << 20)
        with open(tmp, "wb") as f:
            f.write(HEADER + b"T1,2026-03-01,L-1,12,")
            for _ in range(50):
                f.write(chunk)
        os.rename(tmp, os.path.join(folder, "long.csv"))
        started = time.monotonic()
        p = run("ingest", "--root", self.root, check=False, timeout=60)
        self.assertEqual(p.returncode, 4, p.stdout + p.stderr)
        self.assertLess(time.monotonic() - started, 30)
        r = self.receipt("long.csv")
        self.assertEqual(r["status"], "rejected")
        self.assert_problem(r, 2, "1 MiB")
        self.assertLessEqual(len(r["problems"][0]["value"].encode()), 80 * 4)
        self.assertLess(os.path.getsize(self.path("drop", "planning", "receipts", "long.csv.json")), 100_000)

    def test_fifty_megabyte_header_line(self):
        folder = self.path("drop", "planning")
        tmp = os.path.join(folder, ".wide.part")
        with open(tmp, "wb") as f:
            for _ in range(50):
                f.write(b"a," * (1 << 19))
        os.rename(tmp, os.path.join(folder, "wide.csv"))
        p = run("ingest", "--root", self.root, check=False, timeout=60)
        self.assertEqual(p.returncode, 4, p.stdout + p.stderr)
        r = self.receipt("wide.csv")
        self.assertEqual(r["status"], "rejected")
        self.assertGreaterEqual(r["problem_count"], 1)
        self.assertLess(os.path.getsize(self.path("drop", "planning", "receipts", "wide.csv.json")), 100_000)


if __name__ == "__main__":
    unittest.main()
