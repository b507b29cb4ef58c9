"""What the molecules are: nitrogen sites, reactive groups, Lewis acids, and agent kinds.

Pure functions over RDKit molecules; the catalog of patterns is data (``catalog.py``).
"""

from __future__ import annotations

from dataclasses import dataclass, field, replace

from rdkit import Chem

from .._memo import Memo
from .catalog import GROUPS, NITROGEN_CLASSES, compiled

__all__ = [
    "NitrogenSite",
    "GroupMatch",
    "Perception",
    "nitrogen_sites",
    "reactive_groups",
    "lewis_acid_centres",
    "is_hindered_base",
    "perceive",
    "agent_kind",
    "NITROGEN_KINDS",
    "GROUP_NAMES",
]

NITROGEN_KINDS = tuple(c.kind for c in NITROGEN_CLASSES)
GROUP_NAMES = tuple(g.name for g in GROUPS)
_BASIC = {c.kind: c.basic for c in NITROGEN_CLASSES}


@dataclass(frozen=True)
class NitrogenSite:
    atom_index: int
    kind: str
    basic: bool
    hydrogens: int
    charge: int
    aromatic: bool


@dataclass(frozen=True)
class GroupMatch:
    name: str
    atoms: tuple[int, ...]  # the SMARTS match; atoms[0] is the reactive centre
    detail: str = ""  # leaving group, alpha-H count, ...

    @property
    def centre(self) -> int:
        return self.atoms[0]


# Per-molecule facts are kept on the Python molecule object itself (copies start without
# them), with the atom and bond counts they were computed for as a guard against a molecule
# edited in place afterwards.
_KEY_ATTR = "_chemcheck_canonical"
_RINGS_ATTR = "_chemcheck_rings"


def _shape(mol: Chem.Mol) -> int:
    return mol.GetNumAtoms()


def _ensure_rings(mol: Chem.Mol) -> None:
    # molecules read with partial sanitization or split without it have no ring information
    if getattr(mol, _RINGS_ATTR, None) == _shape(mol):
        return
    from .. import _rdlog

    with _rdlog.captured():
        try:
            mol.GetRingInfo().NumRings()
        except RuntimeError:
            Chem.FastFindRings(mol)
    _mark(mol, _RINGS_ATTR, _shape(mol))


def _mark(mol: Chem.Mol, attr: str, value) -> None:
    try:
        setattr(mol, attr, value)
    except AttributeError:  # an object that takes no attributes: recompute next time
        pass


def _canonical_key(mol: Chem.Mol) -> tuple[str, list[int]] | None:
    """Canonical SMILES and, for each canonical atom, its index in ``mol`` (for caches)."""
    hit = getattr(mol, _KEY_ATTR, None)
    if hit is not None and hit[0] == _shape(mol):
        return hit[1]
    key = _compute_key(mol)
    _mark(mol, _KEY_ATTR, (_shape(mol), key))
    return key


def canonical_key(mol: Chem.Mol) -> tuple[str, list[int]] | None:
    """Canonical SMILES of ``mol`` and its canonical atom order (remembered on the object)."""
    return _canonical_key(mol)


def remember_canonical(mol: Chem.Mol, key: tuple[str, list[int]], rings: bool = False) -> None:
    """Record the canonical key of ``mol``, a copy of a molecule whose key is known (same atom
    order), so that perception does not write its SMILES again; ``rings`` when the copy is
    known to carry ring information."""
    _mark(mol, _KEY_ATTR, (_shape(mol), key))
    if rings:
        _mark(mol, _RINGS_ATTR, _shape(mol))


def _compute_key(mol: Chem.Mol) -> tuple[str, list[int]] | None:
    from .. import _rdlog

    if mol.GetNumAtoms() > 300:
        return None
    with _rdlog.captured():
        try:
            smi = Chem.MolToSmiles(mol)
        except Exception:
            return None
    order = [int(x) for x in mol.GetProp("_smilesAtomOutputOrder").strip("[]").split(",") if x.strip()]
    if len(order) != mol.GetNumAtoms():
        return None
    return smi, order


_CANONICAL_SITES = Memo(4096)  # canonical SMILES -> (sites, groups) in canonical atom order


def _sites_canonical(mol: Chem.Mol, smiles: str, order: list[int]) -> tuple:
    """Sites and groups of ``mol`` in its canonical atom order (``order`` from its canonical
    SMILES), remembered by that SMILES: the answer does not depend on how the molecule was
    drawn. The molecule is renumbered, not parsed again from its SMILES (the same atoms in the
    same order, at a fifth of the cost)."""
    hit = _CANONICAL_SITES.get(smiles)
    if hit is None:
        from .. import _rdlog

        with _rdlog.captured():
            m = Chem.RenumberAtoms(mol, order)
        hit = _CANONICAL_SITES.put(smiles, (tuple(_nitrogen_sites(m)), tuple(_reactive_groups(m))))
    return hit


