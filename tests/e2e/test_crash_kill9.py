"""Crash safety: the real daemon is killed with SIGKILL at random moments while
files are dropped, and restarted, many times. At the end nothing is lost or
doubled, and the database equals that of a clean run over the same files.

Scale with FERRUM_CRASH_FILES (default 200) and FERRUM_CRASH_KILLS (default
30); FERRUM_CRASH_SEED picks another deterministic sequence (default 1).
The figures of a longer run are in tests/fuzz/RESULTS.md.
"""
import collections
import hashlib
import json
import os
import random
import re
import shutil
import signal
import sqlite3
import subprocess
import tempfile
import time
import unittest

import ferrumtest

FILES = int(os.environ.get("FERRUM_CRASH_FILES", "200"))
KILLS = int(os.environ.get("FERRUM_CRASH_KILLS", "30"))
SEED = int(os.environ.get("FERRUM_CRASH_SEED", "1"))

PARTIES = {  # folder -> kinds
    "planning": "units_register, load_series",
    "lab": "oil_lab",
    "thermo": "infrared",
    "field": "inspection",
}
UNITS = [f"U{i:02d}" for i in range(1, 21)]
ITEMS = ["bushings", "main_tank", "breather", "radiators", "grounding", "foundation"]
RATINGS = ["good", "fair", "poor"]


def configure(root, extra_keys=None):
    """Rewrites ROOT/ferrum.ini: fast settle and rescan, no report rendering
    during the test, and the test's parties."""
    path = os.path.join(root, "ferrum.ini")
    with open(path) as f:
        text = f.read()
    keys = {"settle_seconds": "0", "rescan_seconds": "1", "debounce_seconds": "86400"}
    keys.update(extra_keys or {})
    for key, value in keys.items():
        text = re.sub(rf"(?m)^{key} = .*$", f"{key} = {value}", text)
    text = re.sub(r"(?ms)^\[party\.planning\].*", "", text)
    for name, kinds in PARTIES.items():
        text += f"\n[party.{name}]\nkinds = {kinds}\nsites = *\n"
    with open(path, "w") as f:
        f.write(text)


def register_file():
    lines = ["unit_id,site,rated_mva,hv_kv,lv_kv,cooling,year_built,vector_group,criticality"]
    for i, u in enumerate(UNITS):
        lines.append(f"{u},Site{i % 4},{20 + i},132,33,ONAF,{1970 + i},Dyn11,{1 + i % 5}")
    return "\n".join(lines) + "\n"


