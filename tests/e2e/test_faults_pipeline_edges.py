"""Edges of the pipeline's crash safety and of the root lock:

- a file refused unread (symbolic link, hard link, stray file in drop/) whose
  row was committed but whose move into quarantine/ a crash interrupted: the
  next start finishes the move under that row, no second 'rejected' row;
- a folder directly in drop/ (a party folder, a folder made by hand) is
  never taken for a dropped file;
- `ferrum status` tells the daemon from a `ferrum ingest` holding the lock.

The crash point is not hit with a kill (the window is a few microseconds):
the state it leaves is made by hand from a real refusal, by moving the
quarantined file back to where it was dropped and removing its receipt (the
receipt is written after the move, so a crash before the move leaves none).
"""
import fcntl
import json
import os
import re
import time
import unittest

import ferrumtest
from ferrumtest import SiteTestCase, run
from test_faults_environment import quick_config

OIL = "unit_id,sample_date,h2_ppm,ch4_ppm\nT1,2024-01-{:02d},{},5\n"


class LabSiteCase(SiteTestCase):
    """A site with a 'lab' party (oil samples) and the units register imported."""

    def setUp(self):
        super().setUp()
        quick_config(self.path("ferrum.ini"), "\n[party.lab]\nkinds = oil_lab\nsites = *\n")
        os.makedirs(self.path("drop", "lab"))
        self.drop("register.csv", ferrumtest.REGISTER)
        self.ingest()


