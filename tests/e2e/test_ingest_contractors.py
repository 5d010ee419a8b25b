"""Contractors' own exports through the real binary: a lab export with its
own column names (ROOT/columns/PARTY.csv) and DD/MM/YYYY dates, a CSV whose
first line is `sep=;`, and .xlsx workbooks; `ferrum check --party`; a column
map that cannot be used is a configuration error naming its line, and on
SIGHUP the old map stays in force."""
import os
import signal
import sqlite3
import sys
import time
import unittest

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, os.path.join(HERE, "ingest_corpus"))
from ingest_fixtures import IngestCase  # noqa: E402
from ferrumtest import run  # noqa: E402
import xlsx_file as x  # noqa: E402
from test_daemon_watch import DaemonCase  # noqa: E402

MAP = """their_column,ferrum_column
Transformer,unit_id
Sampled,sample_date
H2 (ppm),h2_ppm
CH4 (ppm),ch4_ppm
C2H2 (ppm),c2h2_ppm
Lab no.,lab_ref
"""

# As the lab's system writes it: its own names, day/month/year dates, a remark column.
LAB_EXPORT = """Transformer,Sampled,Lab no.,H2 (ppm),CH4 (ppm),C2H2 (ppm),Remarks
T1,05/10/2025,NL-1001,42,18,<0.5,routine
T2,06/10/2025,NL-1002,12,7,ND,
"""


def sample_days(root):
    with sqlite3.connect(os.path.join(root, "ferrum.db")) as c:
        return c.execute("SELECT u.unit_id, date(s.sample_day * 86400, 'unixepoch'), s.lab_ref "
                         "FROM oil_samples s JOIN units u USING (unit_key) ORDER BY 1").fetchall()


class NorthlabCase(IngestCase):
    """The test register, and a laboratory party with its column map and date format."""

    def setUp(self):
        super().setUp()
        self.write_config("[party.northlab]\nkinds = oil_lab\nsites = *\ndate_format = DD/MM/YYYY\n")
        os.makedirs(self.path("drop", "northlab"), exist_ok=True)
        os.makedirs(self.path("columns"), exist_ok=True)
        with open(self.path("columns", "northlab.csv"), "w") as f:
            f.write(MAP)


