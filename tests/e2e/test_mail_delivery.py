"""Mail through a real SMTP server on the loopback interface (Debian's
python3-aiosmtpd, not a mock): who receives what ([recipients.NAME] gets and
sites), attachments byte-identical, the outbox across a server that is down
and a daemon killed with SIGKILL while sending, a rejected recipient, a wrong
password over STARTTLS (certificate made by the test), and hostile addresses
or subjects refused when the configuration loads."""
import asyncio
import email
import email.policy
import glob
import json
import os
import signal
import socket
import subprocess
import sys
import tempfile
import threading
import time
import unittest

try:
    from aiosmtpd.controller import Controller
    from aiosmtpd.smtp import AuthResult
except ImportError:  # pyenv or venv python: use Debian's, which has the package
    if sys.executable != "/usr/bin/python3" and os.path.exists("/usr/bin/python3"):
        os.execv("/usr/bin/python3", ["/usr/bin/python3", *sys.argv])
    raise

from ferrumtest import SiteTestCase, run

REGISTER = """unit_id,site,rated_mva,hv_kv,lv_kv,cooling,year_built,vector_group,criticality
T1,Quillmere,40,132,33,ONAF,1985,Dyn11,4
T2,Ostrand Yard,10,33,11,ONAN,2015,Dyn11,2
"""

RECIPIENTS = """
[recipients.anna]
email = anna@quillmere.example
sites = Quillmere
gets = weekly, alerts

[recipients.ben]
email = ben@ostrand.example
sites = Ostrand Yard
gets = weekly

[recipients.carla]
email = carla@utility.example
sites = *
gets = fleet
"""


def read(path):
    with open(path, "rb") as f:
        return f.read()


def free_port():
    with socket.socket() as s:
        s.bind(("127.0.0.1", 0))
        return s.getsockname()[1]


class Recorder:
    """aiosmtpd handler: keeps every message; can refuse recipients and
    hold the answer to DATA for a while."""

    def __init__(self, reject=(), data_delay=0):
        self.messages = []
        self.reject = set(reject)
        self.data_delay = data_delay
        self.lock = threading.Lock()

    async def handle_RCPT(self, server, session, envelope, address, rcpt_options):
        if address in self.reject:
            return "550 5.1.1 no such mailbox here"
        envelope.rcpt_tos.append(address)
        return "250 OK"

    async def handle_DATA(self, server, session, envelope):
        msg = email.message_from_bytes(envelope.original_content or envelope.content, policy=email.policy.default)
        with self.lock:
            self.messages.append((envelope.mail_from, list(envelope.rcpt_tos), msg))
        if self.data_delay:
            await asyncio.sleep(self.data_delay)
        return "250 OK queued"

    def to(self, address):
        with self.lock:
            return [m for _, rcpt, m in self.messages if address in rcpt]


class MailCase(SiteTestCase):
    def setUp(self):
        super().setUp()
        self.port = free_port()
        self.controller = None
        self.drop("units.csv", REGISTER)
        self.ingest()

    def tearDown(self):
        self.stop_server()
        super().tearDown()

    def start_server(self, handler, **kw):
        self.controller = Controller(handler, hostname="127.0.0.1", port=self.port, **kw)
        self.controller.start()
        return handler

    def stop_server(self):
        if self.controller:
            self.controller.stop()
            self.controller = None

    def configure(self, mail="", recipients=RECIPIENTS):
        self.write_config(f"[mail]\nsmtp_host = 127.0.0.1\nsmtp_port = {self.port}\nsecurity = none\n"
                          f"from = ferrum@utility.example\nretry_seconds = 1\n{mail}\n{recipients}")

    def outbox(self, *sub):
        return sorted(glob.glob(self.path("outbox", *sub, "*.json")))

    def status(self):
        return json.loads(run("status", "--root", self.root, "--json", check=False).stdout)["outbox"]

    def weekly_bundle(self):
        return run("report", "--root", self.root, "--weekly", "--quiet").stdout.strip()

    def attachments(self, msg):
        return {p.get_filename(): p.get_payload(decode=True) for p in msg.iter_attachments()}

    def body(self, msg):
        return msg.get_body(preferencelist=("plain",)).get_content()


