"""Standard tables as audited data: `ferrum tables`, a site's corrected copy in
ROOT/tables/ changes the result and the report names it, a malformed copy is
refused with line and column while the embedded table stays in force and the
daemon keeps running."""
import json
import os
import time
import unittest

from ferrumtest import REGISTER, SOURCE, SiteTestCase, pdftotext, run

# H2 150, CO 420 and CO2 3200 ppm: Condition 2 by IEEE C57.104-2008 Table 1
# (H2 101-700, CO 351-570, CO2 2501-4000); no gas and not TDCG (711 ppm <= 720)
# above Condition 2.
LAB = """unit_id,sample_date,h2_ppm,ch4_ppm,c2h6_ppm,c2h4_ppm,c2h2_ppm,co_ppm,co2_ppm,lab_ref
T1,2026-03-14,120,50,30,40,<0.5,400,3000,L-1
T1,2026-09-14,150,60,35,45,1,420,3200,L-2
"""

DATA = os.path.join(SOURCE, "analytics", "data")


class StandardTables(SiteTestCase):
    def tables_json(self, expect=0):
        p = run("tables", "--root", self.root, "--json", check=False)
        self.assertEqual(p.returncode, expect, p.stdout + p.stderr)
        return json.loads(p.stdout), p.stderr

    def site_copy(self, edit):
        """Exports the tables, edits ieee_c57104_2008.csv and puts it in ROOT/tables/."""
        out = self.path("review")
        run("tables", "--root", self.root, "--export", out)
        with open(os.path.join(out, "ieee_c57104_2008.csv")) as f:
            text = f.read()
        os.makedirs(self.path("tables"), exist_ok=True)
        with open(self.path("tables", "ieee_c57104_2008.csv"), "w") as f:
            f.write(edit(text))

    def condition(self):
        doc = json.loads(run("assess", "--root", self.root, "T1", "--json", "--as-of", "2026-10-01").stdout)[0]
        return doc["dga"]["c57104_2008_condition"]

    def test_every_data_file_is_listed_with_its_status(self):
        doc, _ = self.tables_json()
        files = {t["file"] for t in doc["tables"]}
        self.assertEqual(files, {f for f in os.listdir(DATA) if f.endswith(".csv")})
        self.assertEqual(doc["refused"], [])
        for t in doc["tables"]:
            self.assertIn(t["status"], ("unverified", "checked against a public reproduction",
                                        "verified against the licensed standard"), t)
            self.assertTrue(t["standard"] and t["edition"] and t["clause"], t)
            self.assertFalse(t["site_override"])
            if t["status"] == "checked against a public reproduction":
                self.assertTrue(t["where"], t)
        by_id = {(t["file"], t["table"]): t for t in doc["tables"]}
        # Confirmed against public reproductions (issue 17): C57.104-2008 Table 1,
        # Duval Triangle 1 vertices, IEC 60599 ratios, IEC 60076-7 ONAF and distribution
        # columns, hot-spot limits, normal life, the thermography delta-T table.
        for key in [("ieee_c57104_2008.csv", "table1"), ("duval_triangle1.csv", "vertices"),
                    ("iec60599.csv", "table1_ratios"), ("iec60076_7.csv", "table5_checked"),
                    ("iec60076_7.csv", "table4_hot_spot_limits"), ("ieee_c57_91.csv", "table1_normal_life"),
                    ("thermography.csv", "delta_t")]:
            self.assertEqual(by_id[key]["status"], "checked against a public reproduction", key)
        # Neither typical-value set of IEC 60599 is verified; both are kept.
        self.assertEqual(by_id[("iec60599.csv", "typical_values_a")]["status"], "unverified")
        self.assertEqual(by_id[("iec60599.csv", "typical_values_b")]["status"], "unverified")
        text = run("tables", "--root", self.root).stdout
        self.assertIn("IEEE C57.104-2008, Table 1", text)
        self.assertIn("embedded", text)

    def test_export_writes_every_file_for_review(self):
        out = self.path("review")
        run("tables", "--root", self.root, "--export", out)
        for name in os.listdir(DATA):
            if name.endswith(".csv"):
                with open(os.path.join(DATA, name)) as a, open(os.path.join(out, name)) as b:
                    self.assertEqual(a.read(), b.read(), name)

    def test_site_copy_changes_the_result_and_the_report_names_it(self):
        self.drop("units.csv", REGISTER)
        self.ingest()
        self.drop("lab.csv", LAB)
        self.ingest()
        self.assertEqual(self.condition(), 2)  # IEEE C57.104-2008 Table 1: H2 150 in 101-700

        def corrected(text):
            # A made-up site correction to see its effect: the H2 bound of Condition 2 lowered to 140 ppm.
            text = text.replace("row,H2,100,700,1800", "row,H2,100,140,1800")
            return text.replace("status,checked against a public reproduction\n",
                                "status,verified against the licensed standard\nby,A. Engineer\nwhen,2026-11-30\n", 1)
        self.site_copy(corrected)
        doc, _ = self.tables_json()
        t1 = [t for t in doc["tables"] if t["file"] == "ieee_c57104_2008.csv" and t["table"] == "table1"][0]
        self.assertTrue(t1["site_override"])
        self.assertEqual(t1["source"], "tables/ieee_c57104_2008.csv")
        self.assertEqual(t1["status"], "verified against the licensed standard")
        self.assertEqual(t1["by"], "A. Engineer")
        self.assertEqual(self.condition(), 3)  # the site's table: H2 150 > 140

        pdf = run("report", "--root", self.root, "T1", "--out", self.path("out"), "--as-of", "2026-10-01").stdout.strip()
        text = " ".join(pdftotext(pdf).split())
        self.assertIn("Standard tables behind this report", text)
        # Cells wrap within their column; the layout text interleaves the columns' lines.
        self.assertIn("site copy", text)
        self.assertIn("tables/ieee_c57104_2008.csv", text)
        self.assertIn("verified against the licensed standard by A.", text)
        self.assertIn("Engineer on 2026-11-30", text)
        self.assertIn("standard tables behind this report are unverified", text)  # page 1, once
        self.assertNotIn("from memory; verify", text)

    def test_malformed_copy_is_refused_with_line_and_column(self):
        self.drop("units.csv", REGISTER)
        self.ingest()
        self.drop("lab.csv", LAB)
        self.ingest()
        self.site_copy(lambda text: text.replace("row,CO,350,570,1400", "row,CO,350,5x0,1400"))
        with open(self.path("tables", "ieee_c57104_2008.csv")) as f:
            line = f.read().split("\n").index("row,CO,350,5x0,1400") + 1
        doc, err = self.tables_json(expect=4)
        self.assertEqual(doc["refused"], [{"file": "tables/ieee_c57104_2008.csv", "line": line, "column": 4,
                                           "reason": doc["refused"][0]["reason"]}])
        self.assertIn(f"tables/ieee_c57104_2008.csv: line {line}, column 4", err)
        self.assertFalse(any(t["site_override"] for t in doc["tables"]))
        # The embedded table stays in force for the assessment.
        self.assertEqual(self.condition(), 2)  # IEEE C57.104-2008 Table 1, embedded
        # The daemon starts, logs the refusal and keeps running.
        self.start_daemon()
        time.sleep(1)
        self.assertIsNone(self.daemon.poll())
        code, out, err = self.stop_daemon()
        self.assertEqual(code, 0)
        logged = err
        for name in os.listdir(self.path("log")):
            with open(self.path("log", name)) as f:
                logged += f.read()
        self.assertIn(f"tables/ieee_c57104_2008.csv refused", logged)
        self.assertIn(f"line {line}, column 4", logged)

    def test_unknown_file_in_tables_is_refused(self):
        os.makedirs(self.path("tables"), exist_ok=True)
        with open(self.path("tables", "my_notes.csv"), "w") as f:
            f.write("anything\n")
        doc, err = self.tables_json(expect=4)
        self.assertEqual(doc["refused"][0]["file"], "tables/my_notes.csv")
        self.assertIn("not a table file ferrum reads", err)


if __name__ == "__main__":
    unittest.main()
