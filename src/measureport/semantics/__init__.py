"""semantics stage."""
