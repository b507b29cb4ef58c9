"""Subcommands beyond ``check``; each registers itself with :func:`chemcheck.cli.command`."""

from __future__ import annotations
