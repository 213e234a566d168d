"""spanstay trade layer: scenarios, catalogs, anchors, the line, checks, outputs."""
