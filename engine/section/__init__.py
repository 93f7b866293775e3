"""The section and its materials: what is checked, in which units, and the checks of its inputs.

The engine's bottom layer. Its modules import only from one another; every
other layer (mechanics, provisions, design, documents) may import from here.
The basics every layer shares sit here too, because a section's inputs are
made of them: the errors (`errors`), the unit systems (`units`) and the
validation of inputs at the edge (`validation`).
"""