class InterruptedRefusalTest(LabSiteCase):
    def rows_named(self, name):
        with self.db() as c:
            return c.execute("SELECT status, stored_as FROM files WHERE original_name = ?", (name,)).fetchall()

    def quarantined(self, name):
        stem = name.split(".")[0]
        return sorted(n for n in os.listdir(self.path("quarantine")) if n.startswith(stem))

    def receipts_dir(self, party):
        return self.path("quarantine", "receipts") if party is None else self.path("drop", party, "receipts")

    def undo_the_move(self, name, party):
        """The state of a crash between the row's commit and the move: the file
        back where it was dropped, no receipt, the row in the database."""
        (status, stored_as), = self.rows_named(name)
        self.assertEqual(status, "rejected")
        back = self.path("drop", name) if party is None else self.path("drop", party, name)
        os.rename(self.path(stored_as), back)
        for ext in (".json", ".txt"):
            os.remove(os.path.join(self.receipts_dir(party), name + ext))
        return stored_as

    def refuse_a_link(self, name):
        """A symbolic link dropped into drop/lab/, refused by `ferrum ingest`."""
        target = self.path("outside.csv")
        with open(target, "w") as f:
            f.write(OIL.format(1, 10))
        os.symlink(target, self.path("drop", "lab", name))
        self.ingest(expect=4)  # 4: a file was rejected

    def check_finished_once(self, name, party, stored_as):
        self.assertEqual(self.rows_named(name), [("rejected", stored_as)], "a second row for one refused file")
        self.assertTrue(os.path.lexists(self.path(stored_as)), "the move was not finished")
        self.assertEqual(len(self.quarantined(name)), 1, self.quarantined(name))
        back = self.path("drop", name) if party is None else self.path("drop", party, name)
        self.assertFalse(os.path.lexists(back), "the file is still where it was dropped")
        with open(os.path.join(self.receipts_dir(party), name + ".json")) as f:
            r = json.load(f)
        self.assertEqual((r["status"], r["stored_as"]), ("rejected", stored_as))

    def test_symbolic_link_refused_then_crash_before_the_move(self):
        self.refuse_a_link("link.csv")
        stored_as = self.undo_the_move("link.csv", "lab")
        p = self.ingest(expect=4)  # 4: recover() reports the finished refusal
        self.assertIn("link.csv", p.stdout)
        self.check_finished_once("link.csv", "lab", stored_as)
        self.assertTrue(os.path.islink(self.path(stored_as)))  # moved, never followed
        self.assertEqual(self.count("oil_samples"), 0)

    def test_hard_link_refused_then_crash_before_the_move(self):
        other = self.path("other-name.csv")
        with open(other, "w") as f:
            f.write(OIL.format(2, 11))
        os.link(other, self.path("drop", "lab", "hard.csv"))
        self.ingest(expect=4)
        stored_as = self.undo_the_move("hard.csv", "lab")
        self.ingest(expect=4)
        self.check_finished_once("hard.csv", "lab", stored_as)

    def test_stray_file_in_drop_then_crash_before_the_move_under_the_daemon(self):
        with open(self.path("drop", "stray.csv"), "w") as f:
            f.write(OIL.format(3, 12))
        self.ingest(expect=4)
        stored_as = self.undo_the_move("stray.csv", None)
        self.start_daemon()
        self.wait_for(lambda: os.path.exists(os.path.join(self.receipts_dir(None), "stray.csv.json")), timeout=15,
                      what="the receipt of the finished refusal")
        code, _, err = self.stop_daemon()
        self.assertEqual(code, 0, err[-2000:])
        self.check_finished_once("stray.csv", None, stored_as)
        with open(self.path("log", "ferrum.log"), errors="replace") as f:
            self.assertIn("finished the move of a refused file", f.read())

    def test_a_new_delivery_under_the_same_name_is_a_new_refusal(self):
        """The first refusal was complete (file and receipt in place): the same
        name refused again is a second delivery and gets its own row."""
        self.refuse_a_link("again.csv")
        self.refuse_a_link("again.csv")
        rows = self.rows_named("again.csv")
        self.assertEqual(len(rows), 2, rows)
        self.assertNotEqual(rows[0][1], rows[1][1])
        self.assertEqual(len(self.quarantined("again.csv")), 2)

    def test_a_file_dropped_since_that_may_be_read_is_imported(self):
        """The refused link was replaced by the party with a real file under the
        same name before the restart: that file is a new delivery, imported."""
        self.refuse_a_link("swap.csv")
        stored_as = self.undo_the_move("swap.csv", "lab")
        os.remove(self.path("drop", "lab", "swap.csv"))
        self.drop("swap.csv", OIL.format(4, 13), party="lab")
        self.ingest()
        self.assertEqual(self.receipt("swap.csv", "lab")["status"], "accepted")
        self.assertEqual(self.count("oil_samples"), 1)
        statuses = sorted(s for s, _ in self.rows_named("swap.csv"))
        self.assertEqual(statuses, ["accepted", "rejected"])
        self.assertFalse(os.path.lexists(self.path(stored_as)))


