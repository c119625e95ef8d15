"""judge stage."""
