"""Hostile drops against the running daemon: links, odd names, a file that
grows while it is read, paths and SQL inside cell values.

What every case checks: the daemon keeps running, nothing outside the site
root is read, moved or created, and text from files is stored as text.
"""
import csv
import hashlib
import io
import json
import os
import signal
import sqlite3
import subprocess
import tempfile
import threading
import time
import unittest

import ferrumtest
from ferrumtest import SiteTestCase

REGISTER_HEAD = "unit_id,site,serial,rated_mva,hv_kv,lv_kv,cooling,year_built,vector_group,criticality\n"

# A value of every flavour of SQL injection; stored as text it is harmless.
SQL = [
    "x'); DROP TABLE files;--",
    "1 OR 1=1; DELETE FROM units",
    "\"; UPDATE files SET status='accepted' --",
    "Robert'); ATTACH DATABASE '/tmp/ferrum-pwn.db' AS p;--",
]


def tree(root):
    """Every path under root, relative."""
    out = set()
    for dirpath, dirnames, filenames in os.walk(root):
        for n in dirnames + filenames:
            out.add(os.path.relpath(os.path.join(dirpath, n), root))
    return out


class HostileDropTest(SiteTestCase):
    party = "lab"

    def setUp(self):
        super().setUp()
        self.outside = tempfile.mkdtemp(prefix="ferrum-outside-")
        with open(self.path("ferrum.ini")) as f:
            text = f.read()
        text = text.replace("settle_seconds = 5", "settle_seconds = 1").replace("rescan_seconds = 30", "rescan_seconds = 1")
        text = text.replace("debounce_seconds = 10", "debounce_seconds = 0")
        text += "\n[party.lab]\nkinds = *\nsites = *\n[party.other]\nkinds = *\nsites = *\n"
        with open(self.path("ferrum.ini"), "w") as f:
            f.write(text)
        self.drop("register.csv", REGISTER_HEAD + "T1,North,S1,40,132,33,ONAF,1990,Dyn11,3\n")

    def tearDown(self):
        super().tearDown()
        subprocess.run(["rm", "-rf", self.outside])

    def serve_until_done(self, timeout=30):
        """Starts the daemon, waits until no file waits in a party folder or
        work/, stops it; returns its log."""
        # Not ferrumtest's start_daemon: the log may hold the non-UTF-8 bytes
        # of a hostile file name.
        self.daemon = subprocess.Popen([ferrumtest.FERRUM, "serve", "--root", self.root], stdout=subprocess.PIPE,
                                       stderr=subprocess.PIPE, text=True, errors="replace")
        self.wait_for(lambda: os.path.exists(self.path("status.json")), what="daemon start")

        def idle():
            for top in ("drop", "work"):
                for dirpath, dirnames, filenames in os.walk(self.path(top)):
                    dirnames[:] = [d for d in dirnames if d != "receipts"]
                    if any(not f.startswith(".") for f in filenames):
                        return False
            return True

        self.wait_for(idle, timeout=timeout, what="every drop processed")
        time.sleep(1.5)
        code, out, err = self.stop_daemon()
        self.assertEqual(code, 0, err[-3000:])
        return err

    def receipt_of(self, name, party="lab"):
        with open(self.path("drop", party, "receipts", name + ".json"), encoding="utf-8", errors="surrogateescape") as f:
            return json.load(f)

    # --- links -------------------------------------------------------------

    def test_links_are_refused_unread_and_their_targets_untouched(self):
        secret = os.path.join(self.outside, "secret.csv")
        with open(secret, "w") as f:
            f.write("unit_id,sample_date,h2_ppm\nT1,2024-01-05,77777\n")
        os.chmod(secret, 0o600)
        before = os.stat(secret)
        lab = self.path("drop", "lab")
        os.symlink(secret, os.path.join(lab, "symlink.csv"))
        os.symlink(self.outside, os.path.join(lab, "dirlink"))
        os.link(secret, os.path.join(lab, "hardlink.csv"))
        # A party folder that is itself a link to a folder outside the root.
        os.makedirs(os.path.join(self.outside, "elsewhere"))
        with open(os.path.join(self.outside, "elsewhere", "inside.csv"), "w") as f:
            f.write("unit_id,sample_date,h2_ppm\nT1,2024-01-06,88888\n")
        if os.path.isdir(self.path("drop", "other")):
            os.rmdir(self.path("drop", "other"))
        os.symlink(os.path.join(self.outside, "elsewhere"), self.path("drop", "other"))
        outside_before = tree(self.outside)

        self.serve_until_done()

        for name in ("symlink.csv", "hardlink.csv", "dirlink"):
            r = self.receipt_of(name)
            self.assertEqual(r["status"], "rejected", name)
            self.assertIn("link", r["reason"], name)
            self.assertFalse(r.get("sha256"), f"{name} was read (it has a hash)")
        # The targets are where they were, unchanged, and never read into the database.
        after = os.stat(secret)
        self.assertEqual((after.st_size, after.st_mtime_ns, after.st_mode), (before.st_size, before.st_mtime_ns, before.st_mode))
        self.assertEqual(tree(self.outside), outside_before)
        with self.db() as c:
            dump = "\n".join(c.iterdump())
        self.assertNotIn("77777", dump)
        self.assertNotIn("88888", dump)
        # What went to quarantine/ is the link itself, not a copy of its target.
        quarantined = [os.path.join(d, f) for d, _, fs in os.walk(self.path("quarantine")) for f in fs
                       if "receipts" not in d]
        self.assertTrue(any(os.path.islink(p) for p in quarantined), quarantined)
        for p in quarantined:
            if os.path.islink(p):
                self.assertTrue(os.readlink(p).startswith(self.outside))

    # --- names -------------------------------------------------------------

    def test_odd_names_are_stored_once_inside_the_root(self):
        names = [b"a..b.csv", b"..%2f..%2fescape.csv", b"line\nbreak.csv", b"tab\there.csv",
                 b"\xff\xfe-not-utf8.csv", b"x" * 250 + b".csv", b"semi;colon 'quote\".csv"]
        content = "unit_id,sample_date,h2_ppm\nT1,2024-01-{:02d},12\n"
        lab = os.fsencode(self.path("drop", "lab"))
        for i, n in enumerate(names):
            with open(os.path.join(lab, n), "w") as f:
                f.write(content.format(i + 1))
        log = self.serve_until_done()

        # Nothing escaped the root: the only new entries are inside it.
        self.assertFalse(os.path.exists(os.path.join(os.path.dirname(self.root), "escape.csv")))
        stored = [f for d, _, fs in os.walk(os.fsencode(self.path("archive"))) for f in fs]
        # "..%2f..%2fescape.csv" starts with a dot: a temporary name, left alone.
        self.assertTrue(os.path.exists(os.path.join(lab, b"..%2f..%2fescape.csv")))
        self.assertEqual(len(stored), len(names), stored)  # the others + the register
        with self.db() as c:
            self.assertEqual(c.execute("SELECT count(*) FROM oil_samples").fetchone()[0], len(names) - 1)
            self.assertEqual(c.execute("SELECT count(*) FROM files WHERE status='accepted'").fetchone()[0], len(names))
        # A name cannot forge a log line: each processed file is one line.
        self.assertNotIn("\nbreak.csv", log)

    # --- a file that grows while it is read ---------------------------------

    def test_file_growing_while_read_is_never_half_imported(self):
        """A writer keeps appending to a file after renaming it into place
        (the file is taken at once). Whatever the daemon decides, the rows in
        the database must be exactly those of the bytes it archived, or the
        file is rejected as changed: never a prefix of a file archived whole."""
        self.serve_until_done()  # the register
        lab = self.path("drop", "lab")
        head = "unit_id,timestamp,load_mva,ambient_c,top_oil_c\n"
        tmp = os.path.join(lab, ".grow.csv.part")
        f = open(tmp, "w")
        f.write(head)
        t0 = 1577836800
        for k in range(20000):
            f.write(f"T1,{time.strftime('%Y-%m-%dT%H:%MZ', time.gmtime(t0 + k * 900))},{10 + k % 7},5,40\n")
        f.flush()
        stop = threading.Event()

        def keep_writing():
            k = 20000
            while not stop.is_set() and k < 400000:
                for _ in range(500):
                    f.write(f"T1,{time.strftime('%Y-%m-%dT%H:%MZ', time.gmtime(t0 + k * 900))},{10 + k % 7},5,40\n")
                    k += 1
                f.flush()
            f.close()

        self.start_daemon()
        writer = threading.Thread(target=keep_writing)
        os.rename(tmp, os.path.join(lab, "grow.csv"))
        writer.start()
        self.wait_for(lambda: os.path.exists(os.path.join(lab, "receipts", "grow.csv.json")), timeout=60,
                      what="the growing file's receipt")
        stop.set()
        writer.join()
        time.sleep(0.5)
        self.stop_daemon()
        r = self.receipt_of("grow.csv")
        with open(self.path(r["stored_as"]), "rb") as fh:
            archived = fh.read()
        lines = archived.decode().count("\n") - 1
        with self.db() as c:
            points = c.execute("SELECT count(*) FROM load_points").fetchone()[0]
            db_sha = c.execute("SELECT sha256 FROM files WHERE original_name='grow.csv'").fetchone()[0]
        if r["status"] == "accepted":
            self.assertEqual(points, lines, "rows in the database differ from the archived file")
            self.assertEqual(db_sha, hashlib.sha256(archived).hexdigest(), "recorded hash is not the archived file's")
        else:
            # Rejected (changed while read, or cut in the middle of a row):
            # then nothing of it is in the database.
            self.assertEqual(points, 0)

    # --- paths and SQL in cell values ----------------------------------------

    def test_paths_and_sql_in_cells_are_stored_as_text(self):
        self.serve_until_done()  # the register
        evil_id = "../../other/x"

        def table(*rows):
            out = io.StringIO()
            csv.writer(out, lineterminator="\n").writerows(rows)
            return out.getvalue()

        self.drop("register2.csv", REGISTER_HEAD + table(
            [evil_id, "North", SQL[0], 40, 132, 33, "ONAF", 1990, "Dyn11", 3],
            [SQL[1], SQL[2], SQL[3], 10, 33, 11, "ONAN", 2001, "Dyn11", 2]))
        self.drop("oil.csv", table(
            ["unit_id", "sample_date", "lab_ref", "sample_point", "breakdown_method", "h2_ppm", "breakdown_kv"],
            [evil_id, "2024-03-01", SQL[0], "../../../../tmp/ferrum-pwn", "ASTM D877", 10, 60],
            [SQL[1], "2024-03-02", "../receipts/evil.json", "main_tank", "ASTM D877", 11, 61]))
        self.drop("ir.csv", table(
            ["unit_id", "survey_date", "component", "spot_c", "reference_c", "image_ref", "note"],
            [evil_id, "2024-03-03", SQL[2], 40, 30, "../../../../tmp/ferrum-pwn.jpg", SQL[3]]))
        self.drop("insp.csv", table(
            ["unit_id", "inspection_date", "item", "rating", "note", "inspector"],
            [evil_id, "2024-03-04", "bushings", "good", SQL[0], "../../other/receipts/x.json"]))
        self.serve_until_done()
        for n in ("register2.csv", "oil.csv", "ir.csv", "insp.csv"):
            self.assertEqual(self.receipt_of(n)["status"], "accepted", self.receipt_of(n))
        self.assertFalse(os.path.exists("/tmp/ferrum-pwn"))
        self.assertFalse(os.path.exists("/tmp/ferrum-pwn.db"))
        self.assertFalse(os.path.exists("/tmp/ferrum-pwn.jpg"))
        self.assertEqual(os.listdir(self.path("drop", "other")) if os.path.isdir(self.path("drop", "other")) else [], [])
        with self.db() as c:
            self.assertEqual(c.execute("PRAGMA integrity_check").fetchone()[0], "ok")
            tables = {r[0] for r in c.execute("SELECT name FROM sqlite_master WHERE type='table'")}
            self.assertTrue({"files", "units", "oil_samples", "infrared_scans", "inspections"} <= tables)
            self.assertEqual(c.execute("SELECT count(*) FROM units").fetchone()[0], 3)
            self.assertEqual(c.execute("SELECT count(*) FROM files WHERE status != 'accepted'").fetchone()[0], 0)
            self.assertEqual(c.execute("SELECT serial FROM units WHERE unit_id=?", (evil_id,)).fetchone()[0], SQL[0])
            self.assertEqual(c.execute("SELECT site, serial FROM units WHERE unit_id=?", (SQL[1],)).fetchone(),
                             (SQL[2], SQL[3]))
            self.assertEqual(c.execute("SELECT lab_ref, sample_point, breakdown_method FROM oil_samples s JOIN units u "
                                       "USING (unit_key) WHERE u.unit_id=?", (evil_id,)).fetchone(),
                             # sample points are stored in snake_case: '-' becomes '_'
                             (SQL[0], "../../../../tmp/ferrum_pwn", "ASTM D877"))
            self.assertEqual(c.execute("SELECT component, image_ref, note FROM infrared_scans").fetchone(),
                             (SQL[2], "../../../../tmp/ferrum-pwn.jpg", SQL[3]))
            self.assertEqual(c.execute("SELECT note, inspector FROM inspections").fetchone(),
                             (SQL[0], "../../other/receipts/x.json"))
        # Reports of the hostile units stay inside reports/.
        for dirpath, _, filenames in os.walk(self.root):
            for f in filenames:
                self.assertNotIn("..", os.path.relpath(os.path.join(dirpath, f), self.root).split(os.sep))


if __name__ == "__main__":
    unittest.main()
