"""Code and practice checks of analysed passes, one module per part kind (line, posts, laminated
posts, soil, guys and braces, trees, ride). Imports analysis and the packages above."""
