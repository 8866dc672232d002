"""Check modules of the reference suite; each has `run(harness, recorder)`."""
