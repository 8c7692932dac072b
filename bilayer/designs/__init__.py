"""Design files: the TOML format of a design (its stack tables and one table per job), and the registry
of jobs (:mod:`bilayer.designs.jobs`).

Short paths::

    from bilayer.designs import load_design, save_design, read_design, JOBS
"""
from .design_file import DesignDocument, design_to_text, load_design, read_design, read_design_text, save_design
from .jobs import JOBS, cautions_for

__all__ = ["DesignDocument", "design_to_text", "load_design", "read_design", "read_design_text", "save_design",
           "JOBS", "cautions_for"]
