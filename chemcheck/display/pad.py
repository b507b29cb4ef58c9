"""The check pad: a live editor for a reaction and its amounts, checked as you type.

Controls only: the reaction text, one amount field per component (with how it was read), the
live report below, and a Record button that writes the current check into the notebook as an
ordinary display output (the full report bundle, inputs included). That output survives
saving, export and opening without a kernel or without chemcheck; the widget holds no result
of its own.
"""

from __future__ import annotations

from html import escape

from ..errors import ChemcheckError
from ..report import MIME_TYPE

__all__ = ["CheckPad", "pad"]

# typing pauses shorter than this are one edit; the check itself takes tens of milliseconds
DEBOUNCE_S = 0.03


class CheckPad:
    def __init__(self, reaction: str = "", amounts: dict[str, str] | None = None) -> None:
        import ipywidgets as w

        self._w = w
        self.reaction = w.Text(
            value=reaction,
            placeholder="reactants>agents>products, e.g. CCN.CC(=O)Cl>Et3N>CCNC(C)=O",
            description="Reaction",
            continuous_update=True,
            layout=w.Layout(width="100%"),
        )
        self.reaction.add_class("cc-pad-reaction")
        self.status = w.HTML(value="")
        self.status.add_class("cc-pad-status")
        self.rows = w.VBox([])
        self.rows.add_class("cc-pad-amounts")
        self.record_button = w.Button(description="Record check", icon="save", tooltip="Write this check into the notebook")
        self.record_button.add_class("cc-pad-record")
        self.output = w.Output()
        self.output.add_class("cc-pad-report")
        self.box = w.VBox([self.reaction, self.status, self.rows, self.record_button, self.output])
        self.box.add_class("cc-pad")
        self._amount_fields: dict[str, object] = {}
        self._rows: list[_AmountRow] = []
        self._amounts: dict[str, str] = dict(amounts or {})
        self._report = None
        self._pending = None
        import threading

        self._lock = threading.Lock()
        self.live = False  # debounce only once displayed in a live kernel
        self._record_handle = None
        self.reaction.observe(self._on_change, names="value")
        self.record_button.on_click(self._on_record)
        self.refresh()

    # -- events ----------------------------------------------------------------------------
    def _on_change(self, _change=None) -> None:
        if not self.live:
            self.refresh()
            return
        import threading

        with self._lock:
            if self._pending is not None:
                self._pending.cancel()
            self._pending = threading.Timer(DEBOUNCE_S, self._refresh_safely)
            self._pending.daemon = True
            self._pending.start()

    def _refresh_safely(self) -> None:
        # runs on the timer thread: a failure must never reach the kernel
        try:
            self.refresh()
        except Exception as exc:  # pragma: no cover - reported inline instead
            self._show_error(f"internal error while checking: {type(exc).__name__}: {exc}")

    def _on_amount(self, key: str, change) -> None:
        value = change["new"].strip()
        if value:
            self._amounts[key] = value
        else:
            self._amounts.pop(key, None)
        self._on_change()

    def _on_record(self, _button=None) -> None:
        self.record()

    # -- work ------------------------------------------------------------------------------
    @property
    def report(self):
        return self._report

    def refresh(self) -> None:
        """Check the reaction as it stands now and redraw the report."""
        from ..engine import check
        from ..reading.reaction import parse_reaction

        self._pending = None
        text = self.reaction.value.strip()
        if not text:
            self._show_error("Type a reaction (SMILES or reagent names).", error=False)
            return
        try:
            rxn = parse_reaction(text, join=[k for k in self._amounts if "." in k])
        except ChemcheckError as exc:
            self._show_error(str(exc))
            return
        amounts = {k: v for k, v in self._amounts.items() if rxn.find(k) is not None}
        try:
            report = check(text, amounts or None)
        except ChemcheckError as exc:
            self._sync_rows(rxn)
            self._show_error(str(exc))
            return
        self._report = report
        from .bundle import mimebundle
        from .present import verdict

        bundle = mimebundle(report)
        # the report first, then the controls around it: the report is what the chemist waits for
        # (set directly: safe from the debounce thread, no display hooks involved)
        self.output.outputs = ({"output_type": "display_data", "data": bundle, "metadata": {}},)
        self.status.value = f"<span class='cc-pad-ok'>{escape(verdict(bundle[MIME_TYPE]))}</span>"
        self._sync_rows(rxn)
        st = report.stoichiometry
        for comp in report.components:
            field = self._amount_fields.get(comp.text)
            if field is None:
                continue
            row = st.row_for(comp.index) if st is not None else None
            read = escape(row.read_as) if row is not None and row.read_as else ""
            if field._read_label.value != read:
                field._read_label.value = read

    def _show_error(self, message: str, error: bool = True) -> None:
        cls = "cc-pad-error" if error else "cc-pad-hint"
        self.status.value = f"<span class='{cls}'>{escape(message)}</span>"

    def _sync_rows(self, rxn) -> None:
        """One amount row per component, reused by position: an edit to one component's text
        relabels its row instead of building every row's widgets again (each new widget is
        three messages to the browser, which the chemist waits for on every keystroke)."""
        comps = list(rxn.components)
        if [c.text for c in comps] == list(self._amount_fields) and len(self.rows.children) == len(comps):
            return
        for i, comp in enumerate(comps):
            if i == len(self._rows):
                self._rows.append(_AmountRow(self._w, self._on_amount))
            self._rows[i].show(comp, self._amounts.get(comp.text, ""))
        self._amount_fields = {comp.text: self._rows[i].field for i, comp in enumerate(comps)}
        shown = tuple(r.box for r in self._rows[: len(comps)])
        if shown != tuple(self.rows.children):
            self.rows.children = shown

    def record(self):
        """Write the current check into the notebook as a durable report output."""
        from IPython.display import display

        if self._report is None:
            self._show_error("Nothing to record: the reaction does not read yet.")
            return None
        if self._record_handle is None:
            self._record_handle = display(self._report, display_id=True)
        else:
            self._record_handle.update(self._report)
        return self._report

    def static_text(self) -> str:
        """What the pad shows where no widget runs (a saved notebook, an export)."""
        text = self.reaction.value.strip() or "(empty)"
        return f"chemcheck pad for {text}: live only; the recorded check is the output below"

    def _ipython_display_(self) -> None:
        from IPython.display import display

        self.live = True
        # the widget's own text would be "VBox(children=(Text(…": saved notebooks and exports
        # show this line instead, and the recorded check below is the static report
        bundle = dict(self.box._repr_mimebundle_() or {})
        bundle["text/plain"] = self.static_text()
        display(bundle, raw=True)
        # the place where Record writes: an ordinary output of this cell
        self._record_handle = display({"text/plain": "(no check recorded yet: press Record check)"}, raw=True, display_id=True)


