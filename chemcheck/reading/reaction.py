"""What the chemist typed, read into components with roles.

A reaction is written ``reactants>agents>products`` (reaction SMILES); each side is a list of
fragments separated by ``.``. A *component* is what the chemist weighs: one molecule, or a salt
made of several fragments. Fragments are joined into one component when

* ions on the same side make a salt whose charges cancel (``[Na+].[O-]C(C)=O``); written
  apart, as patent records and drawing programs sort them, they are paired by the salts the
  name table knows and by how close they are written; a neutral molecule is never merged, or
* a CXSMILES fragment group says so (``... |f:0.1|``; fragment indices count every fragment in
  the order they appear in the text, reactants, then agents, then products), or
* the caller names them together (``join=["Cl.NCc1ccccc1"]``, as the keys of ``amounts`` do).

Each fragment may be SMILES or a reagent name; SMILES wins when a token reads as both.
"""

from __future__ import annotations

import re
from collections import Counter
from collections.abc import Iterable, Sequence
from dataclasses import dataclass, field, replace
from functools import lru_cache

from rdkit import Chem
from rdkit.Chem import rdMolDescriptors

from .. import _rdlog
from .._memo import Memo
from ..errors import LimitError, ParseError
from .molecule import read_smiles
from .names import kind_for_smiles, lookup_name, name_for_smiles

__all__ = ["Component", "Reaction", "parse_reaction", "ROLES", "MAX_COMPONENTS", "MAX_ATOMS"]

ROLES = ("reactant", "agent", "product")
MAX_TEXT = 20_000
MAX_COMPONENTS = 100
MAX_ATOMS = 2_000  # heavy atoms in one component

_CX = re.compile(r"\s+\|([^|]*)\|\s*$")
_FRAG_GROUP = re.compile(r"f:([\d.,]+)")
_MAP_NUMBER = re.compile(r":\d+\]")


@dataclass(frozen=True)
class Fragment:
    text: str
    start: int  # 0-based offset in the reaction text
    side: int  # 0 reactants, 1 agents, 2 products
    smiles: str = ""
    mol: Chem.Mol | None = None
    source: str = "smiles"
    name: str | None = None
    kind_hint: str | None = None
    sanitization: str = "full"
    note: str | None = None


@dataclass(eq=False)
class Component:
    """One thing weighed or drawn: a molecule or a salt, with its role in the reaction."""

    index: int
    role: str
    text: str
    mol: Chem.Mol
    smiles: str
    formula: str
    mw: float
    _inchikey: str | None
    name: str | None
    source: str
    sanitization: str
    notes: tuple[str, ...]
    fragments: tuple[str, ...]
    span: tuple[int, int]
    kind: str | None = None  # perceived kind; filled in by perception for agents
    kind_hint: str | None = None
    number: str = ""  # compound number: "1", "2", ... for reactants and products; "a", "b", ... for agents

    @property
    def inchikey(self) -> str:
        """Standard InChIKey, computed on first use (it costs more than the rest of parsing)."""
        if self._inchikey is None:
            key = _INCHIKEYS.get(self.smiles)
            if key is None:
                with _rdlog.captured():
                    try:
                        key = Chem.MolToInchiKey(self.mol) or ""
                    except (RuntimeError, ValueError):
                        key = ""
                if self.mol.GetNumAtoms() <= _CACHE_ATOMS:
                    _INCHIKEYS.put(self.smiles, key)
            self._inchikey = key
        return self._inchikey

    @property
    def charge(self) -> int:
        return sum(a.GetFormalCharge() for a in self.mol.GetAtoms())

    word: str | None = None  # what the component is, for a label without a name ("amine", "acid chloride")

    @property
    def label(self) -> str:
        """How messages name the component, as a chemist does under a scheme: the name and the
        compound number ("benzylamine (1)"), or what it is and its number ("amine 1"); the
        SMILES stays in the components table. Without a number (a component built outside a
        reaction), the text as written with its name."""
        if self.number:
            if self.name:
                return f"{self.name} ({self.number})"
            return f"{self.word or ('product' if self.role == 'product' else 'compound')} {self.number}"
        if self.name and self.name.casefold() != self.text.casefold():
            return f"{self.text} ({self.name})"
        return self.text

    def __repr__(self) -> str:
        return f"Component({self.index}, {self.role!r}, {self.text!r}, {self.smiles!r})"


