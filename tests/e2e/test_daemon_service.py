"""`ferrum serve` as a service: --daemon and --pidfile, `ferrum status`, the
root lock, databases it must refuse, the weekly bundle missed while down,
alerts and the log file."""
import calendar
import json
import os
import signal
import sqlite3
import subprocess
import tempfile
import time
import unittest

from ferrumtest import FERRUM, run
from test_daemon_watch import LOAD_HEADER, DaemonCase, load_rows

WEEKDAYS = ["monday", "tuesday", "wednesday", "thursday", "friday", "saturday", "sunday"]


def iso(t):
    return time.strftime("%Y-%m-%dT%H:%M:%SZ", time.gmtime(t))


def pid_alive(pid):
    try:
        os.kill(pid, 0)
        return True
    except ProcessLookupError:
        return False


class Service(DaemonCase):
    def status(self, *extra):
        return run("status", "--root", self.root, *extra, check=False)

    def test_status_exit_codes_and_content(self):
        p = self.status()
        self.assertEqual(p.returncode, 3, p.stdout + p.stderr)
        self.assertIn("NOT running", p.stdout)
        self.drop("bad.csv", "unit_id,timestamp,load_pu\nT1,yesterday,0.5\n")
        self.start_daemon()
        self.wait_for(lambda: self.has_receipt("bad.csv"), timeout=10, what="receipt")
        self.drop("good.csv", LOAD_HEADER + "".join(load_rows("T1", 0, 3)))
        self.wait_for(lambda: self.has_receipt("good.csv"), timeout=10, what="receipt")
        time.sleep(1.5)  # the status file is rewritten every second
        p = self.status()
        self.assertEqual(p.returncode, 0, p.stdout + p.stderr)
        self.assertIn(f"pid {self.daemon.pid}", p.stdout)
        self.assertIn("planning/good.csv", p.stdout)  # last import and its party
        self.assertIn("bad.csv", p.stdout)            # recent rejection
        self.assertIn("next weekly", p.stdout)
        self.assertIn("files waiting:  0", p.stdout)
        self.assertRegex(p.stdout, r"up \d+")         # uptime
        doc = json.loads(self.status("--json").stdout)
        self.assertTrue(doc["running"])
        self.assertEqual(doc["pid"], self.daemon.pid)
        self.assertEqual(self.stop_daemon(), 0)
        p = self.status()
        self.assertEqual(p.returncode, 3, p.stdout)
        self.assertIn("stopped", p.stdout)

    def test_second_daemon_is_refused(self):
        self.start_daemon()
        p = run("serve", "--root", self.root, check=False, timeout=20)
        self.assertNotEqual(p.returncode, 0)
        self.assertIn(f"pid {self.daemon.pid}", p.stderr)
        self.assertIsNone(self.daemon.poll())
        self.assertEqual(self.stop_daemon(), 0)

    def test_newer_database_is_refused(self):
        with sqlite3.connect(self.path("ferrum.db")) as c:
            c.execute("PRAGMA user_version=999")
        p = run("serve", "--root", self.root, "--once", check=False, timeout=20)
        self.assertEqual(p.returncode, 1, p.stdout + p.stderr)
        self.assertIn("newer", p.stderr)
        self.assertIn("999", p.stderr)

    def test_corrupt_database_is_refused(self):
        with open(self.path("ferrum.db"), "r+b") as f:
            f.write(b"this is not an SQLite file at all")
        p = run("serve", "--root", self.root, "--once", check=False, timeout=20)
        self.assertEqual(p.returncode, 1, p.stdout + p.stderr)
        self.assertIn("ferrum.db", p.stderr)

    def test_daemon_mode_with_pidfile_and_relative_root(self):
        pidfile = os.path.join(tempfile.gettempdir(), f"ferrum-e2e-{os.getpid()}.pid")
        parent, name = os.path.split(self.root)
        # A relative root: the daemon changes to / after forking, so it must be
        # resolved before.
        p = subprocess.run([FERRUM, "serve", "--daemon", f"--pidfile={pidfile}", "--root", name], cwd=parent,
                           capture_output=True, text=True, timeout=20)
        self.assertEqual(p.returncode, 0, p.stderr)
        try:
            self.wait_for(lambda: os.path.exists(pidfile) and open(pidfile).read().strip(), timeout=10, what="pidfile")
            pid = int(open(pidfile).read())
            self.assertTrue(pid_alive(pid))
            self.wait_for(lambda: self.status().returncode == 0, timeout=10, what="status says running")
            self.assertIn(f"pid {pid}", self.status().stdout)
            # It works in the root it was given.
            self.drop("daemonized.csv", LOAD_HEADER + "".join(load_rows("T1", 0, 3)))
            self.wait_for(lambda: self.has_receipt("daemonized.csv"), timeout=10, what="receipt")
            os.kill(pid, signal.SIGTERM)
            self.wait_for(lambda: not pid_alive(pid), timeout=10, what="daemon exit")
            self.assertFalse(os.path.exists(pidfile), "pidfile left behind")
            self.assertEqual(self.status().returncode, 3)
        finally:
            if os.path.exists(pidfile):
                pid = int(open(pidfile).read() or 0)
                if pid and pid_alive(pid):
                    os.kill(pid, signal.SIGKILL)
                os.remove(pidfile)

    def test_daemon_mode_reports_errors_before_forking(self):
        empty = tempfile.mkdtemp(prefix="ferrum-e2e-empty-")
        try:
            p = subprocess.run([FERRUM, "serve", "--daemon", "--root", empty], capture_output=True, text=True, timeout=20)
            self.assertNotEqual(p.returncode, 0)
            self.assertIn("ferrum.ini", p.stderr)
        finally:
            os.rmdir(empty)
        # A daemon already running on the root: refused before forking too.
        self.start_daemon()
        p = subprocess.run([FERRUM, "serve", "--daemon", "--root", self.root], capture_output=True, text=True,
                           timeout=20)
        self.assertNotEqual(p.returncode, 0)
        self.assertIn("another ferrum process", p.stderr)
        # An invalid configuration.
        self.assertEqual(self.stop_daemon(), 0)
        with open(self.path("ferrum.ini"), "a") as f:
            f.write("\n[nonsense]\nkey = 1\n")
        p = subprocess.run([FERRUM, "serve", "--daemon", "--root", self.root], capture_output=True, text=True,
                           timeout=20)
        self.assertNotEqual(p.returncode, 0)
        self.assertIn("nonsense", p.stderr)

    def schedule_just_past(self, seconds_ago=120):
        """Sets the weekly moment to a minute shortly before now (site offset +00:00)."""
        t = time.gmtime(time.time() - seconds_ago)
        self.set_keys({"schedule": {"weekly_day": WEEKDAYS[t.tm_wday], "weekly_time": time.strftime("%H:%M", t)}})

    def test_missed_weekly_bundle_is_produced_at_start(self):
        self.schedule_just_past()
        with self.db() as c:
            c.execute("INSERT OR REPLACE INTO daemon_state(key, value) VALUES ('created_at', ?)",
                      (iso(time.time() - 10 * 86400),))
            c.execute("INSERT OR REPLACE INTO daemon_state(key, value) VALUES ('weekly_last_run', ?)",
                      (iso(time.time() - 8 * 86400),))
        self.serve_once()
        with self.db() as c:
            state = dict(c.execute("SELECT key, value FROM daemon_state"))
        bundle = self.path(state["weekly_last_bundle"])
        self.assertTrue(os.path.exists(os.path.join(bundle, "index.pdf")), state)
        self.assertGreaterEqual(calendar.timegm(time.strptime(state["weekly_last_run"], "%Y-%m-%dT%H:%M:%SZ")),
                                time.time() - 60)
        # Once produced, a second start produces nothing new.
        before = state["weekly_last_run"]
        self.serve_once()
        with self.db() as c:
            self.assertEqual(c.execute("SELECT value FROM daemon_state WHERE key='weekly_last_run'").fetchone()[0],
                             before)

    def test_weekly_bundle_not_due_is_not_produced(self):
        self.schedule_just_past()
        # The last run came after the scheduled moment: the next one is a week away.
        with self.db() as c:
            c.execute("INSERT OR REPLACE INTO daemon_state(key, value) VALUES ('weekly_last_run', ?)",
                      (iso(time.time() - 30),))
        self.serve_once()
        with self.db() as c:
            self.assertIsNone(c.execute("SELECT value FROM daemon_state WHERE key='weekly_last_bundle'").fetchone())

    def test_alerts_unsafe_item_and_acetylene(self):
        self.start_daemon()
        today = time.strftime("%Y-%m-%d", time.gmtime())
        self.drop("inspection.csv", "unit_id,inspection_date,item,rating\n"
                                    f"T1,{today},bushings,unsafe\nT1,{today},breather,good\n")
        self.wait_for(lambda: any(a["kind"] == "unsafe_inspection" for a in self.alerts()), timeout=15,
                      what="unsafe alert")
        self.assertTrue(self.receipt("inspection.csv")["unsafe_alert_sent"])
        with open(self.path("drop", "planning", "receipts", "inspection.csv.txt")) as f:
            self.assertIn("reported to the site's planners at once (an alert was raised):\n  T1: bushings", f.read())
        lab = "unit_id,sample_date,h2_ppm,ch4_ppm,c2h6_ppm,c2h4_ppm,c2h2_ppm,co_ppm,co2_ppm,lab_ref\n"
        day = lambda n: time.strftime("%Y-%m-%d", time.gmtime(time.time() - n * 86400))
        self.drop("lab-1.csv", lab + f"T2,{day(20)},20,10,5,5,<0.5,200,2000,L-1\n")
        self.wait_for(lambda: self.has_receipt("lab-1.csv"), timeout=10, what="lab-1")
        time.sleep(1)
        self.assertFalse(any(a["unit_id"] == "T2" for a in self.alerts()), "no acetylene, no alert")
        self.drop("lab-2.csv", lab + f"T2,{day(10)},25,12,6,6,4,210,2100,L-2\n")
        self.wait_for(lambda: any(a["kind"] == "acetylene" for a in self.alerts()), timeout=15, what="acetylene alert")
        self.drop("lab-3.csv", lab + f"T2,{day(0)},40,20,8,30,15,220,2200,L-3\n")
        self.wait_for(lambda: sum(a["kind"] == "acetylene" for a in self.alerts()) == 2, timeout=15,
                      what="acetylene rising alert")
        # Issue #16: the second is "rising" with the date of the first detection, not "appeared" again.
        texts = [a["text"] for a in self.alerts() if a["kind"] == "acetylene"]
        self.assertTrue(texts[0].startswith("acetylene appeared: 4 ppm"), texts)
        self.assertTrue(texts[1].startswith(f"acetylene rising: 4 -> 15 ppm (first detected {day(10)})"), texts)
        kinds = [(a["unit_id"], a["kind"]) for a in self.alerts()]
        self.assertEqual(kinds.count(("T1", "unsafe_inspection")), 1)
        for a in self.alerts():
            self.assertTrue(os.path.exists(self.path("reports", "alerts", a["pdf"])), a)
        self.assertIn("ALERT T1 unsafe_inspection", self.site_log())
        self.assertEqual(self.stop_daemon(), 0)
        # Open alerts are listed by `ferrum status`.
        out = self.status().stdout
        self.assertIn("unsafe_inspection", out)
        self.assertIn("acetylene", out)


if __name__ == "__main__":
    unittest.main()
