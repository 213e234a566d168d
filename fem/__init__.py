"""spanstay engine: a small, domain-free 3D nonlinear finite-element solver.

Knows nodes, supports, loads, beams, cables, springs and links; knows nothing
of rides, lumber or soil.
"""