@dataclass(eq=False)
class Reaction:
    text: str
    components: list[Component]
    cx_fields: str | None = None
    mapped: bool = False
    notes: list[str] = field(default_factory=list)

    def by_role(self, role: str) -> list[Component]:
        cache = self.__dict__.setdefault("_by_role", {})
        hit = cache.get(role)
        if hit is None or hit[0] != len(self.components):
            hit = (len(self.components), [c for c in self.components if c.role == role])
            cache[role] = hit
        return list(hit[1])

    @property
    def reactants(self) -> list[Component]:
        return self.by_role("reactant")

    @property
    def agents(self) -> list[Component]:
        return self.by_role("agent")

    @property
    def products(self) -> list[Component]:
        return self.by_role("product")

    def find(self, text: str) -> Component | None:
        for c in self.components:
            if c.text == text:
                return c
        return None


def _split_fragments(side_text: str, side: int, offset: int) -> list[tuple[str, int]]:
    """Split one side on '.' outside brackets; keep each piece's offset."""
    pieces: list[tuple[str, int]] = []
    depth = 0
    start = 0
    for i, ch in enumerate(side_text):
        if ch == "[":
            depth += 1
        elif ch == "]":
            depth = max(depth - 1, 0)
        elif ch == "." and depth == 0:
            pieces.append((side_text[start:i], offset + start))
            start = i + 1
    pieces.append((side_text[start:], offset + start))
    out = []
    for text, off in pieces:
        stripped = text.strip()
        lead = len(text) - len(text.lstrip())
        out.append((stripped, off + lead))
    if len(out) == 1 and out[0][0] == "":
        return []
    return out


_SMILES_LIKE = re.compile(r"^[A-Za-z0-9@+\-\[\]()=#$%/\\.:*~]+$")


def _looks_like_smiles(token: str) -> bool:
    if not _SMILES_LIKE.match(token):
        return False
    return any(ch in token for ch in "[]()=#@%") or any(ch.isdigit() for ch in token) or (
        re.fullmatch(r"(Cl|Br|[BCNOPSFI]|[cnops])+", token) is not None
    )


# Fragments and components read before, by their text. A chemist re-checks the same reagents
# (and the check pad the same fragments on every keystroke); names, SMILES parsing,
# sanitization, formula and mass are then read once. Each reaction gets its own copy of the
# molecule, and the perception caches are told that the copy has the same canonical atom order.
_FRAGMENTS = Memo(2048)  # text -> Fragment
_COMPONENTS = Memo(2048)  # fragment texts -> (template molecule, fields, canonical key)
_INCHIKEYS = Memo(2048)  # canonical SMILES -> InChIKey
_CACHE_ATOMS = 150  # larger molecules are rare; keep memory bounded


def _read_fragment(text: str, start: int, side: int, number: int) -> Fragment:
    hit = _FRAGMENTS.get(text)
    if hit is not None:
        # the molecule is shared with the cache: components copy it (or combine it) before use
        return replace(hit, start=start, side=side)
    frag = _read_fragment_uncached(text, start, side, number)
    if frag.mol is not None and frag.mol.GetNumAtoms() <= _CACHE_ATOMS:
        _FRAGMENTS.put(text, replace(frag, mol=Chem.Mol(frag.mol)))
    return frag


