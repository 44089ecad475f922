"""Tests of `measureport verify`: checks, targets, cells, the runner, the report and the command."""
