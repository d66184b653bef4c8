"""Everything that leaves the program: the ``results.json`` dictionary (:mod:`.results`), the
terminal summary (:mod:`.report`, :mod:`.report_combined`) and the VTU fields (:mod:`.vtu`).
The only room that turns numbers into text.

May import :mod:`compare.pipeline` and every room below it, :mod:`fem` and :mod:`classic`.
"""
