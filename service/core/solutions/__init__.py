"""Real aqueous solutions that freeze: seawater (IAPWS R13-08), brines and sugar solutions.

The modules here depend on :mod:`service.core.properties` only; the balances and the chamber
simulation import them.
"""
