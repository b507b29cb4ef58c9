"""The SMARTS catalog: what each nitrogen is, and which reactive groups a molecule carries.

Data first: each nitrogen class is one or more SMARTS whose first atom is the nitrogen, tried
in order (the first class that matches wins, so the specific forms come before the general).
Each reactive group is a SMARTS whose first atom is the group's reactive centre.
Patterns are compiled once, on first use.
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import lru_cache

from rdkit import Chem

__all__ = ["NITROGEN_CLASSES", "GROUPS", "NitrogenClass", "GroupDef", "compiled"]


@dataclass(frozen=True)
class NitrogenClass:
    kind: str
    smarts: tuple[str, ...]
    basic: bool  # has a lone pair that takes a proton in water (pKa of BH+ usually above 1)
    description: str


_ACYL = "[CX3,SX4,SX3,PX4](=[OX1,SX1,NX2])"  # acyl, sulfonyl, sulfinyl, phosphoryl neighbours

NITROGEN_CLASSES: tuple[NitrogenClass, ...] = (
    NitrogenClass("nitro", ("[$([NX3+](=O)[O-]),$([NX3](=O)=O)]", "[$([NX3+](=O)[O-]),$([NX3](=O)=O)]"), False, "nitro group"),
    NitrogenClass("nitroso", ("[NX2](=[OX1])",), False, "nitroso group"),
    NitrogenClass("n_oxide", ("[#7+;!$([#7]=O);H0][OX1-]",), False, "N-oxide"),
    NitrogenClass("diazonium", ("[NX2+]#[NX1]", "[NX1]#[NX2+]"), False, "diazonium ion"),
    NitrogenClass(
        "azide",
        ("[#7]=[#7+]=[#7-]", "[#7+](=[#7])=[#7-]", "[#7-]=[#7+]=[#7]", "[#7-]-[#7+]#[#7]", "[#7+](-[#7-])#[#7]", "[#7](#[#7+])-[#7-]"),
        False,
        "azide",
    ),
    NitrogenClass("quaternary_ammonium", ("[NX4+;H0]",), False, "quaternary ammonium (no N-H, no lone pair)"),
    NitrogenClass("ammonium", ("[#7+;!H0;!$([#7]~[OX1-])]",), False, "protonated nitrogen (an amine salt)"),
    NitrogenClass("iminium", ("[NX3+;H0]=[#6]",), False, "iminium ion"),
    NitrogenClass("amide_anion", ("[#7-;!$([#7-]~[#7+])]",), True, "deprotonated nitrogen (metal amide base)"),
    NitrogenClass("nitrile", ("[NX1]#[#6]",), False, "nitrile"),
    NitrogenClass("isocyanate", ("[NX2]=[CX2]=[O,S,N]",), False, "isocyanate, isothiocyanate or carbodiimide"),
    NitrogenClass("sulfonamide", ("[#7][SX4](=[OX1])=[OX1]", "[#7][SX3]=[OX1]"), False, "sulfonamide"),
    NitrogenClass("imide", ("[#7]([CX3]=[OX1,SX1])[CX3]=[OX1,SX1]",), False, "imide"),
    NitrogenClass("urea", ("[#7][CX3](=[OX1,SX1])[#7]",), False, "urea"),
    NitrogenClass("carbamate", ("[#7][CX3](=[OX1,SX1])[OX2,SX2]",), False, "carbamate"),
    NitrogenClass("amide", ("[#7][CX3]=[OX1,SX1]", "[#7][PX4]=[OX1]"), False, "amide (lone pair in conjugation with C=O)"),
    NitrogenClass("guanidine", ("[#7;!a;$([#7][CX3](~[#7;!a])~[#7;!a]),$([#7]=[CX3](~[#7;!a])~[#7;!a])]",), True, "guanidine"),
    NitrogenClass("amidine", ("[NX2;!a]=[CX3;!a][#7;!a]", "[NX3;!a][CX3;!a]=[NX2;!a]"), True, "amidine"),
    NitrogenClass("hydrazine", ("[#7;!a]-[#7]", "[#7;a]-[#7;!a]"), True, "hydrazine or hydrazone"),
    NitrogenClass("hydroxylamine", ("[#7;!a]-[OX2]",), True, "hydroxylamine or oxime"),
    NitrogenClass("aryl_amine", ("[NX3;!a;+0]-a",), True, "aryl amine (aniline type, N-alkyl included)"),
    NitrogenClass("enamine", ("[NX3;!a;+0]-[CX3]=[CX3]",), True, "enamine"),
    NitrogenClass("imine", ("[NX2;!a;+0]=[#6]",), True, "imine"),
    NitrogenClass("pyridine_type", ("[nX2;H0;+0]",), True, "aromatic N with its lone pair outside the ring π system"),
    NitrogenClass("pyrrole_type", ("[n;+0;$([nX3]),$([nH])]",), False, "aromatic N with its lone pair in the ring π system"),
    NitrogenClass("ammonia", ("[NX3;H3;+0]",), True, "ammonia"),
    NitrogenClass("primary_amine", ("[NX3;H2;+0][CX4]",), True, "primary alkylamine"),
    NitrogenClass("secondary_amine", ("[NX3;H1;+0]([CX4])[CX4]",), True, "secondary alkylamine"),
    NitrogenClass("tertiary_amine", ("[NX3;H0;+0]([CX4])([CX4])[CX4]",), True, "tertiary alkylamine"),
    NitrogenClass("other_nitrogen", ("[#7]",), False, "nitrogen of another kind"),
)


@dataclass(frozen=True)
class GroupDef:
    name: str
    smarts: str
    description: str


GROUPS: tuple[GroupDef, ...] = (
    # acylating and sulfonylating agents (release acid on reaction with an amine)
    GroupDef("acid_halide", "[CX3;$(C-[#6]),$([CH1])](=[OX1])[F,Cl,Br,I]", "acid halide"),
    GroupDef("chloroformate", "[CX3](=[OX1])([OX2][#6])[Cl,Br]", "chloroformate"),
    GroupDef("carbamoyl_chloride", "[CX3](=[OX1])([NX3])[Cl,Br]", "carbamoyl chloride"),
    GroupDef("carbonyl_dihalide", "[CX3](=[OX1])([Cl,Br])[Cl,Br]", "phosgene-type carbonyl dihalide"),
    GroupDef("anhydride", "[CX3](=[OX1])([#6])[OX2][CX3](=[OX1])[#6]", "carboxylic anhydride"),
    GroupDef("dicarbonate", "[CX3](=[OX1])([OX2][#6])[OX2][CX3](=[OX1])[OX2][#6]", "dicarbonate (Boc2O type)"),
    GroupDef("sulfonic_anhydride", "[SX4](=[OX1])(=[OX1])[OX2][SX4](=[OX1])=[OX1]", "sulfonic anhydride"),
    GroupDef("sulfonyl_halide", "[SX4](=[OX1])(=[OX1])[F,Cl,Br]", "sulfonyl halide"),
    GroupDef("inorganic_acid_chloride", "[SX3,PX4,PX5;!$([S,P]-[#6])](=[OX1])[Cl,Br]", "inorganic acid chloride (SOCl2, POCl3)"),
    GroupDef("isocyanate", "[CX2](=[NX2])=[OX1]", "isocyanate"),
    GroupDef("isothiocyanate", "[CX2](=[NX2])=[SX1]", "isothiocyanate"),
    GroupDef("carbodiimide", "[CX2](=[NX2])=[NX2]", "carbodiimide"),
    # amide coupling agents that turn a carboxylic acid into an acylating agent (one name, several
    # structural classes: Montalbetti & Falque, Tetrahedron 2005, 61, 10827; Valeur & Bradley,
    # Chem. Soc. Rev. 2009, 38, 606)
    GroupDef(
        "coupling_agent",
        "[$([CX3](=[NX3+])([NX3])[$([OX2]),$([#7][#7])]),"  # uronium or aminium salt (HATU, HBTU, COMU)
        "$([PX4+][OX2][#7]),"  # phosphonium salt (BOP, PyBOP)
        "$([PX4](=[OX1])[OX2][PX4]=[OX1]),"  # phosphonic or phosphoric anhydride (T3P)
        "$([CX3](=[OX1])([nX3])[nX3]),"  # carbonyl diazole (CDI)
        "$(c1(Cl)ncncn1),$(c1([NX4+])ncncn1),"  # chlorotriazine or triazinylammonium (CDMT, DMTMM)
        "$(c([F,Cl,Br,I])[n+])]",  # 2-halopyridinium salt (Mukaiyama's reagent)
        "amide coupling agent",
    ),
    # alkylating agents
    GroupDef("alkyl_halide", "[CX4;!$(C([F,Cl,Br,I])[F,Cl,Br,I])][Cl,Br,I]", "alkyl halide"),
    GroupDef("alkyl_sulfonate", "[CX4][OX2][SX4](=[OX1])(=[OX1])[#6,OX2]", "alkyl sulfonate or sulfate"),
    GroupDef("aryl_halide", "c[F,Cl,Br,I]", "aryl halide"),
    # carbonyls, acids, alcohols
    GroupDef("aldehyde", "[CX3;H1,H2;!$(C-[O,N,S,F,Cl,Br,I])](=[OX1])", "aldehyde"),
    GroupDef("ketone", "[CX3](=[OX1])([#6])[#6]", "ketone"),
    GroupDef("ester", "[CX3](=[OX1])([#6,#1])[OX2][#6;!$(C=[O,S])]", "ester"),
    GroupDef("carboxylic_acid", "[CX3](=[OX1])[OX2H1]", "carboxylic acid"),
    GroupDef("carboxylate", "[CX3](=[OX1])[OX1-]", "carboxylate"),
    GroupDef("alcohol", "[OX2H1][CX4]", "alcohol"),
    GroupDef("phenol", "[OX2H1]c", "phenol"),
    GroupDef("water", "[OX2H2]", "water"),
    GroupDef("thiol", "[SX2H1][#6]", "thiol"),
    # acids and bases
    GroupDef("hydrogen_halide", "[Cl,Br,I;H1;X1;+0]", "hydrogen halide"),
    GroupDef("sulfonic_acid", "[SX4](=[OX1])(=[OX1])[OX2H1]", "sulfonic or sulfuric acid"),
    GroupDef("perfluoro_acid", "[CX3](=[OX1])([OX2H1])C(F)(F)F", "trifluoroacetic-type acid"),
    GroupDef("nitric_acid", "[NX3+](=[OX1])([OX1-])[OX2H1]", "nitric acid"),
    GroupDef("alkoxide", "[OX1-][CX4]", "alkoxide"),
    GroupDef("phenoxide", "[OX1-]c", "phenoxide"),
    GroupDef("hydroxide", "[OX1H1-]", "hydroxide"),
    GroupDef("carbonate", "[CX3](=[OX1])([OX1-])[OX1-,OX2H1]", "carbonate or bicarbonate"),
    GroupDef("phosphate_base", "[PX4](=[OX1])[OX1-]", "phosphate"),
    GroupDef("hydride_ion", "[#1-]", "hydride ion (NaH type)"),
    GroupDef("metal_amide", "[#7-;!$([#7-]~[#7+])]", "metal amide (LDA type)"),
    GroupDef("organometallic_base", "[Li,Na,K,Mg]-[#6]", "organolithium or Grignard reagent"),
    # reductants
    GroupDef("boron_hydride", "[B;!H0]", "boron hydride"),
    GroupDef("aluminium_hydride", "[Al;!H0]", "aluminium hydride"),
    GroupDef("silicon_hydride", "[Si;!H0]", "silicon hydride"),
    GroupDef("dihydrogen", "[#1][#1]", "dihydrogen"),
    # electrophilic reagents for ring substitution
    GroupDef("nitrating_agent", "[$([NX3+](=[OX1])([OX1-])[OX2]),$([NX2+](=[OX1])=[OX1])]", "nitrating agent (nitric acid, nitronium, acyl nitrate)"),
    GroupDef("nitrate_salt", "[NX3+](=[OX1])([OX1-])[OX1-]", "nitrate salt"),
    GroupDef("halogen", "[Cl,Br,I;X1]-[Cl,Br,I;X1]", "elemental halogen or interhalogen"),
    GroupDef("n_halo", "[Cl,Br,I]-[#7]", "N-halo reagent (NBS type)"),
    GroupDef(
        "sulfur_trioxide",
        "[$([SX3](=[OX1])(=[OX1])=[OX1]),$([SX4](=[OX1])(=[OX1])([OX1-])[#7+])]",
        "sulfur trioxide or an SO3-amine complex",
    ),
    GroupDef("chlorosulfonic_acid", "[SX4](=[OX1])(=[OX1])(Cl)[OX2H1]", "chlorosulfonic acid"),
    GroupDef("sulfuric_acid", "[SX4](=[OX1])(=[OX1])([OX2H1])[OX2H1]", "sulfuric acid"),
    GroupDef("sulfuryl_chloride", "[SX4](=[OX1])(=[OX1])(Cl)Cl", "sulfuryl chloride"),
    # hazards
    GroupDef("diazonium", "[NX2+]#[NX1]", "diazonium ion"),
    GroupDef("azide", "[#7]~[#7+]~[#7-]", "azide"),
    GroupDef("peroxide", "[OX2]-[OX2]", "peroxide"),
    GroupDef("metal_oxo_oxidant", "[Mn,Cr,Os,Ru]=[OX1]", "metal-oxo oxidant"),
    GroupDef("nitro", "[$([NX3+](=O)[O-]),$([NX3](=O)=O)][#6]", "nitro group"),
    # nitrogen as a group (for reagents and leaving groups)
    GroupDef("quaternary_ammonium", "[NX4+;H0]", "quaternary ammonium"),
    GroupDef("ammonium", "[#7+;!H0;!$([#7]~[OX1-])]", "protonated amine"),
    GroupDef("sulfonium", "[SX3+]([#6])([#6])[#6]", "sulfonium"),
)


@lru_cache(maxsize=None)
def compiled(smarts: str) -> Chem.Mol:
    patt = Chem.MolFromSmarts(smarts)
    if patt is None:  # a catalog error, caught by the test suite
        raise ValueError(f"bad SMARTS in catalog: {smarts}")
    return patt
