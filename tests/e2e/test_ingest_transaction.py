"""One file, one transaction: a valid file is imported whole; one bad row
anywhere leaves nothing of the file behind, and the receipt names exactly the
line of that row (1-based physical lines of the file as dropped)."""
import os
import random
import sys
import unittest

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "ingest_corpus"))
from ingest_fixtures import IngestCase  # noqa: E402

SEED = 20260601
ITERATIONS = 20

OIL_PREAMBLE = b"# lab export, batch 7\n\n"
OIL_HEADER = b"unit_id,sample_date,lab_ref,h2_ppm,ch4_ppm,c2h2_ppm,moisture_ppm,note\n"
LOAD_PREAMBLE = b"# scada export\n"
LOAD_HEADER = b"unit_id,timestamp,load_pu,top_oil_c\n"


def oil_rows():
    rows = []
    for i in range(10):
        unit = "T1" if i % 2 else "T2"
        note = b'"two\nline note"' if i in (2, 6) else b"ok"  # quoted line breaks shift physical lines
        rows.append(b"%s,2026-%02d-%02d,L-%02d,%d,%d,%s,%d,%s\n"
                    % (unit.encode(), 1 + i % 9, 1 + i, i, 10 + i, 5 + i, b"<0.5" if i % 3 else b"ND", 8 + i, note))
    return rows


