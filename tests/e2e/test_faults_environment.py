"""Faults of the machine around the daemon: a full disk, a read-only
database, a party folder removed while watched, file times in the past (the
clock jumping backwards), a broken configuration on SIGHUP. Each leaves the
daemon running (or stopping cleanly with a clear log line) and loses nothing.

The full-disk case mounts a 2 MB tmpfs as the site root; it needs root and
mount(8) and is skipped with a message otherwise. Clock jumps are simulated
with file times in the past: faketime is not installed on the test machines
(with it, `faketime -f -1d ferrum serve` would move the daemon's own clock).
"""
import os
import shutil
import signal
import subprocess
import tempfile
import time
import unittest

import ferrumtest
from ferrumtest import SiteTestCase

REGISTER = ferrumtest.REGISTER
OIL = "unit_id,sample_date,h2_ppm,ch4_ppm\nT1,2024-01-{:02d},{},5\n"


def quick_config(path, extra=""):
    with open(path) as f:
        text = f.read()
    text = text.replace("settle_seconds = 5", "settle_seconds = 1").replace("rescan_seconds = 30", "rescan_seconds = 1")
    text = text.replace("debounce_seconds = 10", "debounce_seconds = 86400")
    with open(path, "w") as f:
        f.write(text + extra)


def log_text(root):
    try:
        with open(os.path.join(root, "log", "ferrum.log"), errors="replace") as f:
            return f.read()
    except FileNotFoundError:
        return ""


