"""The demo's mail path (demo-site/run --mail), on a small demo site: the
demo's ferrum.ini and units register, the demo's mail configuration
(demo-site/site/mail.ini) pointed at the demo's own SMTP catcher
(demo-site/mail-catcher, Debian's python3-aiosmtpd on loopback), the daemon
running. The committed spot check of Teskary Quay raises an unsafe-inspection
alert; then `ferrum send --weekly`. Every recipient of mail.ini must have
received, in the catcher's folder, what its `gets` and `sites` say, with the
attachments byte-identical to the files of the site."""
import configparser
import csv
import glob
import importlib.machinery
import importlib.util
import os
import shutil
import signal
import subprocess
import sys
import time
import unittest

try:
    import aiosmtpd  # noqa: F401  (the catcher needs it)
except ImportError:  # pyenv or venv python: use Debian's, which has the package
    if sys.executable != "/usr/bin/python3" and os.path.exists("/usr/bin/python3"):
        os.execv("/usr/bin/python3", ["/usr/bin/python3", *sys.argv])
    raise

from ferrumtest import SOURCE, SiteTestCase, run

DEMO = os.path.join(SOURCE, "demo-site")
CATCHER = os.path.join(DEMO, "mail-catcher")


def load_catcher():
    loader = importlib.machinery.SourceFileLoader("mail_catcher", CATCHER)
    spec = importlib.util.spec_from_loader("mail_catcher", loader)
    module = importlib.util.module_from_spec(spec)
    loader.exec_module(module)
    return module


def read(path):
    with open(path, "rb") as f:
        return f.read()


