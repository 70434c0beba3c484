"""Options shared by the commands, and the one place that writes output.

Option values stay text until the command runs: a bare number is read in the unit
system chosen by ``--units``, which click may parse after the number itself.
"""

from __future__ import annotations

import click

__all__ = ["line_options", "output_options", "ascii_option", "plot_option", "spec_from_options", "emit", "parse_layer",
           "wants_charts"]


class Path(click.Path):
    """``click.Path`` that refuses a NUL character with a usage error instead of the
    ``ValueError`` ``os.stat`` raises on it."""

    def convert(self, value, param, ctx):
        if isinstance(value, str) and "\x00" in value:
            self.fail("a file name cannot hold a NUL character", param, ctx)
        return super().convert(value, param, ctx)


def _opt(*names, **kw):
    return click.option(*names, **kw)


LINE_OPTIONS = [
    _opt("--pipe", help='Catalogue size: "NPS 2", DN50, "copper L 1-1/8".'),
    _opt("--schedule", help="Steel schedule (default 40): 5S, 10S, 10, 20, 30, 40, STD, 80, XS, 120, 160, XXS."),
    _opt("--od", help="Outside diameter of a pipe not in the catalogues, e.g. 60.3mm."),
    _opt("--wall", help="Wall thickness with --od, e.g. 3.91mm."),
    _opt("--pipe-material", help="Pipe wall material (default by pipe kind), e.g. stainless steel."),
    _opt("--fluid-temp", help="Fluid temperature, e.g. 82C, 180F."),
    _opt("--steam-pressure", help="Saturated steam pressure instead of --fluid-temp, e.g. 10barg, 150psig."),
    _opt("--fluid", help='Fluid for the inner film and runs: water, "30% ethylene glycol", a CoolProp name.'),
    _opt("--velocity", help="Mean fluid velocity, e.g. 1.5m/s."),
    _opt("--flow", help="Fluid flow, e.g. 5m3/h, 2L/s, 1.2kg/s, 20gpm, 5000lb/h."),
    _opt("--inner-h", help="Fixed inner film coefficient, W/(m²·K) (or with a unit)."),
    _opt("--ambient-temp", default=None, help="Air temperature (default 20 °C)."),
    _opt("--surroundings-temp", help="Mean radiant temperature of the surroundings (default: the air's)."),
    _opt("--rh", help="Relative humidity of the air, percent (gives the dew point)."),
    _opt("--wind", default=None, help="Wind speed across the pipe (default still air), e.g. 3m/s, 7mph."),
    _opt("--orientation", type=click.Choice(["horizontal", "vertical"]), default="horizontal",
         show_default=True, help="Run orientation."),
    _opt("--height", help="Height of a vertical run, e.g. 6m."),
    _opt("--air-pressure", help="Air pressure, e.g. 95kPa (default 101.325 kPa)."),
    _opt("--altitude", help="Site altitude instead of --air-pressure (standard atmosphere), e.g. 1500m."),
    _opt("--layer", "layers", multiple=True, metavar="MATERIAL:THICKNESS",
         help='Insulation layer, inner to outer, repeatable: "mineral wool:50mm", "k=0.040:2in".'),
    _opt("--finish", help='Outer finish from the catalogue, e.g. "aluminium, dull or aged".'),
    _opt("--emittance", help="Outer surface emittance (0 to 1) instead of or over --finish."),
    _opt("--outer-h", help="Fixed combined outer coefficient, W/(m²·K): replaces convection and radiation."),
    _opt("--touch-limit", help="Surface temperature limit (default 60 °C, common practice)."),
    _opt("--length", help="Run length, e.g. 120m (totals, temperature change); a vessel's shell length; "
                          "a horizontal face's film length."),
    _opt("--duct", help='A duct instead of a pipe: rectangular "600x400mm", "24x16in"; round "450mm", "18in".'),
    _opt("--sheet", help="Sheet metal of a duct, face or vessel wall: galvanised steel (default), aluminium, "
                         "stainless steel; thickness by --wall."),
    _opt("--face", type=click.Choice(["vertical", "up", "down"]),
         help="A flat face by its outward normal: vertical (a wall, with --height), up (a top) or down (an "
              "underside), with --length; results per m²."),
    _opt("--sphere", help="A spherical vessel by its outside diameter, e.g. 2.5m; results in W."),
    _opt("--vessel", type=click.Choice(["vertical", "horizontal"]),
         help="A cylindrical vessel by its axis, with --diameter, --length and --heads; results in W."),
    _opt("--diameter", help="Outside diameter of a vessel shell, e.g. 3m."),
    _opt("--heads", type=click.Choice(["flat", "2:1", "hemispherical"]), help="Vessel heads (default flat)."),
    _opt("--floor", help='A vertical tank standing on a flat floor: "air" (bare, open beneath) or "ground:TEMP" '
                         '(bare, on its foundation to the ground at TEMP, e.g. ground:10C); without it the '
                         'bottom head is insulated like the rest.'),
    _opt("--solar", help="Solar irradiance on a surface normal to the sun, e.g. 800W/m2 (at most 1400); "
                         "absorbed on the projected area."),
    _opt("--absorptance", help="Solar absorptance of the outer surface, 0 to 1 (default: the finish's)."),
]


def line_options(func):
    for option in reversed(LINE_OPTIONS):
        func = option(func)
    return func


def ascii_option(func):
    """``--ascii``: plain ASCII output (read by :func:`emit` from the click context)."""
    return click.option("--ascii", is_flag=True, expose_value=False, callback=_set_ascii,
                        help="Plain ASCII text (rules, bullets, unit signs spelt out); chosen by "
                             "itself when the console cannot show Unicode.")(func)


