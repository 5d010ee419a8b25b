"""Drop-folder ingestion, kinds and values: every kind imports and is
recognised from its header, an unknown header is refused with what each kind
needs, times without an offset take the site's offset, lab values below the
detection limit stay below it, and unit conversions keep the original unit."""
import calendar
import os
import sys
import unittest

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "ingest_corpus"))
from ingest_fixtures import IngestCase, example  # noqa: E402


def utc(y, mo, d, h=0, mi=0):
    return calendar.timegm((y, mo, d, h, mi, 0))


class EveryKind(IngestCase):
    with_register = False

    def test_each_contract_example_imports_and_its_kind_is_recognised(self):
        # The file names say nothing about the kind: it must come from the header.
        self.drop("a.csv", example("units_register.csv"))
        self.ingest()
        self.assertEqual(self.receipt("a.csv")["kind"], "units_register")
        self.assertEqual(self.count("units"), 3)
        files = {"b.csv": ("oil_lab.csv", "oil_lab", "oil_samples"),
                 "c.csv": ("infrared.csv", "infrared", "infrared_scans"),
                 "d.csv": ("load_series.csv", "load_series", "load_points"),
                 "e.csv": ("inspection.csv", "inspection", "inspections"),
                 "f.csv": ("electrical_tests.csv", "electrical_tests", "electrical_tests"),
                 "g.csv": ("work_status.csv", "work_status", "work_status")}
        for name, (src, _, _) in files.items():
            self.drop(name, example(src))
        self.ingest()
        for name, (src, kind, table) in files.items():
            r = self.receipt(name)
            self.assertEqual((r["status"], r["kind"]), ("accepted", kind), r)
            self.assertGreaterEqual(r["rows"], 2)
            self.assertEqual(self.count(table), r["rows"], name)
            self.assertEqual(r["problems"], [])
            self.assertEqual(r["problem_count"], 0)

    def test_header_matching_no_kind_is_refused_with_what_each_kind_needs(self):
        self.drop("mystery.csv", "# from the lab\n\nunit,date,hydrogen\nT1,2026-03-01,12\n")
        self.ingest(expect=4)
        r = self.receipt("mystery.csv")
        self.assertEqual(r["status"], "rejected")
        self.assertIsNone(r["kind"])
        self.assertEqual(r["problem_count"], 1)
        p = r["problems"][0]
        self.assertEqual(p["line"], 3)  # the header's physical line, after a comment and a blank line
        self.assertIn("matches no kind", p["reason"])
        for needs in ("units register needs unit_id, site, rated_mva",
                      "oil-lab results needs unit_id, sample_date",
                      "at least one test column",
                      "infrared survey needs unit_id, survey_date, component, spot_c",
                      "load series needs unit_id, timestamp",
                      "field inspection needs unit_id, inspection_date, item, rating",
                      "electrical field tests needs unit_id, test_date, test and at least one value column"):
            self.assertIn(needs, p["reason"])
        self.assertEqual(self.count("units"), 0)


class EmptyRows(IngestCase):
    def test_blank_lines_and_rows_of_empty_values_are_skipped_with_a_warning(self):
        # Drop-file contract: "Blank lines and rows whose values are all empty are skipped."
        self.drop("units2.csv", "unit_id,site,rated_mva,hv_kv,lv_kv,cooling,year_built\n"
                                "T7,Quillmere,40,132,33,ONAN,2000\n,,,,,,\n\n  , ,,,,,\n"
                                "T8,Quillmere,40,132,33,ONAN,2001\n")
        self.ingest()
        r = self.receipt("units2.csv")
        self.assertEqual((r["status"], r["rows"]), ("accepted", 2), r["problems"])
        empty = [w for w in r["warnings"] if "empty" in w["message"]]
        self.assertEqual(len(empty), 1, r["warnings"])
        self.assertEqual((empty[0]["line"], empty[0]["count"]), (3, 2))


