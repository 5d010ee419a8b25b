"""Progress of long commands: on standard error when it is a terminal (a
pseudo-terminal here), nothing when it is a pipe, nothing with --quiet."""
import datetime
import os
import pty
import subprocess
import unittest

from ferrumtest import FERRUM, REGISTER, SiteTestCase

# 40,000 rows: ten ticks of 4,096 rows.
START = datetime.datetime(2024, 1, 1, tzinfo=datetime.timezone.utc)
LOAD = "unit_id,timestamp,load_pu,ambient_c\n" + "".join(
    f"T{1 + i % 2},{(START + datetime.timedelta(hours=i // 2)).strftime('%Y-%m-%dT%H:%MZ')},0.6,10\n"
    for i in range(40_000))


def stderr_on_terminal(*args):
    """Runs ferrum with stderr on a pseudo-terminal; returns what it wrote there."""
    master, slave = pty.openpty()
    p = subprocess.Popen([FERRUM, *args], stdout=subprocess.DEVNULL, stderr=slave)
    os.close(slave)
    out = b""
    while True:
        try:
            chunk = os.read(master, 4096)
        except OSError:  # EIO: the other end closed
            break
        if not chunk:
            break
        out += chunk
    p.wait(timeout=120)
    os.close(master)
    return p.returncode, out.decode("utf-8", "replace")


class Progress(SiteTestCase):
    def setUp(self):
        super().setUp()
        self.drop("units.csv", REGISTER)
        self.ingest()

    def test_ingest_shows_progress_on_a_terminal_only(self):
        self.drop("load.csv", LOAD)
        rc, err = stderr_on_terminal("ingest", "--root", self.root)
        self.assertEqual(rc, 0, err)
        self.assertIn("load.csv: ", err)
        self.assertRegex(err, r"MB \(\d+ %\)")
        self.assertIn("\r", err)

        self.drop("load-2.csv", LOAD.replace("0.6,", "0.7,"))
        p = subprocess.run([FERRUM, "ingest", "--root", self.root], capture_output=True, text=True)
        self.assertEqual(p.returncode, 0, p.stderr)
        self.assertNotIn("MB (", p.stderr)
        self.assertNotIn("\r", p.stderr)

        self.drop("load-3.csv", LOAD.replace("0.6,", "0.8,"))
        rc, err = stderr_on_terminal("ingest", "--root", self.root, "--quiet")
        self.assertEqual(rc, 0, err)
        self.assertNotIn("MB (", err)

    def test_fleet_commands_show_progress_on_a_terminal_only(self):
        for args in (["rank", "--fresh"], ["assess", "--json"], ["report", "--fleet", "--out", self.path("out")],
                     ["report", "--weekly"]):
            rc, err = stderr_on_terminal(*args, "--root", self.root, "--as-of", "2026-11-30")
            self.assertEqual(rc, 0, (args, err))
            self.assertRegex(err, r"(assessing|unit reports): 2/2 units \(100 %\)", args)
            rc, err = stderr_on_terminal(*args, "--root", self.root, "--as-of", "2026-11-30", "--quiet")
            self.assertNotIn("units (", err, args)
            p = subprocess.run([FERRUM, *args, "--root", self.root, "--as-of", "2026-11-30"], capture_output=True,
                               text=True)
            self.assertNotIn("units (", p.stderr, args)


if __name__ == "__main__":
    unittest.main()
