"""A load series in any row order: unit by unit, every unit at one time then
every unit at the next (as a control-room historian exports it), or
shuffled. The store writes queued points sorted by unit and time
(schema/sqlite_store.cpp), so these files must give the same stored series,
the same provenance per point and the same receipts, and a duplicate must be
reported at the line a row-by-row import reports. 300 units x 1,000 hours =
300,000 rows: more than one queue of kSqliteLoadBatch (262,144) points."""
import calendar
import json
import os
import random
import sqlite3
import tempfile
import shutil
import unittest

from ferrumtest import SiteTestCase, run

UNITS = 300
HOURS = 1000
HEADER = "unit_id,timestamp,load_pu,ambient_c\n"


def cells(order):
    c = [(u, h) for h in range(HOURS) for u in range(UNITS)]  # time-major
    if order == "unit-major":
        c.sort()
    elif order == "shuffled":
        random.Random(20261202).shuffle(c)
    return c


def when(h):
    """Hour h as written in the file and as UTC seconds."""
    day, hour = divmod(h, 24)
    month, mday = 1 + day // 28, 1 + day % 28
    return f"2026-{month:02d}-{mday:02d}T{hour:02d}:00Z", calendar.timegm((2026, month, mday, hour, 0, 0))


def row(u, h):
    return f"U{u:03d},{when(h)[0]},{0.4 + (u * 7 + h) % 50 / 100:.2f},{h % 30}\n"


class RowOrder(SiteTestCase):
    def new_root(self, order, rows):
        """A site with the register and the load file in `order`; returns (root, receipt, stored)."""
        root = tempfile.mkdtemp(prefix="ferrum-e2e-order-")
        self.addCleanup(shutil.rmtree, root, True)
        run("init", "--root", root)
        drop = os.path.join(root, "drop", "planning")
        with open(os.path.join(drop, "units.csv"), "w") as f:
            f.write("unit_id,site,rated_mva,hv_kv,lv_kv,cooling,year_built\n")
            f.writelines(f"U{u:03d},Quillmere,40,132,33,ONAF,1990\n" for u in range(UNITS))
        run("ingest", "--root", root)
        with open(os.path.join(drop, "load.csv"), "w") as f:
            f.write(HEADER)
            f.writelines(rows)
        p = run("ingest", "--root", root, check=False)
        with open(os.path.join(drop, "receipts", "load.csv.json")) as f:
            receipt = json.load(f)
        with sqlite3.connect(os.path.join(root, "ferrum.db")) as c:
            stored = c.execute("SELECT u.unit_id, l.ts, l.load_pu, l.ambient_c, l.line FROM load_points l"
                               " JOIN units u USING(unit_key) ORDER BY u.unit_id, l.ts").fetchall()
        return receipt, stored, p.returncode

    @staticmethod
    def comparable(receipt):
        keep = ("status", "kind", "rows", "rows_new", "rows_already_on_file", "dates", "reason", "warnings", "problems",
                "problem_count", "units", "time_note")
        return {k: receipt.get(k) for k in keep}

    def test_three_orders_store_the_same_series_and_receipts(self):
        results = {}
        for order in ("unit-major", "time-major", "shuffled"):
            c = cells(order)
            receipt, stored, rc = self.new_root(order, [row(u, h) for u, h in c])
            self.assertEqual(rc, 0, receipt)
            self.assertEqual(receipt["status"], "accepted")
            self.assertEqual(receipt["rows"], UNITS * HOURS)
            self.assertEqual((receipt["rows_new"], receipt["rows_already_on_file"]), (UNITS * HOURS, 0))
            self.assertEqual(len(stored), UNITS * HOURS)
            # Provenance: each point names the line it came from in this file.
            line_of = {(u, when(h)[1]): i + 2 for i, (u, h) in enumerate(c)}
            for unit_id, ts, load, ambient, line in stored[:: 997]:
                self.assertEqual(line, line_of[(int(unit_id[1:]), ts)])
            results[order] = (self.comparable(receipt), [s[:4] for s in stored])
        self.assertEqual(results["unit-major"], results["time-major"])
        self.assertEqual(results["unit-major"], results["shuffled"])

    def test_duplicate_reported_at_the_same_line_in_any_order(self):
        # The 200,000th row repeats the 150th of the same file, and a later
        # row of the same queue (row 230,000) repeats another one, which
        # sorting by unit may put first: the receipt names the first line
        # that repeats an earlier one, as a row-by-row import would.
        for order in ("unit-major", "time-major", "shuffled"):
            rows = [row(u, h) for u, h in cells(order)]
            rows[199_999] = rows[149]
            rows[229_999] = rows[229_000]
            receipt, stored, rc = self.new_root(order, rows)
            self.assertNotEqual(rc, 0)
            self.assertEqual(receipt["status"], "rejected", order)
            self.assertEqual(stored, [], order)  # all or nothing
            self.assertEqual(receipt["problems"][0]["line"], 200_001, (order, receipt["problems"][:2]))


if __name__ == "__main__":
    unittest.main()
