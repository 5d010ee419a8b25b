"""Signals to a real `ferrum serve`: SIGHUP reloads ferrum.ini (or keeps the
old one when the new one is invalid); SIGTERM during a large import exits 0
without a half-imported file; kill -9 during an import loses and doubles
nothing after a restart."""
import os
import signal
import time
import unittest

from test_daemon_watch import LOAD_HEADER, DaemonCase, load_rows

BIG_ROWS = 300_000
# 10-minute steps from 2019-01-01T00:00Z: 300,000 rows end in 2024, in the past.
BIG_BASE = 1546300800


def big_load_text():
    return LOAD_HEADER + "".join(load_rows("T1", 0, BIG_ROWS, step_minutes=10, base=BIG_BASE))


class Signals(DaemonCase):
    def wait_claimed(self, name, timeout=20):
        """Waits until the daemon has claimed the file (renamed into work/)."""
        claimed = self.path("work", self.party, name)
        self.wait_for(lambda: os.path.exists(claimed), timeout=timeout, what=f"{name} claimed into work/")

    def files_rows(self):
        with self.db() as c:
            return c.execute("SELECT original_name, status, rows FROM files ORDER BY id").fetchall()

    def test_sighup_valid_configuration_is_applied(self):
        self.start_daemon()
        self.add_party("lab")
        self.set_keys({"log": {"level": "debug"}})
        self.daemon.send_signal(signal.SIGHUP)
        self.wait_for(lambda: "configuration reloaded" in self.site_log(), timeout=10, what="reload log line")
        log = self.site_log()
        self.assertIn("lab", log[log.index("configuration reloaded"):])  # the change is named
        self.assertIn("debug", log[log.index("configuration reloaded"):])
        # The new party's folder is watched without a restart.
        self.wait_for(lambda: os.path.isdir(self.path("drop", "lab")), timeout=5, what="drop/lab")
        self.drop("lab-load.csv", LOAD_HEADER + "".join(load_rows("T2", 0, 3)), party="lab")
        self.wait_for(lambda: self.has_receipt("lab-load.csv", "lab"), timeout=10, what="receipt in drop/lab")
        self.assertEqual(self.receipt("lab-load.csv", "lab")["status"], "accepted")
        self.assertEqual([n for n in os.listdir(self.path("quarantine")) if n != "receipts"], [])
        self.assertIsNone(self.daemon.poll())
        self.assertEqual(self.stop_daemon(), 0)

    def test_sighup_invalid_configuration_keeps_the_old_one(self):
        self.start_daemon()
        with open(self.path("ferrum.ini")) as f:
            good = f.read()
        with open(self.path("ferrum.ini"), "w") as f:
            f.write(good.replace("settle_seconds = 1", "settle_seconds = soon"))
        self.daemon.send_signal(signal.SIGHUP)
        self.wait_for(lambda: "NOT reloaded" in self.site_log(), timeout=10, what="refusal log line")
        self.assertIn("settle_seconds", self.site_log())  # the message names the key
        time.sleep(0.5)
        self.assertIsNone(self.daemon.poll(), "the daemon died on an invalid configuration")
        # Still working with the previous configuration.
        self.drop("after-bad-hup.csv", LOAD_HEADER + "".join(load_rows("T2", 0, 3)))
        self.wait_for(lambda: self.has_receipt("after-bad-hup.csv"), timeout=10, what="receipt")
        self.assertEqual(self.receipt("after-bad-hup.csv")["status"], "accepted")
        self.assertEqual(self.stop_daemon(), 0)

    def test_sigterm_during_a_large_import(self):
        text = big_load_text()
        self.start_daemon()
        self.drop("big-load.csv", text)
        self.wait_claimed("big-load.csv")
        stopped = time.time()
        rc = self.stop_daemon(signal.SIGTERM, timeout=10)
        self.assertEqual(rc, 0, self.daemon_log())
        self.assertLess(time.time() - stopped, 5, "SIGTERM took too long")
        imported = self.count("load_points")
        # Either completely imported, or not at all and still in work/.
        if imported:
            self.assertEqual(imported, BIG_ROWS)
            self.assertEqual(self.receipt("big-load.csv")["status"], "accepted")
        else:
            self.assertTrue(os.path.exists(self.path("work", self.party, "big-load.csv")))
            self.assertFalse(self.has_receipt("big-load.csv"))
        # A restart finishes whatever was left; nothing is doubled.
        self.serve_once()
        self.assertEqual(self.count("load_points"), BIG_ROWS)
        self.assertEqual(self.receipt("big-load.csv")["status"], "accepted")
        self.assertEqual(os.listdir(self.path("work", self.party)), [])
        accepted = [r for r in self.files_rows() if r[0] == "big-load.csv" and r[1] == "accepted"]
        self.assertEqual(len(accepted), 1, self.files_rows())

    def test_kill_9_during_import_then_restart(self):
        small = {f"small-{i}.csv": LOAD_HEADER + "".join(load_rows("T2", 10 * i, 10)) for i in range(6)}
        self.start_daemon()
        for name in list(small)[:3]:
            self.drop(name, small[name])
        self.drop("big-load.csv", big_load_text())
        for name in list(small)[3:]:
            self.drop(name, small[name])
        self.wait_claimed("big-load.csv")
        time.sleep(0.3)  # well inside the import
        self.daemon.send_signal(signal.SIGKILL)
        self.daemon.wait(timeout=5)
        # Whatever state the files are in, a restart settles every one of them.
        self.serve_once()
        rows = self.files_rows()
        for name in [*small, "big-load.csv"]:
            self.assertEqual(self.receipt(name)["status"], "accepted", name)
            self.assertEqual([r[1] for r in rows if r[0] == name], ["accepted"], (name, rows))
        self.assertEqual(self.count("load_points"), BIG_ROWS + 60)
        self.assertEqual(os.listdir(self.path("work", self.party)), [])
        self.assertEqual(sorted(n for n in os.listdir(self.path("drop", self.party)) if n != "receipts"), [])


if __name__ == "__main__":
    unittest.main()
