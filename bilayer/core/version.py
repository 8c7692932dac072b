"""The version of bilayer (also in pyproject.toml)."""

VERSION = "0.1.0"
