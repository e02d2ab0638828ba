"""joint-audit's demo: a generator for an invented steel-framed building and its generated files.

See ``samples/README.md``. Demo data only, not a design: joint-audit is an aid to a competent
engineer, its results must be checked, and local codes and licensed practice take precedence.
"""
