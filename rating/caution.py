"""The caution every surface shows, in one wording: the long form (command line, report,
the desktop's start page and dialogs), a short form for footers, pictures and the
window's status line, and the sentence that says what Ebullio does not cover."""

CAUTION = ("Results are engineering estimates. They must be checked by a qualified engineer "
           "under local codes and licensed practice before use in the design or operation "
           "of pressure equipment, steam systems or plant handling flammable fluids.")

CAUTION_SHORT = ("Ebullio: engineering estimates, to be checked by a qualified engineer "
                 "under local codes and licensed practice.")

SCOPE = ("Ebullio rates thermal and hydraulic performance only: no mechanical design, no "
         "relief cases.")
