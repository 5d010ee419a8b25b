"""Where a file goes and what it gets back: archive/YYYY/MM/ or quarantine/
with a short content hash and never an overwrite, the receipt files and their
keys, duplicates, corrected re-issues, register history and provenance down
to the unit report."""
import datetime
import json
import os
import re
import sys
import unittest

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "ingest_corpus"))
from ingest_fixtures import REGISTER, IngestCase, sha256_bytes, stored_name_re  # noqa: E402
from ferrumtest import pdftotext, run  # noqa: E402

LAB = "unit_id,sample_date,lab_ref,h2_ppm,ch4_ppm,c2h2_ppm\nT1,2026-03-14,L-1,120,50,<0.5\nT2,2026-03-14,L-2,15,4,ND\n"
BAD_LAB = "unit_id,sample_date,lab_ref,h2_ppm\nT1,2026-03-14,L-1,-5\n"


class Placement(IngestCase):
    def test_accepted_file_is_moved_to_archive_year_month_with_its_hash(self):
        self.drop("lab-2026-05.csv", LAB)
        self.ingest()
        r = self.receipt("lab-2026-05.csv")
        sha = sha256_bytes(LAB.encode())
        self.assertEqual(r["sha256"], sha)
        received = datetime.datetime.strptime(r["received_at"], "%Y-%m-%dT%H:%M:%SZ")
        self.assertEqual(r["stored_as"], f"archive/{received:%Y}/{received:%m}/lab-2026-05.{sha[:8]}.csv")
        with open(self.path(r["stored_as"])) as f:
            self.assertEqual(f.read(), LAB)  # moved unchanged
        self.assertFalse(os.path.exists(self.path("drop", "planning", "lab-2026-05.csv")))
        self.assertEqual(os.listdir(self.path("work", "planning")), [])

    def test_rejected_file_goes_to_quarantine_with_its_hash(self):
        self.drop("lab.csv", BAD_LAB)
        self.ingest(expect=4)
        r = self.receipt("lab.csv")
        sha = sha256_bytes(BAD_LAB.encode())
        self.assertEqual(r["stored_as"], f"quarantine/lab.{sha[:8]}.csv")
        self.assertEqual(self.quarantined(), [f"lab.{sha[:8]}.csv"])
        self.assertFalse(os.path.exists(self.path("drop", "planning", "lab.csv")))

    def test_same_name_never_collides(self):
        # Two different contents of one name, and the same rejected content twice.
        self.drop("lab.csv", LAB)
        self.ingest()
        second = LAB.replace("120", "121").replace("L-1", "L-9")
        self.drop("lab.csv", second)
        self.ingest()
        self.drop("lab.csv", BAD_LAB)
        self.ingest(expect=4)
        self.drop("lab.csv", BAD_LAB)
        self.ingest(expect=4)
        archived = self.archived()
        self.assertEqual(len(archived), 3)  # the register and the two lab files
        lab = [a for a in archived if os.path.basename(a).startswith("lab.")]
        self.assertEqual(sorted(os.path.basename(a) for a in lab),
                         sorted(f"lab.{sha256_bytes(t.encode())[:8]}.csv" for t in (LAB, second)))
        q = self.quarantined()
        self.assertEqual(len(q), 2, q)
        self.assertTrue(all(name.startswith("lab.") for name in q))
        for name in q:
            with open(self.path("quarantine", name)) as f:
                self.assertEqual(f.read(), BAD_LAB)
        self.assertEqual(self.count("oil_samples"), 4)

    def test_name_without_extension_keeps_its_name_and_hash(self):
        self.drop("README", LAB)
        self.ingest()
        sha = sha256_bytes(LAB.encode())
        self.assertRegex(self.receipt("README")["stored_as"], r"^archive/\d{4}/\d{2}/README\." + sha[:8] + "$")


