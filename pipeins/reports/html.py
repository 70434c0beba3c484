"""The HTML report: one self-contained file to hand over, read on screen or printed to PDF.

Built from the same :class:`~pipeins.reports.Report` as every other format, so whatever
the report builders put in (tables, warnings, cautions, basis lines, charts) appears
here too.  The page holds everything itself: inline CSS, charts as inline SVG, no
scripts, no fonts or images fetched from anywhere; every text is escaped.

Sections, in order: the title block (from the project file's ``[report]`` table when
there is one, see ``docs/report-title-block.md``), the contents, the basis of design
(the report's basis lines and the method), one section per report table (for a
schedule: the schedule, the lines, the totals), the charts, the warnings and the
cautions.  The print stylesheet lays the page out for A4 or Letter: tables wrap rather
than run off the right edge, headers repeat on each page, pages are numbered.
"""

from __future__ import annotations

import datetime as _dt
import re
from html import escape

__all__ = ["render_html", "TITLE_BLOCK_KEYS", "METHOD"]

#: Keys of the title block, in the order shown, with their labels (the ``[report]`` table).
TITLE_BLOCK_KEYS = {
    "project": "Project",
    "number": "Project number",
    "client": "Client",
    "revision": "Revision",
    "date": "Date",
    "prepared_by": "Prepared by",
    "checked_by": "Checked by",
}

#: The method paragraph of every report's basis of design.
METHOD = (
    "Steady heat flow through a thermal resistance network: inner film, pipe wall, each "
    "insulation layer with its conductivity varying with temperature (Kirchhoff integral of the "
    "fitted k(T)), and the outer surface losing heat by convection in parallel with radiation; "
    "solved for the surface temperature by a bracketed iteration. Air, water and steam "
    "properties come from tables generated with CoolProp. The correlations, property sources and "
    "limits used are named in the basis lines above and in DEVELOPERS.md."
)

# Plain, own design: black text on white, one grey rule colour, a dark teal for headings
# and links only.  Meaning is always carried by words (section names, "warning", the
# governing criterion spelled out), never by colour.
_CSS = """
:root { --ink: #1b1b1b; --muted: #555; --rule: #9a9a9a; --head: #17484f; --band: #f2f4f4; }
* { box-sizing: border-box; }
html { font-family: "Segoe UI", "Helvetica Neue", Arial, sans-serif; color: var(--ink);
       background: #fff; font-size: 15px; line-height: 1.4; }
body { max-width: 68rem; margin: 0 auto; padding: 1.2rem 1.4rem 3rem; }
h1 { font-size: 1.55rem; margin: 0 0 .4rem; color: var(--head); }
h2 { font-size: 1.2rem; margin: 1.8rem 0 .5rem; color: var(--head);
     border-bottom: 1px solid var(--rule); padding-bottom: .15rem; }
a { color: var(--head); }
.title-block { border: 2px solid var(--ink); padding: .7rem .9rem; margin-bottom: 1rem; }
.title-block table { border-collapse: collapse; width: 100%; }
.title-block th { text-align: left; font-weight: 600; width: 11rem; padding: .1rem .6rem .1rem 0;
                  color: var(--muted); vertical-align: top; }
.title-block td { padding: .1rem 0; }
nav.contents ol { margin: .2rem 0 0 0; padding-left: 2.2rem; columns: 2; }
.table-wrap { overflow-x: auto; margin: .3rem 0; }
table.data { border-collapse: collapse; width: 100%; font-size: .9rem; }
table.data caption { caption-side: top; text-align: left; color: var(--muted); font-size: .85rem; }
table.data th, table.data td { border: 1px solid var(--rule); padding: .22rem .4rem;
                               vertical-align: top; overflow-wrap: break-word; }
table.data thead th { background: var(--band); text-align: left; font-weight: 600;
                      vertical-align: bottom; }
table.data td.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
table.data tbody tr:nth-child(even) td { background: #fafafa; }
p.note { font-size: .85rem; color: var(--muted); margin: .2rem 0 0; }
ul.notes li { margin: .15rem 0; }
section.cautions { border-left: 4px solid var(--ink); padding-left: .8rem; }
figure.chart { margin: .8rem 0 1.2rem; break-inside: avoid; page-break-inside: avoid; }
figure.chart svg { max-width: 100%; height: auto; display: block; }
figure.chart figcaption { font-size: .85rem; color: var(--muted); }
footer.colophon { margin-top: 2.5rem; font-size: .8rem; color: var(--muted);
                  border-top: 1px solid var(--rule); padding-top: .4rem; }
@page { margin: 14mm 12mm 16mm 12mm;
        @bottom-right { content: "page " counter(page) " of " counter(pages);
                        font-size: 8pt; color: #555; }
        @bottom-left { content: "pipeins report"; font-size: 8pt; color: #555; } }
@media print {
  html { font-size: 10pt; }
  body { max-width: none; padding: 0; }
  a { color: inherit; text-decoration: none; }
  nav.contents ol { columns: 1; }
  .table-wrap { overflow: visible; }
  table.data { font-size: 8.5pt; width: 100%; table-layout: auto; }
  table.data.wide { font-size: 7pt; }
  table.data.wide th, table.data.wide td { overflow-wrap: anywhere; }
  table.data th, table.data td { padding: 1.5pt 3pt; }
  table.data td.num { white-space: normal; }
  thead { display: table-header-group; }
  tr { break-inside: avoid; page-break-inside: avoid; }
  h2 { break-after: avoid; page-break-after: avoid; }
  section { break-inside: auto; }
  figure.chart svg { max-height: 120mm; width: auto; }
}
"""

