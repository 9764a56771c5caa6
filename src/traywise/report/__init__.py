"""Outputs of a solved case or a sweep: console summary, results folder (JSON, CSV, plots,
Markdown report).

The top layer with ``traywise.cli``: it reads solver results and the loaded case and never
changes them. Modules import at most numpy; matplotlib is imported inside ``plots`` when a plot is
drawn, so that commands which draw nothing stay fast.

  outputs          writes a run's results folder (the entry point of ``traywise run``)
  results          the full results record (results.json)
  results_keys     its documented keys, ``RESULTS_KEYS``
  stages           the stage table (stages.csv)
  plots            the PNG figures
  markdown         report.md for a reviewer (and the blocks report.html is rendered from)
  html             report.html: the same report, self-contained (figures as data URIs), A4 print style
  assumptions      the assumptions in force for a run, from the models it used
  inputs_view      the inputs as written in the case, the designed value beside the first guess
  summary          the console summary
  sections         tables shared by the summary and report.md
  comparison_view  renders the isothermal inert-basis comparison the run computed
  design_view      the design of a case with a [design] table (results.json section, text)
  sweep_view       a sweep's folder (sweep.csv, sweep.json, sweep.md) and console table
  sweep_plot       sweep.png
  sweep_labels     a sweep's words, display units and target/limit lines
  folder           writes the results folder all at once (temporary folder, then rename)
  cautions         the safety cautions every report carries
  tables           plain-text and Markdown tables, display units (``Display``), the trace floor
  component_sheet  the component library as text (``traywise components``)
"""
