"""The walk on disk. ``read`` (parse, migrate, validate, cross-check, within the limits),
``toml_parse`` (TOML text to data as ``tomllib`` reads it, by a compiled parser where installed),
``write`` (the text, and the save that keeps a backup), ``migrate`` (schema versions),
``atomic`` (the one atomic writer every file goes through), ``fingerprint`` (changed on disk
since it was read), ``lock`` (one writer at a time), ``drafts`` (the run card being typed) and
``schema`` (the JSON Schema)."""
