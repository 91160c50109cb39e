"""Process simulations: the vacuum chamber."""
