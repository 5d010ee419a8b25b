"""Two site roots sharing one PostgreSQL database, through the real binary and a
real server (Debian's postgresql, started by tests/pgserver.py in a temporary
folder on a Unix socket; as the postgres user when the test runs as root).

Files are dropped in both roots and imported; the same content dropped in the
second root is a duplicate there; `rank` from either root covers both roots'
units; each root writes the unit reports of the substations it serves. Then
the database goes away under a running daemon: the file waits in work/,
status says why, and it is imported whole once the server is back.
Plumbing: no engineering value is checked here, so no published source applies."""
import json
import os
import shutil
import signal
import subprocess
import sys
import tempfile
import time
import unittest

from ferrumtest import FERRUM, SOURCE, drop_file, run

sys.path.insert(0, os.path.join(SOURCE, "tests"))
import pgserver  # noqa: E402

REGISTER = """unit_id,site,rated_mva,hv_kv,lv_kv,cooling,year_built,vector_group,criticality
N1,North Yard,40,132,33,ONAF,1985,Dyn11,4
S1,Ostrand Yard,10,33,11,ONAN,2015,Dyn11,2
"""
LAB_N = """unit_id,sample_date,h2_ppm,ch4_ppm,c2h6_ppm,c2h4_ppm,c2h2_ppm,co_ppm,co2_ppm,lab_ref
N1,2026-03-14,120,50,30,40,<0.5,400,3000,L-1
"""
LAB_S = """unit_id,sample_date,h2_ppm,ch4_ppm,c2h6_ppm,c2h4_ppm,c2h2_ppm,co_ppm,co2_ppm,lab_ref
S1,2026-04-02,20,5,3,4,<0.5,150,1200,L-7
"""
AS_OF = "2026-06-01"


