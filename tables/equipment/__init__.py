"""Equipment data: motors, welders and transformers (NEC/NFPA 70 2023 unless a module says
otherwise).

Modules: ``horsepower`` (reading the trade's horsepower spellings), ``hp_tables`` (reading a cell
of a table keyed by horsepower), ``motors`` (Tables 430.247, 430.248, 430.250 and the voltage
column a system reads), ``locked_rotor`` (Tables 430.251(A), 430.251(B) and the code letters of
Table 430.7(B)), ``motor_protection`` (Table 430.52(C)(1) and the limits of 430.52(C)(1)(b) and
(C)(3)), ``welders`` (Table 630.11(A), 630.11(B), 630.12), ``transformers`` (Table 450.3(B),
240.21(C) secondary lengths, kVA ratings and typical impedances).

Data and lookups only: the sizing rules that use them live in ``gaugewalk.model``.
"""
