"""Outputs of a solved case or a sweep: console summary, results folder (JSON, CSV, plots,
Markdown report).

The top layer with ``traywise.cli``: it reads solver results and the loaded case and never
changes them. Modules import at most numpy; matplotlib is imported inside ``plots`` when a plot is
drawn, so that commands which draw nothing stay fast.

  outputs          writes a run's results folder (the entry point of ``traywise run``)
  results          the full results record (results.json) and its documented keys, ``RESULTS_KEYS``
  stages           the stage table (stages.csv)
  plots            the PNG figures
  markdown         report.md for a reviewer
  summary          the console summary
  sections         tables shared by the summary and report.md
  comparison_view  runs and renders the isothermal inert-basis comparison
  design_view      the design of a case with a [design] table (results.json section, text)
  sweep_view       a sweep's folder (sweep.csv, sweep.json, sweep.md) and console table
  sweep_plot       sweep.png
  folder           writes the results folder all at once (temporary folder, then rename)
  cautions         the safety cautions every report carries
  tables           plain-text and Markdown tables, display units
  component_sheet  the component library as text (``traywise components``)
"""