def output_options(func):
    func = click.option("--output", "-o", type=Path(),
                        help="Write to this file (written whole, or not at all; - for standard output).")(func)
    func = click.option("--units", type=click.Choice(["si", "us"]), default="si", show_default=True,
                        help="Default units of bare numbers and units shown.")(func)
    func = ascii_option(func)
    func = click.option("--format", "fmt", default="text", show_default=True,
                        help="Output format: text, json, csv, markdown, html (one self-contained page "
                             "with charts) or xlsx (a workbook, needs --output).")(func)
    return func


def _set_ascii(ctx, param, value):
    ctx.meta["pipeins.ascii"] = bool(value)
    return value


def _json_bytes(report, units: str, output: str | None):
    """The JSON document as UTF-8 pieces (:func:`pipeins.reports.json_pieces`), written as
    they are, where it goes takes UTF-8 bytes: a file, or a UTF-8 standard output (else
    None, and the document goes as text).  A 100,000-line schedule's JSON is then never
    held as one string (a string is two bytes a character once it holds one dash)."""
    import sys

    from ..reports import json_pieces

    if output in (None, "-"):
        encoding = (getattr(sys.stdout, "encoding", None) or "").lower().replace("-", "").replace("_", "")
        if getattr(sys.stdout, "buffer", None) is None or encoding != "utf8":
            return None
    ctx = click.get_current_context(silent=True)
    wanted = bool(ctx is not None and ctx.meta.get("pipeins.ascii"))
    return [piece.encode("utf-8", "backslashreplace") for piece in json_pieces(report, units, ascii=wanted)]


def _render(report, fmt: str, units: str, output: str | None):
    """The report rendered for where it goes: plain ASCII with ``--ascii``, and also when
    it goes to a console whose encoding cannot show it (a Windows code page, say)."""
    import sys

    from ..reports import render

    ctx = click.get_current_context(silent=True)
    wanted = bool(ctx is not None and ctx.meta.get("pipeins.ascii"))
    text = render(report, fmt, units, ascii=wanted)
    if wanted or isinstance(text, bytes) or output not in (None, "-"):
        return text
    encoding = getattr(sys.stdout, "encoding", None) or "utf-8"
    try:
        text.encode(encoding)
        return text
    except UnicodeEncodeError:
        pass
    except LookupError:
        return text
    text = render(report, fmt, units, ascii=True)
    return text.encode(encoding, "replace").decode(encoding)


def _check_plot(ctx, param, value):
    if value is not None and not value.lower().endswith((".svg", ".png")):
        from ..errors import InputError

        raise InputError("--plot", f'"{value}": give a file name ending in .svg or .png')
    return value


def plot_option(func):
    """``--plot FILE.svg|png``: also draw the command's charts into that file (see :func:`emit`)."""
    return click.option("--plot", metavar="FILE.svg|png", callback=_check_plot, expose_value=True,
                        help="Also draw the charts into this file: SVG or PNG by its ending.")(func)


def wants_charts(fmt: str) -> bool:
    """Whether the command's charts are drawn: by the HTML page (*fmt*) or into ``--plot FILE``
    (read from the click context).  Text, JSON, CSV, Markdown and XLSX show no chart, so a
    command building them only when this is true writes the same output without loading
    :mod:`pipeins.reports.charts`."""
    ctx = click.get_current_context(silent=True)
    return fmt == "html" or bool(ctx is not None and ctx.params.get("plot"))


def _q(opts, name, kind, units):
    from ..units import parse_quantity

    text = opts.get(name)
    if text is None:
        return None
    return parse_quantity(text, kind, "--" + name.replace("_", "-"), units)


def parse_layer(text: str, units: str, option: str = "--layer") -> tuple[str, float]:
    """``MATERIAL:THICKNESS`` → (material, thickness_m) (see :func:`pipeins.inputs.parse_layer`)."""
    from ..inputs import parse_layer as read

    return read(text, units, option)


def spec_from_options(opts: dict, units: str, items: list | None = None):
    """A :class:`pipeins.line.LineSpec` from the line options (text, with units), built by
    :func:`pipeins.inputs.line_spec` as the project file's lines are.  With *items*, the
    problems are appended there (and None returned) instead of raised."""
    from ..inputs import LINE_PARAMS, line_spec, values_from_options

    return line_spec(values_from_options(opts, LINE_PARAMS), units, items)


def emit(report, fmt: str, units: str, output: str | None) -> None:
    """Render *report* and print it, or write it whole to *output* (``-`` is standard
    output; see :func:`pipeins.fileio.write_text_output`).

    A binary format (xlsx) needs *output* (not a terminal).  When the command has
    ``--plot FILE`` (read from the click context), the report's charts are drawn into FILE
    as well.
    """
    import sys

    from ..errors import InputError
    from ..reports import BINARY_FORMATS

    if fmt in BINARY_FORMATS and (output is None or (output == "-" and sys.stdout.isatty())):
        raise InputError("--format", f"{fmt} is a binary workbook, not written to a terminal; "
                                     f"give --output FILE.{fmt}")
    pieces = _json_bytes(report, units, output) if fmt == "json" else None
    text = _render(report, fmt, units, output) if pieces is None else None
    ctx = click.get_current_context(silent=True)
    plot = ctx.params.get("plot") if ctx is not None else None
    if plot:
        from ..fileio import write_text_output
        from ..reports.charts import plot_bytes

        write_text_output(plot, plot_bytes(report.charts, plot, units), "--plot")
    if pieces is not None:
        from ..fileio import write_bytes_output

        write_bytes_output(output or "-", pieces, "--output")
        return
    if (output is None or output == "-") and not isinstance(text, bytes):
        click.echo(text, nl=False)
        return
    from ..fileio import write_text_output

    write_text_output(output, text, "--output")
