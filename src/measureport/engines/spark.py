"""Spark SQL through pyspark: the model's tables as temporary views, SQL run with ``spark.sql``.

    engine = SparkEngine(bound)                          # a local Spark of its own, local[2]
    engine = SparkEngine(bound, remote="sc://spark.example:15002")   # a user's cluster
    engine = SparkEngine(bound, session=spark)           # a session the caller owns

Local mode starts a JVM (Java 17) in this process's care with ``local[2]``, the web UI off, two
shuffle partitions, the session time zone UTC and ANSI mode on (so an overflow or a division by
zero is an error, never a silent null; the rendering must avoid them); adaptive execution and
whole-stage code generation are off, since local mode serves test-sized data, where they cost
more than they save. :meth:`close` stops the
session and ends the JVM, which otherwise outlives ``stop()``. The JVM's own messages (its start-up
notices and warnings) go to :data:`JVM_LOG` in the temporary folder, not to the terminal; a failed
statement is reported in one sentence by the adapter.

A cluster is reached through Spark Connect with an ``sc://host:port`` URL (add ``/;token=...``
and other parameters as Spark Connect defines them). That needs the Spark Connect client
(``pip install "pyspark[connect]"``); the model's tables are sent to the cluster as temporary
views of the Connect session, which vanish when it ends, and tables whose ``from:`` names a
catalog table (``schema.table``) are read where they are. This is how measureport runs where
the data outgrow one machine; the code path is not exercised by the test suite, which has no
cluster.

Type mapping (model type → Spark SQL type → Python value read back):

========================  ==================  ==========================================
model type                Spark SQL type      read back as
========================  ==================  ==========================================
``integer``, ``bigint``   ``BIGINT``          ``int``
``decimal(p,s)``          ``DECIMAL(p,s)``    ``float``; with no fractional digits ``int``
``double``                ``DOUBLE``          ``float``
``text``                  ``STRING``          ``str``
``date``                  ``DATE``            ``datetime.date``; a ``TIMESTAMP`` (what month
                                              truncation returns) cut to its day in UTC
``boolean``               ``BOOLEAN``         ``bool``
========================  ==================  ==========================================

Results are fetched as Arrow (``DataFrame.toArrow``): timestamps arrive in the session's time
zone, UTC, whatever the machine's local zone is (``collect()`` would shift them into it).
"""

from __future__ import annotations

import logging
import os
import sys
import tempfile
import warnings
from collections.abc import Iterator, Sequence
from contextlib import contextmanager
from pathlib import Path
from typing import TYPE_CHECKING, Any

import pyarrow as pa

from measureport.engines.sqlengine import SqlEngine, workspace_dataset
from measureport.errors import MeasureportError
from measureport.model.schema import DataType
from measureport.model.tabledata import Dataset
from measureport.semantics.bound import BoundModel

if TYPE_CHECKING:
    from pyspark.sql import SparkSession
    from pyspark.sql.types import DataType as SparkType
    from pyspark.sql.types import StructType

    from measureport.workspace import Workspace

LOCAL_MASTER = "local[2]"

#: The settings of a local session.
LOCAL_SETTINGS: dict[str, str] = {
    "spark.ui.enabled": "false",
    "spark.ui.showConsoleProgress": "false",
    "spark.sql.shuffle.partitions": "2",
    "spark.sql.session.timeZone": "UTC",
    "spark.sql.ansi.enabled": "true",
    "spark.driver.host": "127.0.0.1",
    "spark.driver.bindAddress": "127.0.0.1",
    "spark.log.level": "ERROR",
    # Test-sized data: re-planning each stage and compiling code per query cost more than they save.
    "spark.sql.adaptive.enabled": "false",
    "spark.sql.codegen.wholeStage": "false",
}


def is_connect_url(target: str) -> bool:
    """True for a Spark Connect URL, ``sc://host:port``."""
    return target.startswith("sc://")


def _import_pyspark() -> None:
    try:
        with warnings.catch_warnings():
            # pyspark warns at import about pandas versions it has not been tried with; the
            # adapter does not go through pandas.
            warnings.simplefilter("ignore", FutureWarning)
            import pyspark.sql
            import pyspark.testing.utils  # noqa: F401  (pyspark imports it lazily, and it warns)
    except ImportError:
        raise MeasureportError(
            "the Spark engine needs pyspark; install it with: pip install pyspark"
        ) from None
    from pyspark.logger import PySparkLogger

    # pyspark logs every failed statement with its Java stack; the adapter reports it in one sentence.
    for name in ("SQLQueryContextLogger", "DataFrameQueryContextLogger"):
        PySparkLogger.getLogger(name).setLevel(logging.CRITICAL)


def local_session(master: str = LOCAL_MASTER) -> SparkSession:
    """A new local Spark session with :data:`LOCAL_SETTINGS`."""
    _import_pyspark()
    from pyspark.sql import SparkSession

    builder = SparkSession.builder.master(master).appName("measureport")
    for key, value in LOCAL_SETTINGS.items():
        builder = builder.config(key, value)
    with errors_of_started_processes_to(JVM_LOG):
        return builder.getOrCreate()


#: Where the local JVM writes its own messages (start-up notices, warnings, Java stacks).
JVM_LOG = Path(tempfile.gettempdir()) / "measureport-spark.log"


