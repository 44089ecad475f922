"""A throwaway PostgreSQL server: a new cluster in a temporary folder, on 127.0.0.1 and a free port.

    with ThrowawayPostgres() as server:       # initdb + postgres, about two seconds
        engine = PostgresEngine(bound, server.url)

It uses the machine's PostgreSQL server programs (``initdb`` and ``postgres``), found from
``$MEASUREPORT_PG_BINDIR``, then ``pg_config --bindir``, then ``/usr/lib/postgresql/*/bin``
(newest first), then ``PATH``. PostgreSQL refuses to run as root, so under root the server runs
as the unprivileged ``postgres`` user, which must exist (``.ci/start-postgres`` installs the
programs and creates the user when they are missing). The cluster trusts local connections
(``-A trust``), skips every disk flush (``--no-sync``, ``fsync=off``, ``synchronous_commit=off``,
``full_page_writes=off``: its data are thrown away), listens on 127.0.0.1 only, and keeps its
socket and its log in the temporary folder. :meth:`ThrowawayPostgres.stop` shuts it down and
removes the folder; a server still running when Python exits is stopped then.
"""

from __future__ import annotations

import atexit
import contextlib
import glob
import os
import pwd
import shutil
import signal
import socket
import subprocess
import tempfile
import time
from dataclasses import dataclass
from pathlib import Path
from types import TracebackType

from measureport.errors import MeasureportError

SERVER_USER = "postgres"
START_TIMEOUT_SECONDS = 60.0
STOP_TIMEOUT_SECONDS = 20.0
_PROGRAMS = ("initdb", "postgres")


def find_server_binaries() -> Path | None:
    """The folder holding ``initdb`` and ``postgres``, or None when this machine has none."""
    candidates: list[str] = []
    override = os.environ.get("MEASUREPORT_PG_BINDIR")
    if override:
        candidates.append(override)
    if shutil.which("pg_config"):
        with contextlib.suppress(OSError, subprocess.SubprocessError):
            said = subprocess.run(["pg_config", "--bindir"], capture_output=True, text=True, timeout=10)
            candidates.append(said.stdout.strip())
    candidates += sorted(glob.glob("/usr/lib/postgresql/*/bin"), key=_version_key, reverse=True)
    found = shutil.which("initdb")
    if found:
        candidates.append(str(Path(found).resolve().parent))
    for folder in candidates:
        if folder and all((Path(folder) / program).is_file() for program in _PROGRAMS):
            return Path(folder)
    return None


def _version_key(folder: str) -> tuple[int, ...]:
    version = Path(folder).parent.name
    return tuple(int(part) for part in version.split(".") if part.isdigit())


def unavailable_reason(bindir: Path | None = None) -> str | None:
    """Why no throwaway server can be started here (from the programs in ``bindir``, or those
    found on the machine), or None when one can."""
    if bindir is None and find_server_binaries() is None:
        return (
            "the PostgreSQL server programs (initdb, postgres) are not installed; "
            "run .ci/start-postgres or install the 'postgresql' package"
        )
    if os.geteuid() == 0:
        try:
            pwd.getpwnam(SERVER_USER)
        except KeyError:
            return (
                f"PostgreSQL cannot run as root and there is no '{SERVER_USER}' user to run it; "
                "run .ci/start-postgres to create one"
            )
    return None


def free_port() -> int:
    """A TCP port on 127.0.0.1 that nothing listens on (the system's pick for port 0)."""
    with socket.socket(socket.AF_INET, socket.SOCK_STREAM) as probe:
        probe.bind(("127.0.0.1", 0))
        port: int = probe.getsockname()[1]
        return port


@dataclass(frozen=True)
class _RunAs:
    uid: int | None
    gid: int | None

    @classmethod
    def for_server(cls) -> _RunAs:
        if os.geteuid() != 0:
            return cls(None, None)
        entry = pwd.getpwnam(SERVER_USER)
        return cls(entry.pw_uid, entry.pw_gid)


