"""Builds the component library (components/*.toml) from chemicals, thermo and CoolProp.

Used only to generate and audit the data files (``python -m traywise.databank.build``); the
run path never imports this package, nor the libraries it calls.
"""