def day(i):
    """A distinct past date per file index."""
    d = 1 + i % 28
    m = 1 + (i // 28) % 12
    y = 2020 + i // (28 * 12)
    return f"{y:04d}-{m:02d}-{d:02d}"


def oil_file(i, rng):
    head = "unit_id,sample_date,lab_ref,sample_point,h2_ppm,ch4_ppm,c2h6_ppm,c2h4_ppm,c2h2_ppm,co_ppm,co2_ppm,moisture_ppm"
    rows = [head]
    for j in range(rng.randint(1, 5)):
        rows.append(f"{UNITS[(i + j) % 20]},{day(i)},L{i}-{j},main_tank,{rng.randint(1, 200)},{rng.randint(1, 80)},"
                    f"{rng.randint(1, 60)},{rng.randint(1, 40)},<0.5,{rng.randint(50, 600)},{rng.randint(500, 5000)},"
                    f"{rng.randint(3, 30)}")
    return "\n".join(rows) + "\n"


def infrared_file(i, rng):
    rows = ["unit_id,survey_date,component,spot_c,reference_c,ambient_c,load_pct,emissivity,image_ref,note"]
    for j in range(rng.randint(1, 4)):
        rows.append(f"{UNITS[i % 20]},{day(i)},component {i}-{j},{rng.randint(30, 90)}.5,{rng.randint(20, 29)},15,"
                    f"{rng.randint(30, 95)},0.95,IMG{i}_{j}.jpg,note {i} {j}")
    return "\n".join(rows) + "\n"


def inspection_file(i, rng):
    rows = ["unit_id,inspection_date,item,rating,note,inspector"]
    for j, item in enumerate(rng.sample(ITEMS, rng.randint(1, 4))):
        rows.append(f"{UNITS[i % 20]},{day(i)},{item},{rng.choice(RATINGS)},seen {i},Insp {j}")
    return "\n".join(rows) + "\n"


def load_file(i, rng, points):
    """A load series of `points` 15-minute points; files never overlap."""
    rows = ["unit_id,timestamp,load_mva,ambient_c,top_oil_c"]
    start = 1577836800 + i * 400 * 86400  # each file its own 400-day window
    unit = UNITS[i % 20]
    for k in range(points):
        t = time.gmtime(start + k * 900)
        rows.append(f"{unit},{time.strftime('%Y-%m-%dT%H:%MZ', t)},{10 + (k % 96) / 10:.1f},{(k % 30) - 5},{30 + k % 40}")
    return "\n".join(rows) + "\n"


def invalid_file(i, rng):
    variants = [
        "unit_id,sample_date,h2_ppm\nNOPE,2024-01-05,12\n",                       # unknown unit
        f"unit_id,sample_date,h2_ppm\n{UNITS[0]},2024-02-30,12\n",                # impossible date
        f'unit_id,sample_date,h2_ppm\n{UNITS[1]},"2024-01-0{1 + i % 9},12\n',      # open quote
        "",                                                                      # empty
        "\x00\x01binary\xff" * 10,                                              # not text
        f"colour,shape\nred,{i}\n",                                             # unknown kind
    ]
    return variants[i % len(variants)]


def make_files(n, seed):
    """[(party, name, bytes)] in drop order; the register comes first."""
    rng = random.Random(seed)
    files = [("planning", "register.csv", register_file().encode())]
    kinds = ["oil", "ir", "insp", "load", "bad", "oil", "dup", "insp"]
    for i in range(1, n):
        kind = kinds[i % len(kinds)]
        if kind == "oil":
            files.append(("lab", f"oil-{i:04d}.csv", oil_file(i, rng).encode()))
        elif kind == "ir":
            files.append(("thermo", f"ir-{i:04d}.csv", infrared_file(i, rng).encode()))
        elif kind == "insp":
            files.append(("field", f"insp-{i:04d}.csv", inspection_file(i, rng).encode()))
        elif kind == "load":
            points = 6000 if i % 5 == 3 else rng.randint(10, 200)
            files.append(("planning", f"load-{i:04d}.csv", load_file(i, rng, points).encode()))
        elif kind == "bad":
            party = rng.choice(list(PARTIES))
            files.append((party, f"bad-{i:04d}.csv", invalid_file(i, rng).encode("utf-8", "surrogateescape")))
        else:  # the same content as an earlier file of its party, under a new name
            party, _, content = rng.choice(files[1:] or files)
            files.append((party, f"again-{i:04d}.csv", content))
    # A file of a kind its party may not deliver.
    if n > 3:
        files[3] = ("thermo", "not-mine.csv", oil_file(3, rng).encode())
    return files


def drop(root, party, name, content):
    folder = os.path.join(root, "drop", party)
    os.makedirs(folder, exist_ok=True)
    tmp = os.path.join(folder, "." + name + ".part")
    with open(tmp, "wb") as f:
        f.write(content)
    os.rename(tmp, os.path.join(folder, name))


def waiting(root):
    """Files still in party folders or work/."""
    out = []
    for top in ("drop", "work"):
        for dirpath, dirnames, filenames in os.walk(os.path.join(root, top)):
            dirnames[:] = [d for d in dirnames if d != "receipts"]
            out += [os.path.join(dirpath, f) for f in filenames if not f.startswith(".")]
    return out


def start(root):
    return subprocess.Popen([ferrumtest.FERRUM, "serve", "--root", root],
                            stdout=subprocess.DEVNULL, stderr=subprocess.PIPE, text=True)


def settle(root, timeout=60):
    """Runs the daemon until nothing waits, then stops it with SIGTERM."""
    d = start(root)
    deadline = time.time() + timeout
    try:
        while time.time() < deadline:
            if not waiting(root) and os.path.exists(os.path.join(root, "status.json")):
                time.sleep(1.5)  # one more rescan finds nothing
                if not waiting(root):
                    break
            time.sleep(0.1)
        else:
            raise AssertionError(f"files still waiting after {timeout}s: {waiting(root)[:5]}")
    finally:
        d.send_signal(signal.SIGTERM)
        _, err = d.communicate(timeout=60)
    return d.returncode, err


def sha(data):
    return hashlib.sha256(data).hexdigest()


def stored_files(root):
    """sha256 -> [relative path] of every file in archive/ and quarantine/."""
    out = collections.defaultdict(list)
    for top in ("archive", "quarantine"):
        for dirpath, dirnames, filenames in os.walk(os.path.join(root, top)):
            dirnames[:] = [d for d in dirnames if d != "receipts"]
            for f in filenames:
                p = os.path.join(dirpath, f)
                with open(p, "rb") as fh:
                    out[sha(fh.read())].append(os.path.relpath(p, root))
    return out


def data_rows(root):
    """Every data row, without ids, file ids and line numbers (which depend on
    the order files were taken in)."""
    c = sqlite3.connect(os.path.join(root, "ferrum.db"))
    q = {
        "units": "SELECT unit_id, site, rated_mva, hv_kv, lv_kv, cooling, year_built FROM units",
        "oil": "SELECT u.unit_id, s.sample_day, s.lab_ref, s.sample_point, s.superseded_by IS NULL, v.test, v.state, v.value "
               "FROM oil_samples s JOIN units u USING (unit_key) JOIN oil_values v ON v.sample_id = s.id",
        "load": "SELECT u.unit_id, ts, load_pu, ambient_c, top_oil_c FROM load_points JOIN units u USING (unit_key)",
        "ir": "SELECT u.unit_id, survey_day, component, spot_c, reference_c, ambient_c, load_pct, emissivity, image_ref, note "
              "FROM infrared_scans JOIN units u USING (unit_key)",
        "inspections": "SELECT u.unit_id, inspection_day, item, rating, note, inspector FROM inspections JOIN units u USING (unit_key)",
        "files": "SELECT sha256, status, kind, rows, problem_count FROM files",
    }
    out = {k: sorted(map(repr, c.execute(sql).fetchall())) for k, sql in q.items()}
    c.close()
    return out


class CrashKill9Test(unittest.TestCase):
    def setUp(self):
        self.roots = []

    def tearDown(self):
        for r in self.roots:
            shutil.rmtree(r, ignore_errors=True)

    def new_root(self):
        root = tempfile.mkdtemp(prefix="ferrum-crash-")
        self.roots.append(root)
        ferrumtest.run("init", "--root", root)
        configure(root)
        return root

    def clean_run(self, files):
        root = self.new_root()
        # The register first, alone, as in the crash run.
        drop(root, *files[0])
        code, err = settle(root)
        self.assertEqual(code, 0, err[-2000:])
        for party, name, content in files[1:]:
            drop(root, party, name, content)
        code, err = settle(root)
        self.assertEqual(code, 0, err[-2000:])
        return root

    def crash_run(self, files, rng):
        root = self.new_root()
        drop(root, *files[0])
        code, err = settle(root)  # the register is in before the storm
        self.assertEqual(code, 0, err[-2000:])
        pending = list(files[1:])
        kills = 0
        deadline = time.time() + 240
        while (kills < KILLS or pending) and time.time() < deadline:
            d = start(root)
            # Drop some files while it runs, then kill it at a random moment:
            # during start-up and recovery, mid-parse, between commit and move.
            for _ in range(rng.randint(0, 2 * len(files) // max(KILLS, 1) + 1)):
                if pending:
                    drop(root, *pending.pop(0))
            time.sleep(rng.uniform(0.02, 0.8))
            d.kill()
            d.wait()
            d.stderr.close()
            kills += 1
        self.assertFalse(pending, "the crash loop ran out of time")
        self.assertGreaterEqual(kills, min(KILLS, 30))
        code, err = settle(root, timeout=120)
        self.assertEqual(code, 0, err[-2000:])
        return root, kills

    def test_kill9_loses_and_doubles_nothing(self):
        rng = random.Random(SEED)
        files = make_files(FILES, SEED)
        started = time.time()
        crashed, kills = self.crash_run(files, rng)
        crash_seconds = time.time() - started
        clean = self.clean_run(files)
        print(f"{len(files)} files, {kills} SIGKILLs, crash run {crash_seconds:.1f}s")

        # Every file is in archive/ or quarantine/ exactly once: as many
        # stored copies of each content as files were dropped with it.
        dropped = collections.Counter(sha(c) for _, _, c in files)
        stored = stored_files(crashed)
        self.assertEqual(waiting(crashed), [])
        for h, n in dropped.items():
            self.assertEqual(len(stored.get(h, [])), n, f"content {h[:8]} stored {stored.get(h)} for {n} drops")
        self.assertEqual(set(stored), set(dropped), "stored files that were never dropped")

        # The database equals that of the clean run.
        a, b = data_rows(crashed), data_rows(clean)
        for table in a:
            self.assertEqual(len(a[table]), len(b[table]), f"{table}: row count differs from the clean run")
            self.assertEqual(a[table], b[table], f"{table}: rows differ from the clean run")
        self.assertGreater(len(a["load"]), 1000)
        self.assertGreater(len(a["oil"]), 10)

        with sqlite3.connect(os.path.join(crashed, "ferrum.db")) as c:
            self.assertEqual(c.execute("PRAGMA integrity_check").fetchone()[0], "ok")
            self.assertEqual(c.execute("SELECT count(*) FROM files WHERE status = 'importing'").fetchone()[0], 0)
            by_name = {(p, n): (s, st, h) for p, n, s, st, h in
                       c.execute("SELECT party, original_name, status, stored_as, sha256 FROM files ORDER BY id")}

        # No receipt contradicts the final state.
        for party, name, content in files:
            self.assertIn((party, name), by_name, f"{party}/{name} has no files row")
            status, stored_as, h = by_name[(party, name)]
            with open(os.path.join(crashed, "drop", party, "receipts", name + ".json")) as f:
                r = json.load(f)
            self.assertEqual(r["status"], status, f"{party}/{name}: receipt says {r['status']}, database {status}")
            self.assertEqual(r["sha256"], sha(content))
            where = os.path.join(crashed, r["stored_as"])
            self.assertTrue(os.path.exists(where), f"{party}/{name}: receipt points at missing {r['stored_as']}")
            with open(where, "rb") as f:
                self.assertEqual(sha(f.read()), sha(content), f"{party}/{name}: {r['stored_as']} holds other bytes")
            top = "quarantine" if status == "rejected" else "archive"
            self.assertTrue(r["stored_as"].startswith(top + "/"), f"{party}/{name}: {status} stored as {r['stored_as']}")
            self.assertEqual(stored_as, r["stored_as"], f"{party}/{name}: database and receipt disagree on the place")


class RecordedPlaceTest(CrashKill9Test):
    """The place a file is recorded at (files.stored_as, the receipt) is the
    place it really is, also when its stored name was taken already (the
    same file dropped again): recover() trusts the record after a crash."""

    test_kill9_loses_and_doubles_nothing = None

    def test_same_file_dropped_twice(self):
        root = self.new_root()
        drop(root, *make_files(1, SEED)[0])
        settle(root)
        bad = b"unit_id,sample_date,h2_ppm\nNOPE,2024-01-05,12\n"
        good = oil_file(7, random.Random(SEED)).encode()
        for round_ in range(3):
            drop(root, "lab", "same.csv", good)
            drop(root, "lab", "broken.csv", bad)
            code, err = settle(root)
            self.assertEqual(code, 0, err[-2000:])
            with sqlite3.connect(os.path.join(root, "ferrum.db")) as c:
                for name in ("same.csv", "broken.csv"):
                    status, stored_as = c.execute("SELECT status, stored_as FROM files WHERE original_name=? "
                                                  "ORDER BY id DESC LIMIT 1", (name,)).fetchone()
                    with open(os.path.join(root, "drop", "lab", "receipts", name + ".json")) as f:
                        r = json.load(f)
                    self.assertEqual(r["stored_as"], stored_as, f"round {round_}: {name} receipt and record disagree")
                    self.assertEqual(r["status"], status)
            stored = stored_files(root)
            self.assertEqual(len(stored[sha(good)]), round_ + 1)
            self.assertEqual(len(stored[sha(bad)]), round_ + 1)
            # Each record points at its own copy: no two records share a place.
            with sqlite3.connect(os.path.join(root, "ferrum.db")) as c:
                places = [p for (p,) in c.execute("SELECT stored_as FROM files")]
            self.assertEqual(len(places), len(set(places)), places)
            for p in places:
                self.assertTrue(os.path.exists(os.path.join(root, p)), p)


if __name__ == "__main__":
    unittest.main()
