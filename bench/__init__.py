"""The benchmark of measureport: generated SQL against hand-written SQL, compile time, scans."""
