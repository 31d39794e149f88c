"""The parts of the case workspace; ``screens/case_screen.py`` is the screen that holds them.

One module per tab (``*_pane.py``) and one per job of the screen (drafts, file actions, the
draw list, the screens opened over the case, keys and commands). Panes post the messages of
``messages.py`` up; the screen sets their attributes and calls their methods down.
"""