def _read_fragment_uncached(text: str, start: int, side: int, number: int) -> Fragment:
    if text == "":
        raise ParseError("empty component (two dots in a row, or a dot at an end)", component=number, text=text)
    smiles_error: ParseError | None = None
    if any(ch.isspace() for ch in text):
        # RDKit would read "acetyl chloride" as the SMILES "acetyl" named "chloride".
        hit = lookup_name(text)
        if hit is None:
            raise ParseError("not a known reagent name (SMILES has no spaces)", component=number, text=text)
        rm = read_smiles(hit.smiles, component=number, text=text)
        return Fragment(
            text, start, side, hit.smiles, rm.mol, hit.source, hit.name, hit.kind, rm.sanitization, rm.note
        )
    try:
        rm = read_smiles(text, component=number, text=text)
        return Fragment(text, start, side, text, rm.mol, "smiles", None, None, rm.sanitization, rm.note)
    except ParseError as exc:
        smiles_error = exc
    hit = lookup_name(text, database=not _looks_like_smiles(text))
    if hit is not None:
        try:
            rm = read_smiles(hit.smiles, component=number, text=text)
        except ParseError as exc:
            raise ParseError(
                f"the name resolved to '{hit.smiles}', which cannot be read ({exc.reason})",
                component=number,
                text=text,
            ) from None
        return Fragment(
            text, start, side, hit.smiles, rm.mol, hit.source, hit.name, hit.kind, rm.sanitization, rm.note
        )
    if _looks_like_smiles(text):
        raise smiles_error
    if not text.isascii() and smiles_error is not None:
        raise ParseError(
            f"not a known reagent name, and not SMILES: {smiles_error.reason}",
            component=number,
            text=text,
            position=smiles_error.position,
        )
    raise ParseError("neither valid SMILES nor a known reagent name", component=number, text=text)


def _merge_dotted_names(located: list[tuple[str, int, int]]) -> list[tuple[str, int, int]]:
    """Rejoin names that contain a dot, such as ``BF3.OEt2`` or ``EDC.HCl``, split by the reader.

    Two adjacent tokens are one reagent when, joined with '.', they are a name of the package's
    own table and they are not both valid SMILES (a SMILES always wins).
    """
    if len(located) < 2:
        return located
    from .names import lookup_name

    out: list[tuple[str, int, int]] = []
    i = 0
    while i < len(located):
        if i + 1 < len(located) and located[i][2] == located[i + 1][2]:
            a, b = located[i][0], located[i + 1][0]
            if a and b and lookup_name(f"{a}.{b}", database=False) is not None:
                if not (_parses(a) and _parses(b)):
                    out.append((f"{a}.{b}", located[i][1], located[i][2]))
                    i += 2
                    continue
        out.append(located[i])
        i += 1
    return out


def _parses(text: str) -> bool:
    with _rdlog.captured():
        if not text.isascii():
            return False
        try:
            return Chem.MolFromSmiles(text) is not None
        except SystemError:
            return False


def _cx_groups(cx: str | None) -> list[list[int]]:
    if not cx:
        return []
    groups = []
    m = _FRAG_GROUP.search(cx)
    if m:
        for part in m.group(1).split(","):
            if part:
                groups.append([int(x) for x in part.split(".") if x != ""])
    return groups


def _group(fragments: list[Fragment], cx: list[list[int]], join: Sequence[str]) -> list[list[int]]:
    """Indices of fragments forming each component, in order."""
    owner = list(range(len(fragments)))

    def unite(idx: Iterable[int]) -> None:
        idx = sorted(set(idx))
        root = min(owner[i] for i in idx)
        olds = {owner[i] for i in idx}
        for k in range(len(owner)):
            if owner[k] in olds:
                owner[k] = root

    for grp in cx:
        bad = [i for i in grp if i < 0 or i >= len(fragments)]
        if bad:
            raise ParseError(
                f"fragment group names fragment {bad[0]}, but there are {len(fragments)} fragments "
                "(counted from 0)",
                text="|f:...|",
            )
        sides = {fragments[i].side for i in grp}
        if len(sides) > 1:
            raise ParseError("a fragment group spans both sides of an arrow", text="|f:...|")
        unite(grp)
    for key in join:
        parts = [p.strip() for p in key.split(".")]
        if len(parts) < 2:
            continue
        n = len(parts)
        for i in range(len(fragments) - n + 1):
            window = fragments[i : i + n]
            if [f.text for f in window] == parts and len({f.side for f in window}) == 1:
                unite(range(i, i + n))
                break
    # ions: paired into salts within each side, never across a neutral molecule's component
    units: dict[int, list[int]] = {}
    for k, root in enumerate(owner):
        units.setdefault(root, []).append(k)
    for side in (0, 1, 2):
        ions = [
            idx for root, idx in sorted(units.items())
            if fragments[root].side == side and sum(_charge(fragments[i].mol) for i in idx) != 0
        ]
        for block in _pair_ions(fragments, ions):
            if len(block) > 1:
                unite([i for unit in block for i in unit])
    groups: dict[int, list[int]] = {}
    for k, root in enumerate(owner):
        groups.setdefault(root, []).append(k)
    return [groups[r] for r in sorted(groups)]


