"""Walking skeleton: one oil-lab file from the drop folder to a PDF, through
the real binary."""
import json
import os
import unittest

from ferrumtest import REGISTER, SiteTestCase, pdftotext, qpdf_check, run

LAB = """unit_id,sample_date,h2_ppm,ch4_ppm,c2h6_ppm,c2h4_ppm,c2h2_ppm,co_ppm,co2_ppm,lab_ref
T1,2026-03-14,120,50,30,40,<0.5,400,3000,L-1
T1,2026-09-14,150,60,35,45,1,420,3200,L-2
"""


class WalkingSkeleton(SiteTestCase):
    def test_help_and_version(self):
        self.assertIn("ferrum", run("--version").stdout)
        self.assertIn("ingest", run("--help").stdout)
        self.assertIn("--root", run("ingest", "--help").stdout)

    def test_oil_lab_file_to_pdf(self):
        self.drop("units.csv", REGISTER)
        self.ingest()
        self.drop("lab-2026.csv", LAB)
        self.ingest()
        self.assertEqual(self.receipt("lab-2026.csv")["status"], "accepted")
        self.assertEqual(self.count("oil_samples"), 2)
        with self.db() as c:
            h2 = c.execute("SELECT value FROM oil_values v JOIN oil_samples s ON s.id=v.sample_id "
                           "WHERE s.lab_ref='L-2' AND v.test='h2_ppm'").fetchone()[0]
            self.assertEqual(h2, 150)
            state = c.execute("SELECT state FROM oil_values v JOIN oil_samples s ON s.id=v.sample_id "
                              "WHERE s.lab_ref='L-1' AND v.test='c2h2_ppm'").fetchone()[0]
            self.assertEqual(state, 2)  # below detection limit, not zero
        # The file was moved (not copied) into the archive, its name kept with a hash.
        self.assertFalse(os.path.exists(self.path("drop", "planning", "lab-2026.csv")))
        archived = self.receipt("lab-2026.csv")["stored_as"]
        self.assertTrue(archived.startswith("archive/"))
        self.assertTrue(os.path.exists(self.path(archived)))

        # TDCG = H2 + CH4 + C2H2 + C2H4 + C2H6 + CO (IEEE C57.104-2008, clause 6 / Table 1 definition):
        # 150 + 60 + 1 + 45 + 35 + 420 = 711 ppm for the latest sample.
        doc = json.loads(run("assess", "--root", self.root, "T1", "--json").stdout)[0]
        self.assertEqual(doc["unit_id"], "T1")
        self.assertAlmostEqual(doc["dga"]["tdcg_ppm"], 150 + 60 + 1 + 45 + 35 + 420)
        self.assertEqual(doc["dga"]["sample_date"], "2026-09-14")

        out = self.path("out")
        pdf = run("report", "--root", self.root, "T1", "--out", out).stdout.strip()
        self.assertIn("T1", os.path.basename(pdf))
        text = pdftotext(pdf)
        self.assertIn("T1", text)
        self.assertIn("SAFETY", text)
        self.assertIn("711", text)
        ok, msg = qpdf_check(pdf)
        self.assertTrue(ok, msg)


if __name__ == "__main__":
    unittest.main()
