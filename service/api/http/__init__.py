"""HTTP machinery every resource uses: problem documents, content negotiation, CSV, limits and
time limits, API keys, observability, docs assets, unit parsing and quantity reading, the
answer envelope, calculation records."""
