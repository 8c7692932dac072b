"""The HTML report of a design record: one self-contained file with figures and equations, for reviewers."""
from .html_report import report_html, write_report

__all__ = ["report_html", "write_report"]
