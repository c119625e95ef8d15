"""reports stage."""