class DemoMail(SiteTestCase):
    party = "teb_planning"

    def setUp(self):
        super().setUp()
        self.catcher = None
        self.mail = self.path("mail")
        shutil.copy(os.path.join(DEMO, "site", "ferrum.ini"), self.path("ferrum.ini"))
        self.catcher = subprocess.Popen(["/usr/bin/python3", CATCHER, "serve", self.mail],
                                        stderr=subprocess.PIPE, text=True)
        self.wait_for(lambda: os.path.exists(os.path.join(self.mail, "port")), timeout=20,
                      what="the demo's SMTP catcher")
        port = read(os.path.join(self.mail, "port")).decode().strip()
        with open(os.path.join(DEMO, "site", "mail.ini")) as f:
            self.write_config(f.read().replace("SMTP_PORT", port))

    def tearDown(self):
        if self.catcher and self.catcher.poll() is None:
            self.catcher.kill()
            self.catcher.wait()
        super().tearDown()

    def recipients(self):
        ini = configparser.ConfigParser()
        ini.read(os.path.join(DEMO, "site", "mail.ini"))
        out = {}
        for sec in ini.sections():
            if sec.startswith("recipients."):
                r = ini[sec]
                out[r["email"]] = ({s.strip().lower() for s in r["sites"].split(",")},
                                   {g.strip() for g in r["gets"].split(",")})
        return out

    def test_every_planner_and_manager_of_the_demo_gets_their_mail(self):
        register = os.path.join(DEMO, "drops", "teb_planning", "units-register.csv")
        with open(register) as f:
            unit_site = {row["unit_id"]: row["site"].lower() for row in csv.DictReader(f)}
        self.drop("units-register.csv", read(register), mode="wb")
        self.ingest()
        os.makedirs(self.path("drop", "orvane_field"), exist_ok=True)
        self.start_daemon()
        # The committed spot check: TKQ-T2's earth conductor rated unsafe -> an alert at once.
        spot = os.path.join(DEMO, "drops", "orvane_field", "spotcheck-TKQ-2026-11-18.csv")
        self.drop(os.path.basename(spot), read(spot), party="orvane_field", mode="wb")
        recipients = self.recipients()
        alerted = {a for a, (sites, gets) in recipients.items()
                   if "alerts" in gets and ("*" in sites or "teskary quay" in sites)}
        self.assertGreaterEqual(len(alerted), 2)  # the port's planner and the manager
        catcher = load_catcher()
        self.wait_for(lambda: len(catcher.read_messages(self.mail)) >= len(alerted), timeout=60,
                      what="the alert mail")
        bundle = run("report", "--root", self.root, "--weekly", "--quiet").stdout.strip()
        p = run("send", "--root", self.root, "--weekly")
        self.assertIn("the running daemon sends them", p.stdout)
        weekly_to = {a for a, (_, gets) in recipients.items() if gets & {"weekly", "fleet"}}
        self.assertEqual(len(weekly_to), 4)  # three planners and the manager
        self.wait_for(lambda: len(catcher.read_messages(self.mail)) >= len(alerted) + len(weekly_to),
                      timeout=60, what="the weekly mail")
        time.sleep(1.5)  # nothing more comes
        self.assertEqual(self.stop_daemon()[0], 0)
        self.catcher.send_signal(signal.SIGTERM)
        self.assertEqual(self.catcher.wait(timeout=10), 0)
        self.assertFalse(os.path.exists(os.path.join(self.mail, "port")))

        files = {os.path.basename(f): f for f in glob.glob(os.path.join(bundle, "*"))}
        fleet = {n for n in files if n.startswith("ferrum-fleet-")}
        self.assertEqual(len(fleet), 3, files)  # PDF, ranking CSV and sites CSV
        got = {}
        for path, rcpt, msg in catcher.read_messages(self.mail):
            self.assertEqual(msg["To"], rcpt)  # saved under its recipient
            self.assertTrue(msg.get_body(preferencelist=("plain",)).get_content().startswith("SAFETY:"))
            got.setdefault(rcpt, []).append(msg)
        self.assertEqual(set(got), set(recipients))  # every planner and the manager, nobody else
        for address, (sites, gets) in recipients.items():
            msgs = got[address]
            alerts = [m for m in msgs if " ALERT TKQ-T2 " in m["Subject"]]
            weekly = [m for m in msgs if " weekly " in m["Subject"]]
            self.assertEqual(len(alerts), 1 if address in alerted else 0, address)
            self.assertEqual(len(weekly), 1, address)
            self.assertEqual(len(msgs), len(alerts) + len(weekly), address)
            expected = {"index.pdf"}
            if "weekly" in gets:  # the unit reports of their sites
                expected |= {n for n in files if n.endswith(".pdf") and n.startswith("ferrum-")
                             and not n.startswith("ferrum-fleet-")
                             and ("*" in sites or unit_site[n[7:-15]] in sites)}
            if "fleet" in gets:
                expected |= fleet
            att = {p.get_filename(): p.get_payload(decode=True) for p in weekly[0].iter_attachments()}
            self.assertEqual(set(att), expected, address)
            for name, data in att.items():
                self.assertEqual(data, read(files[name]), f"{address}: {name} differs from the bundle's file")
            if alerts:
                pdfs = glob.glob(self.path("reports", "alerts", "alert-TKQ-T2-*.pdf"))
                self.assertEqual(len(pdfs), 1)
                att = {p.get_filename(): p.get_payload(decode=True) for p in alerts[0].iter_attachments()}
                self.assertEqual(att, {os.path.basename(pdfs[0]): read(pdfs[0])}, address)
        # A planner gets the reports of their own sites only: the port's planner none of Corrowby Grid's.
        port_planner = [a for a, (s, g) in recipients.items() if s == {"teskary quay"}]
        self.assertEqual(len(port_planner), 1)
        names = {p.get_filename() for m in got[port_planner[0]] for p in m.iter_attachments()}
        self.assertFalse(any(n.startswith("ferrum-CRW-") for n in names), names)
        self.assertTrue(any(n.startswith("ferrum-TKQ-T2-") for n in names), names)

        # The summary the demo prints names every recipient, subject and attachment.
        out = subprocess.run(["/usr/bin/python3", CATCHER, "summary", self.mail], capture_output=True,
                             text=True, check=True).stdout
        for address in recipients:
            self.assertIn(address, out)
        self.assertIn("ALERT TKQ-T2", out)
        self.assertIn("ferrum-fleet-", out)


if __name__ == "__main__":
    unittest.main()