class ReceiptContent(IngestCase):
    def test_receipt_files_and_keys(self):
        self.drop("lab.csv", "# header comment\nunit_id,sample_date,lab_ref,h2_ppm,extra\n"
                             "T1,2026-03-14,L-1,-5,a\nT1,2026-03-15,L-2,ppm,b\n")
        self.ingest(expect=4)
        folder = self.path("drop", "planning", "receipts")
        self.assertTrue(os.path.exists(os.path.join(folder, "lab.csv.txt")))
        r = self.receipt("lab.csv")
        for key in ("file", "sha256", "status", "kind", "rows", "warnings", "problems", "problem_count"):
            self.assertIn(key, r)
        self.assertEqual((r["file"], r["status"], r["kind"], r["problem_count"]), ("lab.csv", "rejected", "oil_lab", 2))
        self.assertEqual([(p["line"], p["column"], p["value"]) for p in r["problems"]],
                         [(3, "h2_ppm", "-5"), (4, "h2_ppm", "ppm")])
        for p in r["problems"]:
            self.assertEqual(set(p) >= {"line", "column", "value", "reason"}, True)
        self.assertTrue(any(w["column"] == "extra" and "unknown column" in w["message"] for w in r["warnings"]))
        with open(os.path.join(folder, "lab.csv.txt")) as f:
            text = f.read()
        self.assertIn("REJECTED", text)
        self.assertIn("line 3", text)
        self.assertIn("line 4", text)

    def test_at_most_100_problems_listed_with_the_full_count(self):
        rows = "".join(f"T1,2026-03-{1 + i % 28:02d},L-{i},-{i + 1}\n" for i in range(150))
        self.drop("many.csv", "unit_id,sample_date,lab_ref,h2_ppm\n" + rows)
        self.ingest(expect=4)
        r = self.receipt("many.csv")
        self.assertEqual(r["problem_count"], 150)
        self.assertEqual(len(r["problems"]), 100)
        self.assertEqual([p["line"] for p in r["problems"]], list(range(2, 102)))
        with open(self.path("drop", "planning", "receipts", "many.csv.txt")) as f:
            self.assertIn("150 problems", f.read())

    def test_accepted_receipt(self):
        self.drop("lab.csv", LAB)
        p = self.ingest()
        self.assertIn("accepted", p.stdout)
        r = self.receipt("lab.csv")
        self.assertEqual((r["status"], r["kind"], r["rows"], r["problems"], r["problem_count"]),
                         ("accepted", "oil_lab", 2, [], 0))
        self.assertEqual(sorted(r["units"]), ["T1", "T2"])


class NamedFiles(IngestCase):
    def test_ingest_of_named_files_takes_only_those(self):
        bom_crlf = "\ufeffunit_id,sample_date,h2_ppm,note\r\nT1,2026-03-01,1,\"a\r\nb\"\r\nT1,2026-03-02,-1,x\r\n"
        self.drop("crlf.csv", bom_crlf)
        self.drop("header-only.csv", "unit_id,sample_date,h2_ppm\n")
        self.drop("later.csv", LAB)
        p = run("ingest", "--root", self.root, self.path("drop", "planning", "crlf.csv"),
                self.path("drop", "planning", "header-only.csv"), check=False)
        self.assertEqual(p.returncode, 4, p.stdout + p.stderr)
        # BOM accepted, CRLF line ends, a quoted line break: the bad row starts on line 4.
        self.assertEqual([(x["line"], x["column"]) for x in self.receipt("crlf.csv")["problems"]], [(4, "h2_ppm")])
        self.assertIn("no data rows", self.receipt("header-only.csv")["reason"])
        self.assertTrue(os.path.exists(self.path("drop", "planning", "later.csv")))  # not named: left for later
        self.assertEqual(self.count("oil_samples"), 0)
        outside = os.path.join(self.root, "elsewhere.csv")
        with open(outside, "w") as f:
            f.write(LAB)
        p = run("ingest", "--root", self.root, outside, check=False)
        self.assertEqual(p.returncode, 2, p.stdout + p.stderr)  # usage: not inside drop/
        self.assertIn("not inside", p.stderr)
        self.assertTrue(os.path.exists(outside))


