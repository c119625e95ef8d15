"""The caution every report carries, in one place so no writer can drop or reword it."""

CAUTION = (
    "sourcecheck advises; it does not prove error or misconduct. Each band is a prompt to "
    "read the cited passage yourself: the author's and the editor's judgment decides."
)
