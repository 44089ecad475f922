"""Contract tests: a ferry model written from LANGUAGE.md alone, driven through the command line."""