class FaultsTest(SiteTestCase):
    def setUp(self):
        super().setUp()
        quick_config(self.path("ferrum.ini"), "\n[party.lab]\nkinds = oil_lab\nsites = *\n")
        self.drop("register.csv", REGISTER)

    def receipt_status(self, name, party):
        p = self.path("drop", party, "receipts", name + ".json")
        return self.receipt(name, party)["status"] if os.path.exists(p) else None

    def alive(self):
        return self.daemon.poll() is None

    def test_party_folder_removed_while_watched(self):
        self.start_daemon()
        self.wait_for(lambda: self.receipt_status("register.csv", "planning") == "accepted", what="register")
        shutil.rmtree(self.path("drop", "lab"), ignore_errors=True)
        time.sleep(1.5)
        self.assertTrue(self.alive(), "daemon died when a party folder was removed")
        # Other parties go on; the removed folder works again once recreated.
        self.drop("oil-1.csv", OIL.format(1, 10), party="planning")  # planning may deliver everything
        self.wait_for(lambda: self.receipt_status("oil-1.csv", "planning") == "accepted", what="other party's file")
        self.drop("oil-2.csv", OIL.format(2, 11), party="lab")
        self.wait_for(lambda: self.receipt_status("oil-2.csv", "lab") == "accepted", timeout=20,
                      what="file in the recreated party folder")
        code, _, err = self.stop_daemon()
        self.assertEqual(code, 0, err[-2000:])
        self.assertEqual(self.count("oil_samples"), 2)

    def test_file_times_in_the_past_and_future(self):
        """Copied (not renamed) files whose mtime lies years in the past, or in
        the future, as after the clock jumped: each is taken once, complete."""
        self.start_daemon()
        lab = self.path("drop", "lab")
        os.makedirs(lab, exist_ok=True)
        stamps = [0, 86400 * 365 * 20, time.time() - 3600, time.time() + 86400 * 30]
        for i, t in enumerate(stamps):
            p = os.path.join(lab, f"old-{i}.csv")
            with open(p, "w") as f:
                f.write(OIL.format(i + 1, 20 + i))
            os.utime(p, (t, t))
        self.wait_for(lambda: all(self.receipt_status(f"old-{i}.csv", "lab") for i in range(len(stamps))),
                      timeout=30, what="every back-dated file")
        self.assertTrue(self.alive())
        self.stop_daemon()
        for i in range(len(stamps)):
            self.assertEqual(self.receipt_status(f"old-{i}.csv", "lab"), "accepted")
        self.assertEqual(self.count("oil_samples"), len(stamps))

    def test_broken_configuration_on_sighup_keeps_the_old_one(self):
        self.start_daemon()
        # The register first (drop-files.md: "deliver the register first"): a
        # file renamed into a folder is taken at once, a file found by the
        # start-up scan only after settle_seconds, so without this wait the oil
        # file below could be taken first and rightly rejected (unit T1 not in
        # the register). That race, not the reload, made this case fail.
        self.wait_for(lambda: self.receipt_status("register.csv", "planning") == "accepted", what="register")
        with open(self.path("ferrum.ini"), "a") as f:
            f.write("\n[ingest\nthis is not = = a key\nsettle_seconds = banana\n")
        self.daemon.send_signal(signal.SIGHUP)
        self.wait_for(lambda: "NOT reloaded" in log_text(self.root), what="the refusal log line")
        self.assertTrue(self.alive())
        line = [l for l in log_text(self.root).splitlines() if "NOT reloaded" in l][0]
        self.assertIn("ferrum.ini", line)  # names the file (and its line)
        # The old configuration is in force: the lab party still exists.
        self.drop("oil-1.csv", OIL.format(1, 10), party="lab")
        self.wait_for(lambda: self.receipt_status("oil-1.csv", "lab") == "accepted", what="file after a bad SIGHUP")
        code, _, err = self.stop_daemon()
        self.assertEqual(code, 0, err[-2000:])

    def test_read_only_database_at_start_stops_cleanly(self):
        """A database that cannot be written (immutable flag, so that even
        root cannot write it): the daemon stops with a clear message and
        touches no dropped file; `ferrum ingest` exits 1 and leaves the file
        waiting in work/; once writable, the daemon imports it."""
        run = ferrumtest.run("ingest", "--root", self.root)
        self.assertIn("accepted", run.stdout)
        self.drop("oil-1.csv", OIL.format(1, 10), party="lab")
        db = self.path("ferrum.db")
        if subprocess.run(["chattr", "+i", db], capture_output=True).returncode != 0:
            self.skipTest("chattr +i is not possible here (not root, or the file system has no immutable flag)")
        try:
            p = subprocess.run([ferrumtest.FERRUM, "serve", "--root", self.root], capture_output=True, text=True,
                               timeout=30)
            self.assertNotEqual(p.returncode, 0)
            self.assertNotIn("Segmentation", p.stderr)
            self.assertRegex(p.stderr.lower(), r"read-?only|readonly|permission|not permitted|cannot")
            self.assertTrue(os.path.exists(self.path("drop", "lab", "oil-1.csv")), "the dropped file was moved")
            # `ferrum ingest` claims the file, fails on the first write (exit 1,
            # a clear message), and leaves it waiting in work/ with no receipt.
            p = subprocess.run([ferrumtest.FERRUM, "ingest", "--root", self.root], capture_output=True, text=True,
                               timeout=30)
            self.assertEqual(p.returncode, 1, p.stdout + p.stderr)
            self.assertRegex(p.stderr.lower(), r"read-?only|readonly")
            self.assertTrue(os.path.exists(self.path("work", "lab", "oil-1.csv")), "the claimed file is not waiting")
            self.assertIsNone(self.receipt_status("oil-1.csv", "lab"))
        finally:
            subprocess.run(["chattr", "-i", db])
        self.start_daemon()
        self.wait_for(lambda: self.receipt_status("oil-1.csv", "lab") == "accepted", what="file after the fault")
        self.stop_daemon()


