"""Every output carries its caution (report/safety_text.cpp is the one source):
each PDF the full SAFETY block with every hazard (read with pdftotext), each
CSV a `# SAFETY:` comment line, each JSON document a `caution` key, and the
console output of assess, rank, thermal, dga and ratio a last line. Alert
titles are words, not identifiers."""
import csv
import glob
import io
import json
import os
import unittest

from ferrumtest import REGISTER, SiteTestCase, pdftotext, run

AS_OF = "2026-11-30"
LAB = """unit_id,sample_date,h2_ppm,ch4_ppm,c2h6_ppm,c2h4_ppm,c2h2_ppm,co_ppm,co2_ppm,furan_2fal_ppb,lab_ref
T1,2026-10-01,120,50,30,40,<0.5,400,3000,300,L-1
T2,2026-10-01,900,300,40,500,120,300,2000,1500,L-2
"""
LOAD = "unit_id,timestamp,load_pu,ambient_c\n" + "".join(
    f"T1,2026-11-2{d}T{h:02d}:00:00Z,0.8,12\n" for d in range(1, 4) for h in range(24))
# Hazards every PDF's SAFETY block names (the leads of report/safety_text.cpp).
HAZARDS = ["Qualified persons only", "Isolate before contact", "Arc flash", "Working at height",
           "Oil fire and tank rupture", "Sampling near energised equipment", "Confined space",
           "Oil handling and PCB", "Combustible gases", "Electrical tests", "Decision support only"]


def squash(text):
    return " ".join(text.split())


class Cautions(SiteTestCase):
    def setUp(self):
        super().setUp()
        self.drop("units.csv", REGISTER)
        self.ingest()
        self.drop("lab.csv", LAB)
        self.drop("load.csv", LOAD)
        self.ingest()
        self.line = run("dga", "--h2", "100").stdout.rstrip("\n").split("\n")[-1]
        self.assertTrue(self.line.startswith("SAFETY: "), self.line)
        self.assertIn("qualified engineer decides", self.line)

    def assert_pdf_caution(self, pdf):
        text = squash(pdftotext(pdf))
        self.assertIn("SAFETY", text, pdf)
        for hazard in HAZARDS:
            self.assertIn(hazard, text, f"{pdf}: {hazard}")
        self.assertNotIn("1979", text)

    def test_pdfs_carry_every_caution(self):
        out = self.path("out")
        run("report", "--root", self.root, "--as-of", AS_OF, "--out", out, "T1", "T2")
        run("report", "--root", self.root, "--as-of", AS_OF, "--out", out, "--fleet")
        run("report", "--root", self.root, "--as-of", AS_OF, "--weekly")
        pdfs = glob.glob(os.path.join(out, "*.pdf")) + glob.glob(self.path("reports", "*", "*.pdf"))
        self.assertGreaterEqual(len(pdfs), 6, pdfs)  # 2 unit + fleet here; 2 unit + fleet + index weekly
        for pdf in pdfs:
            self.assert_pdf_caution(pdf)

    def test_csv_files_end_with_the_caution(self):
        out = self.path("out")
        files = run("report", "--root", self.root, "--as-of", AS_OF, "--out", out, "--fleet").stdout.split()
        fleet_csv = next(f for f in files if f.endswith(".csv"))
        with open(fleet_csv) as f:
            lines = f.read().rstrip("\n").split("\n")
        self.assertEqual(lines[-1], "# " + self.line)
        ranking = run("rank", "--root", self.root, "--as-of", AS_OF, "--csv").stdout.rstrip("\n").split("\n")
        self.assertEqual(ranking[-1], "# " + self.line)
        rows = list(csv.DictReader(io.StringIO("\n".join(l for l in ranking if not l.startswith("#")))))
        self.assertEqual(sorted(r["unit_id"] for r in rows), ["T1", "T2"])
        series = run("thermal", "--root", self.root, "--csv", "T1").stdout.rstrip("\n").split("\n")
        self.assertEqual(series[-1], "# " + self.line)
        self.assertGreater(len(series), 24)

    def test_console_ends_with_the_caution(self):
        for args in (["assess", "--root", self.root, "--as-of", AS_OF],
                     ["rank", "--root", self.root, "--as-of", AS_OF],
                     ["dga", "--h2", "100", "--c2h2", "5"],
                     ["ratio", "--hv-kv", "132", "--lv-kv", "33", "--vector-group", "Dyn11"]):
            last = run(*args).stdout.rstrip("\n").split("\n")[-1]
            self.assertEqual(last, self.line, args)

    def test_json_documents_carry_a_caution_key(self):
        units = json.loads(run("assess", "--root", self.root, "--as-of", AS_OF, "--json").stdout)
        self.assertEqual(len(units), 2)
        for u in units:
            self.assertEqual(u["caution"], self.line)
        for args in (["rank", "--root", self.root, "--as-of", AS_OF, "--json"],
                     ["dga", "--h2", "100", "--json"],
                     ["ratio", "--hv-kv", "132", "--lv-kv", "33", "--vector-group", "Dyn11", "--json"]):
            self.assertEqual(json.loads(run(*args).stdout)["caution"], self.line, args)

    def test_alerts_have_titles_in_words_and_their_csv_a_caution(self):
        # A new sample with acetylene (140 ppm) raises an alert when the daemon imports it.
        self.drop("lab-2.csv", "unit_id,sample_date,h2_ppm,c2h2_ppm,lab_ref\nT2,2026-11-20,950,140,L-3\n")
        run("serve", "--root", self.root, "--once", timeout=120)
        path = self.path("reports", "alerts", "alerts.csv")
        with open(path) as f:
            lines = f.read().split("\n")
        self.assertEqual(lines[0], "# " + self.line)
        alerts = list(csv.DictReader(l for l in lines[1:] if l))
        acetylene = [a for a in alerts if a["unit_id"] == "T2" and a["kind"] == "acetylene"]
        self.assertEqual(len(acetylene), 1, alerts)
        text = squash(pdftotext(self.path("reports", "alerts", acetylene[0]["pdf"])))
        self.assertIn("Acetylene appeared or rising on T2", text)
        self.assertNotIn("acetylene on T2", text)
        # The first step sends someone to a gassing unit: it says how to go.
        self.assertIn("responsible engineer's permission", text)
        self.assertIn("after de-energising", text)
        self.assert_pdf_caution(self.path("reports", "alerts", acetylene[0]["pdf"]))


if __name__ == "__main__":
    unittest.main()
