"""The documents: the share link, the calculation sheet (with its section drawing) and the beam schedule.

They write a check's inputs and results for people and for other programs:
text, HTML and SVG strings, never files (the commands do the I/O). The
engine's top layer below the command line: may import from every other layer.
"""
