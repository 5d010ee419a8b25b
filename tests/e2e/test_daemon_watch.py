"""`ferrum serve` as a real process: files written slowly, renamed in, and
500 at once; arrival order per party. Also home of DaemonCase, the helpers
the other test_daemon_*.py files share."""
import csv
import os
import re
import signal
import subprocess
import threading
import time
import unittest

from ferrumtest import FERRUM, REGISTER, SiteTestCase, run

# A site configuration fast enough for tests: files settle after 1 s, the
# folders are rescanned every second and reports are rendered at once.
FAST = {"ingest": {"settle_seconds": "1", "rescan_seconds": "1"}, "schedule": {"debounce_seconds": "0"}}


def load_rows(unit, first, count, step_minutes=60, base=1735689600):
    """Load-series rows, one per step from base (default 2025-01-01T00:00Z)
    + first steps."""
    out = []
    for h in range(first, first + count):
        t = time.gmtime(base + 60 * step_minutes * h)
        out.append(f"{unit},{time.strftime('%Y-%m-%dT%H:%M:%SZ', t)},{0.4 + (h % 24) * 0.02:.2f},{10 + h % 7}\n")
    return out


LOAD_HEADER = "unit_id,timestamp,load_pu,ambient_c\n"


class DaemonCase(SiteTestCase):
    """A site with the register imported and a fast configuration; the daemon's
    stderr goes to a file (a pipe nobody reads would block it)."""

    def setUp(self):
        super().setUp()
        self.set_keys(FAST)
        self.drop("units.csv", REGISTER)
        self.ingest()
        self.log_path = self.path("daemon-stderr.log")

    def set_keys(self, sections):
        """Sets keys of ferrum.ini in place: {section: {key: value}}."""
        with open(self.path("ferrum.ini")) as f:
            text = f.read()
        for section, keys in sections.items():
            for key, value in keys.items():
                block = re.search(r"^\[" + re.escape(section) + r"\]\n(?:(?!\[).*\n?)*", text, re.M)
                self.assertIsNotNone(block, section)
                body, n = re.subn(r"^" + re.escape(key) + r" *=.*$", f"{key} = {value}", block.group(0), count=1,
                                  flags=re.M)
                self.assertEqual(n, 1, f"{section}.{key} not in ferrum.ini")
                text = text[:block.start()] + body + text[block.end():]
        with open(self.path("ferrum.ini"), "w") as f:
            f.write(text)

    def start_daemon(self, *extra, wait=True):
        self.stderr_file = open(self.log_path, "a")
        self.daemon = subprocess.Popen([FERRUM, "serve", "--root", self.root, *extra],
                                       stdout=subprocess.DEVNULL, stderr=self.stderr_file, text=True)
        if wait:
            self.wait_for(lambda: os.path.exists(self.path("status.json")) or self.daemon.poll() is not None,
                          timeout=20, what="daemon start")
            self.assertIsNone(self.daemon.poll(), self.daemon_log())
        return self.daemon

    def stop_daemon(self, sig=signal.SIGTERM, timeout=10):
        self.daemon.send_signal(sig)
        rc = self.daemon.wait(timeout=timeout)
        self.stderr_file.close()
        return rc

    def tearDown(self):
        super().tearDown()
        if getattr(self, "stderr_file", None):
            self.stderr_file.close()

    def daemon_log(self):
        with open(self.log_path) as f:
            return f.read()

    def site_log(self):
        with open(self.path("log", "ferrum.log")) as f:
            return f.read()

    def alerts(self):
        """Rows of reports/alerts/alerts.csv (none before the first alert)."""
        path = self.path("reports", "alerts", "alerts.csv")
        if not os.path.exists(path):
            return []
        with open(path, newline="") as f:
            return list(csv.DictReader(line for line in f if not line.startswith("#")))

    def has_receipt(self, name, party=None):
        return os.path.exists(self.path("drop", party or self.party, "receipts", name + ".json"))

    def serve_once(self, expect=0):
        p = run("serve", "--root", self.root, "--once", check=False, timeout=120)
        self.assertEqual(p.returncode, expect, p.stdout + p.stderr)
        return p

    def drop_in_place(self, name, text, party=None):
        """Writes a file directly under its final name (no rename): the
        daemon must wait until it settles."""
        path = self.path("drop", party or self.party, name)
        with open(path, "w") as f:
            f.write(text)
        return path

    def add_party(self, name):
        with open(self.path("ferrum.ini"), "a") as f:
            f.write(f"\n[party.{name}]\nkinds = *\nsites = *\n")


