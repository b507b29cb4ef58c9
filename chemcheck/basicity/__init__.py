"""Basicity: the pKa of every nitrogen's conjugate acid (water, 25 °C).

``basic_sites(smiles_or_mol)`` returns one :class:`Site` per nitrogen. The number comes, in
order of preference, from

1. the reference table of measured values (``reference.py``), when the molecule is in it;
2. *anchoring by analogy*: the largest reference compound of the same site class that is a
   substructure of the molecule (its basic N on the molecule's N) gives the value, corrected
   by the class model's difference between the two (the "prediction from a closely related
   compound" of Perrin, Dempsey & Serjeant 1981, ch. 2);
3. the class model alone (``model.py``): Taft equations for aliphatic amines, Hammett
   equations for anilines and pyridine-type rings, ring-class values for azoles, amidines,
   guanidines, hydrazines and hydroxylamines.

Non-basic nitrogens (amide, sulfonamide, carbamate, imide, urea, pyrrole-type, nitro,
nitrile, N-oxide, quaternary ammonium, ...) get ``pka=None``. A protonated nitrogen (an amine
salt) gets the pKa of its own N-H (that of the free base). With several basic sites, the first
proton goes to the most basic one; the next site's value is recomputed with the first site
protonated (the ammonium as a substituent through the same model), see ``Site.stepwise_pka``.
"""

from __future__ import annotations

import math
import warnings
from dataclasses import dataclass, replace
from functools import lru_cache

from rdkit import Chem

from .. import _rdlog
from . import tautomers
from .._memo import Memo
from .._warnings import ChemcheckWarning
from ..errors import ChemcheckError, ParseError
from ..reading.molecule import read_smiles
from ..perceive import canonical_key, nitrogen_sites
from . import constants as K
from . import hydration, model
from .reference import ANHYDROUS, REFERENCE

__all__ = ["Site", "basic_sites", "first_protonation", "most_basic", "METHOD_UNCERTAINTY"]

# Estimated uncertainty (pKa units) of each method, from the accuracy measured against the
# IUPAC digitized dataset (docs/basicity.md); the reference values carry their own.
METHOD_UNCERTAINTY = {
    "aliphatic": 0.5, "aryl_amine": 0.4, "azine": 0.6, "azole": 0.8, "amidine": 0.7,
    "hydrazine": 0.8, "hydroxylamine": 0.8, "imine": 1.5, "enamine": 2.0, "amide_anion": 3.0,
}
_ANCHOR_EXTRA = 0.1

_FAMILY = {
    "primary_amine": "aliphatic", "secondary_amine": "aliphatic", "tertiary_amine": "aliphatic",
    "ammonia": "aliphatic", "aryl_amine": "aryl_amine", "pyridine_type": "azine",
    "amidine": "amidine", "guanidine": "amidine", "hydrazine": "hydrazine",
    "hydroxylamine": "hydroxylamine", "imine": "imine", "enamine": "enamine",
    "amide_anion": "amide_anion",
}


@dataclass(frozen=True)
class Site:
    """One nitrogen and the pKa of its conjugate acid. ``atom_index`` is 0-based, the RDKit
    atom index in the molecule given (the command-line table numbers atoms from 1)."""

    atom_index: int  # 0-based
    kind: str
    pka: float | None
    method: str
    source: str
    uncertainty: float | None
    protonation_order: int | None = None
    stepwise_pka: float | None = None

    @property
    def basic(self) -> bool:
        return self.pka is not None and self.pka >= 1.0


def _family(mol: Chem.Mol, idx: int, kind: str) -> str | None:
    fam = _FAMILY.get(kind)
    if fam == "azine" and model._ring_of(mol, idx, 6) is None:
        return "azole"
    return fam


def _model(mol: Chem.Mol, idx: int, fam: str) -> tuple[float, str]:
    if fam == "aliphatic":
        return model.aliphatic(mol, idx)
    if fam == "aryl_amine":
        return model.aniline(mol, idx)
    if fam in ("azine", "azole"):
        return model.azine(mol, idx)
    if fam == "amidine":
        return model.amidine(mol, idx)
    if fam == "hydrazine":
        return model.hydrazine(mol, idx)
    if fam == "hydroxylamine":
        return model.hydroxylamine(mol, idx)
    if fam == "imine":
        return model.imine(mol, idx)
    if fam == "enamine":
        return 8.0, "class value, enamine (N-protonation; C-protonation competes)"
    if fam == "amide_anion":
        return 36.0, "class value, metal amide (conjugate acid: the amine, ~36 in THF/DMSO)"
    raise KeyError(fam)