class Duplicates(IngestCase):
    def test_same_content_again_is_a_duplicate_and_changes_nothing(self):
        self.drop("lab.csv", LAB)
        self.ingest()
        first = self.receipt("lab.csv")
        before = self.data_rows()
        self.drop("lab-again.csv", LAB)  # another name, same bytes
        self.ingest()
        r = self.receipt("lab-again.csv")
        self.assertEqual(r["status"], "duplicate")
        self.assertEqual(r["sha256"], first["sha256"])
        self.assertEqual(r["already_imported"], {"received_at": first["received_at"], "stored_as": first["stored_as"]})
        with open(self.path("drop", "planning", "receipts", "lab-again.csv.txt")) as f:
            text = f.read()
        copy = os.path.basename(first["stored_as"])  # the text names the site's copy, not its server path
        self.assertIn(f"already imported on {first['received_at']} as {copy}", text.replace("\n", " "))
        self.assertEqual(self.data_rows(), before)
        self.assertFalse(os.path.exists(self.path("drop", "planning", "lab-again.csv")))
        # The duplicate is kept too (nothing is deleted), and never over the original.
        self.assertTrue(os.path.exists(self.path(first["stored_as"])))
        self.assertTrue(os.path.exists(self.path(r["stored_as"])))
        self.assertNotEqual(r["stored_as"], first["stored_as"])

    def test_rejected_content_is_not_a_duplicate_of_itself(self):
        self.drop("lab.csv", BAD_LAB)
        self.ingest(expect=4)
        self.drop("lab.csv", BAD_LAB)
        self.ingest(expect=4)
        self.assertEqual(self.receipt("lab.csv")["status"], "rejected")


class History(IngestCase):
    def test_corrected_reissue_supersedes_and_keeps_the_earlier_values(self):
        gases = "unit_id,sample_date,lab_ref,h2_ppm,ch4_ppm,c2h6_ppm,c2h4_ppm,c2h2_ppm,co_ppm\n"
        self.drop("lab.csv", gases + "T1,2026-03-14,L-1,120,50,30,40,1,400\nT2,2026-03-14,L-2,15,4,3,2,ND,100\n")
        self.ingest()
        self.drop("lab-corrected.csv", gases + "T1,2026-03-14,L-1,125,51,30,40,1,400\n")
        self.ingest()
        with self.db() as c:
            rows = c.execute("SELECT s.id, s.superseded_by, f.original_name FROM oil_samples s JOIN files f"
                             " ON f.id=s.file_id JOIN units u USING(unit_key)"
                             " WHERE u.unit_id='T1' AND s.lab_ref='L-1' ORDER BY s.id").fetchall()
            self.assertEqual(len(rows), 2)
            (old_id, old_sup, old_file), (new_id, new_sup, new_file) = rows
            self.assertEqual((old_sup, new_sup), (new_id, None))
            self.assertEqual((old_file, new_file), ("lab.csv", "lab-corrected.csv"))
            h2 = dict(c.execute("SELECT sample_id, value FROM oil_values WHERE test='h2_ppm'").fetchall())
            self.assertEqual((h2[old_id], h2[new_id]), (120, 125))  # history kept
            # T2's sample of the first file is untouched.
            self.assertEqual(c.execute("SELECT count(*) FROM oil_samples WHERE superseded_by IS NULL").fetchone()[0], 2)
        doc = json.loads(run("assess", "--root", self.root, "T1", "--json").stdout)[0]
        self.assertEqual(doc["dga"]["sample_date"], "2026-03-14")
        # TDCG = H2 + CH4 + C2H6 + C2H4 + C2H2 + CO (IEEE C57.104-2008, Table 1 definition) of the
        # corrected sample only: 125 + 51 + 30 + 40 + 1 + 400 = 647 (the superseded one gives 641).
        self.assertAlmostEqual(doc["dga"]["tdcg_ppm"], 647)

    def test_different_lab_ref_is_a_second_sample_not_a_reissue(self):
        self.drop("lab.csv", LAB)
        self.ingest()
        self.drop("lab2.csv", "unit_id,sample_date,lab_ref,h2_ppm\nT1,2026-03-14,L-7,130\n")
        self.ingest()
        with self.db() as c:
            self.assertEqual(c.execute("SELECT count(*) FROM oil_samples WHERE superseded_by IS NOT NULL").fetchone()[0], 0)

    def test_redropped_register_updates_units_and_keeps_history(self):
        changed = REGISTER.replace("T1,Quillmere,40,132,33,ONAN/ONAF,1998,3,Dyn11,4",
                                   "T1,Quillmere,45,132,33,ONAN/ONAF,1998,3,Dyn11,5")
        self.assertNotEqual(changed, REGISTER)
        changed += "T4,Quillmere,63,132,11,ONAF,2020,3,YNd1,3\n"
        self.drop("units-v2.csv", changed)
        self.ingest()
        r = self.receipt("units-v2.csv")
        self.assertEqual(r["status"], "accepted")
        self.assertEqual(sorted(r["units"]), ["T1", "T4"])  # only what changed
        with self.db() as c:
            self.assertEqual(c.execute("SELECT rated_mva, criticality FROM units WHERE unit_id='T1'").fetchone(), (45, 5))
            hist = c.execute("SELECT h.unit_id, h.old_row_json, f.original_name FROM unit_history h"
                             " JOIN files f ON f.id=h.replaced_by_file").fetchall()
        self.assertEqual(len(hist), 1, hist)
        self.assertEqual((hist[0][0], hist[0][2]), ("T1", "units-v2.csv"))
        old = json.loads(hist[0][1])
        self.assertEqual(old["rated_mva"], 40)
        self.assertEqual(self.count("units"), 5)