class Watching(DaemonCase):
    def test_slow_writer_is_not_taken_half_written(self):
        self.start_daemon()
        rows = load_rows("T1", 0, 240)
        path = self.path("drop", self.party, "slow-load.csv")
        seen_half = []
        # 8 chunks, one every 0.4 s (~3 s in all): each pause is shorter than
        # settle_seconds = 1, so the file must only be taken after the last one.
        with open(path, "w") as f:
            f.write(LOAD_HEADER)
            for i in range(8):
                # Cut in the middle of a row, so that a half-taken file is rejected.
                chunk = "".join(rows[i * 30:(i + 1) * 30])
                f.write(chunk[:len(chunk) // 2])
                f.flush()
                time.sleep(0.2)
                f.write(chunk[len(chunk) // 2:])
                f.flush()
                time.sleep(0.2)
                seen_half.append(os.path.exists(path) and not self.has_receipt("slow-load.csv"))
        self.assertTrue(all(seen_half), "the file was taken while being written")
        self.wait_for(lambda: self.has_receipt("slow-load.csv"), timeout=15, what="receipt")
        r = self.receipt("slow-load.csv")
        self.assertEqual(r["status"], "accepted", r)
        self.assertEqual(r["rows"], 240)
        self.assertEqual(self.count("load_points"), 240)

    def test_renamed_file_is_taken_at_once(self):
        self.set_keys({"ingest": {"settle_seconds": "30", "rescan_seconds": "30"}})
        self.start_daemon()
        time.sleep(0.5)  # the watches are registered on the watchers' threads
        started = time.time()
        self.drop("renamed.csv", LOAD_HEADER + "".join(load_rows("T2", 0, 24)))
        # Renamed into place: no settle wait (30 s here) and no rescan needed.
        self.wait_for(lambda: self.has_receipt("renamed.csv"), timeout=10, what="receipt")
        self.assertLess(time.time() - started, 5)
        self.assertEqual(self.receipt("renamed.csv")["status"], "accepted")
        # A file written in place under its final name waits for the settle time.
        self.drop_in_place("in-place.csv", LOAD_HEADER + "".join(load_rows("T2", 100, 24)))
        time.sleep(3)
        self.assertFalse(self.has_receipt("in-place.csv"), "taken before it settled")
        self.assertEqual(self.stop_daemon(), 0)

    def test_file_present_at_start_and_missed_events_are_found_by_rescan(self):
        # Dropped while no daemon runs: no event will ever come for it.
        self.drop("before-start.csv", LOAD_HEADER + "".join(load_rows("T1", 0, 5)))
        self.start_daemon()
        self.wait_for(lambda: self.has_receipt("before-start.csv"), timeout=10, what="start-up scan")
        self.assertEqual(self.stop_daemon(), 0)

    def test_reports_debounced_and_only_for_units_affected(self):
        self.set_keys({"schedule": {"debounce_seconds": "2"}})
        self.start_daemon()
        # Three files for T1 in quick succession: one re-render of T1, none of T2.
        for i in range(3):
            self.drop(f"t1-{i}.csv", LOAD_HEADER + "".join(load_rows("T1", 10 * i, 10)))
        self.wait_for(lambda: "report T1 rendered" in self.site_log(), timeout=20, what="T1 report")
        time.sleep(2.5)
        log = self.site_log()
        self.assertEqual(log.count("report T1 rendered"), 1, log)
        self.assertNotIn("report T2 rendered", log)
        self.assertEqual(self.stop_daemon(), 0)

    def test_500_files_at_once_in_order_per_party(self):
        self.add_party("scada")
        self.start_daemon()
        parties = ["planning", "scada"]
        names = {p: [] for p in parties}
        # 250 files per party, renamed into place as fast as Python can; each
        # holds 4 hours of load of its own, so every one must be accepted.
        for i in range(250):
            for j, party in enumerate(parties):
                n = f"load-{i:03d}.csv"
                self.drop(n, LOAD_HEADER + "".join(load_rows("T1" if j == 0 else "T2", 4 * i, 4)), party=party)
                names[party].append(n)
        self.wait_for(lambda: all(self.has_receipt(n, p) for p in parties for n in names[p][-5:]) and
                      all(self.has_receipt(n, p) for p in parties for n in names[p]), timeout=60, what="500 receipts")
        for p in parties:
            for n in names[p]:
                r = self.receipt(n, p)
                self.assertEqual(r["status"], "accepted", (p, n, r))
                self.assertEqual(r["rows"], 4)
        self.assertEqual(self.count("load_points"), 500 * 4)
        with self.db() as c:
            for p in parties:
                got = [row[0] for row in c.execute(
                    "SELECT original_name FROM files WHERE party=? ORDER BY id", (p,))]
                if p == self.party:
                    got = [g for g in got if g != "units.csv"]
                self.assertEqual(got, names[p], f"arrival order of {p}")
        self.assertEqual(os.listdir(self.path("work", "planning")), [])
        # The party folder the daemon created at start-up was not taken for a
        # stray file and quarantined.
        self.assertEqual([n for n in os.listdir(self.path("quarantine")) if n != "receipts"], [])
        self.assertEqual(self.stop_daemon(), 0)
        # One log line per file with its outcome and time.
        lines = [l for l in self.site_log().splitlines() if re.search(r"file (planning|scada)/load-\d+\.csv: accepted", l)]
        self.assertEqual(len(lines), 500)
        self.assertRegex(lines[0], r"in \d+\.\d{3}s")


if __name__ == "__main__":
    unittest.main()
