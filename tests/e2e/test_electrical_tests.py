"""Electrical field tests end to end: a crew's file goes from the drop folder
to the store, `assess --json` (key `electrical`), the unit report (section
and its cautions), the health index and the actions; a broken file is
rejected whole with its line and column; a party may be limited to the kind."""
import json
import os
import sys
import unittest

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "ingest_corpus"))
from ferrumtest import pdftotext, run  # noqa: E402
from ingest_fixtures import IngestCase  # noqa: E402

REGISTER = """unit_id,site,rated_mva,hv_kv,lv_kv,cooling,year_built,vector_group,conductor,tap_positions,tap_nominal,tap_step_pct,impedance_pct
T1,Northfield,40,132,33,ONAF,1985,Dyn11,cu,17,9,1.25,10.5
T2,Northfield,10,33,11,ONAN,2015,Dyn11,,,,,
"""

HEADER = ("unit_id,test_date,test,phase,tap,winding,temp_c,insulation,test_kv,bushing,minutes,ratio,"
          "resistance_ohm,power_factor_pct,capacitance_pf,resistance_megohm,current_ma,impedance_pct,nameplate_value\n")

# T1 Dyn11 132/33 kV: phase ratio at tap 9 = 4*sqrt(3) = 6.9282 (winding connections);
# phase B reads 6.86, -0.98 %: outside the ±0.5 % tolerance (IEEE C57.12.00, from memory; verify).
# Bushing H2 C1 490 pF against the 445 pF nameplate: +10.1 %, over the 10 % out-of-service
# limit (IEEE C57.152, from memory; verify).
TESTS = HEADER + """T1,2026-03-10,turns_ratio,A,9,,,,,,,6.9290,,,,,,,
T1,2026-03-10,turns_ratio,B,9,,,,,,,6.8600,,,,,,,
T1,2026-03-10,turns_ratio,C,9,,,,,,,6.9270,,,,,,,
T1,2026-03-10,winding_resistance,A,9,HV,20,,,,,,0.4000,,,,,,
T1,2026-03-10,bushing_power_factor,,,,20,C1,10,H2,,,,0.33,490,,,,445
T1,2026-03-10,insulation_resistance,,,,20,HV-GROUND,5,,1,,,,,2000,,,
T1,2026-03-10,insulation_resistance,,,,20,HV-GROUND,5,,10,,,,,5000,,,
T1,2026-03-10,leakage_reactance,,9,,,,,,,,,,,,,10.55,
"""


class ElectricalTests(IngestCase):
    with_register = False

    def setUp(self):
        super().setUp()
        self.drop("units.csv", REGISTER)
        self.ingest()

    def assess(self, unit):
        return json.loads(run("assess", "--root", self.root, "--as-of", "2026-06-01", "--json", unit).stdout)[0]

    def test_file_flows_to_the_assessment_actions_index_and_report(self):
        self.drop("tests-2026.csv", TESTS)
        self.ingest()
        r = self.receipt("tests-2026.csv")
        self.assertEqual((r["status"], r["kind"], r["rows"]), ("accepted", "electrical_tests", 8), r["problems"])
        self.assertEqual(self.count("electrical_tests"), 8)
        doc = self.assess("T1")
        e = doc["electrical"]
        self.assertEqual(set(e) - {"latest", "notes"},
                         {"turns_ratio", "winding_resistance", "insulation_power_factor", "bushings",
                          "insulation_resistance", "excitation_current", "leakage_reactance"})
        b = next(x for x in e["turns_ratio"] if x["phase"] == "B")
        self.assertAlmostEqual(b["nameplate"], 6.928203, places=5)  # 4*sqrt(3), computed
        self.assertAlmostEqual(b["deviation_pct"], (6.86 / 6.928203230 - 1) * 100, places=4)
        self.assertFalse(b["within_limit"])
        self.assertTrue(b["source"].startswith("IEEE C57.12.00"))
        # Copper correction to 75 °C: 0.4 * 309.5 / 254.5 (IEEE C57.12.90, from memory; verify).
        self.assertAlmostEqual(e["winding_resistance"][0]["corrected_ohm"], 0.4 * 309.5 / 254.5, places=5)
        self.assertEqual(e["bushings"][0]["verdict"], "out of service")
        self.assertAlmostEqual(e["insulation_resistance"][0]["polarization_index"], 2.5)
        self.assertEqual(e["insulation_resistance"][0]["reading"], "good")  # common practice scale
        self.assertTrue(e["leakage_reactance"][0]["within_limit"])  # +0.48 % of 10.5 %
        texts = [a["text"] for a in doc["actions"]]
        self.assertIn("Investigate the turns-ratio deviation: shorted turns or a tap-changer contact", texts)
        self.assertIn("Take bushing H2 out of service: repair or replace the bushing, not the unit", texts)
        factors = {f["name"]: f for f in doc["factors"]}
        self.assertIsNotNone(factors["turns_ratio"]["score"])
        # A unit without electrical tests: null, and one missing-data line for them.
        t2 = self.assess("T2")
        self.assertIsNone(t2["electrical"])
        self.assertEqual(sum("electrical tests" in m for m in t2["missing"]), 1)

        run("report", "--root", self.root, "--as-of", "2026-06-01", "T1")
        pdf = self.path("reports", "ferrum-T1-2026-06-01.pdf")
        text = " ".join(pdftotext(pdf).split())
        self.assertIn("Electrical tests", text)
        for caution in ("De-energised, isolated and earthed.", "Test voltages are hazardous.",
                        "Discharge after DC tests."):
            self.assertIn(caution, text)
        self.assertIn("SAFETY", text)  # the general block is still there
        self.assertIn("OUTSIDE LIMIT", text)

    def test_broken_file_is_rejected_whole_with_line_and_column(self):
        bad = TESTS + "T1,2026-03-10,turns_ratio,C,9,,,,,,,6.93,0.41,,,,,,\n"  # line 10: two values
        self.drop("bad.csv", bad)
        self.ingest(expect=4)
        r = self.receipt("bad.csv")
        self.assertEqual(r["status"], "rejected")
        self.assertEqual(r["problem_count"], 1)
        p = r["problems"][0]
        self.assertEqual((p["line"], p["column"]), (10, "resistance_ohm"))
        self.assertIn("is not a value of a turns_ratio test", p["reason"])
        self.assertEqual(self.count("electrical_tests"), 0)  # nothing of it was kept

    def test_a_party_may_be_limited_to_electrical_tests(self):
        self.add_party("crew", "electrical_tests", "*")
        self.drop("t.csv", TESTS, party="crew")
        self.drop("u.csv", "# a register from the crew\n" + REGISTER, party="crew")  # not a duplicate
        self.ingest(expect=4)
        self.assertEqual(self.receipt("t.csv", party="crew")["status"], "accepted")
        u = self.receipt("u.csv", party="crew")
        self.assertEqual(u["status"], "rejected")
        self.assertIn("may not deliver units register files", json.dumps(u))

    def test_redelivered_test_replaces_the_earlier_one(self):
        self.drop("a.csv", HEADER + "T1,2026-03-10,bushing_power_factor,,,,20,C1,10,H1,,,,0.30,446,,,,445\n")
        self.ingest()
        self.drop("b.csv", HEADER + "T1,2026-03-10,bushing_power_factor,,,,20,C1,10,H1,,,,0.31,447,,,,445\n")
        self.ingest()
        self.assertEqual(self.count("electrical_tests"), 1)
        self.assertEqual(self.assess("T1")["electrical"]["bushings"][0]["power_factor_pct"], 0.31)


if __name__ == "__main__":
    unittest.main()
