"""Real aqueous solutions that freeze: seawater (IAPWS R13-08), brines, sugar solutions,
ethanol and foods.

The modules here build on :mod:`service.core.properties`; the balances and the chamber
simulation import them, and the food and lookup modules use two of the balances' modules in
turn (the food composition and the equilibrium paths). The balances package is therefore
imported first here, so that any module of this package can be imported on its own.
"""

import service.core.balances  # noqa: F401  (import order: see the docstring)
