"""Colours of the window and its plots.

Lines use the Okabe-Ito palette (Okabe & Ito 2008, "Color Universal Design"), which
readers with the common colour-vision deficiencies can tell apart; the lines that
matter most also differ in style. Regime bands are light tints behind the lines.
"""
OKABE_ITO = {
    "orange": "#E69F00", "sky": "#56B4E9", "green": "#009E73", "yellow": "#F0E442",
    "blue": "#0072B2", "vermillion": "#D55E00", "purple": "#CC79A7", "black": "#000000",
}
INK = "#222222"

# Light tints of the regime bands along the tube (keys are the engine's regime names).
REGIME_FILL = {
    "subcooled liquid": "#e3eef8",
    "subcooled boiling": "#dcefe6",
    "saturated boiling": "#fbf6d5",
    "post-dryout": "#f9dccd",
    "superheated vapour": "#eee0ea",
    "pool boiling": "#fbf6d5",
}

# Case status in the case list and the verdict strip: (text colour, background).
STATUS_COLOURS = {
    "rated": ("#0b5e3f", "#dff2e9"),
    "warnings": ("#7a4d00", "#fcefd2"),
    "failed": ("#8f2d00", "#f9dccd"),
    "invalid input": ("#8f2d00", "#f9dccd"),
    "stale": ("#555555", "#ececec"),
    "cancelled": ("#555555", "#ececec"),
    "rating": ("#08466f", "#e3eef8"),
    "not rated": ("#555555", "#f6f6f6"),
}
