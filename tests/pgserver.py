#!/usr/bin/env python3
"""A throw-away PostgreSQL server for ferrum's tests (Debian's postgresql 15).

The server lives in one temporary folder: its data directory and its Unix
socket (listen_addresses = '', no TCP). PostgreSQL refuses to run as root, and
CI runs as root: then initdb, pg_ctl and psql run as the `postgres` system user
that Debian's package creates, and the folder is handed to it.

Python:   srv = PgServer(folder); srv.start(); srv.conninfo("ferrum"); srv.stop()
Command:  pgserver.py start FOLDER   prints the connection string of database
                                     'ferrum' (created) and leaves the server running
          pgserver.py stop FOLDER
          pgserver.py remove FOLDER     stops the server and deletes FOLDER
          pgserver.py psql FOLDER SQL   runs SQL in database 'ferrum', prints the rows
Exit status 77 with a message on stderr: PostgreSQL is not installed (skip).
"""
import glob
import os
import pwd
import shutil
import subprocess
import sys

SKIP = 77


def find_bindir():
    """The newest /usr/lib/postgresql/N/bin holding initdb and pg_ctl, or None."""
    dirs = sorted(glob.glob("/usr/lib/postgresql/*/bin"), key=lambda d: int(d.split("/")[-2]) if d.split("/")[-2].isdigit() else 0)
    for d in reversed(dirs):
        if os.access(os.path.join(d, "initdb"), os.X_OK) and os.access(os.path.join(d, "pg_ctl"), os.X_OK):
            return d
    return None


def missing_reason():
    """Why no test server can be started here, or None."""
    if find_bindir() is None:
        return "PostgreSQL server not installed (Debian package postgresql; tests/run installs it)"
    if os.geteuid() == 0:
        try:
            pwd.getpwnam("postgres")
        except KeyError:
            return "running as root and there is no 'postgres' system user to run the server"
    return None


class PgServer:
    def __init__(self, folder):
        self.folder = os.path.abspath(folder)
        self.data = os.path.join(self.folder, "data")
        self.socket_dir = self.folder
        self.bindir = find_bindir()
        self.as_postgres = os.geteuid() == 0
        self.user = "postgres" if self.as_postgres else pwd.getpwuid(os.geteuid()).pw_name

    def _run(self, argv, check=True, **kw):
        if self.as_postgres:
            argv = ["runuser", "-u", "postgres", "--"] + argv
        return subprocess.run(argv, check=check, stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True,
                              cwd="/", **kw)

    def _hand_over(self):
        """The folder (and the folders above it) usable by postgres."""
        if not self.as_postgres:
            return
        pw = pwd.getpwnam("postgres")
        os.makedirs(self.folder, exist_ok=True)
        os.chown(self.folder, pw.pw_uid, pw.pw_gid)
        os.chmod(self.folder, 0o700)
        d = os.path.dirname(self.folder)
        while d != "/":
            st = os.stat(d)
            if not st.st_mode & 0o001:
                os.chmod(d, st.st_mode | 0o001)  # search only, so that postgres reaches its folder
            d = os.path.dirname(d)

    def start(self, database="ferrum", durable=False):
        """durable: keep PostgreSQL's default fsync (benchmarks); the tests turn it off."""
        reason = missing_reason()
        if reason:
            raise RuntimeError(reason)
        os.makedirs(self.folder, exist_ok=True)
        self._hand_over()
        if not os.path.exists(os.path.join(self.data, "PG_VERSION")):
            self._run([os.path.join(self.bindir, "initdb"), "-D", self.data, "-U", self.user, "-A", "trust",
                       "-E", "UTF8", "--no-locale", "--no-sync"])
        opts = f"-c listen_addresses='' -c unix_socket_directories='{self.socket_dir}'"
        if not durable:
            opts += " -c fsync=off"
        if not self.running():
            self._run([os.path.join(self.bindir, "pg_ctl"), "-D", self.data, "-l", os.path.join(self.folder, "server.log"),
                       "-o", opts, "-w", "-t", "60", "start"])
        if database:
            r = self.psql("SELECT 1 FROM pg_database WHERE datname = '%s'" % database, database="postgres")
            if r.strip() != "1":
                self.psql('CREATE DATABASE "%s"' % database, database="postgres")
        return self

    def running(self):
        if not os.path.exists(os.path.join(self.data, "postmaster.pid")):
            return False
        return self._run([os.path.join(self.bindir, "pg_ctl"), "-D", self.data, "status"], check=False).returncode == 0

    def stop(self, mode="fast"):
        if self.bindir and os.path.exists(os.path.join(self.data, "postmaster.pid")):
            self._run([os.path.join(self.bindir, "pg_ctl"), "-D", self.data, "-m", mode, "-w", "stop"], check=False)

    def restart(self):
        self.stop()
        self.start(database=None)

    def conninfo(self, database="ferrum"):
        return f"host={self.socket_dir} dbname={database} user={self.user}"

    def psql(self, sql, database="ferrum"):
        r = self._run([os.path.join(self.bindir, "psql"), "-X", "-A", "-t", "-v", "ON_ERROR_STOP=1", "-h",
                       self.socket_dir, "-U", self.user, "-d", database, "-c", sql], check=False)
        if r.returncode != 0:
            raise RuntimeError("psql failed: " + r.stderr.strip())
        return r.stdout

    def remove(self):
        self.stop()
        shutil.rmtree(self.folder, ignore_errors=True)


def main(argv):
    if len(argv) < 3 or argv[1] not in ("start", "stop", "remove", "psql"):
        print(__doc__, file=sys.stderr)
        return 2
    srv = PgServer(argv[2])
    if argv[1] == "start":
        reason = missing_reason()
        if reason:
            print("skipped: " + reason, file=sys.stderr)
            return SKIP
        srv.start()
        print(srv.conninfo())
    elif argv[1] == "stop":
        srv.stop()
    elif argv[1] == "remove":
        srv.remove()
    else:
        sys.stdout.write(srv.psql(argv[3]))
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv))
