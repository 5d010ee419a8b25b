"""An accepted receipt says how many of the file's rows were new and how many
were already on file (an earlier file had delivered the same key: this
file's row replaced or repeated it), and the date range of its data (issue
19, item 8). A file, then a second one sharing some rows, for every kind."""
import os
import sys
import unittest

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "ingest_corpus"))
from ingest_fixtures import REGISTER, IngestCase  # noqa: E402

LOAD_HEADER = "unit_id,timestamp,load_pu,ambient_c\n"


def load_rows(unit, first_hour, hours, load):
    return "".join(f"{unit},2026-03-{1 + h // 24:02d}T{h % 24:02d}:00Z,{load},12\n"
                   for h in range(first_hour, first_hour + hours))


class NewAndOnFile(IngestCase):
    def text(self, name):
        with open(self.path("drop", "planning", "receipts", name + ".txt")) as f:
            return f.read()

    def counts(self, name):
        r = self.receipt(name)
        self.assertEqual(r["status"], "accepted", r)
        self.assertEqual(r["rows_new"] + r["rows_already_on_file"], r["rows"])
        return r["rows_new"], r["rows_already_on_file"]

    def test_second_load_file_sharing_rows(self):
        # First file: T1 and T2, 30 hours each from 2026-03-01 00:00.
        self.drop("scada-1.csv", LOAD_HEADER + load_rows("T1", 0, 30, 0.5) + load_rows("T2", 0, 30, 0.5))
        self.ingest()
        self.assertEqual(self.counts("scada-1.csv"), (60, 0))
        r1 = self.receipt("scada-1.csv")
        self.assertEqual(r1["dates"], {"from": "2026-03-01", "to": "2026-03-02"})
        self.assertIn("rows:        60 new, none already on file\n", self.text("scada-1.csv"))
        self.assertIn("dates:       2026-03-01 to 2026-03-02\n", self.text("scada-1.csv"))

        # Second file, time-major: hours 20..69 of T1 (10 on file, 40 new),
        # hours 25..34 of T2 (5 on file, 5 new).
        rows = []
        for h in range(20, 70):
            rows.append(load_rows("T1", h, 1, 0.7))
            if 25 <= h < 35:
                rows.append(load_rows("T2", h, 1, 0.7))
        self.drop("scada-2.csv", LOAD_HEADER + "".join(rows))
        self.ingest()
        self.assertEqual(self.counts("scada-2.csv"), (45, 15))
        self.assertEqual(self.receipt("scada-2.csv")["dates"], {"from": "2026-03-01", "to": "2026-03-03"})
        self.assertIn("rows:        45 new, 15 already on file (an earlier file delivered them; "
                      "this file's values now stand)\n", self.text("scada-2.csv"))
        with self.db() as c:
            self.assertEqual(c.execute("SELECT count(*) FROM load_points").fetchone()[0], 105)
            # The shared rows now hold the second file's values.
            self.assertEqual(c.execute("SELECT count(*) FROM load_points WHERE load_pu = 0.7").fetchone()[0], 60)
        # The first receipt is unchanged by the second file.
        self.assertEqual(self.counts("scada-1.csv"), (60, 0))

    def test_oil_reissue_infrared_inspection_and_electrical(self):
        lab = "unit_id,sample_date,lab_ref,h2_ppm\nT1,2026-03-14,L-1,120\nT2,2026-03-14,L-2,15\n"
        self.drop("lab-1.csv", lab)
        self.ingest()
        self.assertEqual(self.counts("lab-1.csv"), (2, 0))
        # A corrected re-issue of L-1 and a new sample.
        self.drop("lab-2.csv", "unit_id,sample_date,lab_ref,h2_ppm\nT1,2026-03-14,L-1,110\nT1,2026-04-02,L-3,90\n")
        self.ingest()
        self.assertEqual(self.counts("lab-2.csv"), (1, 1))
        self.assertIn("1 new, 1 already on file (an earlier file delivered it;", self.text("lab-2.csv"))

        ir = "unit_id,survey_date,component,spot_c,reference_c\nT1,2026-04-02,bushing_h1,41,30\n"
        insp = "unit_id,inspection_date,item,rating\nT1,2026-04-03,breather,fair\n"
        elec = "unit_id,test_date,test,phase,tap,ratio\nT1,2026-03-10,turns_ratio,A,9,6.931\n"
        for name, text in (("ir-1.csv", ir), ("insp-1.csv", insp), ("elec-1.csv", elec)):
            self.drop(name, text)
            self.ingest()
            self.assertEqual(self.counts(name), (1, 0))
        # The same rows again (equal, or corrected) beside new ones.
        self.drop("ir-2.csv", ir + "T2,2026-04-02,bushing_h1,35,30\n")
        self.drop("insp-2.csv", insp.replace("fair", "poor") + "T1,2026-04-03,bushings,good\n"
                                "T2,2026-04-03,breather,good\n")
        self.drop("elec-2.csv", elec.replace("6.931", "6.930") + "T1,2026-03-10,turns_ratio,B,9,6.929\n")
        self.ingest()
        self.assertEqual(self.counts("ir-2.csv"), (1, 1))
        self.assertEqual(self.counts("insp-2.csv"), (2, 1))
        self.assertEqual(self.counts("elec-2.csv"), (1, 1))

    def test_register_again_counts_known_units_as_on_file(self):
        # setUp imported the register (4 units, all new).
        self.assertEqual(self.counts("units.csv"), (4, 0))
        again = REGISTER.replace("T2,Quillmere,40,132,33,ONAF,1998,3,Dyn11,3", "T2,Quillmere,45,132,33,ONAF,1998,3,Dyn11,3")
        again += "T4,Quillmere,20,66,11,ONAN,2010,3,Dyn11,2\n"
        self.drop("units-2.csv", again)
        self.ingest()
        # T1, S1, T3 unchanged and T2 changed: all four were on file; T4 is new.
        self.assertEqual(self.counts("units-2.csv"), (1, 4))

    def test_rejected_and_duplicate_receipts_count_nothing_as_new(self):
        self.drop("lab.csv", "unit_id,sample_date,lab_ref,h2_ppm\nT1,2026-03-14,L-1,-5\n")
        self.ingest(expect=4)
        r = self.receipt("lab.csv")
        self.assertEqual(r["status"], "rejected")
        self.assertNotIn("rows_new", r)
        self.assertNotIn("dates", r)
        self.assertNotIn("new,", self.text("lab.csv"))
        good = "unit_id,sample_date,lab_ref,h2_ppm\nT1,2026-03-14,L-1,5\n"
        self.drop("ok.csv", good)
        self.ingest()
        self.drop("ok-again.csv", good)
        self.ingest()
        self.assertEqual(self.receipt("ok-again.csv")["status"], "duplicate")
        self.assertNotIn("rows_new", self.receipt("ok-again.csv"))


if __name__ == "__main__":
    unittest.main()