class ContractorExports(NorthlabCase):
    def test_mapped_export_with_regional_dates_is_taken_as_it_is(self):
        self.drop("lab.csv", LAB_EXPORT, party="northlab")
        self.ingest()
        r = self.receipt("lab.csv", party="northlab")
        self.assertEqual(r["status"], "accepted", r)
        self.assertEqual(r["rows"], 2)
        self.assertIn("columns/northlab.csv", r["format_note"])
        self.assertIn("DD/MM/YYYY", r["format_note"])
        self.assertEqual(sample_days(self.root), [("T1", "2025-10-05", "NL-1001"), ("T2", "2025-10-06", "NL-1002")])
        # The unknown column is reported by the lab's own name.
        self.assertTrue(any(w["column"] == "Remarks" for w in r["warnings"]), r["warnings"])

    def test_problems_quote_the_partys_own_columns_and_the_expected_format(self):
        self.drop("bad.csv", LAB_EXPORT.replace("06/10/2025", "2025/10/06").replace(",42,", ",-42,"),
                  party="northlab")
        self.ingest(expect=4)
        r = self.receipt("bad.csv", party="northlab")
        self.assertEqual(r["status"], "rejected")
        self.assert_problem(r, 2, "cannot be negative", column="H2 (ppm)")
        p = self.assert_problem(r, 3, "DD/MM/YYYY", column="Sampled")
        self.assertEqual(p["value"], "2025/10/06")
        self.assertEqual(sample_days(self.root), [])

    def test_sep_line_semicolons_and_decimal_commas(self):
        self.drop("sep.csv", "sep=;\nTransformer;Sampled;H2 (ppm);CH4 (ppm)\nT1;05/10/2025;42,5;18\n",
                  party="northlab")
        self.ingest()
        r = self.receipt("sep.csv", party="northlab")
        self.assertEqual(r["status"], "accepted", r)
        self.assertIn("';'", r["separator_note"])
        with open(self.path("drop", "northlab", "receipts", "sep.csv.txt")) as f:
            self.assertIn("sep= first line", f.read())
        with sqlite3.connect(self.path("ferrum.db")) as c:
            self.assertEqual(c.execute("SELECT value FROM oil_values WHERE test = 'h2_ppm'").fetchall(), [(42.5,)])

    def test_workbook_with_the_partys_names_and_serial_dates(self):
        rows = [["Transformer", "Sampled", "Lab no.", "H2 (ppm)", "CH4 (ppm)"],
                ["T1", x.Date(x.serial_1900(2025, 10, 5)), "NL-2001", 42, 18],
                ["T2", "06/10/2025", "NL-2002", 12.5, 7]]  # a date typed as text, in the party's format
        self.drop("lab.xlsx", x.workbook([("Results", rows)]), party="northlab", mode="wb")
        self.ingest()
        r = self.receipt("lab.xlsx", party="northlab")
        self.assertEqual(r["status"], "accepted", r)
        self.assertIn("worksheet 'Results'", r["source_note"])
        self.assertIn("1900 date system", r["source_note"])
        self.assertEqual(sample_days(self.root), [("T1", "2025-10-05", "NL-2001"), ("T2", "2025-10-06", "NL-2002")])

    def test_workbook_problem_is_located_by_row_and_cell_and_nothing_is_stored(self):
        rows = [["Transformer", "Sampled", "H2 (ppm)"],
                ["T1", x.Date(x.serial_1900(2025, 10, 5)), 42],
                ["T2", x.Date(x.serial_1900(2025, 10, 6)), x.Formula("C2*2")]]
        self.drop("formula.xlsx", x.workbook([("oil_lab", rows)]), party="northlab", mode="wb")
        self.ingest(expect=4)
        r = self.receipt("formula.xlsx", party="northlab")
        self.assertEqual(r["status"], "rejected")
        p = self.assert_problem(r, 3, "formula without a saved value", column="H2 (ppm)")
        self.assertEqual(p["location"], "row 3, cell C3")
        with open(self.path("drop", "northlab", "receipts", "formula.xlsx.txt")) as f:
            self.assertIn("row 3, cell C3 (H2 (ppm))", f.read())
        self.assertEqual(sample_days(self.root), [])

    def test_old_binary_workbook_gets_save_as(self):
        self.drop("old.xls", bytes([0xD0, 0xCF, 0x11, 0xE0, 0xA1, 0xB1, 0x1A, 0xE1]) + bytes(504),
                  party="northlab", mode="wb")
        self.ingest(expect=4)
        self.assert_problem(self.receipt("old.xls", party="northlab"), 1, "save it as .xlsx")

    def test_misnamed_workbooks_are_refused_with_a_plain_reason(self):
        self.drop("export.xlsx", LAB_EXPORT, party="northlab")
        self.drop("report.xls", "<html><table><tr><td>T1</td></tr></table></html>\n", party="northlab")
        self.ingest(expect=4)
        self.assert_problem(self.receipt("export.xlsx", party="northlab"), 1, "named .xlsx but is not a workbook")
        self.assert_problem(self.receipt("report.xls", party="northlab"), 1, "save it as .xlsx or as CSV")

    def test_check_with_party_applies_its_map_and_formats(self):
        path = os.path.join(self.root, "precheck.csv")
        with open(path, "w") as f:
            f.write(LAB_EXPORT)
        p = run("check", "--root", self.root, "--party", "northlab", path, check=False)
        self.assertEqual(p.returncode, 0, p.stdout + p.stderr)
        self.assertIn("ACCEPTED", p.stdout)
        # Without the party, the same file is not recognised.
        p = run("check", "--root", self.root, path, check=False)
        self.assertNotEqual(p.returncode, 0)
        self.assertEqual(sample_days(self.root), [])

    def test_unusable_map_is_a_configuration_error_naming_its_line(self):
        with open(self.path("columns", "northlab.csv"), "w") as f:
            f.write(MAP + "Acetylene,acetylene_ppm\n")
        p = run("ingest", "--root", self.root, check=False)
        self.assertNotEqual(p.returncode, 0)
        self.assertIn("columns/northlab.csv:8", p.stderr)
        self.assertIn("'acetylene_ppm' is not a ferrum column", p.stderr)
        with open(self.path("columns", "northlab.csv"), "w") as f:
            f.write(MAP + "h2 (PPM) ,h2_ppm\n")
        p = run("ingest", "--root", self.root, check=False)
        self.assertIn("columns/northlab.csv:8", p.stderr)
        self.assertIn("listed twice (first on line 4)", p.stderr)

    def test_bad_date_format_key_is_a_configuration_error(self):
        self.set_config("date_format = DD/MM/YYYY", "date_format = DD/MM/YY")
        p = run("ingest", "--root", self.root, check=False)
        self.assertNotEqual(p.returncode, 0)
        self.assertIn("party.northlab.date_format", p.stderr)