class FullDiskTest(unittest.TestCase):
    """A 2 MB tmpfs as the site root: the database cannot grow."""

    def setUp(self):
        self.root = tempfile.mkdtemp(prefix="ferrum-full-")
        p = subprocess.run(["mount", "-t", "tmpfs", "-o", "size=2m", "tmpfs", self.root], capture_output=True, text=True)
        if p.returncode != 0:
            os.rmdir(self.root)
            self.skipTest(f"cannot mount a tmpfs here ({p.stderr.strip()}); the full-disk case needs root")
        self.daemon = None

    def tearDown(self):
        if self.daemon and self.daemon.poll() is None:
            self.daemon.kill()
            self.daemon.wait()
        for _ in range(50):  # a process that just exited may still hold the mount for a moment
            if subprocess.run(["umount", self.root], capture_output=True).returncode == 0:
                break
            time.sleep(0.1)
        else:
            subprocess.run(["umount", "-l", self.root])
        os.rmdir(self.root)

    def test_full_disk_leaves_the_file_waiting_and_retries(self):
        ferrumtest.run("init", "--root", self.root)
        quick_config(os.path.join(self.root, "ferrum.ini"), "\n[party.lab]\nkinds = *\nsites = *\n")
        lab = os.path.join(self.root, "drop", "lab")
        os.makedirs(lab, exist_ok=True)
        with open(os.path.join(lab, ".r.part"), "w") as f:
            f.write(REGISTER)
        os.rename(os.path.join(lab, ".r.part"), os.path.join(lab, "register.csv"))
        self.daemon = subprocess.Popen([ferrumtest.FERRUM, "serve", "--root", self.root],
                                       stdout=subprocess.DEVNULL, stderr=subprocess.PIPE, text=True)
        receipts = os.path.join(lab, "receipts")
        deadline = time.time() + 20
        while not os.path.exists(os.path.join(receipts, "register.csv.json")) and time.time() < deadline:
            time.sleep(0.1)
        # A load series whose rows cannot fit in the database: written first
        # (under a temporary name), then the disk is filled, leaving a little
        # room (for log lines), then the series is dropped.
        rows = ["unit_id,timestamp,load_mva,ambient_c,top_oil_c"]
        for k in range(4000):
            rows.append(f"T1,{time.strftime('%Y-%m-%dT%H:%MZ', time.gmtime(1577836800 + k * 900))},{10 + k % 9},5,40")
        content = "\n".join(rows) + "\n"
        with open(os.path.join(lab, ".load.part"), "w") as f:
            f.write(content)
        filler = os.path.join(self.root, "filler")
        # Unbuffered: with a buffer, close() would flush the block that did not
        # fit and raise ENOSPC out of the `with`.
        with open(filler, "wb", buffering=0) as f:
            try:
                while True:
                    f.write(b"\0" * 4096)
            except OSError:
                pass
        os.truncate(filler, max(os.path.getsize(filler) - 64 * 1024, 0))
        os.rename(os.path.join(lab, ".load.part"), os.path.join(lab, "load.csv"))
        logf = os.path.join(self.root, "log", "ferrum.log")

        def log():
            try:
                with open(logf, errors="replace") as f:
                    return f.read()
            except FileNotFoundError:
                return ""

        deadline = time.time() + 30
        while "will retry" not in log() and time.time() < deadline:
            self.assertIsNone(self.daemon.poll(), "daemon died on a full disk")
            time.sleep(0.2)
        self.assertIn("will retry", log(), "no clear log line about the failed import")
        self.assertIsNone(self.daemon.poll())
        self.assertFalse(os.path.exists(os.path.join(receipts, "load.csv.json")), "a receipt on a failed import")
        waiting = [f for d in ("work", "drop") for _, _, fs in os.walk(os.path.join(self.root, d)) for f in fs
                   if f == "load.csv" or f.startswith("load.csv.")]
        self.assertTrue(waiting, "the file is neither waiting nor stored")
        # Room again: the retry takes it, complete.
        os.remove(filler)
        deadline = time.time() + 40
        while not os.path.exists(os.path.join(receipts, "load.csv.json")) and time.time() < deadline:
            self.assertIsNone(self.daemon.poll())
            time.sleep(0.2)
        import json
        import sqlite3
        with open(os.path.join(receipts, "load.csv.json")) as f:
            self.assertEqual(json.load(f)["status"], "accepted")
        self.daemon.send_signal(signal.SIGTERM)
        _, err = self.daemon.communicate(timeout=30)
        self.assertEqual(self.daemon.returncode, 0, err[-2000:])
        c = sqlite3.connect(os.path.join(self.root, "ferrum.db"))
        try:  # closed before tearDown unmounts the root
            self.assertEqual(c.execute("SELECT count(*) FROM load_points").fetchone()[0], 4000)
            self.assertEqual(c.execute("PRAGMA integrity_check").fetchone()[0], "ok")
        finally:
            c.close()


if __name__ == "__main__":
    unittest.main()
