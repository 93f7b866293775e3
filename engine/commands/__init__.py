"""The subcommands of `python -m engine`, one module each.

Each module has `register(commands)`, which adds its subparser and sets
`run` (a function of the parsed arguments returning the text to print, or
the text and an exit status when a command can partly fail) as the parser's
default. Modules raise `InputError` for bad input; `engine.cli` turns that
into one line on stderr and exit status 2.
"""