class Provenance(IngestCase):
    def test_every_value_knows_file_line_and_import_time(self):
        self.drop("lab.csv", "# lab\n" + LAB)
        self.drop("scada.csv", "unit_id,timestamp,load_pu\n\nT1,2026-03-14T00:00Z,0.5\nT1,2026-03-14T01:00Z,0.6\n")
        self.drop("ir.csv", "unit_id,survey_date,component,spot_c,ambient_c\nT1,2026-04-02,clamp,50,20\n")
        self.drop("insp.csv", "unit_id,inspection_date,item,rating\nT1,2026-02-20,breather,poor\n")
        self.ingest()
        with self.db() as c:
            def prov(sql):
                return c.execute("SELECT f.original_name, x.line, f.received_at, f.status FROM " + sql).fetchall()
            self.assertEqual([r[:2] for r in prov("units x JOIN files f ON f.id=x.file_id ORDER BY x.line")],
                             [("units.csv", 3), ("units.csv", 4), ("units.csv", 5), ("units.csv", 6)])
            self.assertEqual([r[:2] for r in prov("oil_samples x JOIN files f ON f.id=x.file_id ORDER BY x.line")],
                             [("lab.csv", 3), ("lab.csv", 4)])
            self.assertEqual([r[:2] for r in prov("load_points x JOIN files f ON f.id=x.file_id ORDER BY x.line")],
                             [("scada.csv", 3), ("scada.csv", 4)])
            self.assertEqual([r[:2] for r in prov("infrared_scans x JOIN files f ON f.id=x.file_id")], [("ir.csv", 2)])
            self.assertEqual([r[:2] for r in prov("inspections x JOIN files f ON f.id=x.file_id")], [("insp.csv", 2)])
            for name in ("lab.csv", "scada.csv", "ir.csv", "insp.csv"):
                received, status = c.execute("SELECT received_at, status FROM files WHERE original_name=?",
                                             (name,)).fetchone()
                self.assertEqual(status, "accepted")
                self.assertRegex(received, r"^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\dZ$")
                self.assertEqual(received, self.receipt(name)["received_at"])

    def test_unit_report_lists_the_files_behind_it(self):
        self.drop("lab-march.csv", LAB)
        self.drop("ir-april.csv", "unit_id,survey_date,component,spot_c,ambient_c\nT1,2026-04-02,clamp,50,20\n")
        self.drop("t2-only.csv", "unit_id,inspection_date,item,rating\nT2,2026-02-20,breather,poor\n")
        self.ingest()
        pdf = run("report", "--root", self.root, "T1", "--out", self.path("out")).stdout.strip()
        text = re.sub(r"\s+", " ", pdftotext(pdf))
        for name in ("units.csv", "lab-march.csv", "ir-april.csv"):
            self.assertIn(name, text)
        self.assertNotIn("t2-only.csv", text)  # a file about another unit only


