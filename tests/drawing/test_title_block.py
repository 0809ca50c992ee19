"""The title block after ISO 7200: the data fields a drawing office expects, filled where Kinepoly
knows them (date of issue, sheet n/m, document type, file) and left blank to fill in where the
design file does not hold them; read back from the printed PDF with pdfplumber."""

import datetime
import os
import subprocess
import sys
from pathlib import Path

import pdfplumber

import kinematics
from kinematics.drawing import Ref, Text
from kinematics.drawing.layout import draw_sheet

SAMPLES = Path(__file__).resolve().parents[2] / "samples"
# ISO 7200:2004, data fields in title blocks: the identifying fields (legal owner, identification
# number, revision index, date of issue, segment/sheet number, title, document type), the
# descriptive and administrative ones (created by, approved by, document status).  # from memory
CAPTIONS = ("legal owner", "drawing number", "revision", "date of issue", "sheet", "created by", "approved by",
            "document type", "document status", "file")


def _block_texts(sheet) -> list:
    return [p.text for p in sheet.primitives if isinstance(p, Text) and p.ref == Ref("title block")]


def test_every_field_is_in_the_block_with_what_kinepoly_knows():
    mech = kinematics.load_mechanism(SAMPLES / "label-swing-arm.json")
    texts = _block_texts(draw_sheet(kinematics.construct(kinematics.solve(mech)), date="2026-12-04",
                                    file_name="label-swing-arm.json"))
    for caption in CAPTIONS:
        assert caption in texts, caption
    assert {"2026-12-04", "1/1", "construction", "label-swing-arm.json"} <= set(texts)
    assert not any("date 2026" in t for t in texts), "the date is said once, in its field"


def test_a_printed_pair_of_sheets_is_numbered_one_and_two_of_two(tmp_path):
    out = tmp_path / "pair.pdf"
    done = subprocess.run([sys.executable, "-m", "app.main", "print", str(SAMPLES / "cap-press-feeder.json"),
                           "--forces", "-o", str(out)], capture_output=True, text=True,
                          env={**os.environ, "QT_QPA_PLATFORM": "offscreen"}, timeout=120)
    assert done.returncode == 0, done.stderr
    today = datetime.date.today().isoformat()
    with pdfplumber.open(out) as pdf:
        pages = [page.extract_text() for page in pdf.pages]
    assert len(pages) == 2
    for text, (number, kind) in zip(pages, (("1/2", "construction"), ("2/2", "force polygon")), strict=True):
        words = text.split("\n")
        assert any(number in line for line in words) and any(today in line for line in words)
        assert kind in text and "legal owner" in text and "approved by" in text
