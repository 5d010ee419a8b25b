"""Planners close the loop (issue #16): a work-status file dropped by the
planning party books one action and marks another done; `ferrum worklist
--json` shows the booked one with its booking date and no longer lists the
done one; the receipt names the references it matched and those ferrum does
not raise; a malformed row rejects the whole file with line and column.
The rules are ferrum's own bookkeeping (analytics/work_status.h): common
practice, no published source."""
import csv
import datetime
import io
import json
import os
import sys
import unittest

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "ingest_corpus"))
from ferrumtest import run  # noqa: E402
from ingest_fixtures import IngestCase  # noqa: E402

HEADER = "unit_id,action,status,date,note\n"


class WorkStatus(IngestCase):
    def worklist(self, *extra):
        return json.loads(run("worklist", "--root", self.root, "--json", *extra).stdout)

    def refs(self, doc):
        return {a["reference"]: a for a in doc["actions"]}

    def test_booked_and_done_change_the_work_list(self):
        today = datetime.datetime.now(datetime.timezone.utc).date()
        before = self.worklist()
        self.assertIn("caution", before)
        t1 = [a for a in before["actions"] if a["unit_id"] == "T1"]
        self.assertGreaterEqual(len(t1), 2, before)  # a unit without data: sample, survey, inspect
        booked, done = t1[0]["reference"], t1[1]["reference"]
        for a in t1:
            self.assertTrue(a["reference"].startswith("T1/"), a)
            self.assertEqual(a["status"], "open")
            self.assertEqual(a["site"], "Quillmere")
        dues = [a["due"] for a in before["actions"]]
        self.assertEqual(dues, sorted(dues))  # soonest due first

        booking = (today + datetime.timedelta(days=20)).isoformat()
        self.drop("work-status.csv", HEADER +
                  f"T1,{booked},booked,{booking},crew A\n"
                  f"T1,{done},done,{today.isoformat()},carried out\n"
                  f"T1,T1/no-such-need,done,{today.isoformat()},\n")
        self.ingest()
        r = self.receipt("work-status.csv")
        self.assertEqual((r["status"], r["kind"], r["rows"]), ("accepted", "work_status", 3), r["problems"])
        self.assertEqual(r["action_references"]["matched"], [booked, done])
        self.assertEqual(r["action_references"]["not_raised"], ["T1/no-such-need"])
        self.assertEqual(self.count("work_status"), 3)

        after = self.refs(self.worklist())
        self.assertNotIn(done, after)  # done: off the list
        self.assertEqual(after[booked]["status"], "booked")
        self.assertEqual(after[booked]["booked_date"], booking)
        self.assertFalse(after[booked]["overdue"])
        self.assertEqual(after[booked]["note"], "crew A")
        # The other units' actions are untouched.
        self.assertEqual({k for k in self.refs(before) if not k.startswith("T1/")},
                         {k for k in after if not k.startswith("T1/")})

        # The unit's own assessment says the same: booked, with its date.
        doc = json.loads(run("assess", "--root", self.root, "--json", "T1").stdout)
        acts = {a["reference"]: a for a in doc[0]["actions"]}
        self.assertEqual((acts[booked]["status"], acts[booked]["work_date"]), ("booked", booking))
        self.assertFalse(acts[booked]["overdue"])
        self.assertNotIn(done, acts)

        # CSV: the same rows, a header first.
        rows = list(csv.DictReader(io.StringIO(run("worklist", "--root", self.root, "--csv").stdout)))
        self.assertEqual([x["reference"] for x in rows], list(after))
        b = next(x for x in rows if x["reference"] == booked)
        self.assertEqual((b["status"], b["booked_date"]), ("booked", booking))

    def test_site_and_crew_filters(self):
        doc = self.worklist("--site", "southgate")
        self.assertTrue(doc["actions"])
        self.assertEqual({a["unit_id"] for a in doc["actions"]}, {"T3"})
        crews = {a["crew"] for a in self.worklist()["actions"]}
        for crew in crews - {None}:
            only = self.worklist("--crew", crew)["actions"]
            self.assertTrue(only)
            self.assertEqual({a["crew"] for a in only}, {crew})

    def test_a_malformed_row_rejects_the_whole_file(self):
        self.drop("bad-status.csv", HEADER +
                  "T1,T1/oil-resample,booked,2026-12-20,\n"
                  "T1,T1/oil-resample,scheduled,2026-11-20,\n"
                  "T1,T1/outage,done,20.11.2026,\n")
        self.ingest(expect=4)
        r = self.receipt("bad-status.csv")
        self.assertEqual(r["status"], "rejected")
        p = self.assert_problem(r, 3, "booked, done or cancelled", column="status")
        self.assertEqual(p["column_number"], 3)
        self.assert_problem(r, 4, "", column="date")
        self.assertEqual(self.count("work_status"), 0)  # nothing of it was kept


if __name__ == "__main__":
    unittest.main()
