"""Everything that becomes fem elements: posts, laminated posts, footings and p-y curves, guys,
braces, trees, the line, and the whole structure (system.py). Imports fem and the packages above."""