class WhoGetsWhat(MailCase):
    def test_recipients_receive_what_gets_and_sites_say_byte_identical(self):
        rec = self.start_server(Recorder())
        self.configure()
        bundle = self.weekly_bundle()
        p = run("send", "--root", self.root, "--weekly")
        self.assertIn(": sent", p.stdout)
        files = {os.path.basename(f): read(f) for f in glob.glob(os.path.join(bundle, "*"))}
        t1 = next(n for n in files if n.startswith("ferrum-T1-"))
        t2 = next(n for n in files if n.startswith("ferrum-T2-"))
        fleet = sorted(n for n in files if n.startswith("ferrum-fleet-"))
        self.assertEqual(len(fleet), 3, files.keys())  # PDF, ranking CSV and sites CSV
        expected = {"anna@quillmere.example": {t1, "index.pdf"},      # planner of Quillmere: T1 only
                    "ben@ostrand.example": {t2, "index.pdf"},        # planner of Ostrand Yard: T2 only
                    "carla@utility.example": set(fleet) | {"index.pdf"}}  # manager: fleet PDF + CSV
        for address, names in expected.items():
            got = rec.to(address)
            self.assertEqual(len(got), 1, address)
            att = self.attachments(got[0])
            self.assertEqual(set(att), names, address)
            for n, data in att.items():
                self.assertEqual(data, files[n], f"{address}: {n} differs from the bundle's file")
            body = self.body(got[0])
            # Every body opens with the one-line caution, then the week's summary.
            self.assertTrue(body.startswith("SAFETY:"), body[:200])
            self.assertEqual(body.count("SAFETY:"), 1, body[:400])  # summary.txt's own, not a second
            self.assertIn("Units needing action:", body)
            self.assertIn("Actions due in the next 7 days", body)
            self.assertIn("Alerts raised this week: 0", body)
            self.assertIn("planning: 1 received, 0 rejected", body)  # the register, dropped this week
            self.assertTrue(got[0]["Message-ID"].startswith("<weekly-"), got[0]["Message-ID"])
        self.assertEqual(len(rec.messages), 3)
        self.assertEqual(len(self.outbox("sent")), 3)
        self.assertEqual(self.status()["waiting"], 0)
        # Asking again does not send the same week twice.
        p = run("send", "--root", self.root, "--weekly")
        self.assertEqual(p.stdout.count("queued before"), 3, p.stdout)
        self.assertEqual(len(rec.messages), 3)

    def test_over_the_size_limit_the_paths_instead_of_the_files(self):
        rec = self.start_server(Recorder())
        # max_mb is whole megabytes: the smallest limit, 1 MB, passed by a
        # 1 MB file added to the fleet part of the bundle (base64 grows it by 4/3).
        self.configure("max_mb = 1")
        bundle = self.weekly_bundle()
        big = os.path.join(bundle, "ferrum-fleet-padding.csv")
        with open(big, "wb") as f:
            f.write(b"x" * (1024 * 1024))
        run("send", "--root", self.root, "--weekly")
        carla = rec.to("carla@utility.example")[0]
        self.assertEqual(self.attachments(carla), {})
        self.assertIn("too large to attach", self.body(carla))
        self.assertIn(big, self.body(carla))
        anna = rec.to("anna@quillmere.example")[0]
        self.assertIn("index.pdf", self.attachments(anna))  # small: still attached

    def test_alert_goes_at_once_to_those_whose_sites_it_concerns(self):
        rec = self.start_server(Recorder())
        self.configure()
        self.start_daemon()
        today = time.strftime("%Y-%m-%d", time.gmtime())
        self.drop("inspection.csv", "unit_id,inspection_date,item,rating\n"
                                    f"T1,{today},bushings,unsafe\n")
        self.wait_for(lambda: rec.to("anna@quillmere.example"), timeout=20, what="alert mail to anna")
        msg = rec.to("anna@quillmere.example")[0]
        self.assertIn("ALERT T1", msg["Subject"])
        self.assertTrue(self.body(msg).startswith("SAFETY:"))
        pdfs = glob.glob(self.path("reports", "alerts", "alert-T1-*.pdf"))
        self.assertEqual(len(pdfs), 1)
        self.assertEqual(self.attachments(msg), {os.path.basename(pdfs[0]): read(pdfs[0])})
        time.sleep(1.5)
        # ben serves Ostrand Yard only and carla does not get alerts.
        self.assertEqual([r for _, r, _ in rec.messages], [["anna@quillmere.example"]])
        self.assertEqual(self.stop_daemon()[0], 0)


