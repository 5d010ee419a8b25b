"""Parties and permissions: one drop folder per party, what each may deliver
and for which sites, files dropped outside a party folder, and the default
configuration of `ferrum init`."""
import configparser
import json
import os
import sys
import unittest

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "ingest_corpus"))
from ingest_fixtures import IngestCase  # noqa: E402

KINDS = ("units_register", "oil_lab", "infrared", "load_series", "inspection", "electrical_tests", "work_status")


class DefaultConfiguration(IngestCase):
    with_register = False

    def test_init_creates_one_party_planning_with_every_kind_and_site(self):
        ini = configparser.ConfigParser(comment_prefixes=(";", "#"), inline_comment_prefixes=None)
        ini.read(self.path("ferrum.ini"))
        parties = [s for s in ini.sections() if s.startswith("party.")]
        self.assertEqual(parties, ["party.planning"])
        self.assertEqual(ini["party.planning"]["kinds"].strip(), "*")
        self.assertEqual(ini["party.planning"]["sites"].strip(), "*")
        self.assertTrue(os.path.isdir(self.path("drop", "planning", "receipts")))
        self.assertEqual(sorted(os.listdir(self.path("drop"))), ["planning"])

    def test_default_party_may_deliver_every_kind_for_every_site(self):
        from ingest_fixtures import example
        self.drop("register.csv", example("units_register.csv"))  # sites Quillmere 132 kV and Ostrand Yard
        self.ingest()
        for k in KINDS[1:]:
            self.drop(k + ".csv", example(k + ".csv"))
        self.ingest()
        for k in KINDS:
            name = "register.csv" if k == "units_register" else k + ".csv"
            self.assertEqual(self.receipt(name)["status"], "accepted", name)


class Permissions(IngestCase):
    def setUp(self):
        super().setUp()
        self.add_party("lab", "oil_lab", "Quillmere")
        self.add_party("thermo", "infrared, inspection", "quillmere, Ostrand Yard")

    def test_kind_the_party_may_not_deliver_is_rejected_whole(self):
        self.drop("units.csv", "unit_id,site,rated_mva,hv_kv,lv_kv,cooling,year_built\n"
                               "T9,Quillmere,40,132,33,ONAN,2000\n", party="lab")
        self.drop("ir.csv", "unit_id,survey_date,component,spot_c,ambient_c\nT1,2026-04-02,clamp,50,20\n",
                  party="lab")
        self.ingest(expect=4)
        for name in ("units.csv", "ir.csv"):
            r = self.receipt(name, party="lab")
            self.assertEqual(r["status"], "rejected")
            self.assertIn("party 'lab' may not deliver", r["reason"])
            self.assertTrue(r["stored_as"].startswith("quarantine/"))
        self.assertEqual(self.count("units"), 4)
        self.assertEqual(self.count("infrared_scans"), 0)

    def test_unit_outside_the_party_sites_rejects_the_whole_file(self):
        # T1 (Quillmere) is fine; S1 (Ostrand Yard) is not the lab's site; T1 again after it.
        self.drop("lab.csv", "unit_id,sample_date,lab_ref,h2_ppm\n"
                             "T1,2026-03-14,L-1,10\nS1,2026-03-14,L-2,11\nT2,2026-03-14,L-3,12\n", party="lab")
        self.ingest(expect=4)
        r = self.receipt("lab.csv", party="lab")
        self.assertEqual(r["status"], "rejected")
        self.assertEqual(r["problem_count"], 1, r["problems"])
        self.assert_problem(r, 3, "does not serve")
        self.assertIn("Ostrand Yard", r["problems"][0]["reason"])
        self.assertEqual(self.count("oil_samples"), 0)

    def test_sites_compare_without_case_and_lists_allow_several(self):
        self.drop("ir.csv", "unit_id,survey_date,component,spot_c,ambient_c\n"
                            "T1,2026-04-02,clamp,50,20\nS1,2026-04-02,clamp,40,20\n", party="thermo")
        self.drop("ir-south.csv", "unit_id,survey_date,component,spot_c,ambient_c\nT3,2026-04-02,clamp,50,20\n",
                  party="thermo")
        self.ingest(expect=4)
        self.assertEqual(self.receipt("ir.csv", party="thermo")["status"], "accepted")
        self.assert_problem(self.receipt("ir-south.csv", party="thermo"), 2, "does not serve")
        self.assertEqual(self.count("infrared_scans"), 2)

    def test_register_for_a_site_the_party_does_not_serve(self):
        self.add_party("north_planner", "units_register", "Quillmere")
        self.drop("units.csv", "unit_id,site,rated_mva,hv_kv,lv_kv,cooling,year_built\n"
                               "T8,Quillmere,40,132,33,ONAN,2000\nT9,Elsewhere,40,132,33,ONAN,2000\n",
                  party="north_planner")
        self.ingest(expect=4)
        r = self.receipt("units.csv", party="north_planner")
        self.assert_problem(r, 3, "does not serve")
        self.assertEqual(self.count("units"), 4)  # not even T8


class OutsidePartyFolders(IngestCase):
    def test_file_directly_in_drop_is_rejected(self):
        with open(self.path("drop", "lab.csv"), "w") as f:
            f.write("unit_id,sample_date,h2_ppm\nT1,2026-03-14,10\n")
        p = self.ingest(expect=4)
        self.assertIn("your party's folder", p.stdout)
        self.assertFalse(os.path.exists(self.path("drop", "lab.csv")))
        q = self.quarantined()
        self.assertEqual(len(q), 1)
        self.assertTrue(q[0].startswith("lab."))
        with open(self.path("quarantine", "receipts", "lab.csv.json")) as f:
            r = json.load(f)
        self.assertEqual(r["status"], "rejected")
        self.assertIn("into your party's folder", r["reason"])
        self.assertEqual(self.count("oil_samples"), 0)

    def test_folder_of_an_unknown_party_is_rejected(self):
        self.drop("lab.csv", "unit_id,sample_date,h2_ppm\nT1,2026-03-14,10\n", party="stranger")
        self.ingest(expect=4)
        self.assertEqual(self.count("oil_samples"), 0)
        self.assertEqual(len(self.quarantined()), 1)
        self.assertFalse(os.path.exists(self.path("drop", "stranger", "receipts")))  # no folder made for it


if __name__ == "__main__":
    unittest.main()