class ThrowawayPostgres:
    """A PostgreSQL server of its own, started by :meth:`start` and removed by :meth:`stop`."""

    def __init__(self, bindir: Path | None = None, database: str = "postgres") -> None:
        """A server from the programs in ``bindir`` (found on the machine when None)."""
        self.bindir = bindir
        self.database = database
        self.port: int | None = None
        self.folder: Path | None = None
        self._process: subprocess.Popen[bytes] | None = None

    @property
    def url(self) -> str:
        """The connection URL of the running server."""
        if self.port is None:
            raise MeasureportError("the throwaway PostgreSQL server is not running")
        return f"postgresql://{SERVER_USER}@127.0.0.1:{self.port}/{self.database}"

    @property
    def pid(self) -> int | None:
        """The server's process id while it runs."""
        return self._process.pid if self._process is not None else None

    def start(self) -> str:
        """Create the cluster, start the server, wait until it accepts connections; its URL."""
        reason = unavailable_reason(self.bindir)
        if reason is not None:
            raise MeasureportError(f"cannot start a PostgreSQL server: {reason}")
        bindir = self.bindir or find_server_binaries()
        assert bindir is not None  # unavailable_reason said the programs are there
        run_as = _RunAs.for_server()
        folder = Path(tempfile.mkdtemp(prefix="measureport-pg-"))
        self.folder = folder
        atexit.register(self.stop)
        if run_as.uid is not None and run_as.gid is not None:
            os.chown(folder, run_as.uid, run_as.gid)
        data = folder / "data"
        self._run_initdb(bindir, data, run_as)
        self.port = free_port()
        log = (folder / "server.log").open("wb")
        with log:
            self._process = subprocess.Popen(
                [
                    str(bindir / "postgres"),
                    "-D", str(data),
                    "-p", str(self.port),
                    "-k", str(folder),
                    "-c", "listen_addresses=127.0.0.1",
                    "-c", "fsync=off",
                    "-c", "synchronous_commit=off",
                    "-c", "full_page_writes=off",
                ],
                stdin=subprocess.DEVNULL,
                stdout=log,
                stderr=subprocess.STDOUT,
                cwd=folder,
                user=run_as.uid,
                group=run_as.gid,
                start_new_session=True,
            )  # fmt: skip
        self._wait_until_ready()
        return self.url

    def _run_initdb(self, bindir: Path, data: Path, run_as: _RunAs) -> None:
        command = [
            str(bindir / "initdb"),
            "-D", str(data),
            "-A", "trust",
            "-U", SERVER_USER,
            "-E", "UTF8",
            "--locale=C",
            "--no-sync",
            "--no-instructions",
        ]  # fmt: skip
        done = subprocess.run(
            command, capture_output=True, text=True, cwd=data.parent, user=run_as.uid, group=run_as.gid
        )
        if done.returncode != 0:
            self.stop()
            last = (done.stderr.strip().splitlines() or ["no message"])[-1]
            raise MeasureportError(f"initdb could not create a PostgreSQL cluster: {last}")

    def _wait_until_ready(self) -> None:
        import psycopg

        deadline = time.monotonic() + START_TIMEOUT_SECONDS
        while True:
            assert self._process is not None
            if self._process.poll() is not None:
                tail = self._log_tail()
                self.stop()
                raise MeasureportError(f"the PostgreSQL server stopped as it started: {tail}")
            try:
                with psycopg.connect(self.url, connect_timeout=2):
                    return
            except psycopg.OperationalError:
                if time.monotonic() > deadline:
                    self.stop()
                    waited = f"{START_TIMEOUT_SECONDS:.0f} s"
                    raise MeasureportError(
                        f"the PostgreSQL server did not accept connections within {waited}"
                    ) from None
                time.sleep(0.1)

    def _log_tail(self) -> str:
        if self.folder is None:
            return "no log"
        try:
            lines = (self.folder / "server.log").read_text(errors="replace").strip().splitlines()
        except OSError:
            return "no log"
        return lines[-1] if lines else "no log"

    def stop(self) -> None:
        """Shut the server down (fast shutdown, then a kill if it lingers) and remove its folder."""
        process, self._process = self._process, None
        if process is not None and process.poll() is None:
            process.send_signal(signal.SIGINT)
            try:
                process.wait(STOP_TIMEOUT_SECONDS)
            except subprocess.TimeoutExpired:
                process.kill()
                process.wait()
        self.port = None
        folder, self.folder = self.folder, None
        if folder is not None:
            shutil.rmtree(folder, ignore_errors=True)
        atexit.unregister(self.stop)

    def __enter__(self) -> ThrowawayPostgres:
        self.start()
        return self

    def __exit__(
        self,
        exc_type: type[BaseException] | None,
        exc: BaseException | None,
        tb: TracebackType | None,
    ) -> None:
        self.stop()