@dataclass(frozen=True)
class _Ref:
    name: str
    mol: Chem.Mol
    site: int
    site2: int | None
    pka1: float
    pka2: float | None
    source: str
    uncertainty: float
    family: str
    smiles: str
    n_equiv: int
    heavy: int
    ring: int  # size of the smallest ring through the site (0: none)


def _equivalents(mol: Chem.Mol, idx: int) -> int:
    ranks = list(Chem.CanonicalRankAtoms(mol, breakTies=False))
    return sum(1 for r in ranks if r == ranks[idx])


@lru_cache(maxsize=1)
def _references() -> tuple[_Ref, ...]:
    out = []
    with _rdlog.captured():
        for name, smi, pka1, pka2, source, unc in REFERENCE:
            mol = Chem.MolFromSmiles(smi)
            site = site2 = None
            for a in mol.GetAtoms():
                if a.GetAtomMapNum() == 1:
                    site = a.GetIdx()
                elif a.GetAtomMapNum() == 2:
                    site2 = a.GetIdx()
                a.SetAtomMapNum(0)
            kinds = {s.atom_index: s.kind for s in nitrogen_sites(mol)}
            fam = _family(mol, site, kinds[site])
            out.append(
                _Ref(name, mol, site, site2, pka1, pka2, source, unc, fam, Chem.MolToSmiles(mol),
                     _equivalents(mol, site), mol.GetNumHeavyAtoms(), _site_ring(mol, site))
            )
    return tuple(out)


def _ring_bonds_kept(ref: Chem.Mol, mol: Chem.Mol, match: tuple[int, ...]) -> bool:
    """Ring bonds stay ring bonds and chain bonds stay chain bonds (a chain reference such as
    diethylamine must not anchor a ring amine such as an aziridine)."""
    for b in ref.GetBonds():
        q = mol.GetBondBetweenAtoms(match[b.GetBeginAtomIdx()], match[b.GetEndAtomIdx()])
        if q is None or q.IsInRing() != b.IsInRing():
            return False
        if b.IsInRing() and _smallest_ring(ref, b) != _smallest_ring(mol, q):
            return False
    return True


def _groups_kept(ref: Chem.Mol, mol: Chem.Mol, match: tuple[int, ...]) -> bool:
    """The matched atoms are the same kind of group in the compound as in the reference: each
    keeps its charge (an amino N is not the N of a nitro group), a substituent carbon on an
    aromatic ring keeps its hybridisation (the methyl C of a picoline is not the carbonyl C of
    an ester), and an aldehyde carbon stays an aldehyde (a pyridinecarbaldehyde's measured
    value includes its hydrate)."""
    for a in ref.GetAtoms():
        target = mol.GetAtomWithIdx(match[a.GetIdx()])
        if target.GetFormalCharge() != a.GetFormalCharge():
            return False
        if a.GetIsAromatic():
            continue
        if any(n.GetIsAromatic() for n in a.GetNeighbors()) and target.GetHybridization() != a.GetHybridization():
            return False
        aldehyde = a.GetAtomicNum() == 6 and a.GetTotalNumHs() > 0 and any(
            b.GetBondType() == Chem.BondType.DOUBLE and b.GetOtherAtom(a).GetAtomicNum() == 8 for b in a.GetBonds()
        )
        if aldehyde and target.GetTotalNumHs() == 0:
            return False
    return True


def _smallest_ring(mol: Chem.Mol, bond) -> int:
    sizes = [len(r) for r in mol.GetRingInfo().BondRings() if bond.GetIdx() in r]
    return min(sizes) if sizes else 0


