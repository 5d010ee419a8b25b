"""`ferrum plan` on a small site: two old units due for replacement and a
young one. The plan funds what the budget allows, in order of risk removed
per unit of money, a second budget is shown side by side, every output ends
with the caution, and the fleet report carries the plan section."""
import csv
import glob
import io
import json
import os
import unittest

from ferrumtest import SiteTestCase, pdftotext, run

AS_OF = "2026-11-30"
REGISTER = """unit_id,site,rated_mva,hv_kv,lv_kv,cooling,year_built,vector_group,criticality
T1,Quillmere,40,132,33,ONAF,1962,Dyn11,4
T2,Quillmere,10,33,11,ONAN,2015,Dyn11,2
T3,Ardlow,60,275,132,ONAF,1968,YNd1,5
"""
LAB = """unit_id,sample_date,h2_ppm,ch4_ppm,c2h6_ppm,c2h4_ppm,c2h2_ppm,co_ppm,co2_ppm,furan_2fal_ppb,lab_ref
T1,2026-03-14,120,50,30,40,<0.5,400,3000,2500,L-1
T2,2026-03-14,20,5,3,4,<0.5,200,1500,50,L-2
T3,2026-03-14,60,30,20,10,<0.5,500,4000,1200,L-3
"""
# Replacement: 132 kV is class 2 (25,000 per MVA), 275 kV class 3 (20,000):
# T1 40 x 25,000 + 200,000 = 1,200,000; T3 60 x 20,000 + 200,000 = 1,400,000.
COSTS = """[costs]
currency = EUR
cost_per_mva_class1 = 30000
cost_per_mva_class2 = 25000
cost_per_mva_class3 = 20000
fixed_replacement_cost = 200000
"""
CAUTION_START = "SAFETY: decision support only"


