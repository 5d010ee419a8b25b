"""Faults that are not the file's fault, on a real `ferrum serve`: the
database locked by another writer, the archive folder unusable. The file
stays claimed in work/, nothing is half-imported, the daemon logs the cause,
retries with back-off and finishes once the fault is gone."""
import os
import shutil
import sqlite3
import time
import unittest

from test_daemon_watch import LOAD_HEADER, DaemonCase, load_rows


class Faults(DaemonCase):
    def test_database_locked_by_another_writer(self):
        self.start_daemon()
        blocker = sqlite3.connect(self.path("ferrum.db"), isolation_level=None, timeout=1)
        blocker.execute("BEGIN IMMEDIATE")  # holds the write lock: every import must wait
        try:
            self.drop("while-locked.csv", LOAD_HEADER + "".join(load_rows("T1", 0, 48)))
            self.wait_for(lambda: "could not process" in self.site_log(), timeout=20, what="failure logged")
            # Claimed, not imported, not rejected: waiting in work/ for the retry.
            self.assertTrue(os.path.exists(self.path("work", self.party, "while-locked.csv")))
            self.assertFalse(self.has_receipt("while-locked.csv"))
            self.assertEqual(blocker.execute("SELECT count(*) FROM load_points").fetchone()[0], 0)
        finally:
            blocker.execute("ROLLBACK")
            blocker.close()
        self.wait_for(lambda: self.has_receipt("while-locked.csv"), timeout=30, what="import after the lock")
        self.assertEqual(self.receipt("while-locked.csv")["status"], "accepted")
        self.assertEqual(self.count("load_points"), 48)
        self.assertEqual(os.listdir(self.path("work", self.party)), [])
        self.assertEqual(self.stop_daemon(), 0)

    def test_archive_unusable_then_repaired(self):
        self.start_daemon()
        # archive/ replaced by a plain file: the committed file cannot be moved.
        shutil.rmtree(self.path("archive"))
        with open(self.path("archive"), "w") as f:
            f.write("not a folder\n")
        self.drop("no-archive.csv", LOAD_HEADER + "".join(load_rows("T2", 0, 24)))
        self.wait_for(lambda: "could not process" in self.site_log(), timeout=20, what="failure logged")
        self.assertTrue(os.path.exists(self.path("work", self.party, "no-archive.csv")))
        time.sleep(2.5)  # at least one retry fails too
        self.assertIn("retry failed", self.site_log())
        self.assertIsNone(self.daemon.poll())
        os.remove(self.path("archive"))
        os.mkdir(self.path("archive"))
        self.wait_for(lambda: self.has_receipt("no-archive.csv"), timeout=30, what="receipt after repair")
        r = self.receipt("no-archive.csv")
        self.assertEqual(r["status"], "accepted")
        self.assertTrue(os.path.exists(self.path(r["stored_as"])))
        # Imported exactly once.
        self.assertEqual(self.count("load_points"), 24)
        with self.db() as c:
            self.assertEqual(c.execute("SELECT count(*) FROM files WHERE original_name='no-archive.csv'").fetchone()[0], 1)
        self.assertEqual(self.stop_daemon(), 0)


if __name__ == "__main__":
    unittest.main()