class ReceiptsContractorsUnderstand(NorthlabCase):
    def test_accepted_receipt_gives_the_date_range(self):
        self.drop("lab.csv", LAB_EXPORT, party="northlab")
        self.ingest()
        r = self.receipt("lab.csv", party="northlab")
        self.assertEqual(r["dates"], {"from": "2025-10-05", "to": "2025-10-06"})
        with open(self.path("drop", "northlab", "receipts", "lab.csv.txt")) as f:
            self.assertIn("dates:       2025-10-05 to 2025-10-06", f.read())

    def test_rejected_receipt_names_the_units_held_up(self):
        self.drop("bad.csv", LAB_EXPORT.replace(",42,", ",-42,"), party="northlab")
        self.ingest(expect=4)
        r = self.receipt("bad.csv", party="northlab")
        self.assertEqual(r["status"], "rejected")
        self.assertEqual(sorted(r["units"]), ["T1", "T2"])
        self.assertNotIn("dates", r)
        with open(self.path("drop", "northlab", "receipts", "bad.csv.txt")) as f:
            self.assertIn("units held:  T1, T2 (their results in this file are held up", f.read())

    def test_unmatched_header_speaks_of_the_partys_kinds_and_its_own_columns(self):
        self.drop("odd.csv", "Transformer,Taken on,H2 (ppm),Colour code\nT1,x,1,2\n", party="northlab")
        self.ingest(expect=4)
        reason = self.receipt("odd.csv", party="northlab")["problems"][0]["reason"]
        self.assertIn("party 'northlab' delivers (oil-lab results)", reason)
        self.assertIn("Recognised: 'Transformer' (unit_id), 'H2 (ppm)' (h2_ppm).", reason)
        self.assertIn("Not recognised: 'Taken on', 'Colour code'.", reason)
        self.assertNotIn("load series", reason)  # a kind this party does not deliver
        self.assertIn("schema/drop-files.md", reason)


class Subfolders(IngestCase):
    def test_file_in_a_subfolder_is_taken_with_its_subpath(self):
        folder = self.path("drop", self.party, "2026-10", "week 1")
        os.makedirs(folder)
        with open(os.path.join(folder, "inspection.csv"), "w") as f:
            f.write("unit_id,inspection_date,item,rating\nT1,2026-02-20,bushings,good\n")
        self.ingest()
        r = self.receipt("2026-10_week 1_inspection.csv")
        self.assertEqual(r["status"], "accepted", r)
        self.assertEqual(r["subfolder"], "2026-10/week 1/")
        self.assertIn("2026-10_week 1_inspection.", r["stored_as"])
        self.assertTrue(r["stored_as"].startswith("archive/"))
        self.assertEqual(os.listdir(folder), [])  # taken; the folder itself is left alone
        with open(self.path("drop", self.party, "receipts", "2026-10_week 1_inspection.csv.txt")) as f:
            self.assertIn("dropped in:  2026-10/week 1/", f.read())

    def test_receipts_and_hidden_folders_are_not_drop_folders(self):
        for sub in ("receipts", ".sync"):
            with open(self.path("drop", self.party, sub, "x.csv") if sub == "receipts" else
                      self._mk(sub, "x.csv"), "w") as f:
                f.write("unit_id,inspection_date,item,rating\nT1,2026-02-20,bushings,good\n")
        self.ingest()
        self.assertTrue(os.path.exists(self.path("drop", self.party, "receipts", "x.csv")))
        self.assertTrue(os.path.exists(self.path("drop", self.party, ".sync", "x.csv")))
        self.assertEqual(self.count("inspections"), 0)

    def _mk(self, sub, name):
        os.makedirs(self.path("drop", self.party, sub), exist_ok=True)
        return self.path("drop", self.party, sub, name)


class MapReload(DaemonCase):
    def test_daemon_takes_a_file_from_a_subfolder_at_its_rescan(self):
        self.start_daemon()
        folder = self.path("drop", self.party, "2026-10")
        os.makedirs(folder)
        with open(os.path.join(folder, ".lab.csv.part"), "w") as f:
            f.write("unit_id,inspection_date,item,rating\nT1,2026-02-20,bushings,good\n")
        os.rename(os.path.join(folder, ".lab.csv.part"), os.path.join(folder, "lab.csv"))
        self.wait_for(lambda: self.has_receipt("2026-10_lab.csv"), timeout=20, what="receipt of the sub-folder file")
        self.assertEqual(self.receipt("2026-10_lab.csv")["status"], "accepted")
        self.assertEqual(self.stop_daemon(), 0)

    def test_sighup_with_a_broken_map_keeps_the_old_map(self):
        with open(self.path("ferrum.ini"), "a") as f:
            f.write("\n[party.northlab]\nkinds = oil_lab\nsites = *\ndate_format = DD/MM/YYYY\n")
        os.makedirs(self.path("drop", "northlab"), exist_ok=True)
        os.makedirs(self.path("columns"), exist_ok=True)
        with open(self.path("columns", "northlab.csv"), "w") as f:
            f.write(MAP)
        self.start_daemon()
        with open(self.path("columns", "northlab.csv"), "w") as f:
            f.write("their_column,ferrum_column\nTransformer,unit_identifier\n")
        self.daemon.send_signal(signal.SIGHUP)
        self.wait_for(lambda: "NOT reloaded" in self.site_log(), timeout=10, what="refusal log line")
        self.assertIn("columns/northlab.csv:2", self.site_log())
        time.sleep(0.3)
        self.drop("after.csv", LAB_EXPORT, party="northlab")
        self.wait_for(lambda: self.has_receipt("after.csv", "northlab"), timeout=15, what="receipt")
        self.assertEqual(self.receipt("after.csv", "northlab")["status"], "accepted")
        self.assertEqual(self.stop_daemon(), 0)


if __name__ == "__main__":
    unittest.main()