def load_rows():
    return [b"T%d,2026-03-%02dT%02d:00Z,%.2f,%d\n" % (1 + i % 2, 1 + i // 24, i % 24, 0.3 + i / 100, 30 + i % 10)
            for i in range(30)]


# Bad rows: (defect name, row bytes, reason fragment). Each function gets the
# random generator and the rows before the insertion point.
def oil_defects(rng, before):
    d = [("negative gas", b"T1,2026-05-02,L-90,-3,5,1,8,x\n", "cannot be negative"),
         ("date format", b"T1,14/05/2026,L-90,3,5,1,8,x\n", "YYYY-MM-DD"),
         ("impossible date", b"T1,2026-02-30,L-90,3,5,1,8,x\n", "no such calendar date"),
         ("future date", b"T1,2031-02-01,L-90,3,5,1,8,x\n", "in the future"),
         ("unknown unit", b"T-999,2026-05-02,L-90,3,5,1,8,x\n", "not in the units register"),
         ("not a number", b"T1,2026-05-02,L-90,n/a,5,1,8,x\n", "not a number"),
         ("too many values", b"T1,2026-05-02,L-90,3,5,1,8,x,y\n", "9 values but the header has 8"),
         ("too few values", b"T1,2026-05-02,L-90,3\n", "4 values but the header has 8"),
         ("no test value", b"T1,2026-05-02,L-90,,,,,x\n", "no test value"),
         ("unclosed quote", b'T1,2026-05-02,"L-90,3,5,1,8,x\n', "never closed"),
         ("stray quote", b'T1,2026-05-02,L"90,3,5,1,8,x\n', "quote inside an unquoted value"),
         ("NUL byte", b"T1,2026-05-02,L-90,3\x004,5,1,8,x\n", "NUL byte"),
         ("invalid UTF-8", b"T1,2026-05-02,L-90,3,5,1,8,caf\xe9\n", "invalid UTF-8"),
         ("percent moisture", b"T1,2026-05-02,L-90,3,5,1,40 %,x\n", "not a number")]
    if before:
        d.append(("duplicate key", rng.choice(before), "same unit_id, sample_date, lab_ref and sample_point"))
    return d


def load_defects(rng, before):
    d = [("50 pu", b"T1,2026-04-01T00:00Z,50,40\n", "50 per unit is not possible"),
         ("bad time", b"T1,2026-04-01T25:00Z,0.5,40\n", "no such time of day"),
         ("top oil", b"T1,2026-04-01T00:00Z,0.5,300\n", "300 \u00b0C is not possible"),
         ("unknown unit", b"T-999,2026-04-01T00:00Z,0.5,40\n", "not in the units register"),
         ("ragged", b"T1,2026-04-01T00:00Z,0.5\n", "3 values but the header has 4"),
         ("thousands", b"T1,2026-04-01T00:00Z,1.234,5,40\n", "5 values but the header has 4")]
    if before:
        d.append(("same time twice", rng.choice(before), "a second reading"))
    return d


def physical_line(preamble, records, index):
    """1-based line where record `index` starts (header right after the preamble)."""
    return preamble.count(b"\n") + 2 + sum(r.count(b"\n") for r in records[:index])


class OneTransaction(IngestCase):
    def test_valid_files_are_imported_whole(self):
        self.drop("lab.csv", (OIL_PREAMBLE + OIL_HEADER + b"".join(oil_rows())).decode())
        self.drop("scada.csv", (LOAD_PREAMBLE + LOAD_HEADER + b"".join(load_rows())).decode())
        self.ingest()
        self.assertEqual(self.receipt("lab.csv")["rows"], 10)
        self.assertEqual(self.count("oil_samples"), 10)
        self.assertEqual(self.count("oil_values"), 40)
        self.assertEqual(self.receipt("scada.csv")["rows"], 30)
        self.assertEqual(self.count("load_points"), 30)
        with self.db() as c:
            # The quoted two-line note of record 3 (line 6) puts record 4 on line 8.
            self.assertEqual(c.execute("SELECT line FROM oil_samples WHERE lab_ref='L-03'").fetchone()[0], 8)

    def test_bad_last_row_after_thousands_of_good_rows_leaves_nothing(self):
        good = b"".join(b"T1,2026-03-%02dT%02d:%02dZ,0.5,40\n" % (1 + i // 1440, i // 60 % 24, i % 60)
                        for i in range(5000))
        self.drop("big.csv", (LOAD_HEADER + good + b"T1,2026-04-01T00:00Z,50,40\n").decode())
        self.ingest(expect=4)
        r = self.receipt("big.csv")
        self.assertEqual((r["status"], r["problem_count"]), ("rejected", 1))
        self.assert_problem(r, 5002, "not possible", column="load_pu")
        self.assertEqual(self.count("load_points"), 0)

    def test_one_bad_row_at_a_random_place_imports_nothing_and_is_named(self):
        rng = random.Random(SEED)
        before = self.data_rows()
        cases = {}
        for i in range(ITERATIONS):
            kind = rng.choice(("oil", "load"))
            preamble, header, rows, defects = ((OIL_PREAMBLE, OIL_HEADER, oil_rows(), oil_defects) if kind == "oil"
                                               else (LOAD_PREAMBLE, LOAD_HEADER, load_rows(), load_defects))
            pos = rng.randrange(len(rows) + 1)
            what, bad, reason = rng.choice(defects(rng, rows[:pos]))
            records = rows[:pos] + [bad] + rows[pos:]
            line = physical_line(preamble, records, pos)
            name = f"case{i:02d}-{kind}.csv"
            folder = self.path("drop", "planning")
            with open(os.path.join(folder, "." + name), "wb") as f:
                f.write(preamble + header + b"".join(records))
            os.rename(os.path.join(folder, "." + name), os.path.join(folder, name))
            cases[name] = (what, line, reason)
        self.ingest(expect=4)
        self.assertEqual(self.data_rows(), before, "a rejected file changed stored rows")
        for name, (what, line, reason) in cases.items():
            with self.subTest(name=name, defect=what, line=line):
                r = self.receipt(name)
                self.assertEqual(r["status"], "rejected")
                self.assertEqual(r["problem_count"], 1, r["problems"])
                self.assertEqual(r["problems"][0]["line"], line, r["problems"])
                self.assertIn(reason, r["problems"][0]["reason"])
        with self.db() as c:
            self.assertEqual(c.execute("SELECT count(*) FROM files WHERE status='rejected'").fetchone()[0],
                             ITERATIONS)
        # Control: the same files without the bad row are acceptable.
        self.drop("lab.csv", (OIL_PREAMBLE + OIL_HEADER + b"".join(oil_rows())).decode())
        self.drop("scada.csv", (LOAD_PREAMBLE + LOAD_HEADER + b"".join(load_rows())).decode())
        self.ingest()


if __name__ == "__main__":
    unittest.main()
