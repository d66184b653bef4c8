"""Textbook closed-form formulas, one function per published formula, each citing its source.

Every function takes and returns SI values unless its docstring says otherwise (a few fatigue
correlations are published in kpsi or MPa and keep that unit, stated in brackets).
"""