def _anchor(mol: Chem.Mol, idx: int, fam: str) -> tuple[_Ref, bool] | None:
    """The best reference for this site: (ref, exact) where exact means the same compound."""
    key = _fragment_key(mol, idx) if mol.GetNumAtoms() < 200 else ""
    best: _Ref | None = None
    best_rank = None
    exact = False
    ring_here = _site_ring(mol, idx)
    for ref in _references():
        if ref.family != fam or ref.heavy > mol.GetNumHeavyAtoms():
            continue
        for match in mol.GetSubstructMatches(ref.mol, uniquify=False, maxMatches=50):
            if match[ref.site] != idx or not _ring_bonds_kept(ref.mol, mol, match):
                continue
            if not _groups_kept(ref.mol, mol, match):
                continue
            if ref.smiles == key:
                return ref, True
            # a reference whose N sits in a ring of the same size comes first (an N-alkyl
            # aziridine anchors on aziridine, not on ethylamine), then the larger reference
            rank = (ref.ring == ring_here, ref.heavy)
            if best_rank is None or rank > best_rank:
                best, best_rank = ref, rank
            break
    return (best, exact) if best is not None else None


def _fragment_key(mol: Chem.Mol, idx: int) -> str:
    """Canonical SMILES of the fragment that holds atom ``idx`` (a salt's counter-ion or a
    second molecule in the same text does not hide an exact reference match)."""
    frags = Chem.GetMolFrags(mol)
    if len(frags) == 1:
        return Chem.MolToSmiles(mol)
    atoms = next(f for f in frags if idx in f)
    return Chem.MolFragmentToSmiles(mol, atomsToUse=list(atoms))


def _site_ring(mol: Chem.Mol, idx: int) -> int:
    """Size of the smallest ring through atom ``idx`` (0 when it is in none)."""
    sizes = [len(r) for r in mol.GetRingInfo().AtomRings() if idx in r]
    return min(sizes) if sizes else 0


def _site_value(mol: Chem.Mol, idx: int, kind: str) -> tuple[float, str, str, float]:
    """Microscopic pKa of one site with the rest of the molecule as drawn."""
    fam = _family(mol, idx, kind)
    value, label = _model(mol, idx, fam)
    unc = METHOD_UNCERTAINTY[fam]
    found = _anchor(mol, idx, fam)
    if found is None:
        return value, label, "class model (constants in chemcheck/basicity/constants.py)", unc
    ref, exact = found
    micro_ref = ref.pka1 - math.log10(ref.n_equiv)
    if exact:
        return micro_ref, "reference value", f"{ref.name}: {ref.source}", ref.uncertainty
    anchor_text = f"{ref.name} ({ref.pka1:.2f})"
    if ref.name in ANHYDROUS:  # anchor on the aromatic cation; hydration is added later
        micro_ref = ANHYDROUS[ref.name] - math.log10(ref.n_equiv)
        anchor_text = f"{ref.name} (anhydrous cation {ANHYDROUS[ref.name]:.2f}, Albert, Armarego & Spinner 1961)"
    ref_model, _ = _model(ref.mol, ref.site, fam)
    shifted = micro_ref + (value - ref_model)
    return (
        shifted,
        f"anchored on {anchor_text} with {label}",
        f"{ref.name}: {ref.source}; shift from the class model",
        max(unc - 0.1, 0.2) + _ANCHOR_EXTRA,
    )


def _protonate(mol: Chem.Mol, idx: int) -> Chem.Mol:
    rw = Chem.RWMol(mol)
    a = rw.GetAtomWithIdx(idx)
    a.SetFormalCharge(a.GetFormalCharge() + 1)
    a.SetNumExplicitHs(a.GetTotalNumHs() + 1)
    a.SetNoImplicit(True)
    out = rw.GetMol()
    with _rdlog.captured():
        Chem.SanitizeMol(out, catchErrors=True)
    return out


def _deprotonate(mol: Chem.Mol, *indices: int) -> Chem.Mol:
    """The molecule with one proton taken from each of the given atoms."""
    rw = Chem.RWMol(mol)
    for idx in indices:
        a = rw.GetAtomWithIdx(idx)
        a.SetFormalCharge(a.GetFormalCharge() - 1)
        a.SetNumExplicitHs(max(a.GetTotalNumHs() - 1, 0))
        a.SetNoImplicit(True)
    out = rw.GetMol()
    with _rdlog.captured():
        Chem.SanitizeMol(out, catchErrors=True)
    return out


def _to_mol(smiles_or_mol) -> Chem.Mol:
    if isinstance(smiles_or_mol, Chem.Mol):
        return smiles_or_mol
    if not isinstance(smiles_or_mol, str):
        raise ParseError(f"expected SMILES or an RDKit molecule, not {type(smiles_or_mol).__name__}")
    return read_smiles(smiles_or_mol).mol


