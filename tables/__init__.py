"""gaugewalk's published electrical tables (NEC/NFPA 70, 2023 edition unless a module says
otherwise).

Pure data with lookups, standard library only; never imports Textual. Installed as
``gaugewalk.tables`` (the bare name ``tables`` belongs to an HDF5 library). Rooms:
``conductor`` (sizes, Ch. 9 Tables 8 and 9, Table 310.16 and its corrections), ``protection``
(240.6(A), 240.4(D), Table 250.122), ``raceway`` (Ch. 9 Tables 1, 4, 5; installation rules),
``order`` (colours and put-ups for the takeoff), ``equipment`` (motors, Art. 430 tables; welders,
Table 630.11(A); transformers, Table 450.3(B) and 240.21(C)).
"""

GAUGEWALK_TABLES = True