_SITES_ATTR = "_chemcheck_sites"
_GROUPS_ATTR = "_chemcheck_groups"


def _on_object(mol: Chem.Mol, attr: str, compute) -> list:
    """For molecules without a canonical key (the largest): the result kept on the object."""
    hit = getattr(mol, attr, None)
    if hit is not None and hit[0] == _shape(mol):
        return list(hit[1])
    value = compute(mol)
    _mark(mol, attr, (_shape(mol), tuple(value)))
    return value


def nitrogen_sites(mol: Chem.Mol) -> list[NitrogenSite]:
    """One site per nitrogen atom, classified by the first catalog class that matches it."""
    key = _canonical_key(mol)
    if key is None:
        return _on_object(mol, _SITES_ATTR, _nitrogen_sites)
    smi, order = key
    sites, _ = _sites_canonical(mol, smi, order)
    return sorted((replace(s, atom_index=order[s.atom_index]) for s in sites), key=lambda s: s.atom_index)


def reactive_groups(mol: Chem.Mol) -> list[GroupMatch]:
    key = _canonical_key(mol)
    if key is None:
        return _on_object(mol, _GROUPS_ATTR, _reactive_groups)
    smi, order = key
    _, groups = _sites_canonical(mol, smi, order)
    return [GroupMatch(g.name, tuple(order[i] for i in g.atoms), g.detail) for g in groups]


_ANY_N = Chem.MolFromSmarts("[#7]")
_ANY_AG = Chem.MolFromSmarts("[Ag]")


def _nitrogen_sites(mol: Chem.Mol) -> list[NitrogenSite]:
    n_count = len(mol.GetSubstructMatches(_ANY_N, maxMatches=100000))
    if not n_count:
        return []
    _ensure_rings(mol)
    kind_of: dict[int, str] = {}
    for cls in NITROGEN_CLASSES:
        if len(kind_of) == n_count:  # first class wins: every nitrogen has its class already
            break
        for smarts in cls.smarts:
            for match in mol.GetSubstructMatches(compiled(smarts), uniquify=False):
                idx = match[0]
                if mol.GetAtomWithIdx(idx).GetAtomicNum() == 7 and idx not in kind_of:
                    kind_of[idx] = cls.kind
    sites = []
    for atom in mol.GetAtoms():
        if atom.GetAtomicNum() != 7:
            continue
        kind = kind_of.get(atom.GetIdx(), "other_nitrogen")
        sites.append(
            NitrogenSite(
                atom_index=atom.GetIdx(),
                kind=kind,
                basic=_BASIC[kind],
                hydrogens=atom.GetTotalNumHs(),
                charge=atom.GetFormalCharge(),
                aromatic=atom.GetIsAromatic(),
            )
        )
    return sites


def _alpha_h(mol: Chem.Mol, carbonyl: int) -> int:
    atom = mol.GetAtomWithIdx(carbonyl)
    return sum(
        n.GetTotalNumHs() for n in atom.GetNeighbors() if n.GetAtomicNum() == 6 and not n.GetIsAromatic()
    )


def _reactive_groups(mol: Chem.Mol) -> list[GroupMatch]:
    _ensure_rings(mol)
    out: list[GroupMatch] = []
    for g in GROUPS:
        seen: set[int] = set()
        for match in mol.GetSubstructMatches(compiled(g.smarts)):
            if match[0] in seen:
                continue
            seen.add(match[0])
            detail = ""
            if g.name in ("alkyl_halide", "aryl_halide", "acid_halide", "sulfonyl_halide"):
                detail = mol.GetAtomWithIdx(match[-1]).GetSymbol()
            elif g.name == "alkyl_sulfonate":
                detail = "sulfonate"
            elif g.name == "ketone":
                detail = f"{_alpha_h(mol, match[0])} alpha-H"
            out.append(GroupMatch(g.name, tuple(match), detail))
    for idx in lewis_acid_centres(mol):
        out.append(GroupMatch("lewis_acid", (idx,), mol.GetAtomWithIdx(idx).GetSymbol()))
    if _silver_oxide(mol):
        ag = next(a.GetIdx() for a in mol.GetAtoms() if a.GetSymbol() == "Ag")
        out.append(GroupMatch("silver_oxide", (ag,), "Ag2O"))
    return out


