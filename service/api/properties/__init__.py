"""Property lookups: saturation, sublimation, melting, state, constants."""
