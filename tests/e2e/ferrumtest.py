"""Helpers shared by the end-to-end tests: a temporary site root, running the
real ferrum binary, reading receipts and PDFs."""
import json
import os
import shutil
import signal
import sqlite3
import subprocess
import tempfile
import time
import unittest

FERRUM = os.environ.get("FERRUM_BIN", "ferrum")
SOURCE = os.environ.get("FERRUM_SOURCE", os.path.join(os.path.dirname(__file__), "..", ".."))


def run(*args, check=True, **kw):
    """Runs ferrum with args; returns the CompletedProcess."""
    p = subprocess.run([FERRUM, *args], capture_output=True, text=True, timeout=kw.pop("timeout", 300), **kw)
    if check and p.returncode not in (0,):
        raise AssertionError(f"ferrum {' '.join(args)} exited {p.returncode}\nstdout:\n{p.stdout}\nstderr:\n{p.stderr}")
    return p


def pdftotext(path):
    return subprocess.run(["pdftotext", "-layout", path, "-"], capture_output=True, text=True, check=True).stdout


def qpdf_check(path):
    p = subprocess.run(["qpdf", "--check", path], capture_output=True, text=True)
    return p.returncode == 0, p.stdout + p.stderr


REGISTER = """unit_id,site,rated_mva,hv_kv,lv_kv,cooling,year_built,vector_group,criticality
T1,Quillmere,40,132,33,ONAF,1985,Dyn11,4
T2,Quillmere,10,33,11,ONAN,2015,Dyn11,2
"""


def drop_file(folder, name, content, mode="w"):
    """Drops a file the safe way: temporary name in the folder, then rename."""
    os.makedirs(folder, exist_ok=True)
    tmp = os.path.join(folder, "." + name + ".part")
    with open(tmp, mode) as f:
        f.write(content)
    os.rename(tmp, os.path.join(folder, name))
    return os.path.join(folder, name)


class SiteTestCase(unittest.TestCase):
    """A fresh site root per test, removed afterwards."""

    party = "planning"

    def setUp(self):
        self.root = tempfile.mkdtemp(prefix="ferrum-e2e-")
        run("init", "--root", self.root)
        self.daemon = None

    def tearDown(self):
        if self.daemon and self.daemon.poll() is None:
            self.daemon.kill()
            self.daemon.wait()
        shutil.rmtree(self.root, ignore_errors=True)

    def path(self, *parts):
        return os.path.join(self.root, *parts)

    def write_config(self, extra=""):
        with open(self.path("ferrum.ini"), "a") as f:
            f.write("\n" + extra + "\n")

    def drop(self, name, content, party=None, mode="w"):
        """Drops a file the safe way: temporary name, then rename."""
        return drop_file(self.path("drop", party or self.party), name, content, mode)

    def receipt(self, name, party=None):
        with open(self.path("drop", party or self.party, "receipts", name + ".json")) as f:
            return json.load(f)

    def db(self):
        return sqlite3.connect(self.path("ferrum.db"))

    def count(self, table):
        with self.db() as c:
            return c.execute(f"SELECT count(*) FROM {table}").fetchone()[0]

    def ingest(self, *files, expect=0):
        p = run("ingest", "--root", self.root, *files, check=False)
        self.assertEqual(p.returncode, expect, p.stdout + p.stderr)
        return p

    def start_daemon(self, *extra):
        self.daemon = subprocess.Popen([FERRUM, "serve", "--root", self.root, *extra],
                                       stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
        deadline = time.time() + 20
        while time.time() < deadline:
            if os.path.exists(self.path("status.json")):
                return self.daemon
            time.sleep(0.1)
        raise AssertionError("daemon did not start")

    def stop_daemon(self, sig=signal.SIGTERM, timeout=15):
        self.daemon.send_signal(sig)
        out, err = self.daemon.communicate(timeout=timeout)
        return self.daemon.returncode, out, err

    def wait_for(self, predicate, timeout=30, what="condition"):
        deadline = time.time() + timeout
        while time.time() < deadline:
            if predicate():
                return
            time.sleep(0.1)
        raise AssertionError(f"timed out waiting for {what}")
