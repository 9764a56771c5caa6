"""report.html: the same report as report.md, self-contained (figures embedded as PNG data URIs,
one inline stylesheet, no script, nothing fetched), printable on A4 with a print stylesheet.

Rendered from ``markdown.report_blocks`` (the same blocks report.md is written from); blocks that
other views hand over as Markdown text (the equipment datasheet) pass through ``_markdown_html``,
which knows the few constructs traywise writes: headings, paragraphs, bullet lists (two levels),
tables, images, **bold** and `code`.
"""

import base64
import html
import re

from .markdown import report_blocks

STYLE = """
body { font-family: "DejaVu Sans", Arial, sans-serif; font-size: 10pt; line-height: 1.35; color: #111;
       max-width: 190mm; margin: 1em auto; padding: 0 1em; }
h1 { font-size: 16pt; margin-bottom: 0.2em; } h2 { font-size: 12.5pt; border-bottom: 1px solid #888;
     margin-top: 1.4em; } h3 { font-size: 11pt; }
table { border-collapse: collapse; margin: 0.6em 0; font-size: 9pt; }
th, td { border: 1px solid #bbb; padding: 2px 6px; vertical-align: top; }
th { background: #eee; text-align: left; } td.n { text-align: right; font-variant-numeric: tabular-nums; }
img { max-width: 100%; height: auto; display: block; margin: 0.6em 0; }
figure { margin: 0.6em 0; } figcaption { font-size: 9pt; color: #444; }
.cautions { border: 2px solid #b00; padding: 0.3em 0.8em 0.3em 2em; background: #fff4f4; }
code { font-family: "DejaVu Sans Mono", monospace; font-size: 9pt; }
@page { size: A4; margin: 15mm 12mm 15mm 12mm; }
@media print {
  body { max-width: none; margin: 0; padding: 0; font-size: 9pt; }
  h2 { break-after: avoid; } table, figure, img, .cautions { break-inside: avoid; }
  a { color: inherit; text-decoration: none; }
}
"""
_NUMBER = re.compile(r"^[<>]?\s*[-+]?(\d[\d.]*|\.\d+)(e[-+]?\d+)?( \(.*\))?$|^-$")


def html_report(results, folder):
    """The text of report.html for a results record; figures are read from ``folder``."""
    case = results["case"]
    parts = [f"<h1>{_e(case['title'])}</h1>",
             f"<p>Case file <code>{_e(case['file'])}</code>, solved by traywise {_e(results['software']['version'])}. "
             "Machine-readable results: <code>results.json</code> (all values in SI) and <code>stages.csv</code>.</p>"]
    if case["notes"]:
        parts += ["<h2>Notes</h2>", *(f"<p>{_inline(' '.join(paragraph.split()))}</p>"
                                      for paragraph in case["notes"].strip().split("\n\n") if paragraph.strip())]
    for heading, kind, body in report_blocks(results):
        if heading is not None:
            parts.append(f"<h2>{_e(heading)}</h2>")
        parts.append(_block(kind, body, folder, cautions=heading == "Safety cautions"))
    title = _e(case["title"])
    return ("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n"
            f"<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n<title>{title}</title>\n"
            f"<style>{STYLE}</style>\n</head>\n<body>\n" + "\n".join(parts) + "\n</body>\n</html>\n")


def _block(kind, body, folder, *, cautions=False):
    if kind == "text":
        return f"<p>{_inline(body)}</p>"
    if kind == "bullets":
        items = "".join(f"<li>{_inline(line)}</li>" for line in body)
        return f"<ul class=\"cautions\">{items}</ul>" if cautions else f"<ul>{items}</ul>"
    if kind == "table":
        return _table(*body)
    if kind == "figure":
        name, title = body
        return _figure(folder, name, title)
    if kind == "sources":
        items = []
        for name, sources in body.items():
            inner = "".join(f"<li>{_e(label)}: {_e(citation)}</li>" for label, citation in sources.items())
            items.append(f"<li><strong>{_e(name)}</strong><ul>{inner}</ul></li>")
        return f"<ul>{''.join(items)}</ul>"
    if kind == "markdown":
        return _markdown_html(body, folder)
    raise ValueError(kind)


def _table(headers, rows):
    head = "".join(f"<th>{_e(h)}</th>" for h in headers)
    body = []
    for row in rows:
        cells = [f"<td>{_inline(str(row[0]))}</td>"]
        cells += [f"<td class=\"n\">{_inline(str(c))}</td>" if _NUMBER.match(str(c)) else f"<td>{_inline(str(c))}</td>"
                  for c in row[1:]]
        body.append(f"<tr>{''.join(cells)}</tr>")
    return f"<table><thead><tr>{head}</tr></thead><tbody>{''.join(body)}</tbody></table>"


def _figure(folder, name, title):
    path = folder / name
    if not path.is_file():
        return f"<p>{_e(title)}: figure <code>{_e(name)}</code> not drawn.</p>"
    data = base64.b64encode(path.read_bytes()).decode("ascii")
    return (f"<figure><img src=\"data:image/png;base64,{data}\" alt=\"{_e(title)}\">"
            f"<figcaption>{_e(title)}</figcaption></figure>")


def _markdown_html(text, folder):
    """The Markdown traywise writes (see module docstring) as HTML."""
    out, lines, i = [], text.split("\n"), 0
    while i < len(lines):
        line = lines[i]
        if not line.strip():
            i += 1
        elif line.startswith("#"):
            level = min(len(line) - len(line.lstrip("#")), 6)
            out.append(f"<h{level}>{_inline(line.lstrip('#').strip())}</h{level}>")
            i += 1
        elif line.startswith("|"):
            block = []
            while i < len(lines) and lines[i].startswith("|"):
                block.append(lines[i])
                i += 1
            cells = [_cells(row) for row in block if not re.fullmatch(r"\|[\s:|-]+\|", row.strip())]
            out.append(_table(cells[0], cells[1:]))
        elif re.match(r"\s*- ", line):
            items = []
            while i < len(lines) and re.match(r"\s*- ", lines[i]):
                nested = lines[i].startswith("  ")
                entry = _inline(lines[i].strip()[2:])
                if nested and items:
                    items[-1][1].append(entry)
                else:
                    items.append((entry, []))
                i += 1
            out.append("<ul>" + "".join(f"<li>{e}" + (f"<ul>{''.join(f'<li>{n}</li>' for n in sub)}</ul>" if sub else "")
                                        + "</li>" for e, sub in items) + "</ul>")
        elif (image := re.fullmatch(r"!\[(.*)\]\((.*)\)", line.strip())):
            out.append(_figure(folder, image.group(2), image.group(1)))
            i += 1
        else:
            paragraph = []
            while i < len(lines) and lines[i].strip() and not re.match(r"\s*(- |#|\||!\[)", lines[i]):
                paragraph.append(lines[i].strip())
                i += 1
            if not paragraph:  # a line no rule above takes: show it as text
                paragraph, i = [line.strip()], i + 1
            out.append(f"<p>{_inline(' '.join(paragraph))}</p>")
    return "\n".join(out)


def _cells(row):
    return [cell.strip().replace("\\|", "|") for cell in re.split(r"(?<!\\)\|", row.strip())[1:-1]]


def _inline(text):
    """Escaped text with **bold** and `code` of Markdown."""
    text = _e(text)
    text = re.sub(r"\*\*(.+?)\*\*", r"<strong>\1</strong>", text)
    return re.sub(r"`([^`]+)`", r"<code>\1</code>", text)


def _e(text):
    return html.escape(str(text), quote=True)

