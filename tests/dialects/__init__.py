"""Tests of the dialect profiles, the SQL each dialect gets, and the round-trip engine."""