class ContractorsExports(IngestCase):
    """Issue 19: receipts keep their history; a sep= first line is honoured."""

    def test_earlier_receipts_of_a_name_are_kept_under_numbers(self):
        folder = self.path("drop", "planning", "receipts")
        self.drop("lab.csv", BAD_LAB)
        self.ingest(expect=4)
        self.drop("lab.csv", LAB)
        self.ingest()
        self.drop("lab.csv", LAB)
        self.ingest()  # the same content again: a duplicate, and a third receipt
        names = sorted(n for n in os.listdir(folder) if n.startswith("lab.csv"))
        self.assertEqual(names, ["lab.csv.1.json", "lab.csv.1.txt", "lab.csv.2.json", "lab.csv.2.txt",
                                 "lab.csv.json", "lab.csv.txt"])
        statuses = []
        for n in ("lab.csv.1.json", "lab.csv.2.json", "lab.csv.json"):
            with open(os.path.join(folder, n)) as f:
                statuses.append(json.load(f)["status"])
        self.assertEqual(statuses, ["rejected", "accepted", "duplicate"])  # oldest first, newest unnumbered
        with open(os.path.join(folder, "lab.csv.1.txt")) as f:
            self.assertIn("REJECTED", f.read())

    def test_sep_line_names_the_separator_and_the_receipt_says_so(self):
        text = "sep=;\nunit_id;sample_date;lab_ref;h2_ppm\nT1;2026-03-14;L-1;12,5\n"
        self.drop("lab.csv", text)
        self.ingest()
        r = self.receipt("lab.csv")
        self.assertEqual((r["status"], r["rows"]), ("accepted", 1))
        self.assertIn("sep=", r["separator_note"])
        with self.db() as c:
            # The decimal comma of a ';' file, as without the sep= line.
            self.assertEqual(c.execute("SELECT value FROM oil_values WHERE test = 'h2_ppm'").fetchall(), [(12.5,)])
        with open(self.path("drop", "planning", "receipts", "lab.csv.txt")) as f:
            self.assertIn("separator:   values separated by ';'", f.read())

    def test_rejected_receipt_counts_every_data_row(self):
        # A bad row first, last, malformed (one value too many) and two good rows.
        text = ("unit_id,sample_date,lab_ref,h2_ppm\nT1,2026-03-14,L-1,-5\nT1,2026-03-15,L-2,5\n"
                "T1,2026-03-16,L-3,5,extra\nT2,2026-03-14,L-4,6\n\nT2,2026-03-15,L-5,x\n")
        self.drop("lab.csv", text)
        self.ingest(expect=4)
        r = self.receipt("lab.csv")
        self.assertEqual((r["status"], r["rows"], r["problem_count"]), ("rejected", 5, 3))

    def test_unsafe_inspection_item_is_confirmed_as_reported(self):
        self.drop("insp.csv", "unit_id,inspection_date,item,rating\nT1,2026-03-14,bushings,unsafe\n"
                              "T1,2026-03-14,breather,good\n")
        self.ingest()
        r = self.receipt("insp.csv")
        self.assertEqual(r["unsafe_items_reported"], ["T1: bushings (2026-03-14)"])
        with open(self.path("drop", "planning", "receipts", "insp.csv.txt")) as f:
            text = f.read()
        # `ferrum ingest` raises no alert, and the receipt says so (the daemon's receipt:
        # test_daemon_service).
        self.assertFalse(r["unsafe_alert_sent"])
        self.assertIn("which raises no alert: tell the site's planners now):\n  T1: bushings (2026-03-14)", text)

    def test_rejected_receipt_wording(self):
        self.drop("lab.csv", BAD_LAB)
        self.ingest(expect=4)
        with open(self.path("drop", "planning", "receipts", "lab.csv.txt")) as f:
            text = f.read()
        self.assertIn("1 problem found. Correct it and drop", text)
        self.assertNotIn("still taken", text)


if __name__ == "__main__":
    unittest.main()
