"""Hostile drops: links, devices, FIFOs and oversized files are refused
without being read; no name, in the file system or inside a file, makes
ferrum write outside the site root."""
import json
import os
import shutil
import sys
import tempfile
import unittest

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "ingest_corpus"))
from ingest_fixtures import REGISTER, IngestCase  # noqa: E402
from ferrumtest import run  # noqa: E402

LAB = "unit_id,sample_date,lab_ref,h2_ppm\nT1,2026-03-14,{ref},10\n"


class NestedRoot(IngestCase):
    """The site root is ROOT/site inside a private folder, so that anything
    written next to the root (or above it) can be seen."""

    def setUp(self):
        self.daemon = None
        self.outer = tempfile.mkdtemp(prefix="ferrum-e2e-outer-")
        self.root = os.path.join(self.outer, "site")
        self.outside = os.path.join(self.outer, "outside")
        os.makedirs(self.outside)
        run("init", "--root", self.root)
        self.drop("units.csv", REGISTER)
        self.ingest()

    def tearDown(self):
        super().tearDown()
        shutil.rmtree(self.outer, ignore_errors=True)

    def ingest_bounded(self, expect):
        # A read of a FIFO would block: a hang fails the test instead of stalling CI.
        p = run("ingest", "--root", self.root, check=False, timeout=30, errors="surrogateescape")
        self.assertEqual(p.returncode, expect, p.stdout + p.stderr)
        return p

    def assert_nothing_written_outside(self):
        self.assertEqual(sorted(os.listdir(self.outer)), ["outside", "site"])

    def receipts(self, party="planning"):
        """Every receipt JSON of a party, by the file name it reports."""
        out = {}
        folder = os.path.join(self.root, "drop", party, "receipts")
        for n in os.listdir(folder):
            if n.endswith(".json"):
                with open(os.path.join(folder, n), "rb") as f:
                    r = json.loads(f.read().decode("utf-8"))  # strict: a receipt is valid UTF-8
                out[r["file"]] = r
        return out


def receipt_name(name):
    """A file name as a receipt reports it: bytes that are not UTF-8 as \\xNN."""
    return "".join(f"\\x{ord(c) - 0xDC00:02X}" if 0xDC80 <= ord(c) <= 0xDCFF else c for c in name)


class RefusedUnread(NestedRoot):
    def refuse_link(self, make_link, name, reason):
        """A file outside the drop tree reached through a link: the link is refused
        unread (no hash), the file outside stays as it was, nothing is imported."""
        target = os.path.join(self.outside, "target.csv")
        with open(target, "w") as f:
            f.write(LAB.format(ref="outside"))
        make_link(target, self.path("drop", "planning", name))
        self.ingest_bounded(4)
        r = self.receipt(name)
        self.assertEqual(r["status"], "rejected")
        self.assertIn(reason, r["reason"])
        self.assertIsNone(r["sha256"])  # never read
        with open(target) as f:
            self.assertEqual(f.read(), LAB.format(ref="outside"))
        self.assertFalse(os.path.lexists(self.path("drop", "planning", name)))
        self.assertEqual(self.count("oil_samples"), 0)
        self.assert_nothing_written_outside()

    def test_symlink_is_refused_and_its_target_left_alone(self):
        self.refuse_link(os.symlink, "link.csv", "symbolic link")

    def test_hard_link_to_a_file_outside_is_refused(self):
        self.refuse_link(os.link, "hard.csv", "hard link")

    def test_symlink_to_a_fifo_is_not_opened(self):
        fifo = os.path.join(self.outside, "pipe")
        os.mkfifo(fifo)
        os.symlink(fifo, self.path("drop", "planning", "pipe-link.csv"))
        self.ingest_bounded(4)
        self.assertIn("symbolic link", self.receipt("pipe-link.csv")["reason"])

    def test_fifo_is_refused_without_blocking(self):
        os.mkfifo(self.path("drop", "planning", "fifo.csv"))
        self.ingest_bounded(4)
        r = self.receipt("fifo.csv")
        self.assertEqual(r["status"], "rejected")
        self.assertIn("FIFO", r["reason"])
        self.assertIsNone(r["sha256"])

    def test_file_over_the_size_limit_is_refused_unread(self):
        self.set_config("max_file_mb = 2048", "max_file_mb = 1")
        big = self.drop("big.csv", "unit_id,timestamp,load_pu\n" +
                        "".join(f"T1,2026-03-{1 + i // 1440:02d}T{i // 60 % 24:02d}:{i % 60:02d}Z,0.5\n"
                                for i in range(50000)))
        self.assertGreater(os.path.getsize(big), 1024 * 1024)
        self.drop("small.csv", LAB.format(ref="ok"))
        self.ingest_bounded(4)
        r = self.receipt("big.csv")
        self.assertEqual(r["status"], "rejected")
        self.assertIn("ingest.max_file_mb", r["reason"])
        self.assertIsNone(r["sha256"])
        self.assertFalse(os.path.exists(big))
        self.assertEqual(self.count("load_points"), 0)
        self.assertEqual(self.receipt("small.csv")["status"], "accepted")


