"""The ``pipeins`` command: a thin layer over the library.

Commands are loaded on first use so that ``pipeins --help`` starts quickly; every
command parses its options, calls the library and prints through
:func:`pipeins.reports.render`.  Bad input (:class:`pipeins.errors.InputError`) becomes
one line ``Error: …`` on standard error and exit status 2.
"""

from __future__ import annotations

import importlib
import importlib.util
import sys

import click

__all__ = ["main", "cli"]

COMMANDS = {
    "check": ("pipeins.cli.check", "check", "Heat flow and temperatures of one insulated line."),
    "size": ("pipeins.cli.size", "size", "The least thickness that meets each criterion."),
    "table": ("pipeins.cli.table", "table", "Thickness table per pipe size for one service."),
    "cost": ("pipeins.cli.cost", "cost", "Annual energy, cost and CO2; bare against insulated; economic thickness."),
    "sweep": ("pipeins.cli.sweep", "sweep", "Vary one input over a range: heat flow and thickness per value."),
    "schedule": ("pipeins.cli.schedule", "schedule", "Insulation schedule of a whole project file."),
    "list": ("pipeins.cli.listing", "list_", "Show the catalogues: pipes, materials, finishes, series, rules."),
    "verify": ("pipeins.cli.verify", "verify", "Run the published checks shipped with pipeins and compare."),
}


class _LazyGroup(click.Group):
    def list_commands(self, ctx):
        return [name for name, (module, _, _) in COMMANDS.items() if importlib.util.find_spec(module)]

    def get_command(self, ctx, name):
        if name not in COMMANDS:
            return None
        module, attr, _ = COMMANDS[name]
        try:
            return getattr(importlib.import_module(module), attr)
        except ModuleNotFoundError:
            return None

    def format_commands(self, ctx, formatter):
        rows = [(name, COMMANDS[name][2]) for name in self.list_commands(ctx)]
        with formatter.section("Commands"):
            formatter.write_dl(rows)


@click.group(cls=_LazyGroup, context_settings={"help_option_names": ["-h", "--help"], "max_content_width": 100})
@click.version_option(package_name="pipeins")
def cli():
    """Size thermal insulation on pipes and ducts.

    Heat loss or gain per metre, surface and interface temperatures, the thickness that
    keeps a surface touch-safe or a chilled line dry, heat-loss caps, code minimums and
    the economic thickness, by the cylindrical resistance network with convection and
    radiation at the outer surface.

    Results are engineering estimates for the stated conditions: local codes, the
    owner's safety rules and licensed practice govern.
    """


def main(argv=None):
    """Entry point: run the CLI and turn bad input into ``Error: …`` with exit status 2."""
    from ..errors import InputError, one_line

    def errors(lines) -> None:  # one line each, control characters escaped
        click.echo("\n".join(f"Error: {one_line(p)}" for p in lines), err=True)

    try:
        cli.main(args=argv, prog_name="pipeins", standalone_mode=False)
    except InputError as exc:  # several problems at once, one line each, each input named by its flag
        from ..inputs import cli_line

        if getattr(exc, "items", None):
            lines = [cli_line(name, message) for name, message in exc.items]
        elif getattr(exc, "problems", None):
            lines = exc.problems
        else:
            lines = [cli_line(exc.name, exc.message)]
        errors(lines)
        sys.exit(2)
    except click.exceptions.Abort:
        click.echo("Aborted.", err=True)
        sys.exit(1)
    except click.UsageError as exc:  # click's own checks (unknown option, bad choice): one line too
        command = exc.ctx.command_path if exc.ctx is not None else "pipeins"
        errors([f"{exc.format_message()} (see {command} --help)"])
        sys.exit(2)
    except click.ClickException as exc:
        errors([exc.format_message()])
        sys.exit(exc.exit_code)
    except click.exceptions.Exit as exc:
        sys.exit(exc.exit_code)
    sys.exit(0)
