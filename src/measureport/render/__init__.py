"""render stage."""
