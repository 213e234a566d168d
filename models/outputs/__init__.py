"""What people and scripts read: the results folder, terminal summary, report, plots, 3D view.
Imports checks, analysis and the packages above; never imported by them."""