class _AmountRow:
    """A component's label, its amount field and how the amount was read."""

    def __init__(self, w, on_amount) -> None:
        self.key = ""
        self._quiet = False
        self.label = w.Label(value="", layout=w.Layout(width="38%"))
        self.field = w.Text(
            value="",
            placeholder="e.g. 1.2 mmol, 0.5 g, 2.0 mL, 1.1 equiv",
            continuous_update=True,
            layout=w.Layout(width="260px"),
        )
        self.field.add_class("cc-pad-amount")
        self.field._read_label = w.HTML(value="")
        self.field.observe(lambda ch: None if self._quiet else on_amount(self.key, ch), names="value")
        self.box = w.HBox([self.label, self.field, self.field._read_label])

    def show(self, comp, amount: str) -> None:
        """Point the row at ``comp``; a new component brings its own amount (or none)."""
        label = f"{comp.role}: {comp.text}"
        if self.label.value != label:
            self.label.value = label
        if self.key != comp.text:
            self.key = comp.text
            self._quiet = True  # the amount shown is the component's own, not an edit
            try:
                self.field.value = amount
                self.field._read_label.value = ""
            finally:
                self._quiet = False


def pad(reaction: str = "", amounts: dict[str, str] | None = None) -> CheckPad:
    """A live check pad for ``reaction`` (display it as the last line of a cell)."""
    return CheckPad(reaction, amounts)
