"""Calculation records: listing and reading what the balances and simulations stored."""
