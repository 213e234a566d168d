"""``python3 -m spanstay``: the same as the ``spanstay`` command."""
from spanstay.models.cli import main

main()