# Metals and metalloids whose halides and triflates act as Lewis acids in organic synthesis.
_LA_METALS = frozenset("B Al Ga In Fe Ti Sn Zn Sc Bi Zr Hf Cu Mg Yb La Ce Sm Hg".split())
_HALOGENS = frozenset((9, 17, 35, 53))
_TRIFLATE = "[OX2]S(=O)(=O)C(F)(F)F"
_LA_OR_SI = Chem.MolFromSmarts(
    "[" + ",".join(f"#{Chem.GetPeriodicTable().GetAtomicNumber(e)}" for e in sorted(_LA_METALS | {"Si"})) + "]"
)


def _ligand_count(mol: Chem.Mol, atom: Chem.Atom, triflate_o: set[int]) -> int:
    n = 0
    for nb in atom.GetNeighbors():
        if nb.GetAtomicNum() in _HALOGENS or nb.GetIdx() in triflate_o:
            n += 1
        elif nb.GetAtomicNum() == 8 and atom.GetSymbol() in ("Ti", "Al", "Zr", "Hf", "Sn", "B") and any(
            x.GetAtomicNum() == 6 for x in nb.GetNeighbors()
        ):
            # alkoxide ligand (Ti(OiPr)4), or an ether bound to BF3 (counted with the halides)
            n += 1 if atom.GetSymbol() != "B" else 0
    return n


def lewis_acid_centres(mol: Chem.Mol) -> list[int]:
    """Atoms of Lewis-acidic metal halides, triflates and alkoxides (drawn covalent or ionic).

    Borohydrides and metal hydrides are reductants, tetrafluoroborate and tetrachloroaluminate
    are saturated anions, boronic acids and esters are weak: none of them counts.
    """
    if not mol.HasSubstructMatch(_LA_OR_SI):
        return []  # none of the metals, metalloids or silicon a Lewis acid is centred on
    triflate_o = {m[0] for m in mol.GetSubstructMatches(compiled(_TRIFLATE))}
    anions = sum(
        1
        for a in mol.GetAtoms()
        if a.GetFormalCharge() < 0
        and a.GetDegree() == 0
        and a.GetAtomicNum() in _HALOGENS
    ) + sum(1 for i in triflate_o if mol.GetAtomWithIdx(i).GetFormalCharge() < 0)
    centres = []
    for atom in mol.GetAtoms():
        sym = atom.GetSymbol()
        if sym not in _LA_METALS and sym != "Si":
            continue
        if atom.GetTotalNumHs() > 0:
            continue
        ligands = _ligand_count(mol, atom, triflate_o)
        if sym == "Si":
            # silyl triflates and iodides are Lewis acids; chlorosilanes barely
            if any(nb.GetIdx() in triflate_o or nb.GetAtomicNum() == 53 for nb in atom.GetNeighbors()):
                centres.append(atom.GetIdx())
            continue
        if sym == "B":
            halos = sum(1 for nb in atom.GetNeighbors() if nb.GetAtomicNum() in _HALOGENS)
            if halos >= 3 and atom.GetDegree() <= 4 and not (halos == 4):
                centres.append(atom.GetIdx())
            continue
        if atom.GetFormalCharge() < 0:
            continue  # AlCl4-, FeCl4-: saturated
        if ligands >= 1:
            centres.append(atom.GetIdx())
        elif atom.GetFormalCharge() >= 2 and atom.GetDegree() == 0 and anions >= 1:
            centres.append(atom.GetIdx())  # ionic drawing: [Al+3].[Cl-].[Cl-].[Cl-]
        elif sym == "Al" and atom.GetDegree() >= 3 and atom.GetFormalCharge() == 0:
            centres.append(atom.GetIdx())  # trialkylaluminium
    return centres


def _silver_oxide(mol: Chem.Mol) -> bool:
    if not mol.HasSubstructMatch(_ANY_AG):
        return False
    symbols = [a.GetSymbol() for a in mol.GetAtoms()]
    return "Ag" in symbols and "O" in symbols and "C" not in symbols and "N" not in symbols


_HINDERED = tuple(
    compiled(s)
    for s in (
        # tertiary amine with two branched alkyl groups (DIPEA type)
        "[NX3;H0;+0;!$(N-a)]([CX4;H1,H0]([#6])[#6])[CX4;H1,H0]([#6])[#6]",
        # pyridine flanked by two alkyl groups (2,6-lutidine type)
        "[nX2;$(n(:c-[CX4]):c-[CX4])]",
        # tertiary alkoxide (tert-butoxide type)
        "[OX1-][CX4]([#6])([#6])[#6]",
        # metal amide with two branched or silyl groups (LDA, HMDS type)
        "[#7-]([CX4;H1]([#6])[#6])[CX4;H1]([#6])[#6]",
        "[#7-]([Si])[Si]",
        # bicyclic amidines (DBU, DBN): basic, poor nucleophiles
        "[NX2;R]=[CX3;R]-[NX3;R]",
    )
)