_MAX_IONS = 12  # ions on one side searched exhaustively; beyond, runs of adjacent ions only


def _pair_ions(fragments: list[Fragment], ions: list[list[int]]) -> list[list[list[int]]]:
    """Partition the ions of one side (each a list of fragment indices) into salts.

    Patent records and drawing programs sort the fragments of a side, so the ions of one salt
    are often not next to each other (``[H-].CN(C)C=O.[NH4+].[Na+].[Cl-]`` is NaH and NH4Cl
    in DMF). Among the partitions into charge-neutral blocks, the best one makes the most
    known reagents (by formula and charge: the name table's salts), then keeps ions written next
    to each other together, then makes the smallest salts. An ion nothing can balance stands
    alone. Neutral molecules are never part of a salt.
    """
    n = len(ions)
    if n < 2:
        return [[u] for u in ions]
    charges = [sum(_charge(fragments[i].mol) for i in u) for u in ions]
    if n > _MAX_IONS:
        return _adjacent_blocks(ions, charges)
    known = _known_salt_formulas()
    counts = [_unit_counts(fragments, u) for u in ions]  # each ion's atoms, read once

    from functools import lru_cache
    from itertools import combinations

    @lru_cache(maxsize=None)
    def score(block: tuple[int, ...]) -> float:
        if len(block) == 1:
            return -10.0  # an ion left without its counter-ion
        total: Counter[str] = Counter()
        for b in block:
            total.update(counts[b])
        if _formula_text(total) in known:
            value = 3.0 + len(block)  # a known salt, the more ions it accounts for the better
        else:
            value = -0.5 * (len(block) - 2)
        # written next to each other: consecutive fragments, no neutral molecule between them
        frag_idx = sorted(i for b in block for i in ions[b])
        if frag_idx[-1] - frag_idx[0] + 1 == len(frag_idx):
            value += 1.0
        return value

    @lru_cache(maxsize=None)
    def best(remaining: frozenset[int]) -> tuple[float, tuple[tuple[int, ...], ...]]:
        if not remaining:
            return 0.0, ()
        first = min(remaining)
        rest = sorted(remaining - {first})
        options = [(first,)]
        target = -charges[first]
        charge_of = charges.__getitem__
        for size in range(1, min(len(rest), 6) + 1):
            for combo in combinations(rest, size):
                if sum(map(charge_of, combo)) == target:
                    options.append((first, *combo))
        top: tuple[float, tuple[tuple[int, ...], ...]] | None = None
        for block in options:
            sub_score, sub_blocks = best(remaining - set(block))
            total = score(block) + sub_score
            if top is None or total > top[0] + 1e-9:
                top = (total, (block, *sub_blocks))
        assert top is not None
        return top

    _, blocks = best(frozenset(range(n)))
    return [[ions[b] for b in block] for block in sorted(blocks)]


def _adjacent_blocks(ions: list[list[int]], charges: list[int]) -> list[list[list[int]]]:
    """Runs of ions written next to each other whose charges cancel (the fall-back for sides
    with very many ions)."""
    out: list[list[list[int]]] = []
    i = 0
    while i < len(ions):
        total = 0
        for j in range(i, len(ions)):
            if j > i and ions[j][0] != ions[j - 1][-1] + 1:
                break
            total += charges[j]
            if total == 0:
                out.append(ions[i : j + 1])
                i = j + 1
                break
        else:
            out.append([ions[i]])
            i += 1
            continue
        if total != 0:
            out.append([ions[i]])
            i += 1
    return out


def _unit_counts(fragments: list[Fragment], unit: list[int]) -> Counter[str]:
    """Element counts (hydrogens included) of the fragments of one unit."""
    counts: Counter[str] = Counter()
    for i in unit:
        mol = fragments[i].mol
        if mol is None:
            continue
        for k in range(mol.GetNumAtoms()):
            a = mol.GetAtomWithIdx(k)
            counts[a.GetSymbol()] += 1
            counts["H"] += a.GetTotalNumHs()
    return counts