class SiteOffset(IngestCase):
    def test_times_without_offset_take_the_site_offset_and_the_receipt_says_so(self):
        self.set_config("utc_offset = +00:00", "utc_offset = +02:00")
        self.drop("scada.csv", "unit_id,timestamp,load_pu\n"
                               "T1,2026-03-14 00:45,0.5\n"
                               "T1,2026-03-14T01:00,0.6\n"
                               "T1,2026-03-14T02:00+01:00,0.4\n"
                               "T1,2026-03-14T03:00Z,0.7\n")
        self.ingest()
        r = self.receipt("scada.csv")
        self.assertEqual(r["status"], "accepted", r)
        with self.db() as c:
            ts = dict(c.execute("SELECT load_pu, ts FROM load_points").fetchall())
        self.assertEqual(ts[0.5], utc(2026, 3, 13, 22, 45))  # 00:45 at +02:00
        self.assertEqual(ts[0.6], utc(2026, 3, 13, 23, 0))
        self.assertEqual(ts[0.4], utc(2026, 3, 14, 1, 0))    # explicit +01:00 wins
        self.assertEqual(ts[0.7], utc(2026, 3, 14, 3, 0))    # explicit Z wins
        self.assertIn("+02:00", r["time_note"])
        self.assertIn("site.utc_offset", r["time_note"])
        offset_warnings = [w for w in r["warnings"] if "offset" in w["message"]]
        self.assertEqual(len(offset_warnings), 1, r["warnings"])
        self.assertEqual(offset_warnings[0]["count"], 2)  # how many rows it concerned
        with open(self.path("drop", "planning", "receipts", "scada.csv.txt")) as f:
            self.assertIn("+02:00", f.read())

    def test_no_offset_note_when_every_time_has_one(self):
        self.drop("scada.csv", "unit_id,timestamp,load_pu\nT1,2026-03-14T00:00Z,0.5\n")
        self.ingest()
        self.assertNotIn("time_note", self.receipt("scada.csv"))


class LabValues(IngestCase):
    def test_below_detection_limit_is_stored_as_such_never_zero(self):
        self.drop("lab.csv", "unit_id,sample_date,lab_ref,h2_ppm,c2h2_ppm,co_ppm,furan_2fal_ppb\n"
                             "T1,2026-03-14,L-1,<5,ND,<nd,12\n"
                             "T2,2026-03-14,L-2,7,< 0.5,300,<10\n")
        self.ingest()
        self.assertEqual(self.receipt("lab.csv")["status"], "accepted")
        with self.db() as c:
            rows = {(lab, test): (state, value) for lab, test, state, value in c.execute(
                "SELECT s.lab_ref, v.test, v.state, v.value FROM oil_values v JOIN oil_samples s ON s.id=v.sample_id")}
        self.assertEqual(rows[("L-1", "h2_ppm")], (2, 5.0))      # <5: below the limit 5
        self.assertEqual(rows[("L-1", "c2h2_ppm")], (2, None))   # ND: below an unstated limit
        self.assertEqual(rows[("L-1", "co_ppm")], (2, None))     # <ND, any case
        self.assertEqual(rows[("L-1", "furan_2fal_ppb")], (1, 12.0))
        self.assertEqual(rows[("L-2", "c2h2_ppm")], (2, 0.5))
        self.assertEqual(rows[("L-2", "furan_2fal_ppb")], (2, 10.0))
        self.assertEqual(rows[("L-2", "h2_ppm")], (1, 7.0))
        with self.db() as c:
            self.assertEqual(c.execute("SELECT count(*) FROM oil_values WHERE state=2 AND value=0").fetchone()[0], 0)


