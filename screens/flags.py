"""The clinical-context checklist: each flag says "[x]" or "[ ]" in text, not only in colour."""

from __future__ import annotations

from textual.binding import Binding
from textual.message import Message
from textual.widgets import OptionList
from textual.widgets.option_list import Option

from workup.context import MEANING, Flag


def _prompt(flag: Flag, on: bool) -> str:
    return f"[{'x' if on else ' '}] {flag.value.replace('_', ' ')}: {MEANING[flag]}"


class FlagList(OptionList):
    """Every context flag with its meaning; Space or Enter toggles the highlighted one."""

    BINDINGS = [Binding("space", "toggle", "Toggle flag", show=False)]

    class Toggled(Message):
        """The set of chosen flags changed."""

        def __init__(self, flag_list: FlagList, flags: list[Flag]) -> None:
            super().__init__()
            self.flag_list = flag_list
            self.flags = flags

        @property
        def control(self) -> FlagList:
            """The list that changed."""
            return self.flag_list

    def __init__(self, chosen: list[Flag], **kwargs) -> None:
        self.chosen = set(chosen)
        super().__init__(
            *[Option(_prompt(f, f in self.chosen), id=f.value) for f in Flag], **kwargs
        )

    @property
    def flags(self) -> list[Flag]:
        """The chosen flags in vocabulary order."""
        return [f for f in Flag if f in self.chosen]

    def set_flags(self, flags: list[Flag]) -> None:
        """Show ``flags`` as chosen (without posting Toggled)."""
        self.chosen = set(flags)
        for i, f in enumerate(Flag):
            self.replace_option_prompt_at_index(i, _prompt(f, f in self.chosen))

    def action_toggle(self) -> None:
        """Toggle the highlighted flag."""
        if self.highlighted is None:
            return
        flag = list(Flag)[self.highlighted]
        self.chosen ^= {flag}
        self.replace_option_prompt_at_index(self.highlighted, _prompt(flag, flag in self.chosen))
        self.post_message(self.Toggled(self, self.flags))

    def action_select(self) -> None:
        """Enter toggles too (OptionList would only announce the choice)."""
        self.action_toggle()