class PlanCommand(SiteTestCase):
    def setUp(self):
        super().setUp()
        self.drop("units.csv", REGISTER)
        self.ingest()
        self.drop("lab.csv", LAB)
        self.ingest()

    def plan(self, *extra, check=True):
        return run("plan", "--root", self.root, "--as-of", AS_OF, *extra, check=check)

    def test_needs_a_budget_and_costs(self):
        p = self.plan(check=False)
        self.assertEqual(p.returncode, 2, p.stderr)
        self.assertIn("budget", p.stderr)
        p = self.plan("--budget", "1500000", check=False)  # no costs configured yet
        self.assertEqual(p.returncode, 1, p.stderr)
        self.assertIn("cost_per_mva_class2", p.stderr)
        self.write_config(COSTS)
        p = self.plan("--budget", "lots", check=False)
        self.assertEqual(p.returncode, 2)

    def test_budget_funds_by_risk_and_two_budgets_compare(self):
        self.write_config(COSTS + "[plan]\nbudget_per_year = 1300000\n")
        doc = json.loads(self.plan("--json").stdout)
        self.assertTrue(doc["caution"].startswith(CAUTION_START))
        plan = doc["plans"][0]
        self.assertEqual(plan["budget_per_year"], 1300000)
        self.assertEqual(len(plan["years"]), 10)
        funded = {f["unit_id"]: (y["year"], f) for y in plan["years"] for f in y["funded"]}
        # Both units are due in 2028 (the decision's 24-month lead time); 1,300,000 pays for T1
        # (1,200,000) only, and T3 (1,400,000) never fits a year's budget without carry-over.
        self.assertEqual(funded["T1"][0], 2028)
        self.assertEqual(funded["T1"][1]["cost"], 1200000)
        self.assertNotIn("T3", funded)
        self.assertEqual(plan["unfunded"], ["T3"])
        for y in plan["years"]:
            self.assertLessEqual(y["spent"], y["budget"])
            self.assertLessEqual(y["risk_with_plan"], y["risk_without_plan"] + 1e-9)

        # With carry-over nothing is spent in 2026 and 2027 (nothing due), so 2028 has
        # 3 x 1,300,000 = 3,900,000: both replacements (2,600,000) are funded that year.
        self.write_config("carry_over = yes")  # appended: still in [plan]
        carried = json.loads(self.plan("--json").stdout)["plans"][0]
        years = {f["unit_id"]: y["year"] for y in carried["years"] for f in y["funded"]}
        self.assertEqual(years, {"T1": 2028, "T3": 2028})
        self.assertEqual(carried["years"][2]["budget"], 3900000)

        # Two budgets side by side: the larger one never leaves more risk.
        text = self.plan("--budget", "1300000", "--budget", "3000000").stdout
        self.assertIn("A: budget 1,300,000 EUR a year", text)
        self.assertIn("B: budget 3,000,000 EUR a year", text)
        self.assertTrue(text.rstrip().splitlines()[-1].startswith(CAUTION_START))
        two = json.loads(self.plan("--budget", "1300000", "--budget", "3000000", "--json").stdout)["plans"]
        self.assertEqual([p["budget_per_year"] for p in two], [1300000, 3000000])
        self.assertLessEqual(two[1]["total_risk_with_plan"], two[0]["total_risk_with_plan"])

        rows = self.plan("--csv", "--horizon", "3").stdout.splitlines()
        self.assertTrue(rows[-1].startswith("# " + CAUTION_START))
        table = list(csv.DictReader(io.StringIO("\n".join(rows[:-1]))))
        self.assertEqual({r["year"] for r in table}, {"2026", "2027", "2028"})
        self.assertIn(("2028", "funded", "T1"), {(r["year"], r["row"], r["unit_id"]) for r in table})
        # The budget whose allocation the plan follows (never above the budget itself).
        self.assertTrue(all(float(r["allocation_budget"]) <= float(r["budget_per_year"]) for r in table))

    def test_register_costs_override_the_classes(self):
        # T3's own replacement cost (register column, migration 005) replaces 1,400,000: with
        # 1,300,000 a year it now fits, in 2028 or 2029 beside T1 (1,200,000).
        self.drop("units2.csv", REGISTER.replace("year_built,vector_group,criticality",
                                                 "year_built,vector_group,criticality,replacement_cost")
                  .replace("1962,Dyn11,4", "1962,Dyn11,4,").replace("2015,Dyn11,2", "2015,Dyn11,2,")
                  .replace("1968,YNd1,5", "1968,YNd1,5,1000000"))
        self.ingest()
        self.write_config(COSTS + "[plan]\nbudget_per_year = 1300000\n")
        plan = json.loads(self.plan("--json").stdout)["plans"][0]
        funded = {f["unit_id"]: (y["year"], f["cost"]) for y in plan["years"] for f in y["funded"]}
        self.assertEqual(funded["T3"][1], 1000000)
        self.assertEqual(funded["T1"][1], 1200000)
        self.assertEqual(sorted([funded["T1"][0], funded["T3"][0]]), [2028, 2029])
        p = self.plan(check=False)
        self.assertEqual(p.returncode, 0)

    def test_fleet_report_has_the_plan(self):
        self.write_config(COSTS + "[plan]\nbudget_per_year = 1500000\n")
        out = self.path("out")
        run("report", "--root", self.root, "--fleet", "--as-of", AS_OF, "--out", out)
        text = pdftotext(os.path.join(out, "ferrum-fleet-" + AS_OF + ".pdf"))
        self.assertIn("Ten-year plan", text)
        self.assertIn("T1 replace 1,200,000, 40 MVA", text)
        self.assertIn("without any plan", text)
        self.assertIn("unlimited budget", text)
        self.assertIn("CIGRE TB 761", text)  # the method and its sources are stated
        self.assertIn("from memory; verify", text)

    def test_horizon_start_year_and_the_weekly_bundle(self):
        # A five-year plan from 2027: the heading follows the horizon, the years start in 2027, and the
        # weekly bundle's fleet report carries the same section.
        self.write_config(COSTS + "[plan]\nbudget_per_year = 1500000\nhorizon_years = 5\nstart_year = 2027\n")
        plan = json.loads(self.plan("--json").stdout)["plans"][0]
        self.assertEqual([y["year"] for y in plan["years"]], [2027, 2028, 2029, 2030, 2031])
        self.assertEqual(plan["currency"], "EUR")
        # --horizon on the command line overrides the configured one.
        plan = json.loads(self.plan("--json", "--horizon", "12").stdout)["plans"][0]
        self.assertEqual(len(plan["years"]), 12)
        self.assertEqual(plan["years"][0]["year"], 2027)
        run("report", "--root", self.root, "--weekly", "--as-of", AS_OF)
        fleet = glob.glob(self.path("reports", "*-W*", "ferrum-fleet-*.pdf"))
        self.assertEqual(len(fleet), 1, fleet)
        text = pdftotext(fleet[0])
        self.assertIn("Five-year plan", text)
        self.assertNotIn("Ten-year plan", text)
        self.assertIn("2027", text)
        self.assertIn("1,500,000 EUR a year", text)


if __name__ == "__main__":
    unittest.main()
