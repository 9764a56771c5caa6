"""Component data, pure vectorised property functions and the per-case property model.

Knows nothing of columns, case files or the command line.
"""