class Faults(MailCase):
    def test_server_down_then_up_every_message_exactly_once(self):
        self.configure()
        self.weekly_bundle()
        p = run("send", "--root", self.root, "--weekly", check=False)
        self.assertEqual(p.returncode, 1, p.stdout + p.stderr)
        self.assertIn("waiting, will be retried", p.stdout)
        st = self.status()
        self.assertEqual(st["waiting"], 3)
        self.assertIn("Connection refused", st["last_error"])
        self.assertTrue(st["oldest_waiting"])
        self.start_daemon()
        time.sleep(2.5)  # a few failed rounds with back-off
        rec = self.start_server(Recorder())
        self.wait_for(lambda: len(self.outbox("sent")) == 3, timeout=30, what="delivery after the server came up")
        time.sleep(3)  # nothing comes a second time
        self.assertEqual(sorted(r[0] for _, r, _ in rec.messages),
                         ["anna@quillmere.example", "ben@ostrand.example", "carla@utility.example"])
        self.assertEqual(self.outbox(), [])
        self.assertEqual(self.stop_daemon()[0], 0)

    def test_daemon_killed_while_sending_delivers_at_least_once_same_message_id(self):
        self.configure()
        self.weekly_bundle()
        slow = self.start_server(Recorder(data_delay=3))
        self.start_daemon()
        run("send", "--root", self.root, "--weekly")  # the daemon runs: queued for it
        self.wait_for(lambda: slow.messages, timeout=20, what="the first message's data at the server")
        self.daemon.send_signal(signal.SIGKILL)  # before the server's 250
        self.daemon.wait()
        self.stop_server()
        first = {m["To"]: m["Message-ID"] for _, _, m in slow.messages}
        rec = self.start_server(Recorder())
        self.start_daemon()
        self.wait_for(lambda: len(self.outbox("sent")) == 3, timeout=30, what="delivery after the restart")
        self.assertEqual(self.outbox(), [])
        got = {m["To"]: m["Message-ID"] for _, _, m in rec.messages}
        self.assertEqual(set(first) | set(got),
                         {"anna@quillmere.example", "ben@ostrand.example", "carla@utility.example"})
        for to, mid in first.items():  # resent with the same Message-ID
            self.assertEqual(got.get(to), mid, to)
        self.assertEqual(self.stop_daemon()[0], 0)

    def test_rejected_recipient_goes_to_failed_with_the_server_answer(self):
        rec = self.start_server(Recorder(reject={"ben@ostrand.example"}))
        self.configure()
        self.weekly_bundle()
        p = run("send", "--root", self.root, "--weekly", check=False)
        self.assertEqual(p.returncode, 1)
        self.assertIn("REJECTED", p.stdout)
        self.assertEqual(len(rec.messages), 2)  # anna and carla
        failed = self.outbox("failed")
        self.assertEqual([os.path.basename(f) for f in failed], [os.path.basename(failed[0])])
        self.assertIn("-ben", failed[0])
        self.assertTrue(os.path.exists(failed[0][:-5] + ".eml"))  # the message is kept
        st = self.status()
        self.assertEqual((st["waiting"], st["failed"], st["sent"]), (0, 1, 2))
        self.assertIn("550", st["failures"][0])
        text = run("status", "--root", self.root, check=False).stdout
        self.assertIn("1 failed", text)
        self.assertIn("no such mailbox", text)