def _formula_text(counts: Counter[str]) -> str:
    return "".join(f"{el}{counts[el]}" for el in sorted(counts) if counts[el])


def _block_formula(fragments: list[Fragment], units: list[list[int]]) -> str:
    counts: Counter[str] = Counter()
    for unit in units:
        counts.update(_unit_counts(fragments, unit))
    return _formula_text(counts)


@lru_cache(maxsize=1)
def _known_salt_formulas() -> frozenset[str]:
    """Formulas of the salts in the name table (NaH, NH4Cl, LiAlH4, Cs2CO3, ...)."""
    from ..data.reagents import REAGENTS

    out = set()
    with _rdlog.captured():
        for _names, smiles, _kind in REAGENTS:
            mol = Chem.MolFromSmiles(smiles)
            if mol is None or not any(a.GetFormalCharge() for a in mol.GetAtoms()):
                continue
            frag = Fragment(smiles, 0, 0, smiles, mol)
            out.add(_block_formula([frag], [[0]]))
    return frozenset(out)


def _charge(mol: Chem.Mol | None) -> int:
    if mol is None:
        return 0
    return Chem.GetFormalCharge(mol)


def _canonical(mol: Chem.Mol) -> str:
    bare = Chem.Mol(mol)
    for a in bare.GetAtoms():
        a.SetAtomMapNum(0)
    return Chem.MolToSmiles(bare)


def _build_component(index: int, frags: list[Fragment], text_full: str) -> Component:
    key = tuple(f.text for f in frags)
    hit = _COMPONENTS.get(key)
    start = frags[0].start
    end = frags[-1].start + len(frags[-1].text)
    if hit is not None:
        template, fields, canon = hit
        mol = Chem.Mol(template)
        if canon is not None:
            from ..perceive import remember_canonical

            remember_canonical(mol, canon, rings=fields["sanitization"] == "full")
        return Component(index=index, role=ROLES[frags[0].side], mol=mol, span=(start, end), **fields)
    comp = _build_component_uncached(index, frags, text_full)
    if comp.mol.GetNumAtoms() <= _CACHE_ATOMS:
        from ..perceive import canonical_key

        template = Chem.Mol(comp.mol)
        fields = dict(
            text=comp.text, smiles=comp.smiles, formula=comp.formula, mw=comp.mw, _inchikey=None, name=comp.name,
            source=comp.source, sanitization=comp.sanitization, notes=comp.notes, fragments=comp.fragments,
            kind_hint=comp.kind_hint,
        )
        _COMPONENTS.put(key, (template, fields, canonical_key(comp.mol)))
    return comp


def _build_component_uncached(index: int, frags: list[Fragment], text_full: str) -> Component:
    mol = Chem.Mol(frags[0].mol)
    for f in frags[1:]:
        mol = Chem.CombineMols(mol, f.mol)
    if len(frags) > 1:
        with _rdlog.captured():
            try:
                Chem.GetSymmSSSR(mol)  # CombineMols drops ring information; restore it as sanitizing does
            except RuntimeError:
                pass
    heavy = mol.GetNumHeavyAtoms()
    text = ".".join(f.text for f in frags)
    if heavy > MAX_ATOMS:
        raise LimitError(
            f"component {index + 1} '{text[:40]}{'…' if len(text) > 40 else ''}': {heavy} heavy atoms; "
            f"the limit is {MAX_ATOMS}"
        )
    sanitization = "partial" if any(f.sanitization == "partial" for f in frags) else "full"
    notes = tuple(f.note for f in frags if f.note)
    with _rdlog.captured():
        if any(_MAP_NUMBER.search(f.smiles) for f in frags):
            smiles = _canonical(mol)
        else:
            from ..perceive import canonical_key

            key = canonical_key(mol)  # remembered on the molecule for perception
            smiles = key[0] if key is not None else _canonical(mol)
        try:
            formula = rdMolDescriptors.CalcMolFormula(mol)
        except (RuntimeError, ValueError):
            formula = ""
        try:
            mw = float(rdMolDescriptors._CalcMolWt(mol))
        except (RuntimeError, ValueError):
            mw = float("nan")
    names = [f.name for f in frags]
    if len(frags) == 1:
        name = names[0] or name_for_smiles(smiles)
    elif all(names):
        name = " · ".join(n for n in names if n)
    else:
        name = name_for_smiles(smiles)
    sources = sorted({f.source for f in frags})
    kind_hint = frags[0].kind_hint if len(frags) == 1 else None
    if kind_hint is None:
        kind_hint = kind_for_smiles(smiles)
    start = frags[0].start
    end = frags[-1].start + len(frags[-1].text)
    return Component(
        index=index,
        role=ROLES[frags[0].side],
        text=text,
        mol=mol,
        smiles=smiles,
        formula=formula,
        mw=mw,
        _inchikey=None,
        name=name,
        source=" + ".join(sources),
        sanitization=sanitization,
        notes=notes,
        fragments=tuple(f.text for f in frags),
        span=(start, end),
        kind_hint=kind_hint,
    )


