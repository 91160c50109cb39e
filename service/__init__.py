"""tripoint: water, ice and vapor phase-change energy calculations over HTTP."""

__version__ = "0.1.0"