class StartTlsAndPasswords(MailCase):
    def make_certificate(self):
        self.cert_dir = tempfile.mkdtemp(prefix="ferrum-tls-")
        self.cert = os.path.join(self.cert_dir, "cert.pem")
        self.key = os.path.join(self.cert_dir, "key.pem")
        subprocess.run(["openssl", "req", "-x509", "-newkey", "rsa:2048", "-nodes", "-days", "2",
                        "-subj", "/CN=127.0.0.1", "-addext", "subjectAltName=IP:127.0.0.1,DNS:localhost",
                        "-keyout", self.key, "-out", self.cert], check=True, capture_output=True)

    def tls_server(self, rec):
        import ssl
        ctx = ssl.create_default_context(ssl.Purpose.CLIENT_AUTH)
        ctx.load_cert_chain(self.cert, self.key)

        def check(server, session, envelope, mechanism, auth_data):
            ok = auth_data.login == b"ferrum" and auth_data.password == b"s3cret pass"
            return AuthResult(success=ok, handled=False)

        return self.start_server(rec, tls_context=ctx, require_starttls=True, authenticator=check,
                                 auth_require_tls=True)

    def test_starttls_with_the_right_then_a_wrong_password(self):
        self.make_certificate()
        pw = os.path.join(self.cert_dir, "password")
        with open(pw, "w") as f:
            f.write("s3cret pass\n")
        rec = self.tls_server(Recorder())
        self.configure(f"security = starttls\nuser = ferrum\npassword_file = {pw}\nca_file = {self.cert}")
        p = run("send", "--root", self.root, "--test", "dora@utility.example", check=False)
        self.assertEqual(p.returncode, 0, p.stdout + p.stderr)
        self.assertEqual(len(rec.to("dora@utility.example")), 1)
        self.assertTrue(self.body(rec.to("dora@utility.example")[0]).startswith("SAFETY:"))
        # A wrong password: nothing sent, the message waits (it is not the
        # message's fault), the server's answer is shown.
        with open(pw, "w") as f:
            f.write("wrong\n")
        p = run("send", "--root", self.root, "--test", "dora@utility.example", check=False)
        self.assertEqual(p.returncode, 1, p.stdout + p.stderr)
        self.assertIn("535", p.stdout)
        self.assertEqual(len(rec.messages), 1)
        st = self.status()
        self.assertEqual(st["waiting"], 1)
        self.assertIn("535", st["last_error"])

    def test_implicit_tls(self):
        import ssl
        self.make_certificate()
        ctx = ssl.create_default_context(ssl.Purpose.CLIENT_AUTH)
        ctx.load_cert_chain(self.cert, self.key)
        rec = self.start_server(Recorder(), ssl_context=ctx)
        self.configure(f"security = tls\nca_file = {self.cert}")
        p = run("send", "--root", self.root, "--test", "dora@utility.example", check=False)
        self.assertEqual(p.returncode, 0, p.stdout + p.stderr)
        self.assertEqual(len(rec.to("dora@utility.example")), 1)

    def test_a_certificate_not_trusted_is_refused(self):
        self.make_certificate()
        self.tls_server(Recorder())
        self.configure("security = starttls")  # no ca_file: the system's authorities do not know it
        p = run("send", "--root", self.root, "--test", "dora@utility.example", check=False)
        self.assertEqual(p.returncode, 1, p.stdout + p.stderr)
        self.assertEqual(self.status()["waiting"], 1)


class HostileConfiguration(SiteTestCase):
    def refused(self, text, key):
        with open(self.path("ferrum.ini"), "ab") as f:
            f.write(text.encode())
        for cmd in (["send", "--root", self.root, "--test", "a@b.example"], ["serve", "--root", self.root, "--once"]):
            p = run(*cmd, check=False)
            self.assertNotEqual(p.returncode, 0, cmd)
            self.assertIn(key, p.stderr, p.stderr)

    def setUp(self):
        super().setUp()
        self.base = read(self.path("ferrum.ini"))

    def reset(self):
        with open(self.path("ferrum.ini"), "wb") as f:
            f.write(self.base)

    def test_hostile_addresses_and_subjects_are_refused_at_load(self):
        mail = "\n[mail]\nsmtp_host = 127.0.0.1\nfrom = ferrum@utility.example\n"
        cases = [
            (mail + "[recipients.x]\nemail = a@b.example, evil@c.example\ngets = alerts\n", "recipients.x.email"),
            (mail + "[recipients.x]\nemail = a@b.example>\ngets = alerts\n", "recipients.x.email"),
            (mail + "[recipients.x]\nemail = a@b.example\rBcc: evil@c.example\ngets = alerts\n", "recipients.x.email"),
            (mail + "[recipients.x]\nemail = <evil@c.example>\ngets = alerts\n", "recipients.x.email"),
            (mail + "[recipients.x]\nemail = a b@c.example\ngets = alerts\n", "recipients.x.email"),
            (mail + "[recipients.x]\nemail = a@b.example\ngets = everything\n", "recipients.x.gets"),
            ("\n[mail]\nsmtp_host = 127.0.0.1\nfrom = ferrum@utility.example\rRCPT TO:<evil@c.example>\n", "mail.from"),
            (mail + "subject_prefix = ok\rBcc: evil@c.example\n", "mail.subject_prefix"),
            (mail + "subject_prefix = bell\x07\n", "mail.subject_prefix"),
            ("\n[mail]\nsmtp_host = 127.0.0.1\n", "mail.from"),
        ]
        for text, key in cases:
            with self.subTest(key=key, text=text):
                self.reset()
                self.refused(text, key)
        # An address given on the command line is checked the same way.
        self.reset()
        with open(self.path("ferrum.ini"), "a") as f:
            f.write(mail)
        p = run("send", "--root", self.root, "--test", "a@b.example>\nRCPT TO:<x@y.example", check=False)
        self.assertNotEqual(p.returncode, 0)
        self.assertIn("--test", p.stderr)
        self.assertFalse(os.path.exists(self.path("outbox")) and os.listdir(self.path("outbox")))


if __name__ == "__main__":
    unittest.main()