class Conversions(IngestCase):
    def conversions(self, name):
        with self.db() as c:
            fid = c.execute("SELECT id FROM files WHERE original_name=? AND status='accepted'", (name,)).fetchone()[0]
            return {col: (unit, stored) for col, unit, stored in c.execute(
                "SELECT column, original_unit, stored_as FROM conversions WHERE file_id=?", (fid,))}

    def test_fahrenheit_to_celsius_with_the_original_unit_kept(self):
        self.drop("ir.csv", "unit_id,survey_date,component,spot_f,reference_f,ambient_f\n"
                            "T1,2026-04-02,HV bushing,212,86,50\n"
                            "T1,2026-04-02,LV bushing,98.6,,-40\n")
        self.ingest()
        self.assertEqual(self.receipt("ir.csv")["status"], "accepted")
        with self.db() as c:
            got = dict((comp, (s, r, a)) for comp, s, r, a in c.execute(
                "SELECT component, spot_c, reference_c, ambient_c FROM infrared_scans"))
        # degC = (degF - 32) * 5/9 (definition of the Fahrenheit scale)
        for have, want in zip(got["HV bushing"], (100.0, 30.0, 10.0)):
            self.assertAlmostEqual(have, want, places=6)
        self.assertAlmostEqual(got["LV bushing"][0], 37.0, places=6)
        self.assertIsNone(got["LV bushing"][1])
        self.assertAlmostEqual(got["LV bushing"][2], -40.0, places=6)  # -40 is the same on both scales
        conv = self.conversions("ir.csv")
        self.assertEqual(set(conv), {"spot_f", "reference_f", "ambient_f"})
        self.assertIn("F", conv["spot_f"][0])
        self.assertIn("spot_c", conv["spot_f"][1])

    def test_oil_temperature_and_furan_ppm(self):
        self.drop("lab.csv", "unit_id,sample_date,oil_temp_f,furan_2fal_ppm\nT1,2026-03-14,104,0.25\n")
        self.ingest()
        with self.db() as c:
            v = dict(c.execute("SELECT test, value FROM oil_values").fetchall())
        self.assertAlmostEqual(v["oil_temp_c"], 40.0, places=6)      # (104 - 32) * 5/9
        self.assertAlmostEqual(v["furan_2fal_ppb"], 250.0, places=6)  # mg/L -> ug/L x 1000
        conv = self.conversions("lab.csv")
        self.assertIn("oil_temp_f", conv)
        self.assertIn("furan_2fal_ppm", conv)

    def test_line_current_to_per_unit_with_root_three(self):
        # Common practice, no published source: three-phase I_rated = S / (sqrt(3) U);
        # 40 MVA at 132 kV -> 174.95 A, so 87.5 A = 0.50 pu. Single-phase I_rated = S / U:
        # 10 MVA at 66 kV -> 151.52 A, so 75.76 A = 0.50 pu.
        self.drop("amps.csv", "unit_id,timestamp,load_a\n"
                              "T1,2026-03-14T00:00Z,87.5\n"
                              "T1,2026-03-14T01:00Z,174.95\n"
                              "S1,2026-03-14T00:00Z,75.76\n")
        self.ingest()
        self.assertEqual(self.receipt("amps.csv")["status"], "accepted")
        with self.db() as c:
            pu = [r[0] for r in c.execute(
                "SELECT p.load_pu FROM load_points p JOIN units u USING(unit_key) ORDER BY u.unit_id DESC, p.ts")]
        self.assertAlmostEqual(pu[0], 0.5, places=3)
        self.assertAlmostEqual(pu[0], 87.5 / (40e6 / (3 ** 0.5 * 132e3)), places=9)
        self.assertAlmostEqual(pu[1], 1.0, places=4)
        self.assertAlmostEqual(pu[2], 0.5, places=3)
        conv = self.conversions("amps.csv")
        self.assertIn("load_a", conv)
        self.assertIn("A", conv["load_a"][0])
        self.assertIn("load_pu", conv["load_a"][1])

    def test_mva_and_kva_to_per_unit(self):
        self.drop("mva.csv", "unit_id,timestamp,load_mva\nT1,2026-03-14T00:00Z,20\nS1,2026-03-14T00:00Z,15\n")
        self.drop("kva.csv", "unit_id,timestamp,load_kva\nT2,2026-03-14T00:00Z,30000\n")
        self.ingest()
        with self.db() as c:
            pu = dict(c.execute("SELECT u.unit_id, p.load_pu FROM load_points p JOIN units u USING(unit_key)"))
        self.assertAlmostEqual(pu["T1"], 0.5)   # 20 / 40 MVA
        self.assertAlmostEqual(pu["S1"], 1.5)   # 15 / 10 MVA
        self.assertAlmostEqual(pu["T2"], 0.75)  # 30000 kVA / 1000 / 40 MVA
        self.assertEqual(self.conversions("mva.csv")["load_mva"][0], "MVA")
        self.assertIn("load_pu", self.conversions("mva.csv")["load_mva"][1])
        self.assertEqual(self.conversions("kva.csv")["load_kva"][0], "kVA")

    def test_decimal_comma_with_semicolons(self):
        self.drop("eu-lab.csv", "unit_id;sample_date;h2_ppm;moisture_ppm;acidity_mgkoh_g;note\n"
                                "T1;2026-03-14;12,5;8,25;0.04;\"wet, cloudy\"\n")
        self.drop("eu-load.csv", "Unit ID;Timestamp;Load MVA;Ambient C\nT1;2026-03-14T00:00Z;20,0;-3,5\n")
        self.ingest()
        self.assertEqual(self.receipt("eu-lab.csv")["status"], "accepted")
        self.assertEqual(self.receipt("eu-load.csv")["status"], "accepted")
        with self.db() as c:
            v = dict(c.execute("SELECT test, value FROM oil_values").fetchall())
            load, amb = c.execute("SELECT load_pu, ambient_c FROM load_points").fetchone()
        self.assertEqual((v["h2_ppm"], v["moisture_ppm"], v["acidity_mgkoh_g"]), (12.5, 8.25, 0.04))
        self.assertAlmostEqual(load, 0.5)
        self.assertEqual(amb, -3.5)


if __name__ == "__main__":
    unittest.main()