def _number(components: list[Component]) -> None:
    """Compound numbers as a chemist writes them under a scheme: reactants then products 1, 2,
    3, ...; agents a, b, c, ... (aa, ab, ... past z)."""
    n = 0
    letters = 0
    for c in components:
        if c.role == "agent":
            q, r = divmod(letters, 26)
            c.number = (chr(ord("a") + q - 1) if q else "") + chr(ord("a") + r)
            letters += 1
        else:
            n += 1
            c.number = str(n)


def parse_reaction(text: str, *, join: Sequence[str] = ()) -> Reaction:
    """Read a reaction (or a plain list of molecules) into components with roles.

    Raises :class:`~chemcheck.errors.ParseError` naming the component and position of the
    first problem, and :class:`~chemcheck.errors.LimitError` beyond the size limits.
    """
    if not isinstance(text, str):
        raise ParseError(f"a reaction must be text, not {type(text).__name__}")
    if len(text) > MAX_TEXT:
        raise LimitError(f"reaction text is {len(text)} characters; the limit is {MAX_TEXT}")
    raw = text
    cx_fields = None
    m = _CX.search(text)
    if m:
        cx_fields = m.group(1)
        text = text[: m.start()]
    if not text.strip():
        raise ParseError("the reaction is empty")
    arrows = text.count(">")
    if arrows == 0:
        sides = [text, "", ""]
        offsets = [0, len(text), len(text)]
    elif arrows == 2:
        a = text.index(">")
        b = text.index(">", a + 1)
        sides = [text[:a], text[a + 1 : b], text[b + 1 :]]
        offsets = [0, a + 1, b + 1]
    else:
        raise ParseError(
            f"a reaction has the form reactants>agents>products (two '>'); found {arrows}",
            text=raw if len(raw) <= 60 else raw[:57] + "...",
        )
    located: list[tuple[str, int, int]] = []
    for side, (s, off) in enumerate(zip(sides, offsets)):
        for frag_text, frag_off in _split_fragments(s, side, off):
            located.append((frag_text, frag_off, side))
    if not located:
        raise ParseError("the reaction has no molecules", text=raw)
    if not any(side == 0 for _, _, side in located):
        raise ParseError("the reaction has no reactants (nothing before the first '>')", text=raw)
    located = _merge_dotted_names(located)
    if len(located) > MAX_COMPONENTS * 4:
        raise LimitError(f"the reaction has {len(located)} fragments; the limit is {MAX_COMPONENTS} components")
    fragments = [
        _read_fragment(t, off, side, number) for number, (t, off, side) in enumerate(located, start=1)
    ]
    groups = _group(fragments, _cx_groups(cx_fields), join)
    if len(groups) > MAX_COMPONENTS:
        raise LimitError(f"the reaction has {len(groups)} components; the limit is {MAX_COMPONENTS}")
    components = [_build_component(i, [fragments[k] for k in g], raw) for i, g in enumerate(groups)]
    _number(components)
    mapped = any(_MAP_NUMBER.search(f.smiles) for f in fragments) and any(
        a.GetAtomMapNum() for c in components for a in c.mol.GetAtoms()
    )
    return Reaction(text=raw, components=components, cx_fields=cx_fields, mapped=mapped)
