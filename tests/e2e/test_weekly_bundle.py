"""The weekly bundle renders its unit reports from the fleet assessment it
already made, on one thread per core. Each of its unit PDFs must read exactly
as `ferrum report UNIT` writes it for the same day from the same data, in the
register's order in the index, and each unit's report day must be recorded
(the next report's "what changed" compares with it). Units named together
to `ferrum report` read as each named alone.
Plumbing: the two paths are compared with each other, so no published source
applies."""
import glob
import os
import shutil
import tempfile
import unittest

from ferrumtest import SiteTestCase, pdftotext, run

AS_OF = "2026-11-30"
# Seven units on three sites: more units than cores, so that the workers share them.
REGISTER = """unit_id,site,rated_mva,hv_kv,lv_kv,cooling,year_built,vector_group,criticality
A1,Quillmere,40,132,33,ONAF,1978,Dyn11,4
A2,Quillmere,40,132,33,ONAF,1981,Dyn11,4
B1,Ostrand Yard,10,33,11,ONAN,2015,Dyn11,2
B2,Ostrand Yard,20,66,11,ONAN,1999,Dyn11,3
C1,Harrowby,60,132,33,ONAF,1972,YNd1,5
C2,Harrowby,15,33,11,ONAN,2004,Dyn11,2
C3,Harrowby,15,33,11,ONAN,2010,Dyn11,1
"""
LAB = """unit_id,sample_date,h2_ppm,ch4_ppm,c2h6_ppm,c2h4_ppm,c2h2_ppm,co_ppm,co2_ppm,furan_2fal_ppb,lab_ref
A1,2026-05-01,60,30,20,25,<0.5,350,2800,900,L-1
A1,2026-11-20,900,300,40,500,120,300,2000,1500,L-2
A2,2026-10-01,20,5,3,4,<0.5,150,1200,120,L-3
B2,2026-11-25,300,120,60,90,2,500,4000,2500,L-4
C1,2026-09-09,40,60,70,20,<0.5,700,6000,4200,L-5
C3,2026-11-29,10,2,2,1,<0.5,90,800,30,L-6
"""
LOAD = "unit_id,timestamp,load_pu,ambient_c\n" + "".join(
    f"{u},2026-11-{d:02d}T{h:02d}:00:00Z,{0.6 + 0.05 * k},{8 + h % 5}\n"
    for k, u in enumerate(["A1", "B2", "C1"]) for d in range(20, 30) for h in range(24))
UNITS = ["A1", "A2", "B1", "B2", "C1", "C2", "C3"]


class WeeklyBundle(SiteTestCase):
    def setUp(self):
        super().setUp()
        self.drop("units.csv", REGISTER)
        self.ingest()
        self.drop("lab.csv", LAB)
        self.drop("load.csv", LOAD)
        self.ingest()
        # A copy of the root as it stands before the bundle: the single-unit
        # reports are rendered there, with the same "previous report" day.
        self.twin = tempfile.mkdtemp(prefix="ferrum-e2e-twin-")
        shutil.rmtree(self.twin)
        shutil.copytree(self.root, self.twin)

    def tearDown(self):
        shutil.rmtree(self.twin, ignore_errors=True)
        super().tearDown()

    def test_unit_pdfs_read_as_the_single_unit_reports(self):
        bundle = run("report", "--root", self.root, "--as-of", AS_OF, "--weekly", "--quiet").stdout.strip()
        out = os.path.join(self.twin, "single")
        run("report", "--root", self.twin, "--as-of", AS_OF, "--out", out, *UNITS)
        pdfs = sorted(os.path.basename(p) for p in glob.glob(os.path.join(bundle, "ferrum-*.pdf"))
                      if "fleet" not in os.path.basename(p))
        self.assertEqual(pdfs, [f"ferrum-{u}-{AS_OF}.pdf" for u in UNITS])
        for name in pdfs:
            bundled = pdftotext(os.path.join(bundle, name))
            single = pdftotext(os.path.join(out, name))
            self.assertIn("SAFETY", bundled, name)
            self.assertEqual(bundled, single, name)
        # The index lists every unit report.
        index = pdftotext(os.path.join(bundle, "index.pdf"))
        for u in UNITS:
            self.assertIn(f"ferrum-{u}-{AS_OF}.pdf", index.replace("\n", ""), u)

    def test_units_reported_together_read_as_each_reported_alone(self):
        # One call for every unit assesses each unit of their sites once
        # (ReportWriter::unit_reports_by_id); the files must not differ from
        # one call per unit, which assesses the unit's whole site each time.
        together = os.path.join(self.root, "together")
        printed = run("report", "--root", self.root, "--as-of", AS_OF, "--out", together, *UNITS).stdout.split()
        self.assertEqual(printed, [os.path.join(together, f"ferrum-{u}-{AS_OF}.pdf") for u in UNITS])
        alone = os.path.join(self.twin, "alone")
        for u in UNITS:
            run("report", "--root", self.twin, "--as-of", AS_OF, "--out", alone, u)
        for u in UNITS:
            name = f"ferrum-{u}-{AS_OF}.pdf"
            self.assertEqual(pdftotext(os.path.join(together, name)), pdftotext(os.path.join(alone, name)), name)

    def test_an_unknown_unit_does_not_stop_the_others(self):
        out = os.path.join(self.root, "some")
        p = run("report", "--root", self.root, "--as-of", AS_OF, "--out", out, "A1", "NOPE", "C2", check=False)
        self.assertNotEqual(p.returncode, 0)
        self.assertIn("NOPE: unit NOPE is not in the register", p.stderr)
        self.assertEqual(p.stdout.split(), [os.path.join(out, f"ferrum-{u}-{AS_OF}.pdf") for u in ["A1", "C2"]])
        for u in ["A1", "C2"]:
            self.assertIn("SAFETY", pdftotext(os.path.join(out, f"ferrum-{u}-{AS_OF}.pdf")))

    def test_each_unit_report_day_is_recorded(self):
        run("report", "--root", self.root, "--as-of", AS_OF, "--weekly", "--quiet")
        with self.db() as c:
            rows = dict(c.execute("SELECT key, value FROM daemon_state WHERE key LIKE 'report:%'").fetchall())
        self.assertEqual(sorted(rows), [f"report:{u}" for u in UNITS])
        self.assertEqual(len(set(rows.values())), 1, rows)  # one day, the bundle's
        # The next week's report names this one as the previous report.
        later = run("report", "--root", self.root, "--as-of", "2026-12-07", "--out", self.path("next"), "A1").stdout.strip()
        self.assertIn(f"previous report ({AS_OF})", " ".join(pdftotext(later).split()))


if __name__ == "__main__":
    unittest.main()
