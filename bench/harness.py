#!/usr/bin/env python3
"""The benchmark harness behind bench/run (Python 3, standard library only).

Runs each benchmark --repeat times, takes medians, and writes a table with the
reference measured in the same run beside each figure, and the ratio, to
bench/results.md (and stdout). The load average is recorded with each section:
the machine is shared, so only ratios measured in the same run are compared.

Sections (--only NAME to run one):
  ingest   1,000,000-row load series through `ferrum ingest` vs the sqlite3
           shell's .import of the same file; peak memory (and 10,000,000 rows
           with --with-10m)
  fleet    5,000 units, 20 years of history, a year of hourly load:
           `ferrum assess --json` + `ferrum rank` vs a plain SELECT of the rows
  kernels  Google Benchmark: thermal kernel, unit reports on 1 and 2 threads
  latency  `ferrum serve`: lab file renamed into a party folder -> receipt ->
           updated unit report, 50 drops
  postgresql  the shared store ([store] backend = postgresql) on a server the
           harness starts (tests/pgserver.py, Debian's postgresql, fsync on):
           the 1M-row file through `ferrum ingest` vs `psql \\copy` into a
           plain table; fleet `assess --json` + `rank` vs the SQLite fleet;
           with --with-100m, `assess` of one unit with 100,000,000 load points
           in the table (~15 GB of disk, filled by SQL, kept for later runs)
"""
import argparse
import datetime
import json
import os
import re
import shutil
import statistics
import subprocess
import sys
import time
from pathlib import Path

AS_OF = "2026-12-01"
FLEET_UNITS = 5000
FLEET_CURVE = [1000, 5000, 20000]
INGEST_UNITS = 5000
LOAD_ORDERS = ["unit-major", "time-major", "shuffled"]
LATENCY_UNITS = 50
LATENCY_DROPS = 50
BIG_TABLE_POINTS = 100_000_000

INI = """[site]
name = ferrum benchmark fleet
utc_offset = +00:00

[ingest]
settle_seconds = {settle}
rescan_seconds = 30

[schedule]
debounce_seconds = {debounce}

[log]
level = warn

[party.bench]
kinds = units_register, oil_lab, infrared, inspection, load_series
sites = *
"""