class FolderInDropTest(LabSiteCase):
    """A folder is never a dropped file: not a party folder given by name, not
    a folder made by hand directly in drop/ (before 2080a73 such a folder was
    refused as 'not in a party folder' and moved, whole, into quarantine/)."""

    def files_rows(self):
        return self.count("files")

    def quarantine_entries(self):
        return [n for n in os.listdir(self.path("quarantine")) if n != "receipts"]

    def test_ingest_given_folders_leaves_them_alone(self):
        os.makedirs(self.path("drop", "made-by-hand"))
        with open(self.path("drop", "lab", "keep.txt.part"), "w") as f:
            f.write("still being written")
        before = self.files_rows()
        p = run("ingest", "--root", self.root, self.path("drop", "lab"), self.path("drop", "made-by-hand"),
                self.path("drop", "lab", "receipts"), check=False)
        self.assertEqual(p.returncode, 0, p.stdout + p.stderr)
        self.assertTrue(os.path.isdir(self.path("drop", "lab")))
        self.assertTrue(os.path.isdir(self.path("drop", "made-by-hand")))
        self.assertTrue(os.path.exists(self.path("drop", "lab", "keep.txt.part")))
        self.assertEqual(self.files_rows(), before)
        self.assertEqual(self.quarantine_entries(), [])
        self.assertFalse(os.path.exists(self.path("quarantine", "receipts", "made-by-hand.json")))

    def test_folder_made_in_drop_while_the_daemon_runs(self):
        self.start_daemon()
        before = self.files_rows()
        os.makedirs(self.path("drop", "new-folder"))
        os.makedirs(self.path("drop", "another", "inner"))
        self.drop("oil-1.csv", OIL.format(1, 10), party="lab")
        self.wait_for(lambda: os.path.exists(self.path("drop", "lab", "receipts", "oil-1.csv.json")), timeout=15,
                      what="the receipt of a file dropped beside the new folders")
        time.sleep(1.5)  # at least one rescan of drop/ (rescan_seconds = 1)
        code, _, err = self.stop_daemon()
        self.assertEqual(code, 0, err[-2000:])
        self.assertTrue(os.path.isdir(self.path("drop", "new-folder")))
        self.assertTrue(os.path.isdir(self.path("drop", "another", "inner")))
        self.assertEqual(self.files_rows(), before + 1)
        self.assertEqual(self.quarantine_entries(), [])
        # A later run over the same drop/ still leaves them alone.
        self.ingest()
        self.assertTrue(os.path.isdir(self.path("drop", "new-folder")))
        self.assertEqual(self.files_rows(), before + 1)


class StatusLockHolderTest(SiteTestCase):
    def status(self, *extra):
        return run("status", "--root", self.root, *extra, check=False)

    def test_lock_file_names_the_command_that_holds_it(self):
        self.drop("register.csv", ferrumtest.REGISTER)
        run("ingest", "--root", self.root)
        with open(self.path("ferrum.lock")) as f:
            self.assertRegex(f.read(), r"^\d+ ingest\n$")
        self.start_daemon()
        with open(self.path("ferrum.lock")) as f:
            self.assertEqual(f.read(), f"{self.daemon.pid} serve\n")
        self.assertEqual(self.status().returncode, 0)
        self.assertEqual(self.stop_daemon()[0], 0)

    def test_status_while_an_ingest_holds_the_lock(self):
        # Hold the lock as a `ferrum ingest` does (flock + "PID ingest"): the
        # real ingest is too quick to be caught while it runs.
        with open(self.path("ferrum.lock"), "a+") as lock:
            fcntl.flock(lock, fcntl.LOCK_EX | fcntl.LOCK_NB)
            lock.truncate(0)
            lock.write(f"{os.getpid()} ingest\n")
            lock.flush()
            p = self.status()
            self.assertEqual(p.returncode, 3, p.stdout + p.stderr)  # 3: the daemon is not running
            self.assertIn("NOT running", p.stdout)
            self.assertIn(f"'ferrum ingest' (pid {os.getpid()}) is working on this root", p.stdout)
            doc = json.loads(self.status("--json").stdout)
            self.assertFalse(doc["running"])
            self.assertEqual(doc["lock_holder"], {"pid": os.getpid(), "command": "ingest"})
            # A second daemon is refused while the ingest runs, naming its pid.
            s = run("serve", "--root", self.root, "--once", check=False, timeout=20)
            self.assertNotEqual(s.returncode, 0)
            self.assertIn(f"pid {os.getpid()}", s.stderr)
            # A lock file of an older version (pid only) is taken as the daemon's.
            lock.truncate(0)
            lock.seek(0)
            lock.write(f"{os.getpid()}\n")
            lock.flush()
            p = self.status()
            self.assertEqual(p.returncode, 0, p.stdout)
            self.assertIn(f"running on {self.root} (pid {os.getpid()}", p.stdout)
            self.assertNotIn("busy", p.stdout)
        p = self.status()
        self.assertEqual(p.returncode, 3)
        self.assertNotIn("busy", p.stdout)
        self.assertIsNone(re.search(r"\bpid\b", p.stdout), p.stdout)


if __name__ == "__main__":
    unittest.main()
