"""The property formulations of water substance and what they state: IAPWS-95, IAPWS-IF97,
ice Ih (R10-06), the melting and sublimation lines (R14-08), saturation, equilibrium states,
the sources, uncertainties and advisories attached to results, and the lookups that bundle
them."""