_NUMBER = re.compile(r"^[−+-]?[\d,]*\.?\d+( ?%)?$")


def _is_number(text: str) -> bool:
    return bool(_NUMBER.match(text.strip()))


def _slug(index: int, title: str) -> str:
    words = re.sub(r"[^a-z0-9]+", "-", title.lower()).strip("-")[:40]
    return f"s{index}-{words}" if words else f"s{index}"


def _title_block_rows(report, units: str) -> list[tuple[str, str]]:
    block = dict(getattr(report, "title_block", None) or {})
    rows = [(label, str(block[key])) for key, label in TITLE_BLOCK_KEYS.items()
            if block.get(key) not in (None, "")]
    if not any(key == "date" for key in block):
        rows.append(("Date", _dt.date.today().isoformat()))
    rows.append(("Units", "SI" if units == "si" else "US customary"))
    try:
        from importlib.metadata import version

        rows.append(("Prepared with", f"pipeins {version('pipeins')}"))
    except Exception:  # noqa: BLE001 - not installed (a bare checkout): say nothing
        pass
    return rows


def _table_html(table, units: str, anchor: str) -> str:
    from . import _cells

    heads, rows = _cells(table, units)
    wide = " wide" if len(heads) > 8 else ""
    out = [f'<section class="table" id="{anchor}"><h2>{escape(table.title)}</h2>',
           '<div class="table-wrap">', f'<table class="data{wide}">', "<thead><tr>"]
    out += [f'<th scope="col">{escape(h)}</th>' for h in heads]
    out.append("</tr></thead><tbody>")
    for row in rows:
        cells = []
        for text in row:
            cls = ' class="num"' if _is_number(text) else ""
            cells.append(f"<td{cls}>{escape(text)}</td>")
        out.append("<tr>" + "".join(cells) + "</tr>")
    if not rows:
        out.append(f'<tr><td colspan="{max(1, len(heads))}">(no rows)</td></tr>')
    out.append("</tbody></table></div>")
    if table.note:
        out.append(f'<p class="note">{escape(table.note)}</p>')
    out.append("</section>")
    return "\n".join(out)


def _list_section(kind: str, title: str, lines, anchor: str, empty: str) -> str:
    out = [f'<section class="{kind}" id="{anchor}"><h2>{escape(title)}</h2>']
    if lines:
        out.append('<ul class="notes">' + "".join(f"<li>{escape(str(x))}</li>" for x in lines) + "</ul>")
    else:
        out.append(f"<p>{escape(empty)}</p>")
    out.append("</section>")
    return "\n".join(out)


def render_html(report, units: str = "si") -> str:
    """The report as one self-contained HTML page (text).

    Parameters
    ----------
    report : pipeins.reports.Report
        Any report; its optional ``title_block`` (dict of :data:`TITLE_BLOCK_KEYS`) fills
        the title block and its optional ``charts`` (:class:`pipeins.reports.charts.Chart`)
        are drawn as inline SVG (matplotlib is imported only then).
    units : {"si", "us"}
        Unit system of the values and column headers shown.

    Returns
    -------
    str
        The page, UTF-8 text starting with ``<!DOCTYPE html>``.
    """
    sections: list[tuple[str, str, str]] = []  # (anchor, title, html)
    n = 0

    def add(title, make):
        nonlocal n
        n += 1
        anchor = _slug(n, title)
        sections.append((anchor, title, make(anchor)))

    basis = list(report.footer)
    add("Basis of design", lambda a: _list_section("basis", "Basis of design", basis, a,
                                                   "No basis lines for this report.")
        .replace("</section>", f'<p class="method"><strong>Method.</strong> {escape(METHOD)}</p></section>'))
    for table in report.tables:
        add(table.title, lambda a, t=table: _table_html(t, units, a))
    charts = list(getattr(report, "charts", None) or [])
    if charts:
        from .charts import chart_svg

        def chart_section(anchor):
            parts = [f'<section class="charts" id="{anchor}"><h2>Charts</h2>']
            for j, chart in enumerate(charts, 1):
                svg = chart_svg(chart, units, id_prefix=f"c{j}-")
                parts.append(f'<figure class="chart" id="chart-{j}">{svg}'
                             f"<figcaption>Figure {j}. {escape(chart.title)}</figcaption></figure>")
            parts.append("</section>")
            return "\n".join(parts)

        add("Charts", chart_section)
    add(f"Warnings ({len(report.warnings)})",
        lambda a: _list_section("warnings", "Warnings", report.warnings, a, "None."))
    add("Cautions", lambda a: _list_section("cautions", "Cautions", report.cautions, a, "None."))

    block = "".join(f'<tr><th scope="row">{escape(k)}</th><td>{escape(v)}</td></tr>'
                    for k, v in _title_block_rows(report, units))
    contents = "".join(f'<li><a href="#{a}">{escape(t)}</a></li>' for a, t, _ in sections)
    body = "\n".join(html for _, _, html in sections)
    return (
        "<!DOCTYPE html>\n"
        '<html lang="en">\n<head>\n<meta charset="utf-8">\n'
        '<meta name="viewport" content="width=device-width, initial-scale=1">\n'
        f"<title>{escape(report.title)}</title>\n<style>{_CSS}</style>\n</head>\n<body>\n"
        f'<header class="title-block"><h1>{escape(report.title)}</h1><table>{block}</table></header>\n'
        f'<nav class="contents" id="contents"><h2>Contents</h2><ol>{contents}</ol></nav>\n'
        f"{body}\n"
        '<footer class="colophon">Engineering estimates for the stated steady conditions; local codes, '
        "the owner's rules and licensed practice govern."
        "</footer>\n</body>\n</html>\n"
    )