_NOT_BASIC = "not basic in water (lone pair delocalised, or none)"


def basic_sites(smiles_or_mol, *, max_sites: int = 8) -> list[Site]:
    """One :class:`Site` per nitrogen of the molecule, with the pKa of its conjugate acid.

    Atom indices are 0-based (RDKit order of the molecule given). A bad input raises a
    :class:`~chemcheck.errors.ParseError`; a molecule the models cannot read never raises: its
    nitrogens come back without a value (``pka=None``, the method says why) and a
    :class:`~chemcheck._warnings.ChemcheckWarning` says so.
    """
    mol = _to_mol(smiles_or_mol)
    try:
        return _basic_sites(mol, max_sites)
    except ChemcheckError:
        raise
    except Exception as exc:  # a gap in the models must not end a check: no value, said plainly
        return _without_values(mol, exc)


def _without_values(mol: Chem.Mol, exc: Exception) -> list[Site]:
    smiles = Chem.MolToSmiles(mol)
    warnings.warn(
        f"basicity: no pKa estimate for the nitrogens of {smiles} (the models do not cover this "
        f"structure: {type(exc).__name__})",
        ChemcheckWarning,
        stacklevel=3,
    )
    why = "no estimate: the basicity models do not cover this structure"
    try:
        perceived = nitrogen_sites(mol)
    except Exception:  # perception itself failed: one entry per nitrogen atom
        return [
            Site(a.GetIdx(), "unknown", None, why, "none", None)
            for a in mol.GetAtoms() if a.GetAtomicNum() == 7
        ]
    return [Site(s.atom_index, s.kind, None, why, "none", None) for s in perceived]


def _basic_sites(mol: Chem.Mol, max_sites: int) -> list[Site]:
    if mol.GetNumAtoms() >= 400:
        return _compute(mol, max_sites)
    # the cache works in canonical atom order: map the indices back to the caller's molecule
    key = canonical_key(mol)
    if key is None:
        return _compute(mol, max_sites)
    smiles, order = key
    hit = _REMAPPED.get_for((smiles, max_sites), order)
    if hit is None:
        cached = _basic_sites_cached(smiles, max_sites)
        hit = tuple(sorted((replace(s, atom_index=order[s.atom_index]) for s in cached), key=lambda s: s.atom_index))
        _REMAPPED.put_for((smiles, max_sites), order, hit)
    return list(hit)


_REMAPPED = Memo()  # the cached sites in the atom order of the molecule last asked about


@lru_cache(maxsize=2048)
def _basic_sites_cached(smiles: str, max_sites: int) -> tuple[Site, ...]:
    with _rdlog.captured():
        mol = Chem.MolFromSmiles(smiles)
    if mol is None:  # a partially sanitized species: nothing to say about its nitrogens
        return ()
    # an imino tautomer of an amino-heteroaromatic is counted as its amino form, an NH-pyridone
    # through its hydroxypyridine form (same atoms, same cation)
    read = tautomers.amino_form(mol)
    sites = _zwitterion(read, _compute(read, max_sites), max_sites)
    if read is mol:
        return tuple(sites)
    moved = {
        a.GetIdx() for a in mol.GetAtoms()
        if a.GetAtomicNum() == 7 and a.GetTotalNumHs() != read.GetAtomWithIdx(a.GetIdx()).GetTotalNumHs()
    }
    return tuple(
        replace(s, method=f"{s.method}; read as its tautomer with the ring N-H moved (same cation)")
        if s.atom_index in moved and s.pka is not None else s
        for s in sites
    )


# Acid groups that a base in the same molecule deprotonates in water (an amino acid is a
# zwitterion): SMARTS of the O-H, and the pKa above which a base takes the proton, about that
# of the acid (carboxylic acids 2-5, alpha-amino acids 2.3; sulfonic acids below 0; the first
# step of a phosphonic or phosphoric acid about 2; CRC and Perrin, from memory).
# The last field: only one proton per acid centre (the first step of a phosphorus acid).
_ACID_OH = (
    (Chem.MolFromSmarts("[OX2H1][CX3]=[OX1]"), 4.0, False),
    (Chem.MolFromSmarts("[OX2H1][SX4](=[OX1])=[OX1]"), -1.0, False),
    (Chem.MolFromSmarts("[OX2H1][PX4]=[OX1]"), 2.0, True),
)


