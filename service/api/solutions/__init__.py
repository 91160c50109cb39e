"""The ice-fraction lookup of solutions and seawater: /v1/properties/ice-fraction."""
