"""`kinepoly print --centres`: the centres on the printed sheet, read back from the PDF."""

import pdfplumber

from app.cli import main
from tests.designs import SAMPLE_FILES

QUICK_RETURN = next(p for p in SAMPLE_FILES if p.name.startswith("tile-trimmer"))


def test_print_draws_the_centres(qapp, tmp_path):
    out = tmp_path / "trimmer.pdf"
    assert main(["print", str(QUICK_RETURN), "--centres", "-o", str(out)]) == 0
    with pdfplumber.open(out) as pdf:
        text = pdf.pages[0].extract_text()
    assert "ground|ram, ground|rod at infinity, 90.0°" in text
    assert "undetermined: crank|rod, crank|ram" in text
