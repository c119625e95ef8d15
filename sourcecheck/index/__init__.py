"""index stage."""
