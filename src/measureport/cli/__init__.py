"""The command line: `measureport check`, `run` and `demo` (entry point :func:`main.main`)."""