def _zwitterion(mol: Chem.Mol, sites: list[Site], max_sites: int) -> list[Site]:
    """Sites of a molecule with both an acid group and a base stronger than that acid (amino
    acids, aminosulfonic acids such as taurine and HEPES): in water the acid has given its
    proton to the base, and the base's pKa is that of the zwitterion, the acid ionized (glycine
    9.78 against 7.7 for the same amine beside a neutral COOH, CRC). The sites of such a
    molecule are then read with its acid groups ionized; a base weaker than the acid keeps the
    neutral acid (4-aminobenzoic acid, 2.4 below the COOH's 4.9). Each acid group gives one
    proton (one per phosphorus), and only within its own molecule: an acid drawn as a second
    component (pyridine with acetic acid) is left to the proton bookkeeping of acid_base."""
    frag_of = {}
    for k, frag in enumerate(Chem.GetMolFrags(mol)):
        for i in frag:
            frag_of[i] = k
    acids: dict[int, list[tuple[int, float]]] = {}
    centres: set[int] = set()
    for pattern, threshold, once in _ACID_OH:
        for o, centre, *_ in mol.GetSubstructMatches(pattern):
            if once and centre in centres:
                continue
            centres.add(centre)
            acids.setdefault(frag_of[o], []).append((o, threshold))
    if not acids:
        return sites

    def strongest(values, frag):
        return max(
            (x.pka for x in values if x.pka is not None and x.kind != "ammonium" and frag_of[x.atom_index] == frag),
            default=None,
        )

    candidates = [f for f in acids if strongest(sites, f) is not None]
    if not candidates:
        return sites
    charged = _compute(_deprotonate(mol, *(o for f in candidates for o, _t in acids[f])), max_sites)
    chosen = set()
    for f in candidates:
        threshold = min(t for _o, t in acids[f])
        neutral_best, charged_best = strongest(sites, f), strongest(charged, f)
        # the zwitterion wins when the base beats the acid as drawn, or when the anion's base
        # does so clearly (EDTA: four neutral COOH pull the amines below 4, the anion's are at 8-10)
        if neutral_best > threshold or (charged_best is not None and charged_best > threshold + 2.0):
            chosen.add(f)
    if not chosen:
        return sites
    if chosen != set(candidates):
        charged = _compute(_deprotonate(mol, *(o for f in chosen for o, _t in acids[f])), max_sites)
    return [
        replace(x, method=f"{x.method}; with the acid group ionized (zwitterion in water)")
        if x.pka is not None and frag_of[x.atom_index] in chosen else x
        for x in charged
    ]


def _shared_amidine(mol: Chem.Mol, site, kinds: dict[int, str], voiced: set[int]) -> bool:
    """The sp3 N of an amidine or guanidine shares its cation with the =N: report it once.

    When the =N is not itself a basic site (an acyl or sulfonyl group on it: the N-acyl
    tautomer of an acylguanidine or of creatinine, as usually drawn), one sp3 N of the unit
    carries the value instead, so the unit is never reported as not basic. ``voiced`` holds the
    amidine carbons already given a site."""
    atom = mol.GetAtomWithIdx(site.atom_index)
    if site.kind not in ("amidine", "guanidine") or any(b.GetBondType() == Chem.BondType.DOUBLE for b in atom.GetBonds()):
        return False
    for c in atom.GetNeighbors():
        if c.GetAtomicNum() != 6:
            continue
        partners = [
            b.GetOtherAtom(c) for b in c.GetBonds()
            if b.GetBondType() == Chem.BondType.DOUBLE and b.GetOtherAtom(c).GetAtomicNum() == 7
        ]
        if not partners:
            continue
        if any(kinds.get(p.GetIdx()) in ("amidine", "guanidine") for p in partners):
            return True
        if c.GetIdx() in voiced:
            return True
        voiced.add(c.GetIdx())
        return False
    return True