class Bench:
    def __init__(self, args):
        self.args = args
        self.build = Path(args.build).resolve()
        self.work = Path(args.work).resolve()
        self.ferrum = self.build / "daemon" / "ferrum"
        self.gen = self.build / "bench" / "ferrum_bench_gen"
        self.kernels = self.build / "bench" / "ferrum_bench_kernels"
        # Sizes: the targets' sizes, or tiny ones for --smoke (ctest label
        # smoke: the harness runs end to end in seconds, so it cannot rot).
        smoke = args.smoke
        self.ingest_units = 20 if smoke else INGEST_UNITS
        self.ingest_rows = 2000 if smoke else 1_000_000
        self.big_rows = 20_000 if smoke else 10_000_000
        self.fleet_sizes = [10, 20, 40] if smoke else FLEET_CURVE
        self.fleet_units = 20 if smoke else FLEET_UNITS
        self.latency_units = 5 if smoke else LATENCY_UNITS
        self.latency_drops = 3 if smoke else LATENCY_DROPS
        self.data = self.work / "data"
        self.data.mkdir(parents=True, exist_ok=True)
        self.rows = []      # result table rows
        self.notes = []     # lines printed under the table

    # ------------------------------------------------------------ helpers
    def log(self, msg):
        print(f"[bench {time.strftime('%H:%M:%S')}] {msg}", file=sys.stderr, flush=True)

    @staticmethod
    def loadavg():
        return "{:.2f} {:.2f} {:.2f}".format(*os.getloadavg())

    def run(self, cmd, **kw):
        return subprocess.run([str(c) for c in cmd], check=True, text=True, capture_output=True, **kw)

    def timed(self, cmd, stdout=subprocess.DEVNULL):
        """Runs cmd under /usr/bin/time -v: (wall seconds, peak RSS in MiB, stdout).
        The CPU seconds (user + system) of the last call are kept in self.cpu:
        on a shared machine they say more than the wall time."""
        t0 = time.perf_counter()
        p = subprocess.run(["/usr/bin/time", "-v"] + [str(c) for c in cmd], text=True,
                           stdout=stdout, stderr=subprocess.PIPE)
        wall = time.perf_counter() - t0
        if p.returncode != 0:
            raise RuntimeError(f"{cmd[0]} failed ({p.returncode}):\n{p.stderr[-2000:]}")
        rss = int(re.search(r"Maximum resident set size \(kbytes\): (\d+)", p.stderr).group(1)) / 1024
        self.cpu = sum(float(re.search(rf"{k} time \(seconds\): ([\d.]+)", p.stderr).group(1))
                       for k in ("User", "System"))
        return wall, rss, p.stdout

    def new_root(self, name, settle=1, debounce=0, store=""):
        root = self.work / name
        if root.exists():
            shutil.rmtree(root)
        root.mkdir(parents=True)
        (root / "ferrum.ini").write_text(INI.format(settle=settle, debounce=debounce) + store)
        self.run([self.ferrum, "init", "--root", root])
        (root / "drop" / "bench").mkdir(parents=True, exist_ok=True)
        return root

    def drop(self, root, src, copy=True):
        dst = root / "drop" / "bench" / Path(src).name
        tmp = dst.with_name("." + dst.name + ".part")
        (shutil.copyfile if copy else os.link)(src, tmp)
        os.rename(tmp, dst)
        return dst

    def ingest(self, root, *files):
        """Untimed `ferrum ingest`; every file must be accepted."""
        p = self.run([self.ferrum, "ingest", "--root", root] + [str(f) for f in files])
        bad = [l for l in p.stdout.splitlines() if not l.startswith("accepted")]
        if bad:
            raise RuntimeError("setup file not accepted: " + "; ".join(bad))
        return p.stdout

    def generated(self, name, *args):
        """A generated file or folder under data/, made once (the generator is deterministic)."""
        path = self.data / name
        if not path.exists():
            self.log(f"generating {name}")
            tmp = path.with_name(path.name + ".building")
            if tmp.is_dir():
                shutil.rmtree(tmp)
            self.run([self.gen, *args, tmp])
            os.rename(tmp, path)
        return path

    def add(self, what, value, unit, reference="", ratio="", target="", met=""):
        self.rows.append((what, value, unit, reference, ratio, target, met))

    def section(self, name):
        self.log(f"{name}: load average {self.loadavg()}")
        self.notes.append(f"- {name}: load average at start {self.loadavg()}")

    # ------------------------------------------------------------ 1. ingest
    def bench_ingest(self):
        self.section("ingest")
        register = self.generated(f"units-{self.ingest_units}.csv", "register", self.ingest_units)
        one, big = self.ingest_rows, self.big_rows
        sizes = [one] + ([big] if self.args.with_10m or self.args.smoke else [])
        if self.args.only_10m:
            sizes = [big]
        results = {}
        # The same rows in three orders (bench/generate.cpp): the 1M file in
        # each, the 10M one time-major (the order that once thrashed SQLite's
        # page cache) for peak memory.
        runs = [(rows, order) for rows in sizes
                for order in (LOAD_ORDERS if rows == one else ["time-major"])]
        for rows, order in runs:
            data = self.generated(f"load-{rows}-{order}.csv", "load", rows, self.ingest_units, order)
            reps = self.args.repeat if rows == one else 1
            label = (f"{rows // 1_000_000}M" if rows >= 1_000_000 else f"{rows}-row") + f" {order}"
            f_wall, f_rss, s_wall, s_rss, f_cpu, s_cpu = [], [], [], [], [], []
            for i in range(reps):
                root = self.new_root(f"ingest-root-{label}")
                self.ingest(root, self.drop(root, register))
                dropped = self.drop(root, data)
                wall, rss, out = self.timed([self.ferrum, "ingest", "--root", root, dropped], stdout=subprocess.PIPE)
                if not out.startswith("accepted") or f"{rows} rows" not in out:
                    raise RuntimeError("ferrum ingest did not accept the file: " + out)
                f_wall.append(wall)
                f_rss.append(rss)
                f_cpu.append(self.cpu)
                db = self.work / "shell-import.db"
                db.unlink(missing_ok=True)
                wall, rss, _ = self.timed(["sqlite3", db, ".mode csv", f".import {data} load"])
                count = self.run(["sqlite3", db, "SELECT count(*) FROM load"]).stdout.strip()
                if int(count) != rows:
                    raise RuntimeError(f"sqlite3 .import gave {count} rows")
                s_wall.append(wall)
                s_rss.append(rss)
                s_cpu.append(self.cpu)
                self.log(f"ingest {rows} rows #{i + 1}: ferrum {f_wall[-1]:.2f} s {f_rss[-1]:.0f} MiB,"
                         f" sqlite3 shell {s_wall[-1]:.2f} s  (load {self.loadavg()})")
            fw, sw = statistics.median(f_wall), statistics.median(s_wall)
            results[(rows, order)] = statistics.median(f_rss)
            ratio = sw / fw
            self.add(f"ingest {label} load rows: `ferrum ingest` (n={reps})", f"{rows / fw / 1e3:.0f}k",
                     "rows/s", f"{rows / sw / 1e3:.0f}k (sqlite3 .import)", f"{ratio:.2f}×", "≥ 1.0×",
                     "yes" if ratio >= 1.0 else "no")
            self.add(f"ingest {label}: wall time ferrum / sqlite3 shell", f"{fw:.2f}", "s", f"{sw:.2f}", "", "", "")
            fc, sc = statistics.median(f_cpu), statistics.median(s_cpu)
            self.add(f"ingest {label}: CPU time (user + sys) ferrum / sqlite3 shell", f"{fc:.2f}", "s", f"{sc:.2f}",
                     f"{sc / fc:.2f}×", "≥ 1.0×", "yes" if sc >= fc else "no")
            self.add(f"ingest {label}: peak RSS ferrum / sqlite3 shell", f"{results[(rows, order)]:.0f}", "MiB",
                     f"{statistics.median(s_rss):.0f}", "", "", "")
        big, small = (big, "time-major"), (one, "time-major")
        if big in results and small in results:
            growth = results[big] / results[small]
            self.add(f"ingest peak RSS {big[0]:,} / {one:,} rows, time-major", f"{growth:.2f}", "×", "1M run", f"{growth:.2f}×",
                     "≤ 1.2×",
                     "yes" if growth <= 1.2 else "no")

    # ------------------------------------------------------------ 2. fleet
    def fleet_root(self, units):
        """A site of `units` units, ingested once and kept (its data is deterministic)."""
        files = self.generated(f"fleet-{units}", "fleet", units)
        root = self.work / f"fleet-root-{units}"
        if (root / ".complete").exists():
            return root
        self.log("ingesting the fleet (once; kept in the work folder)")
        root = self.new_root(f"fleet-root-{units}")
        t0 = time.perf_counter()
        self.ingest(root, self.drop(root, files / "units.csv"))
        others = ["oil.csv", "infrared.csv", "inspection.csv"] + sorted(
            p.name for p in files.glob("load-*.csv"))
        self.ingest(root, *[self.drop(root, files / name) for name in others])
        (root / ".complete").write_text(f"ingested in {time.perf_counter() - t0:.1f} s\n")
        return root

    def bench_fleet(self):
        """The fleet at the target size (fleet_units), then the cost curve."""
        root = self.fleet_root(self.fleet_units)
        self.section("fleet")
        db = root / "ferrum.db"
        counts = {}
        for table in ["units", "oil_samples", "oil_values", "infrared_scans", "inspections", "load_points"]:
            counts[table] = int(self.run(["sqlite3", "-readonly", db, f"SELECT count(*) FROM {table}"]).stdout)
        select_all = "; ".join(f"SELECT * FROM {t}" for t in counts)
        assess_t, rank_t, fresh_t, floor_t = [], [], [], []
        for i in range(self.args.repeat):
            wall, rss, _ = self.timed(["sqlite3", "-readonly", db, select_all])
            floor_t.append(wall)
            wall, a_rss, out = self.timed([self.ferrum, "assess", "--root", root, "--json", "--as-of", AS_OF],
                                          stdout=subprocess.PIPE)
            assess_t.append(wall)
            if len(json.loads(out)) != self.fleet_units:
                raise RuntimeError("assess --json did not list every unit")
            wall, r_rss, out = self.timed([self.ferrum, "rank", "--root", root, "--as-of", AS_OF])
            rank_t.append(wall)
            wall, f_rss, out = self.timed([self.ferrum, "rank", "--root", root, "--as-of", AS_OF, "--fresh"])
            fresh_t.append(wall)
            self.log(f"fleet #{i + 1}: assess {assess_t[-1]:.1f} s ({a_rss:.0f} MiB), rank {rank_t[-1]:.1f} s"
                     f" ({r_rss:.0f} MiB), rank --fresh {fresh_t[-1]:.1f} s ({f_rss:.0f} MiB),"
                     f" plain SELECT {floor_t[-1]:.1f} s  (load {self.loadavg()})")
        a, r, rf, f = (statistics.median(x) for x in (assess_t, rank_t, fresh_t, floor_t))
        n = counts["units"]
        self.add(f"fleet: `assess --json` + `rank`, {n} units (n={self.args.repeat})", f"{a + r:.1f}", "s",
                 f"{f:.1f} (2 × SELECT: {2 * f:.1f})", f"{(a + r) / (2 * f):.2f}× of 2 SELECTs", "≤ 60 s",
                 "yes" if a + r <= 60 else "no")
        self.add("fleet: `assess --json` per unit", f"{a / n * 1e3:.2f}", "ms", f"{f / n * 1e3:.2f} (SELECT)",
                 f"{a / f:.2f}×", "", "")
        self.add("fleet: `rank` per unit (inputs kept by `assess`)", f"{r / n * 1e3:.2f}", "ms",
                 f"{f / n * 1e3:.2f} (SELECT)", f"{r / f:.2f}×", "", "")
        self.add("fleet: `rank --fresh` (assesses every unit again)", f"{rf:.1f}", "s", f"{f:.1f} (SELECT)",
                 f"{rf / f:.2f}×", "", "")
        self.add("fleet: peak RSS `assess --json` / `rank --fresh`", f"{a_rss:.0f}", "MiB", f"{f_rss:.0f}", "", "", "")
        self.notes.append("- fleet rows: " + ", ".join(f"{t} {c:,}" for t, c in counts.items()))
        self.fleet_curve()
        self.weekly_bundle(root)

    def fleet_curve(self):
        """`assess --json` + `rank --fresh` per unit and peak memory at each fleet size: time per
        unit should stay flat within 20 %, peak memory should not grow with the fleet."""
        per_unit, peak = {}, {}
        for units in self.fleet_sizes:
            root = self.fleet_root(units)
            times, rss = [], []
            for _ in range(self.args.repeat):
                wall_a, rss_a, _ = self.timed([self.ferrum, "assess", "--root", root, "--json", "--as-of", AS_OF,
                                               "--quiet"], stdout=subprocess.DEVNULL)
                wall_r, rss_r, _ = self.timed([self.ferrum, "rank", "--root", root, "--as-of", AS_OF, "--fresh",
                                               "--quiet"])
                times.append((wall_a + wall_r) / units)
                rss.append(max(rss_a, rss_r))
            per_unit[units], peak[units] = statistics.median(times), statistics.median(rss)
            self.log(f"curve {units} units: {per_unit[units] * 1e3:.2f} ms/unit, {peak[units]:.0f} MiB"
                     f"  (load {self.loadavg()})")
        small, large = min(per_unit), max(per_unit)
        for units in sorted(per_unit):
            self.add(f"curve: `assess --json` + `rank --fresh`, {units:,} units", f"{per_unit[units] * 1e3:.2f}",
                     "ms/unit", f"{per_unit[small] * 1e3:.2f} ({small:,} units)",
                     f"{per_unit[units] / per_unit[small]:.2f}×", "≤ 1.2×",
                     "yes" if per_unit[units] <= 1.2 * per_unit[small] else "no")
        self.add(f"curve: peak RSS {large:,} / {small:,} units", f"{peak[large]:.0f}", "MiB", f"{peak[small]:.0f}",
                 f"{peak[large] / peak[small]:.2f}×", "≤ 1.2×", "yes" if peak[large] <= 1.2 * peak[small] else "no")
        # A small chart of the curve for results.md (text: the file is read in a terminal too).
        top = max(per_unit.values())
        for units in sorted(per_unit):
            bar = "#" * max(1, round(40 * per_unit[units] / top))
            self.notes.append(f"    {units:>6,} units {bar} {per_unit[units] * 1e3:.2f} ms/unit")

    def weekly_bundle(self, root):
        """The weekly bundle (every unit PDF, the fleet report, the index) of the target fleet."""
        shutil.rmtree(root / "reports", ignore_errors=True)
        wall, rss, _ = self.timed([self.ferrum, "report", "--root", root, "--weekly", "--as-of", AS_OF, "--quiet"])
        target = 180 * self.fleet_units / FLEET_UNITS
        self.add(f"weekly bundle, {self.fleet_units:,} units", f"{wall:.1f}", "s", f"CPU {self.cpu:.1f} s", "",
                 f"≤ {target:.0f} s", "yes" if wall <= target else "no")

    # ------------------------------------------------------------ 3+4. kernels
    def bench_kernels(self):
        self.section("kernels")
        out_json = self.work / "kernels.json"
        pdfs = self.work / "reports"
        shutil.rmtree(pdfs, ignore_errors=True)
        env = dict(os.environ, FERRUM_BENCH_OUT=str(pdfs))
        subprocess.run([str(self.kernels), f"--benchmark_repetitions={self.args.repeat}",
                        "--benchmark_report_aggregates_only=true", f"--benchmark_out={out_json}",
                        "--benchmark_out_format=json"], check=True, env=env, stdout=sys.stderr)
        # Google Benchmark writes aggregates (median, ...) only for two or more
        # repetitions; with --repeat 1 the single run is the median.
        med = {}
        rows = json.loads(out_json.read_text())["benchmarks"]
        for b in rows:
            if b.get("aggregate_name") == "median" or (self.args.repeat == 1 and b.get("run_type") == "iteration"):
                med[b.get("run_name", b["name"])] = b
        th = med["BM_ThermalUnitYear"]
        ms = th["real_time"]
        self.add(f"thermal kernel: 525,600 one-minute steps (n={self.args.repeat})", f"{ms:.1f}", "ms", "", "",
                 "≤ 20 ms", "yes" if ms <= 20 else "no")
        self.add("thermal kernel: per step", f"{ms * 1e6 / 525600:.1f}", "ns", "", "", "", "")
        cpu = th["cpu_time"]
        self.add("thermal kernel: CPU time (shared machine: the fairer figure)", f"{cpu:.1f}", "ms",
                 f"{cpu * 1e6 / 525600:.1f} ns/step", "", "≤ 20 ms", "yes" if cpu <= 20 else "no")
        one = med["BM_UnitReports/1/iterations:1/real_time"]["real_time"] / 200
        two = med["BM_UnitReports/2/iterations:1/real_time"]["real_time"] / 200
        cpu_one = med["BM_UnitReports/1/iterations:1/real_time"]["cpu_ms_per_unit"]
        pages = self.run(["qpdf", "--show-npages", next(pdfs.glob("*.pdf"))]).stdout.strip()
        self.add(f"unit report ({pages} pages), 1 thread (n={self.args.repeat})", f"{one:.1f}", "ms/unit", "", "",
                 "≤ 50 ms", "yes" if one <= 50 else "no")
        self.add("unit report, CPU time per report (1 thread)", f"{cpu_one:.1f}", "ms/unit", "", "", "≤ 50 ms",
                 "yes" if cpu_one <= 50 else "no")
        self.add("unit reports, 2 threads", f"{two:.1f}", "ms/unit", f"{one:.1f} (1 thread)",
                 f"{one / two:.2f}× speed-up", "≥ 1.7×", "yes" if one / two >= 1.7 else "no")

    # ------------------------------------------------------------ 5. latency
    def bench_latency(self):
        files = self.generated(f"fleet-{self.latency_units}", "fleet", self.latency_units)
        drops = self.generated(f"lab-drops-{self.latency_drops}", "lab", self.latency_drops, self.latency_units)
        root = self.new_root("latency-root", settle=0, debounce=0)
        self.ingest(root, self.drop(root, files / "units.csv"))
        self.ingest(root, *[self.drop(root, files / n) for n in
                            ["oil.csv", "infrared.csv", "inspection.csv", "load-01.csv"]])
        self.section("latency")
        log = open(root / "serve.out", "w")
        daemon = subprocess.Popen([str(self.ferrum), "serve", "--root", str(root)], stdout=log, stderr=log)
        try:
            self.wait(lambda: self.idle(root), 60, "the daemon to start")
            to_receipt, to_report = [], []
            for i, src in enumerate(sorted(drops.glob("lab-*.csv"))):
                unit = src.read_text().splitlines()[1].split(",")[0]
                tmp = root / "drop" / "bench" / ("." + src.name + ".part")
                shutil.copyfile(src, tmp)
                receipt = root / "drop" / "bench" / "receipts" / (src.name + ".json")
                t0 = time.time()
                os.rename(tmp, root / "drop" / "bench" / src.name)
                t_receipt = self.wait(lambda: receipt.exists(), 30, f"the receipt of {src.name}")
                t_report = self.wait(lambda: self.report_newer(root, unit, t0), 30, f"the report of {unit}")
                to_receipt.append(t_receipt - t0)
                to_report.append(t_report - t0)
                if '"accepted"' not in receipt.read_text():
                    raise RuntimeError(f"{src.name} was not accepted")
        finally:
            daemon.terminate()
            daemon.wait(timeout=30)
            log.close()

        def p95(v):
            return sorted(v)[max(0, int(round(0.95 * len(v))) - 1)]
        for what, v in (("receipt", to_receipt), ("updated unit report", to_report)):
            ok = p95(v) <= 1.0
            self.add(f"latency: rename → {what}, median (n={len(v)})", f"{statistics.median(v) * 1e3:.0f}", "ms",
                     "", "", "", "")
            self.add(f"latency: rename → {what}, p95", f"{p95(v) * 1e3:.0f}", "ms", "settle 0 s", "",
                     "≤ 1000 ms", "yes" if ok else "no")

    @staticmethod
    def idle(root):
        try:
            s = json.loads((root / "status.json").read_text())
            return s["files_waiting"] == 0 and s["units_waiting_for_report"] == 0
        except (OSError, ValueError, KeyError):
            return False

    @staticmethod
    def report_newer(root, unit, t0):
        for p in (root / "reports").glob(f"ferrum-{unit}-*.pdf"):
            if p.stat().st_mtime >= t0:
                return True
        return False

    @staticmethod
    def wait(predicate, timeout, what):
        end = time.time() + timeout
        while time.time() < end:
            if predicate():
                return time.time()
            time.sleep(0.002)
        raise RuntimeError(f"timed out waiting for {what}")

    # ------------------------------------------------------------ 5. postgresql
    def pg_server(self):
        """The harness's PostgreSQL server (tests/pgserver.py) with fsync on, or None with a note."""
        sys.path.insert(0, str(Path(__file__).resolve().parent.parent / "tests"))
        import pgserver
        reason = pgserver.missing_reason()
        if reason:
            self.log("postgresql: skipped: " + reason)
            self.notes.append("- postgresql: skipped: " + reason)
            return None
        return pgserver.PgServer(self.work / "pg").start(database=None, durable=True)

    def pg_root(self, srv, name, database, fresh=True):
        """A site root on database `database` of the harness's server (created if missing, emptied if fresh)."""
        if fresh:
            srv.psql(f'DROP DATABASE IF EXISTS "{database}"', database="postgres")
        if srv.psql(f"SELECT 1 FROM pg_database WHERE datname = '{database}'", database="postgres").strip() != "1":
            srv.psql(f'CREATE DATABASE "{database}"', database="postgres")
        store = f"\n[store]\nbackend = postgresql\npostgresql = {srv.conninfo(database)}\n"
        return self.new_root(name, store=store)

    def pg_copy(self, srv, database, sql):
        """psql run as this user (the file is read by the client), timed."""
        return self.timed([Path(srv.bindir) / "psql", "-X", "-q", "-v", "ON_ERROR_STOP=1", "-h", srv.socket_dir,
                           "-U", srv.user, "-d", database, "-c", sql])

    def bench_postgresql(self):
        srv = self.pg_server()
        if srv is None:
            return
        try:
            self.pg_sections(srv)
        finally:
            srv.stop()

    def pg_sections(self, srv):
        self.section("postgresql")
        version = srv.psql("SHOW server_version", database="postgres").strip()
        self.notes.append(f"- postgresql: server {version} started by the harness (Unix socket, fsync on, "
                          "default settings)")
        register = self.generated(f"units-{self.ingest_units}.csv", "register", self.ingest_units)
        rows = self.ingest_rows
        for order in LOAD_ORDERS:
            data = self.generated(f"load-{rows}-{order}.csv", "load", rows, self.ingest_units, order)
            f_wall, f_cpu, c_wall, k_wall = [], [], [], []
            for i in range(self.args.repeat):
                root = self.pg_root(srv, "pg-ingest-root", "ferrum_ingest")
                self.ingest(root, self.drop(root, register))
                srv.psql("CHECKPOINT", database="ferrum_ingest")
                dropped = self.drop(root, data)
                wall, _, out = self.timed([self.ferrum, "ingest", "--root", root, dropped], stdout=subprocess.PIPE)
                if not out.startswith("accepted") or f"{rows} rows" not in out:
                    raise RuntimeError("ferrum ingest (postgresql) did not accept the file: " + out)
                f_wall.append(wall)
                f_cpu.append(self.cpu)
                # The reference: psql's \copy of the same file into a plain table of the file's
                # columns (no key), and into one with the store's key (unit, time), same server.
                srv.psql("DROP TABLE IF EXISTS plain_load, keyed_load; CHECKPOINT", database="ferrum_ingest")
                srv.psql("CREATE TABLE plain_load(unit_id TEXT, ts TEXT, load_pu DOUBLE PRECISION,"
                         " ambient_c DOUBLE PRECISION, top_oil_c DOUBLE PRECISION);"
                         " CREATE TABLE keyed_load(LIKE plain_load, PRIMARY KEY (unit_id, ts))",
                         database="ferrum_ingest")
                copy = "\\copy {} FROM '" + str(data) + "' WITH (FORMAT csv, HEADER true)"
                wall, _, _ = self.pg_copy(srv, "ferrum_ingest", copy.format("plain_load"))
                c_wall.append(wall)
                wall, _, _ = self.pg_copy(srv, "ferrum_ingest", copy.format("keyed_load"))
                k_wall.append(wall)
                n = int(srv.psql("SELECT count(*) FROM plain_load", database="ferrum_ingest"))
                stored = int(srv.psql("SELECT count(*) FROM load_points", database="ferrum_ingest"))
                if n != rows or stored != rows:
                    raise RuntimeError(f"postgresql ingest: {stored} points stored, psql copied {n}, file {rows}")
                self.log(f"postgresql ingest {order} #{i + 1}: ferrum {f_wall[-1]:.2f} s, psql \\copy plain"
                         f" {c_wall[-1]:.2f} s, keyed {k_wall[-1]:.2f} s  (load {self.loadavg()})")
            fw, cw, kw = (statistics.median(x) for x in (f_wall, c_wall, k_wall))
            label = (f"{rows // 1_000_000}M" if rows >= 1_000_000 else f"{rows}-row") + f" {order}"
            self.add(f"postgresql: ingest {label}: `ferrum ingest` (n={self.args.repeat})", f"{rows / fw / 1e3:.0f}k",
                     "rows/s", f"{rows / cw / 1e3:.0f}k (psql \\copy, plain table)", f"{cw / fw:.2f}×", "≥ 1.0×",
                     "yes" if cw >= fw else "no")
            self.add(f"postgresql: ingest {label}: wall time ferrum / psql \\copy into a keyed table",
                     f"{fw:.2f}", "s", f"{kw:.2f}", f"{kw / fw:.2f}×", "", "")
            self.add(f"postgresql: ingest {label}: ferrum's CPU time (the server's is not counted)",
                     f"{statistics.median(f_cpu):.2f}", "s", "", "", "", "")
        self.pg_fleet(srv)
        if self.args.with_100m or self.args.smoke:
            self.pg_big_table(srv)

    def pg_fleet(self, srv):
        """Fleet `assess --json` + `rank` on the shared store against the SQLite fleet, same run."""
        units = self.fleet_units
        files = self.generated(f"fleet-{units}", "fleet", units)
        lite = self.fleet_root(units)
        root = self.work / f"pg-fleet-root-{units}"
        database = f"ferrum_fleet_{units}"
        if not (root / ".complete").exists():
            self.log("postgresql: ingesting the fleet (once; kept in the work folder and the server)")
            root = self.pg_root(srv, root.name, database)
            t0 = time.perf_counter()
            self.ingest(root, self.drop(root, files / "units.csv"))
            others = ["oil.csv", "infrared.csv", "inspection.csv"] + sorted(p.name for p in files.glob("load-*.csv"))
            self.ingest(root, *[self.drop(root, files / name) for name in others])
            (root / ".complete").write_text(f"ingested in {time.perf_counter() - t0:.1f} s\n")
        self.notes.append(f"- postgresql fleet of {units:,} units: {(root / '.complete').read_text().strip()}; "
                          f"SQLite: {(lite / '.complete').read_text().strip()}")
        srv.psql("VACUUM ANALYZE", database=database)
        # The first assessment after an import reads every month of load points as rows and packs
        # it (schema/postgresql/migrations/012_load_packs.sql); later ones read the packs, except
        # for the months a new file touched. Measured on its own, with the packs emptied first.
        srv.psql("DO $$ BEGIN IF to_regclass('load_packs') IS NOT NULL THEN TRUNCATE load_packs; END IF; END $$",
                 database=database)
        wall_first, _, _ = self.timed([self.ferrum, "assess", "--root", root, "--json", "--as-of", AS_OF, "--quiet"],
                                      stdout=subprocess.DEVNULL)
        self.log(f"postgresql fleet: first assess (packs every month) {wall_first:.1f} s  (load {self.loadavg()})")
        self.add(f"postgresql: first fleet `assess --json` after import (reads rows, packs months), {units:,} units",
                 f"{wall_first:.1f}", "s", "", "", "", "")
        pg_t, lite_t = [], []
        for i in range(self.args.repeat):
            for r, out_t in ((lite, lite_t), (root, pg_t)):
                wall_a, _, out = self.timed([self.ferrum, "assess", "--root", r, "--json", "--as-of", AS_OF, "--quiet"],
                                            stdout=subprocess.PIPE)
                if len(json.loads(out)) != units:
                    raise RuntimeError("assess --json did not list every unit")
                wall_r, _, _ = self.timed([self.ferrum, "rank", "--root", r, "--as-of", AS_OF, "--quiet"])
                out_t.append(wall_a + wall_r)
            self.log(f"postgresql fleet #{i + 1}: assess + rank {pg_t[-1]:.1f} s, SQLite {lite_t[-1]:.1f} s"
                     f"  (load {self.loadavg()})")
        p, l = statistics.median(pg_t), statistics.median(lite_t)
        self.add(f"postgresql: fleet `assess --json` + `rank`, {units:,} units (n={self.args.repeat})", f"{p:.1f}", "s",
                 f"{l:.1f} (SQLite)", f"{p / l:.2f}×", "≤ 1.5×", "yes" if p <= 1.5 * l else "no")

    def pg_big_table(self, srv):
        """`assess` of one unit with BIG_TABLE_POINTS load points in the table (hourly, one year, as
        many units as it takes; filled by SQL, not by ingest, and kept), against the same unit in a
        database of the same register where only its site's units have points (an assessment reads
        the site's other units too, for the site view)."""
        points = 200_000 if self.args.smoke else BIG_TABLE_POINTS
        per_unit = 8760
        units = -(-points // per_unit)
        register = self.generated(f"units-{units}.csv", "register", units)
        with open(register) as f:
            ids = [l.split(",", 1)[0] for l in f if l and not l.startswith(("#", "unit_id"))]
        unit = ids[len(ids) // 2]
        fill = ("INSERT INTO load_points(unit_key, ts, load_pu, ambient_c, top_oil_c, file_id, line)"
                " SELECT u.unit_key, t, 0.55 + 0.3 * sin(t / 13750.987), 12 + 9 * sin(t / 5022000.0), NULL,"
                " (SELECT min(id) FROM files), 0 FROM units u CROSS JOIN generate_series({lo}, {hi}, 3600) t"
                " WHERE {where} ORDER BY u.unit_key, t")
        year0 = int(datetime.datetime(2025, 1, 1, tzinfo=datetime.timezone.utc).timestamp())
        roots = {}
        for name, database, where in (("small", "ferrum_one_site", f"u.site = (SELECT site FROM units WHERE unit_id = '{unit}')"),
                                      ("big", f"ferrum_{points}_points", "true")):
            root = self.work / f"pg-{name}-table-root"
            if not (root / ".complete").exists():
                self.log(f"postgresql: filling {database} (once; kept)")
                root = self.pg_root(srv, root.name, database)
                self.ingest(root, self.drop(root, register))
                t0 = time.perf_counter()
                for m in range(12):
                    lo = int(datetime.datetime(2025, m + 1, 1, tzinfo=datetime.timezone.utc).timestamp())
                    hi = int(datetime.datetime(2025 + (m == 11), (m + 1) % 12 + 1, 1,
                                               tzinfo=datetime.timezone.utc).timestamp())
                    part = f"load_points_p2025{m + 1:02d}"
                    srv.psql(f"CREATE TABLE IF NOT EXISTS {part} (LIKE load_points INCLUDING DEFAULTS INCLUDING"
                             f" CONSTRAINTS); ALTER TABLE load_points ATTACH PARTITION {part} FOR VALUES FROM ({lo})"
                             f" TO ({hi})", database=database)
                    srv.psql(fill.format(lo=lo, hi=min(hi, year0 + per_unit * 3600) - 3600, where=where),
                             database=database)
                srv.psql("VACUUM ANALYZE load_points", database=database)
                (root / ".complete").write_text(f"filled in {time.perf_counter() - t0:.0f} s\n")
            roots[name] = (root, database)
        stored = int(srv.psql("SELECT count(*) FROM load_points", database=roots["big"][1]))
        size = int(srv.psql("SELECT sum(pg_total_relation_size(inhrelid)) FROM pg_inherits"
                            " WHERE inhparent = 'load_points'::regclass", database=roots["big"][1]))
        times = {"small": [], "big": []}
        for i in range(self.args.repeat):
            for name in ("small", "big"):
                wall, _, out = self.timed([self.ferrum, "assess", "--root", roots[name][0], unit, "--json",
                                           "--as-of", AS_OF, "--quiet"], stdout=subprocess.PIPE)
                if unit not in out:
                    raise RuntimeError(f"assess {unit} gave no assessment")
                times[name].append(wall)
            self.log(f"postgresql one unit #{i + 1}: {stored:,} points {times['big'][-1] * 1e3:.0f} ms,"
                     f" only its site's {times['small'][-1] * 1e3:.0f} ms  (load {self.loadavg()})")
        b, sm = statistics.median(times["big"]), statistics.median(times["small"])
        self.add(f"postgresql: `assess` of one unit, {stored:,} load points in the table (n={self.args.repeat})",
                 f"{b * 1e3:.0f}", "ms", f"{sm * 1e3:.0f} (only its site's points)", f"{b / sm:.2f}×", "", "")
        self.add(f"postgresql: load_points on disk (heap and key, {stored:,} points)", f"{size / 2**30:.1f}", "GiB",
                 f"{size / stored:.0f} bytes/point", "", "", "")
        self.notes.append(f"- postgresql big table: {(roots['big'][0] / '.complete').read_text().strip()}; at "
                          f"{size / stored:.0f} bytes a point, 1.75 billion points take "
                          f"{1.75e9 * size / stored / 2**40:.2f} TiB")

    # ------------------------------------------------------------ output
    def table(self):
        head = ["benchmark", "median", "unit", "reference (same run)", "ratio", "target", "met"]
        lines = ["| " + " | ".join(head) + " |", "|" + "---|" * len(head)]
        lines += ["| " + " | ".join(str(c) for c in r) + " |" for r in self.rows]
        return "\n".join(lines)

    def write(self, started):
        commit = self.run(["git", "-C", Path(__file__).resolve().parent.parent, "rev-parse", "--short", "HEAD"]).stdout.strip()
        cpu = next((l.split(":", 1)[1].strip() for l in open("/proc/cpuinfo") if l.startswith("model name")), "?")
        text = [f"Run {started} UTC, commit {commit}, {os.cpu_count()} × {cpu}, "
                f"repeat {self.args.repeat}, Release build.", "", self.table(), ""] + self.notes + \
               [f"- load average at end {self.loadavg()}", ""]
        print("\n".join(text))
        if self.args.results and not self.args.only:  # a partial run does not replace the table
            self.merge_results(Path(self.args.results), "\n".join(text))

    @staticmethod
    def merge_results(path, text):
        """Replaces the part of results.md between the markers, keeping the prose around it."""
        begin, end = "<!-- bench/run: table begins -->", "<!-- bench/run: table ends -->"
        old = path.read_text() if path.exists() else f"# Benchmark results\n\n{begin}\n{end}\n"
        if begin not in old:
            old += f"\n{begin}\n{end}\n"
        head, rest = old.split(begin, 1)
        tail = rest.split(end, 1)[1] if end in rest else ""
        path.write_text(f"{head}{begin}\n{text}\n{end}{tail}")


def main():
    ap = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    ap.add_argument("--build", required=True, help="Release build folder")
    ap.add_argument("--work", required=True, help="scratch folder for data and site roots")
    ap.add_argument("--repeat", type=int, default=3)
    ap.add_argument("--with-10m", action="store_true", help="also ingest a 10,000,000-row file (peak memory)")
    ap.add_argument("--only-10m", action="store_true", help="ingest only the 10,000,000-row file")
    ap.add_argument("--only", action="append", choices=["ingest", "fleet", "kernels", "latency", "postgresql"])
    ap.add_argument("--with-100m", action="store_true",
                    help="postgresql: also assess one unit with 100,000,000 load points in the table (~15 GB)")
    ap.add_argument("--results", help="results.md to update (only by a run of every section)")
    ap.add_argument("--smoke", action="store_true",
                    help="tiny sizes, repeat 1, no results written: checks that the harness runs (ctest label smoke)")
    args = ap.parse_args()
    if args.smoke:
        args.repeat, args.results = 1, None
    b = Bench(args)
    started = datetime.datetime.now(datetime.timezone.utc).strftime("%Y-%m-%d %H:%M")
    sections = args.only or ["ingest", "fleet", "kernels", "latency", "postgresql"]
    if args.smoke and not b.kernels.exists():
        sections = [s for s in sections if s != "kernels"]  # Google Benchmark kernels: bench/run only
    for name in sections:
        getattr(b, "bench_" + name)()
    b.write(started)
    if args.smoke:
        # The smoke run's data, site roots and PostgreSQL folder (~370 MB) are
        # of no use once it has passed, and CI's disk is small; a failed run
        # keeps them to look at.
        shutil.rmtree(b.work, ignore_errors=True)


if __name__ == "__main__":
    main()