class HostileNames(NestedRoot):
    NAMES = [
        "a..b.csv",
        "x..%2f..%2fescape.csv",
        "x\ny.csv",
        "new\nline\n",
        "x" * 246 + ".csv",              # 250 bytes
        "\u00e9" * 123 + ".csv",          # 250 bytes of two-byte characters
        os.fsdecode(b"lab-\xff\xfe\x80.csv"),  # not UTF-8
        "-rf .csv",
        " space ",
        "back\\..\\slash.csv",
        "tab\there.csv",
    ]

    def test_hostile_file_names_stay_inside_the_root_and_get_receipts(self):
        folder = self.path("drop", "planning")
        for i, name in enumerate(self.NAMES):
            content = LAB.format(ref=f"N{i}") if i % 2 == 0 else "unit_id,sample_date,h2_ppm\nT1,2026-03-14,-1\n# " + str(i)
            tmp = os.path.join(folder, f".tmp{i}.part")
            with open(tmp, "w") as f:
                f.write(content)
            os.rename(tmp, os.path.join(folder, name))
        with open(os.path.join(folder, "..hidden.csv"), "w") as f:  # a temporary name: left alone
            f.write(LAB.format(ref="hidden"))
        self.ingest_bounded(4)
        got = self.receipts()
        for i, name in enumerate(self.NAMES):
            with self.subTest(name=name[:40]):
                self.assertIn(receipt_name(name), got)
                r = got[receipt_name(name)]
                self.assertEqual(r["status"], "accepted" if i % 2 == 0 else "rejected")
                stored = os.path.join(self.root, r["stored_as"])
                if receipt_name(name) != name:  # the stored name keeps the original bytes
                    stored = os.path.join(self.root, os.path.dirname(r["stored_as"]),
                                          os.path.basename(r["stored_as"]).replace(receipt_name(name)[:-4], name[:-4]))
                self.assertTrue(os.path.exists(stored), r["stored_as"])
                self.assertEqual(os.path.commonpath([os.path.realpath(stored), os.path.realpath(self.root)]),
                                 os.path.realpath(self.root))
                self.assertNotIn("..", r["stored_as"].split("/"))
        self.assertEqual(sorted(n for n in os.listdir(folder)), ["..hidden.csv", "receipts"])  # all others taken
        self.assertEqual(self.count("oil_samples"), (len(self.NAMES) + 1) // 2)
        self.assertEqual(os.listdir(self.path("work", "planning")), [])
        self.assert_nothing_written_outside()

    def test_hostile_unit_ids_cannot_name_a_path_outside(self):
        ids = ["../../escape", "..", "/etc/passwd", "a/b/c", "x" * 250, "dot.", "\u00e9\u00e9"]
        rows = "".join(f'"{u}",Quillmere,40,132,33,ONAN,2000\n' for u in ids)
        self.drop("evil-units.csv", "unit_id,site,rated_mva,hv_kv,lv_kv,cooling,year_built\n" + rows)
        self.ingest_bounded(0)
        out = os.path.join(self.root, "out")
        p = run("report", "--root", self.root, "--out", out, *ids, check=False, timeout=60)
        self.assertEqual(p.returncode, 0, p.stderr)
        written = p.stdout.strip().split("\n")
        self.assertEqual(len(written), len(ids))
        for path in written:
            self.assertEqual(os.path.dirname(os.path.realpath(path)), os.path.realpath(out), path)
            self.assertLessEqual(len(os.path.basename(path).encode()), 255)
        self.assertEqual(len(set(written)), len(ids), "two units share one report file")
        self.assert_nothing_written_outside()


if __name__ == "__main__":
    unittest.main()
