"""sources stage."""
