"""Analyses of the built structure: installed state, load cases and rider stations, ride speed,
slack budget, footing capacity by pushover. Imports fem, parts and the packages above."""