@contextmanager
def errors_of_started_processes_to(path: Path) -> Iterator[None]:
    """Processes started inside write their standard error to ``path`` for as long as they run;
    this process's own standard error is restored on leaving."""
    sys.stderr.flush()
    saved = os.dup(2)
    try:
        with path.open("ab") as log:
            os.dup2(log.fileno(), 2)
        yield
    finally:
        sys.stderr.flush()
        os.dup2(saved, 2)
        os.close(saved)


def active_local_session() -> SparkSession | None:
    """The local Spark session already running in this process, if any (someone else's)."""
    _import_pyspark()
    from pyspark.sql import SparkSession

    return SparkSession.getActiveSession()


def connect_session(url: str) -> SparkSession:
    """A Spark Connect session with the cluster at ``url`` (``sc://host:port``), time zone UTC, ANSI on."""
    _import_pyspark()
    from pyspark.sql import SparkSession

    try:
        session = SparkSession.builder.remote(url).getOrCreate()
    except ImportError as exc:
        raise MeasureportError(
            f"reaching a Spark cluster needs the Spark Connect client ({exc.name or exc}); "
            'install it with: pip install "pyspark[connect]"'
        ) from None
    except Exception as exc:
        first = (str(exc).strip().splitlines() or [type(exc).__name__])[0]
        raise MeasureportError(f"could not reach the Spark cluster at {url}: {first}") from None
    session.conf.set("spark.sql.session.timeZone", "UTC")
    session.conf.set("spark.sql.ansi.enabled", "true")
    return session


def end_local_jvm() -> None:
    """End the JVM that pyspark started for a local session (after ``stop()``), and forget it,
    so that a later local session starts a new one."""
    from pyspark import SparkContext

    gateway = SparkContext._gateway
    process = getattr(gateway, "proc", None) if gateway is not None else None
    if process is not None and process.poll() is None:
        # The JVM that pyspark launched exits when its standard input closes.
        process.stdin.close()
        try:
            process.wait(timeout=60)
        except Exception:
            process.kill()
            process.wait()
    SparkContext._gateway = None
    SparkContext._jvm = None


class SparkEngine(SqlEngine):
    """Runs statements with Spark SQL over the model's tables as temporary views."""

    title = "Spark SQL"
    dialect = "spark"
    sqlglot_dialect = "spark"

    def __init__(
        self,
        bound: BoundModel,
        dataset: Dataset | None = None,
        session: SparkSession | None = None,
        remote: str | None = None,
        master: str = LOCAL_MASTER,
    ) -> None:
        """Load the model's tables (from ``dataset`` when given, else from the data files) into
        ``session`` (the caller's, left running on :meth:`close`), or a Spark Connect session
        with the cluster at ``remote``, or else a local session of ``master`` of its own."""
        super().__init__(bound)
        self._owns_local = session is None and remote is None
        self._owns_session = session is None
        if session is not None:
            _import_pyspark()
            self.session = session
        elif remote is not None:
            self.session = connect_session(remote)
        else:
            running = active_local_session()
            if running is not None:
                # getOrCreate would hand back this session; stopping it would end its owner's JVM.
                self._owns_local = self._owns_session = False
                self.session = running
            else:
                self.session = local_session(master)
        self.load_tables(dataset)

    @classmethod
    def for_workspace(cls, workspace: Workspace, url: str | None = None) -> SparkEngine:
        """The engine of a workspace: on the cluster at ``url`` (``sc://...``), else local."""
        return cls(workspace.bound, workspace_dataset(workspace), remote=url)

    def schema(self, name: str) -> StructType:
        """The Spark schema a model table is loaded with."""
        from pyspark.sql.types import StructField, StructType

        columns = self.model.tables[name].columns.values()
        return StructType([StructField(c.name, spark_type(c.type), nullable=True) for c in columns])

    def load_table(self, name: str, table: pa.Table) -> None:
        with warnings.catch_warnings():
            warnings.simplefilter("ignore", FutureWarning)  # pyspark's pandas version check, as above
            frame = self.session.createDataFrame(table, schema=self.schema(name))
        frame.createOrReplaceTempView(name)

    def fetch(self, sql: str) -> Sequence[Sequence[Any]]:
        from py4j.protocol import Py4JError
        from pyspark.errors import PySparkException

        try:
            result = self.session.sql(sql).toArrow()
        except (PySparkException, Py4JError) as exc:
            raise self.run_error(exc) from None
        columns = [result.column(i).to_pylist() for i in range(result.num_columns)]
        return list(zip(*columns, strict=True)) if columns else []

    def shutdown(self) -> None:
        if not self._owns_session:
            for name in self.loaded:
                self.session.catalog.dropTempView(name)
            return
        self.session.stop()
        if self._owns_local:
            end_local_jvm()


def spark_type(data_type: DataType) -> SparkType:
    """The Spark SQL type a model column is loaded as (see the table above)."""
    from pyspark.sql import types as spark

    if data_type.precision is not None:
        return spark.DecimalType(data_type.precision, data_type.scale or 0)
    kinds: dict[str, SparkType] = {
        "integer": spark.LongType(),
        "bigint": spark.LongType(),
        "double": spark.DoubleType(),
        "text": spark.StringType(),
        "date": spark.DateType(),
        "boolean": spark.BooleanType(),
    }
    return kinds[data_type.sql]