def _compute(mol: Chem.Mol, max_sites: int, *, hydrate: bool = True) -> list[Site]:
    perceived = nitrogen_sites(mol)
    kinds = {s.atom_index: s.kind for s in perceived}
    voiced: set[int] = set()
    sites: dict[int, Site] = {}
    for s in perceived:
        kind = s.kind
        if kind == "ammonium":
            free = _deprotonate(mol, s.atom_index)
            free_kind = {x.atom_index: x.kind for x in nitrogen_sites(free)}.get(s.atom_index)
            if free_kind in _FAMILY:
                v, label, src, unc = _site_value(free, s.atom_index, free_kind)
                one = {s.atom_index: Site(s.atom_index, free_kind, round(v, 2), label, src, unc)}
                if hydrate:
                    for hs in hydration.hydration_sites(free):
                        if s.atom_index in (hs.n_added, hs.amidine_n):
                            _add_hydration(free, one, hs, max_sites)
                    # the salt of an amino acid: its N-H is that of the zwitterion
                    one = {x.atom_index: x for x in _zwitterion(free, list(one.values()), max_sites)}
                base = one[s.atom_index]
                sites[s.atom_index] = Site(
                    s.atom_index, kind, base.pka, f"salt: N-H of the {free_kind.replace('_', ' ')}; {base.method}",
                    base.source, base.uncertainty,
                )
                continue
        if kind not in _FAMILY or (s.basic is False and kind not in _FAMILY):
            sites[s.atom_index] = Site(s.atom_index, kind, None, _NOT_BASIC, "class (perception)", None)
            continue
        if _shared_amidine(mol, s, kinds, voiced):
            sites[s.atom_index] = Site(s.atom_index, kind, None, "protonation shared with the C=N nitrogen (amidinium)", "class (perception)", None)
            continue
        v, label, src, unc = _site_value(mol, s.atom_index, kind)
        sites[s.atom_index] = Site(s.atom_index, kind, round(v, 2), label, src, unc)
    if hydrate:
        for hs in hydration.hydration_sites(mol):
            _add_hydration(mol, sites, hs, max_sites)
    # protonation order among the neutral basic sites, each next one with the earlier protonated
    basic = sorted(
        (s for s in sites.values() if s.pka is not None and s.kind != "ammonium" and s.kind != "amide_anion"),
        key=lambda s: -s.pka,
    )[:max_sites]
    if basic:
        first = basic[0]
        sites[first.atom_index] = replace(first, protonation_order=1, stepwise_pka=first.pka)
    if len(basic) > 1:
        _stepwise(mol, sites, basic)
    return [sites[k] for k in sorted(sites)]


def _add_hydration(mol: Chem.Mol, sites: dict[int, Site], hs: "hydration.HydrationSite", max_sites: int) -> None:
    """Fold the covalently hydrated cation into the value of the ring N it protonates
    (``hydration.py``): pKa = log10((10**pKa + Kn 10**pKa_hydrate) / (1 + Kn))."""
    cands = [sites.get(i) for i in (hs.n_added, hs.amidine_n)]
    cands = [c for c in cands if c is not None and c.pka is not None]
    if not cands:
        return
    target = max(cands, key=lambda c: c.pka)
    if target.method == "reference value":  # a measured value already includes the hydration
        return
    hydrated = hydration.hydrate(mol, hs)
    if hydrated is None:
        return
    values = [
        s.pka for s in _compute(hydrated, max_sites, hydrate=False)
        if s.atom_index in (hs.n_added, hs.amidine_n, hs.amidine_c) and s.pka is not None
    ]
    if not values:
        return
    hyd = max(values)
    # the more electron-poor the ring (the lower its aromatic cation's pKa), the more the
    # neutral base hydrates: a linear free-energy relation anchored on quinazoline
    log_kn = K.HYDRATION_LOG_KN - K.HYDRATION_SLOPE * (target.pka - ANHYDROUS["quinazoline"])
    log_kn = min(log_kn, 0.0)
    kn = 10 ** log_kn
    value = math.log10((10 ** target.pka + kn * 10 ** hyd) / (1 + kn))
    if value - target.pka < 0.05:
        return
    sites[target.atom_index] = replace(
        target,
        pka=round(value, 2),
        method=f"{target.method}; with the covalently hydrated cation (hydrate {hyd:.2f}, log Kn {log_kn:.1f})",
        source=f"{target.source}; covalent hydration after Albert, Armarego & Spinner 1961",
        uncertainty=(target.uncertainty or 0.5) + 0.3,
    )


# The lowest stepwise value reported: a further protonation would need more than concentrated
# sulfuric acid (H0 about -12; common practice, from memory), so the model's number there is
# meaningless and the step is left out.
_LAST_STEP = -10.0


