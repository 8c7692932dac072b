"""The core: units, errors, files, materials, the stack and its results, the laminate kernel, the symbolic
derivation, section specs and job declarations. It imports numpy, scipy, sympy and pint, nothing above
it, and nothing that draws (docs/architecture.md)."""
