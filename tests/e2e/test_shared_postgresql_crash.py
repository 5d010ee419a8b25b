"""Crash safety on a shared PostgreSQL database: two daemons with two roots on
one real server; one daemon is killed with SIGKILL again and again while both
roots receive files, and restarted; then the server itself is restarted
under load. At the end every file is in archive/ or
quarantine/ of its root exactly once, work/ is empty, and the database holds
the rows of one clean run.

Scale with FERRUM_PG_CRASH_FILES (files per root, default 200) and
FERRUM_PG_CRASH_KILLS (default 20): about 15 s on two cores.
Plumbing: no engineering value is checked here, so no published source applies."""
import os
import random
import re
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

FILES = int(os.environ.get("FERRUM_PG_CRASH_FILES", "200"))
KILLS = int(os.environ.get("FERRUM_PG_CRASH_KILLS", "20"))
UNITS = {"north": ["N1", "N2", "N3"], "south": ["S1", "S2", "S3"]}


def lab_file(root, i):
    """One oil sample per file, a content of its own."""
    unit = UNITS[root][i % 3]
    day = 1 + i % 28
    month = 1 + (i // 28) % 12
    return ("unit_id,sample_date,h2_ppm,ch4_ppm,lab_ref\n"
            f"{unit},2026-{month:02d}-{day:02d},{10 + i},{5 + i % 7},{root}-{i}\n")


@unittest.skipIf(pgserver.missing_reason(), "skipped: %s" % pgserver.missing_reason())
class SharedCrash(unittest.TestCase):
    def setUp(self):
        self.folder = tempfile.mkdtemp(prefix="ferrum-pgcrash-")
        self.server = pgserver.PgServer(os.path.join(self.folder, "server")).start()
        self.roots = {}
        self.daemons = {}
        for name in ("north", "south"):
            root = os.path.join(self.folder, name)
            run("init", "--root", root)
            ini = os.path.join(root, "ferrum.ini")
            with open(ini) as f:
                text = f.read()
            text = text.replace("backend = sqlite", "backend = postgresql")
            text = text.replace("postgresql = \n", "postgresql = %s\n" % self.server.conninfo())
            for key, value in {"settle_seconds": "0", "rescan_seconds": "1", "debounce_seconds": "86400"}.items():
                text = re.sub(rf"(?m)^{key} = .*$", f"{key} = {value}", text)
            with open(ini, "w") as f:
                f.write(text)
            os.remove(os.path.join(root, "ferrum.db"))
            self.roots[name] = root

    def tearDown(self):
        for d in self.daemons.values():
            if d.poll() is None:
                d.kill()
                d.wait()
        self.server.remove()
        shutil.rmtree(self.folder, ignore_errors=True)

    def start(self, name):
        self.daemons[name] = subprocess.Popen([FERRUM, "serve", "--root", self.roots[name]],
                                              stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)

    def drop(self, name, fname, content):
        drop_file(os.path.join(self.roots[name], "drop", "planning"), fname, content)

    def placed(self, name):
        """Names of the files in archive/ and quarantine/, with repeats."""
        out = []
        for sub in ("archive", "quarantine"):
            for d, _, fs in os.walk(os.path.join(self.roots[name], sub)):
                out += [f for f in fs if f.startswith("lab-")]
        return out

    def start_fleet(self):
        register = "unit_id,site,rated_mva,hv_kv,lv_kv,cooling,year_built\n" + "".join(
            f"{u},{'North' if u[0] == 'N' else 'South'},40,132,33,ONAF,1990\n" for us in UNITS.values() for u in us)
        self.drop("north", "units.csv", register)
        run("ingest", "--root", self.roots["north"])
        self.start("north")
        self.start("south")
        # Started (and connected: the files below are to meet running daemons).
        deadline = time.time() + 30
        while not all(os.path.exists(os.path.join(r, "status.json")) for r in self.roots.values()):
            self.assertLess(time.time(), deadline, "the daemons did not start")
            time.sleep(0.1)

    def check_every_file_once(self, files):
        deadline = time.time() + 300
        while time.time() < deadline:
            if all(len(self.placed(n)) >= files for n in self.roots):
                break
            for name, d in self.daemons.items():
                self.assertIsNone(d.poll(), name + " daemon stopped")
            time.sleep(0.5)
        for name in self.roots:
            placed = self.placed(name)
            stems = sorted(re.sub(r"\.[0-9a-f]{8}\.csv$", "", f) for f in placed)
            self.assertEqual(stems, sorted(f"lab-{i:03d}" for i in range(files)), name)  # each exactly once
            work = [f for d, _, fs in os.walk(os.path.join(self.roots[name], "work")) for f in fs]
            self.assertEqual(work, [], name)
        for d in self.daemons.values():
            self.assertIsNone(d.poll(), "a daemon stopped")
            d.send_signal(signal.SIGTERM)
            d.wait(timeout=60)
        # The rows of one clean run: one sample per file, one accepted record per file.
        self.assertEqual(self.server.psql("SELECT count(*) FROM oil_samples").strip(), str(2 * files))
        self.assertEqual(self.server.psql(
            "SELECT count(*) FROM files WHERE status = 'accepted' AND original_name LIKE 'lab-%'").strip(), str(2 * files))
        self.assertEqual(self.server.psql(
            "SELECT count(*) FROM (SELECT lab_ref FROM oil_samples GROUP BY lab_ref HAVING count(*) > 1) d").strip(), "0")

    def test_sigkill_one_of_two_daemons(self):
        self.start_fleet()
        rng = random.Random(1)
        kills = 0
        for i in range(FILES):
            for name in ("north", "south"):
                self.drop(name, f"lab-{i:03d}.csv", lab_file(name, i))
            if kills < KILLS and i % max(1, FILES // KILLS) == FILES // KILLS // 2:
                time.sleep(rng.uniform(0.05, 0.4))
                self.daemons["north"].send_signal(signal.SIGKILL)
                self.daemons["north"].wait()
                kills += 1
                self.start("north")
        self.assertEqual(kills, KILLS)
        self.check_every_file_once(FILES)

    def test_database_restarted_under_load(self):
        # Both daemons keep running; the server is restarted twice while
        # files arrive: imports in flight roll back and are done again.
        self.start_fleet()
        files = 80
        for i in range(files):
            for name in ("north", "south"):
                self.drop(name, f"lab-{i:03d}.csv", lab_file(name, i))
            if i in (20, 50):
                time.sleep(0.1)
                self.server.restart()
        self.check_every_file_once(files)

if __name__ == "__main__":
    unittest.main()
