"""Balances: flash-freeze and evaporative cooling."""