_HINDERED_BY_SMILES = Memo()


def is_hindered_base(mol: Chem.Mol) -> bool:
    key = _canonical_key(mol)
    if key is not None:
        hit = _HINDERED_BY_SMILES.get(key[0])
        if hit is not None:
            return hit
    _ensure_rings(mol)
    out = any(mol.HasSubstructMatch(p) for p in _HINDERED)
    if key is not None:
        _HINDERED_BY_SMILES.put(key[0], out)
    return out


@dataclass(frozen=True)
class Perception:
    nitrogens: tuple[NitrogenSite, ...]
    groups: tuple[GroupMatch, ...]
    hindered_base: bool
    kind: str
    group_names: frozenset[str] = field(default=frozenset())

    def has(self, *names: str) -> bool:
        return any(n in self.group_names for n in names)

    def groups_named(self, *names: str) -> list[GroupMatch]:
        return [g for g in self.groups if g.name in names]

    @property
    def basic_nitrogens(self) -> list[NitrogenSite]:
        return [s for s in self.nitrogens if s.basic]


_BASE_GROUPS = ("alkoxide", "phenoxide", "hydroxide", "carbonate", "phosphate_base", "hydride_ion", "metal_amide", "organometallic_base", "carboxylate")
_REDUCTANT_GROUPS = ("boron_hydride", "aluminium_hydride", "silicon_hydride", "dihydrogen")
_ACID_GROUPS = ("hydrogen_halide", "sulfonic_acid", "perfluoro_acid", "nitric_acid", "carboxylic_acid")
_ELECTROPHILES = (
    "acid_halide", "chloroformate", "carbamoyl_chloride", "carbonyl_dihalide", "anhydride", "dicarbonate",
    "sulfonic_anhydride", "sulfonyl_halide", "inorganic_acid_chloride", "isocyanate", "alkyl_halide",
    "alkyl_sulfonate",
)


def agent_kind(nitrogens, groups: list[GroupMatch], hint: str | None) -> str:
    """base, acid, lewis_acid, solvent, reductant, catalyst, oxidant, coupling_agent or other."""
    names = {g.name for g in groups}
    if "lewis_acid" in names:
        return "lewis_acid"
    if hint in ("solvent", "catalyst"):
        return hint
    if names & set(_REDUCTANT_GROUPS):
        return "reductant"
    if names & {"peroxide", "metal_oxo_oxidant"}:
        return "oxidant"
    if names & {"coupling_agent", "carbodiimide"} and hint not in ("acid", "lewis_acid"):
        return "coupling_agent"  # its ring N or amino groups are not there to take a proton
    if "carbonate" in names:
        return "base"  # bicarbonate's O-H also matches the carboxylic acid pattern
    if names & set(_ACID_GROUPS) or "ammonium" in names:
        basic_n = [s for s in nitrogens if s.basic]
        if not basic_n or names & {"hydrogen_halide", "sulfonic_acid"} or "ammonium" in names:
            return "acid"
    if names & set(_BASE_GROUPS) - {"carboxylate"}:
        return "base"
    if not names & set(_ELECTROPHILES) and any(s.basic for s in nitrogens):
        return "base"
    if "carboxylate" in names:
        return "base"
    if hint in ("base", "acid", "reductant", "oxidant", "lewis_acid"):
        return hint
    return "other"


_PERCEIVED = Memo()  # (canonical SMILES, hint) -> Perception, for one atom order


def perceive(mol: Chem.Mol, hint: str | None = None) -> Perception:
    """Nitrogen classes, reactive groups, hindrance and agent kind of one molecule. Remembered
    by canonical SMILES together with the atom order it was worked out for (a Perception is
    immutable), so a molecule drawn the same way again costs one lookup."""
    key = _canonical_key(mol)
    if key is None:
        return _perceive(mol, hint)
    hit = _PERCEIVED.get_for((key[0], hint), key[1])
    return hit if hit is not None else _PERCEIVED.put_for((key[0], hint), key[1], _perceive(mol, hint))


def _perceive(mol: Chem.Mol, hint: str | None) -> Perception:
    _ensure_rings(mol)
    sites = nitrogen_sites(mol)
    groups = reactive_groups(mol)
    return Perception(
        nitrogens=tuple(sites),
        groups=tuple(groups),
        hindered_base=is_hindered_base(mol),
        kind=agent_kind(sites, groups, hint),
        group_names=frozenset(g.name for g in groups),
    )
