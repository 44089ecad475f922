"""reference stage."""
