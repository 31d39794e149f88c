"""Subcommands of the ``workup`` command line, one module each (imported only when used).

Each module defines ``add_arguments(parser)`` and ``run(args) -> int`` (exit code: 0 success,
1 a failure of the command, 2 a bad file or bad arguments, with the message on stderr).
"""
