"""Sizing: the value of one case field that meets a cooling target (/v1/sizing)."""