def _measured_second(mol: Chem.Mol, first: int, kind: str) -> tuple[set[int], float] | None:
    """For a compound of the reference table with a measured second pKa (piperazine, DABCO,
    nicotine): the atoms of the second site and the published second pKa. It is the
    macroscopic constant, the number a chemist looks up (DABCO 2.97; its microscopic value is
    0.30 higher for the two equivalent protons of the dication)."""
    fam = _family(mol, first, kind)
    if fam is None:
        return None
    found = _anchor(mol, first, fam)
    if found is None or not found[1] or found[0].pka2 is None or found[0].site2 is None:
        return None
    ref = found[0]
    seconds: set[int] = set()
    for match in mol.GetSubstructMatches(ref.mol, uniquify=False, maxMatches=50):
        if match[ref.site] == first:
            seconds.add(match[ref.site2])
    if not seconds:
        return None
    return seconds, ref.pka2


def _from_measured_second(mol: Chem.Mol, current: Chem.Mol, site: Site, second: float) -> Site:
    """The second site's own value (the first site neutral) read back from the measured second
    pKa: that value less the model's shift for the first site's charge (quinine's quinoline N:
    4.13 measured with the quinuclidine protonated). A reference value of the site is kept."""
    if site.method == "reference value":
        return site
    fam = _family(mol, site.atom_index, site.kind)
    try:
        now, _ = _model(current, site.atom_index, fam)
        before, _ = _model(mol, site.atom_index, fam)
    except (IndexError, KeyError, ValueError, StopIteration):
        return site
    return replace(
        site,
        pka=round(second - (now - before), 2),
        method=f"measured second pKa ({second:.2f}) less the model's shift for the first site's charge ({now - before:+.2f})",
        uncertainty=(site.uncertainty or 0.5),
    )


def _stepwise(mol: Chem.Mol, sites: dict[int, Site], basic: list[Site]) -> None:
    """Order of protonation and the stepwise values, each step with the earlier sites protonated."""
    remaining = {s.atom_index for s in basic}
    first = basic[0]
    remaining.discard(first.atom_index)
    current = _protonate(mol, first.atom_index)
    measured = _measured_second(mol, first.atom_index, sites[first.atom_index].kind)
    order = 2
    while remaining and order <= 4:
        best = None
        for idx in remaining:
            if order == 2 and measured is not None and idx in measured[0]:
                value = measured[1]  # the measured second step of this very compound
                if best is None or value > best[1]:
                    best = (idx, value)
                continue
            base = sites[idx]
            kind = base.kind
            fam = _family(mol, idx, kind)
            try:
                now, _ = _model(current, idx, fam)
                before, _ = _model(mol, idx, fam)
            except (IndexError, KeyError, ValueError, StopIteration):
                # the protonated species lost what the model reads at this site (an azole ring
                # no longer aromatic once a ring N is protonated): no stepwise value for it
                continue
            value = base.pka + (now - before)
            if best is None or value > best[1]:
                best = (idx, value)
        if best is None:
            break
        idx, value = best
        if value < _LAST_STEP:  # beyond the most acidic water: no further proton to speak of
            break
        sites[idx] = replace(sites[idx], protonation_order=order, stepwise_pka=round(value, 2))
        if order == 2 and measured is not None and idx in measured[0]:
            sites[idx] = _from_measured_second(mol, current, sites[idx], value)
        current = _protonate(current, idx)
        remaining.discard(idx)
        order += 1


def most_basic(sites: list[Site]) -> Site | None:
    cands = [s for s in sites if s.pka is not None and s.kind not in ("ammonium",)]
    return max(cands, key=lambda s: s.pka) if cands else None


def first_protonation(smiles_or_mol) -> tuple[Site | None, float | None]:
    """The site that takes the first proton and the molecule's first (macroscopic) pKa.

    The macroscopic value counts every site: pKa1 = log10(sum of 10**pKa_i) over the neutral
    basic sites (two equivalent amines add log10 2 = 0.30).
    """
    sites = basic_sites(smiles_or_mol)
    cands = [s for s in sites if s.pka is not None and s.kind not in ("ammonium", "amide_anion")]
    if not cands:
        return None, None
    best = max(cands, key=lambda s: s.pka)
    macro = math.log10(sum(10 ** s.pka for s in cands))
    return best, round(macro, 2)
