"""The sample workbooks, one module each (written by tools/make_sample_sheets.py).

Each module has ``FILE_NAME`` and ``fill(doc)``; ``common`` holds what they share.
"""
