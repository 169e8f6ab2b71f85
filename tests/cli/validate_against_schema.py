"""Validates result files against docs/result.schema.json (JSON Schema draft 2020-12) with the
jsonschema library (Debian's python3-jsonschema 4.10). Usage:
validate_against_schema.py SCHEMA DEFINITION FILE... where DEFINITION is "result" for the root
(a validate result) or the name of one of the schema's $defs (e.g. update_result)."""
import json
import sys

import jsonschema

schema_path, definition, files = sys.argv[1], sys.argv[2], sys.argv[3:]
with open(schema_path, encoding="utf-8") as f:
    schema = json.load(f)
jsonschema.Draft202012Validator.check_schema(schema)
target = schema
if definition != "result":
    # Validate against the named definition only: keep $defs for references, drop the root's rules.
    target = {"$schema": schema["$schema"], "$defs": schema["$defs"], "$ref": "#/$defs/" + definition}
validator = jsonschema.Draft202012Validator(target)
failures = 0
for path in files:
    with open(path, encoding="utf-8") as f:
        document = json.load(f)
    errors = sorted(validator.iter_errors(document), key=lambda e: list(e.absolute_path))
    for error in errors[:10]:
        print(f"FAIL: {path}: at {'/'.join(str(p) for p in error.absolute_path) or '(root)'}: {error.message[:300]}")
    failures += bool(errors)
    if not errors:
        print(f"ok: {path} is a valid {definition}")
sys.exit(1 if failures else 0)
