"""drafts stage."""
