"""engines stage."""