@unittest.skipIf(pgserver.missing_reason(), "skipped: %s" % pgserver.missing_reason())
class SharedPostgresql(unittest.TestCase):
    @classmethod
    def setUpClass(cls):
        cls.folder = tempfile.mkdtemp(prefix="ferrum-pg-")
        cls.server = pgserver.PgServer(os.path.join(cls.folder, "server")).start()

    @classmethod
    def tearDownClass(cls):
        cls.server.stop()
        shutil.rmtree(cls.folder, ignore_errors=True)

    def setUp(self):
        self.server.psql("DROP SCHEMA public CASCADE; CREATE SCHEMA public")
        self.roots = {}
        self.daemon = None
        for name, serves in (("north", "North Yard"), ("south", "Ostrand Yard")):
            root = os.path.join(self.folder, name)
            shutil.rmtree(root, ignore_errors=True)
            run("init", "--root", root)
            ini = os.path.join(root, "ferrum.ini")
            with open(ini) as f:
                text = f.read()
            text = text.replace("serves = *", "serves = " + serves).replace("backend = sqlite", "backend = postgresql")
            text = text.replace("postgresql = \n", "postgresql = %s\n" % self.server.conninfo())
            with open(ini, "w") as f:
                f.write(text)
            os.remove(os.path.join(root, "ferrum.db"))  # made by init, before the root was told of the database
            self.roots[name] = root

    def tearDown(self):
        if self.daemon and self.daemon.poll() is None:
            self.daemon.kill()
            self.daemon.wait()
        if not self.server.running():
            self.server.start()

    def drop(self, root, name, content):
        drop_file(os.path.join(self.roots[root], "drop", "planning"), name, content)

    def receipt(self, root, name):
        with open(os.path.join(self.roots[root], "drop", "planning", "receipts", name + ".json")) as f:
            return json.load(f)

    def ingest(self, root):
        p = run("ingest", "--root", self.roots[root], check=False)
        self.assertEqual(p.returncode, 0, p.stdout + p.stderr)

    def server_back_and_file_imported(self, root):
        """The server started again: lab-n.csv, waiting in work/, is imported whole."""
        self.server.start(database=None)
        receipt = os.path.join(root, "drop", "planning", "receipts", "lab-n.csv.json")
        deadline = time.time() + 120
        while not os.path.exists(receipt) and time.time() < deadline:
            time.sleep(0.2)
        self.assertEqual(self.receipt("north", "lab-n.csv")["status"], "accepted")
        self.assertEqual(self.rows("SELECT count(*) FROM oil_samples"), ["1"])

    def serve_with_the_database_down(self):
        """The register imported in the north root, the server stopped, then `ferrum serve` started."""
        self.drop("north", "units.csv", REGISTER)
        self.ingest("north")
        root = self.roots["north"]
        self.server.stop()
        self.daemon = subprocess.Popen([FERRUM, "serve", "--root", root],
                                       stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
        return root

    def rows(self, sql):
        return self.server.psql(sql).split()

    def test_two_roots_one_database(self):
        self.drop("north", "units.csv", REGISTER)
        self.ingest("north")
        self.drop("north", "lab-n.csv", LAB_N)
        self.ingest("north")
        self.drop("south", "lab-s.csv", LAB_S)
        self.ingest("south")
        self.drop("south", "copy-of-lab-n.csv", LAB_N)  # the same content, in the second region
        self.ingest("south")
        self.assertEqual(self.receipt("north", "lab-n.csv")["status"], "accepted")
        self.assertEqual(self.receipt("south", "lab-s.csv")["status"], "accepted")
        self.assertEqual(self.receipt("south", "copy-of-lab-n.csv")["status"], "duplicate")
        self.assertEqual(self.rows("SELECT count(*) FROM oil_samples"), ["2"])
        self.assertFalse(os.path.exists(os.path.join(self.roots["north"], "ferrum.db")))  # nothing in SQLite
        for root in ("north", "south"):
            ranked = json.loads(run("rank", "--root", self.roots[root], "--as-of", AS_OF, "--json").stdout)
            units = sorted(u["unit_id"] for u in (ranked["units"] if isinstance(ranked, dict) else ranked))
            self.assertEqual(units, ["N1", "S1"], root)

    def test_same_content_in_two_roots_at_once_is_one_import(self):
        # Two processes on two roots import the same content at the same
        # moment: the file is long enough (60,000 load points, about a second
        # to import) that both look for an accepted copy before either commits.
        self.drop("north", "units.csv", REGISTER)
        self.ingest("north")
        start = (int(time.time()) // 86400 - 640) * 86400  # 60,000 quarter-hours end before today
        content = "unit_id,timestamp,load_mva,ambient_c\n" + "".join(
            "N1,%s,%.1f,%.1f\n" % (time.strftime("%Y-%m-%dT%H:%MZ", time.gmtime(start + 900 * i)),
                                   20 + (i % 96) / 8, 5 + (i % 96) / 10) for i in range(60000))
        for root in ("north", "south"):
            self.drop(root, "load.csv", content)
        racers = [subprocess.Popen([FERRUM, "ingest", "--root", self.roots[root]], stdout=subprocess.PIPE,
                                   stderr=subprocess.PIPE, text=True) for root in ("north", "south")]
        for p in racers:
            out, err = p.communicate(timeout=300)
            self.assertEqual(p.returncode, 0, out + err)
        statuses = sorted(self.receipt(root, "load.csv")["status"] for root in ("north", "south"))
        self.assertEqual(statuses, ["accepted", "duplicate"])
        self.assertEqual(self.rows("SELECT count(*) FROM files WHERE original_name = 'load.csv' AND status = 'accepted'"),
                         ["1"])
        self.assertEqual(self.rows("SELECT count(*) FROM load_points"), ["60000"])

    def test_each_root_reports_its_own_substations(self):
        self.drop("north", "units.csv", REGISTER)
        self.ingest("north")
        self.daemon = subprocess.Popen([FERRUM, "serve", "--root", self.roots["north"], "--once"],
                                       stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
        self.drop("north", "lab-n.csv", LAB_N)
        self.drop("north", "lab-s.csv", LAB_S)
        self.daemon.communicate(timeout=120)
        reports = os.listdir(os.path.join(self.roots["north"], "reports"))
        self.assertTrue(any("N1" in r for r in reports), reports)
        self.assertFalse(any("S1" in r for r in reports), reports)  # Ostrand Yard is the south root's

    def test_database_unreachable_files_wait_and_are_imported_later(self):
        self.drop("north", "units.csv", REGISTER)
        self.ingest("north")
        root = self.roots["north"]
        self.daemon = subprocess.Popen([FERRUM, "serve", "--root", root],
                                       stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
        status = os.path.join(root, "status.json")
        deadline = time.time() + 20
        while not os.path.exists(status) and time.time() < deadline:
            time.sleep(0.1)
        self.server.stop(mode="immediate")
        self.drop("north", "lab-n.csv", LAB_N)
        deadline = time.time() + 30
        problem = ""
        while time.time() < deadline:
            try:
                with open(status) as f:
                    problem = json.load(f).get("store_problem", "")
            except ValueError:
                pass
            if problem:
                break
            time.sleep(0.2)
        self.assertTrue(problem, "status.json never said the database is unreachable")
        text = run("status", "--root", root, check=False).stdout
        self.assertIn("unreachable", text)
        self.assertIsNone(self.daemon.poll(), "the daemon must keep running")
        waiting = [f for d, _, fs in os.walk(os.path.join(root, "work")) for f in fs]
        self.assertEqual(len(waiting), 1, waiting)  # nothing lost: the file waits in work/
        self.server_back_and_file_imported(root)
        self.daemon.send_signal(signal.SIGTERM)
        self.daemon.communicate(timeout=30)

    def test_serve_starts_while_the_database_is_down(self):
        root = self.serve_with_the_database_down()
        status = os.path.join(root, "status.json")
        deadline = time.time() + 30
        problem = ""
        while time.time() < deadline and not problem:
            self.assertIsNone(self.daemon.poll(), "the daemon must start and keep running without its database")
            try:
                with open(status) as f:
                    problem = json.load(f).get("store_problem", "")
            except (OSError, ValueError):
                pass
            time.sleep(0.2)
        self.assertIn("connect", problem)  # why: libpq's own reason
        text = run("status", "--root", root, check=False).stdout
        self.assertIn("unreachable", text)
        self.assertIn(problem, text)
        self.drop("north", "lab-n.csv", LAB_N)
        work = os.path.join(root, "work")
        deadline = time.time() + 30
        waiting = []
        while time.time() < deadline and not waiting:
            waiting = [f for d, _, fs in os.walk(work) for f in fs]
            time.sleep(0.2)
        self.assertEqual(len(waiting), 1, waiting)  # nothing lost: the file waits in work/
        time.sleep(3)  # a few retries with back-off while the database is still down
        self.assertIsNone(self.daemon.poll(), "the daemon must keep running")
        self.assertEqual([f for d, _, fs in os.walk(work) for f in fs], waiting)
        self.server_back_and_file_imported(root)
        self.assertEqual([f for d, _, fs in os.walk(work) for f in fs], [])
        deadline = time.time() + 30
        while time.time() < deadline:
            with open(status) as f:
                if not json.load(f).get("store_problem"):
                    break
            time.sleep(0.2)
        with open(status) as f:
            self.assertEqual(json.load(f).get("store_problem"), "")  # status no longer blames the database
        self.daemon.send_signal(signal.SIGTERM)
        self.daemon.communicate(timeout=30)

    def test_database_back_between_two_tries_recovers_before_a_new_file(self):
        # ferrum's own rule, no published source: started while the database is down, the
        # start's recovery (files an interruption left in work/) comes before any new file,
        # even when the database is back long before the back-off's next try.
        root = self.serve_with_the_database_down()
        time.sleep(8)  # tries after 1, 2 and 4 s: the next one is about 8 s away
        self.assertIsNone(self.daemon.poll(), "the daemon must keep running without its database")
        self.server.start(database=None)
        self.drop("north", "lab-n.csv", LAB_N)
        receipt = os.path.join(root, "drop", "planning", "receipts", "lab-n.csv.json")
        deadline = time.time() + 60
        while not os.path.exists(receipt) and time.time() < deadline:
            time.sleep(0.1)
        self.assertEqual(self.receipt("north", "lab-n.csv")["status"], "accepted")
        self.daemon.send_signal(signal.SIGTERM)
        _, log = self.daemon.communicate(timeout=30)
        recovered = log.find("the start's recovery is done")
        imported = log.find("lab-n.csv: accepted")
        self.assertGreaterEqual(recovered, 0, log[-3000:])
        self.assertGreaterEqual(imported, 0, log[-3000:])
        self.assertLess(recovered, imported, log[-3000:])


if __name__ == "__main__":
    unittest.main()
