"""The `measureport` command: a group of subcommands sharing one way of reporting failures."""

from __future__ import annotations

import click

from measureport import __version__
from measureport.cli.check import check
from measureport.cli.demo import demo
from measureport.cli.dialects import dialects
from measureport.cli.diff import diff
from measureport.cli.failures import ReportingGroup
from measureport.cli.run import run
from measureport.cli.sql import explain, sql
from measureport.cli.verify import verify
from measureport.cli.views import views


@click.group(cls=ReportingGroup, context_settings={"help_option_names": ["-h", "--help"]})
@click.option("--debug", is_flag=True, help="Show the traceback of a failure as well as its message.")
@click.version_option(__version__, prog_name="measureport")
def main(debug: bool) -> None:
    """Port business measures to SQL and prove the port is right."""


main.add_command(check)
main.add_command(run)
main.add_command(sql)
main.add_command(explain)
main.add_command(diff)
main.add_command(views)
main.add_command(verify)
main.add_command(dialects)
main.add_command(demo)
