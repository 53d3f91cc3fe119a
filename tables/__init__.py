"""gaugewalk's published electrical tables (NEC/NFPA 70, 2023 edition unless a module says otherwise).

Pure data with lookups; never imports Textual. The name ``tables`` is generic (an HDF5 library
uses it too), so gaugewalk installs into its own virtual environment and a test checks that this
package is ours through ``GAUGEWALK_TABLES``.
"""

GAUGEWALK_TABLES = True
