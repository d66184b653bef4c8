"""Checks on the solved section: the combined stress field and its critical points
(:mod:`.combined`), static and fatigue criteria (:mod:`.checks`), material ranking
(:mod:`.materials`, with its table reader) and the step that runs them in order (:mod:`.step`).
They return numbers and records, never formatted text.

May import :mod:`compare.pairs`, :mod:`compare.solve`, :mod:`compare.case`, :mod:`fem` and :mod:`classic`.
"""
