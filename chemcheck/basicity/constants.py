"""Substituent constants and class equations for the pKa of conjugate acids of nitrogen bases.

Sources (values transcribed from these compilations; where a value was recalled rather than
read off the page it says so, and its uncertainty is widened accordingly):

* [HLT] C. Hansch, A. Leo, R. W. Taft, "A survey of Hammett substituent constants and
  resonance and field parameters", Chem. Rev. 1991, 91, 165-195 (sigma_m, sigma_p, sigma_p-).
* [PDS] D. D. Perrin, B. Dempsey, E. P. Serjeant, *pKa Prediction for Organic Acids and
  Bases*, Chapman & Hall, 1981: the Taft equations for amines (chapter 4), sigma* values
  (table of Taft constants), the attenuation factor 0.4 per CH2, and the Hammett equations
  for anilines (pKa = 4.60 - 2.89 sum sigma) and pyridines (pKa = 5.25 - 5.90 sum sigma).
* [P65] D. D. Perrin, *Dissociation Constants of Organic Bases in Aqueous Solution*,
  Butterworths, 1965, and Supplement, 1972: pKa of ortho-substituted anilines and 2-substituted
  pyridines, from which the ortho increments below are differences to the parent (recalled).
"""

from __future__ import annotations

# --- Hammett constants [HLT]: (sigma_m, sigma_p, sigma_p_minus) ---------------------------
HAMMETT: dict[str, tuple[float, float, float]] = {
    "H": (0.00, 0.00, 0.00),
    "CH3": (-0.07, -0.17, -0.17),
    "alkyl": (-0.07, -0.15, -0.15),
    "tBu": (-0.10, -0.20, -0.13),
    "CF3": (0.43, 0.54, 0.65),
    "CCl3": (0.40, 0.46, 0.46),
    "CHX2": (0.30, 0.32, 0.32),  # CHF2 0.29 / 0.32, CHCl2 0.31 / 0.32 [HLT, from memory]
    "CH2X": (0.11, 0.12, 0.12),  # CH2Cl, CH2OH-type: weak acceptor
    "CH2N": (-0.03, -0.11, -0.11),
    # an ammonium one carbon from the ring, CH2NMe3+ [HLT, from memory]: the protonated first
    # site of nicotine seen from its pyridine N (5.44 - 5.9 x 0.43 = 2.9, measured pKa2 3.1)
    "CH2N+": (0.40, 0.44, 0.44),
    "Ph": (0.06, -0.01, 0.02),
    "vinyl": (0.06, -0.04, -0.04),
    "ethynyl": (0.21, 0.23, 0.53),
    "F": (0.34, 0.06, -0.03),
    "Cl": (0.37, 0.23, 0.19),
    "Br": (0.39, 0.23, 0.25),
    "I": (0.35, 0.18, 0.27),
    "OH": (0.12, -0.37, -0.37),
    "O-": (-0.47, -0.81, -0.81),
    "OMe": (0.12, -0.27, -0.26),
    "OPh": (0.25, -0.03, -0.10),
    "OAc": (0.39, 0.31, 0.31),
    "OCF3": (0.38, 0.35, 0.27),
    "NH2": (-0.16, -0.66, -0.15),
    "NHR": (-0.21, -0.70, -0.70),
    "NHAr": (-0.02, -0.56, -0.56),  # anilino, NHC6H5 [HLT, from memory]
    "NR2": (-0.16, -0.83, -0.12),
    "NHAc": (0.21, 0.00, -0.46),
    # the pyrrole-type N of a fused azole ring, seen from the other ring (imidazo[4,5-c]pyridine,
    # purines): its lone pair belongs to the azole sextet but still gives to the fused ring,
    # less than an amino group does. Our estimate, between NHAc and NHR.
    "fused_nR": (0.0, -0.4, -0.4),
    "NH3+": (0.86, 0.60, 0.56),
    "NR3+": (0.88, 0.82, 0.77),
    "NO2": (0.71, 0.78, 1.27),
    "CN": (0.56, 0.66, 1.00),
    "CHO": (0.35, 0.42, 1.03),
    "COR": (0.38, 0.50, 0.84),
    "COOR": (0.37, 0.45, 0.75),
    "COOH": (0.37, 0.45, 0.77),
    "COO-": (-0.10, 0.00, 0.31),
    "CONH2": (0.28, 0.36, 0.61),
    "SO2R": (0.60, 0.72, 1.13),
    "SOR": (0.52, 0.49, 0.73),  # methylsulfinyl [HLT], as recalled; it used to be taken as SO2R
    "SO2N": (0.53, 0.60, 0.94),
    "SO3-": (0.30, 0.35, 0.35),
    "SR": (0.15, 0.00, 0.06),
    # fluorinated sulfur groups [HLT, from memory]: they used to be read as SR and SO2R
    "SCF3": (0.40, 0.50, 0.57),
    "SO2CF3": (0.83, 0.96, 1.63),
    "SH": (0.25, 0.15, 0.73),
    "SiR3": (-0.04, -0.07, 0.11),
    "N=N": (0.32, 0.39, 0.45),
    "B": (-0.01, 0.12, 0.12),  # boronic acid
    "fused": (0.06, -0.04, -0.04),  # an aromatic ring fused on: treated as a vinyl-like substituent
}

# --- ortho increments: pKa(2-X parent) - pKa(parent), from [P65] (recalled) ----------------
ORTHO_ANILINE: dict[str, float] = {
    "CH3": -0.16, "alkyl": -0.25, "tBu": -0.8, "OMe": -0.08, "OH": 0.12, "NH2": -0.13,
    "NHR": -0.1, "NHAr": -0.1, "NR2": -0.5, "F": -1.40, "Cl": -1.96, "Br": -2.07, "I": -2.0, "NO2": -4.86,
    "CN": -3.6, "COOR": -2.4, "COR": -2.3, "CHO": -2.6, "COOH": -2.5, "CF3": -3.4, "Ph": -0.78,
    "SR": -1.15, "CONH2": -1.8, "NHAc": -0.9, "vinyl": -0.5, "fused": -0.68, "OPh": -1.2,
    "SO2R": -4.5, "SO2N": -4.0, "CH2X": -0.6, "CH2N": -0.2, "ethynyl": -1.6, "OAc": -1.5,
    "CH2N+": -2.5,  # our estimate: CF3's increment scaled by sigma_m, less for the longer reach
    # our estimates, for want of measured parents: OCF3 as the acyloxy group of like sigma_m,
    # SCF3 between SR and CF3, SO2CF3 beyond SO2R as its sigma_m is
    "OCF3": -1.5, "SCF3": -2.3, "SO2CF3": -5.5,
    "CHX2": -2.4,  # CF3's increment scaled by sigma_m (0.30 against 0.43)
}
ORTHO_PYRIDINE: dict[str, float] = {
    "CH3": 0.72, "alkyl": 0.70, "tBu": 0.51, "NH2": 1.61, "NHR": 1.85, "NR2": 1.7, "OMe": -1.97,
    "NHAr": 1.5,  # our estimate: NHR scaled by the sigma_p of the two groups (-0.56 against -0.70)
    "OPh": -2.2, "F": -5.69, "Cl": -4.53, "Br": -4.54, "I": -3.4, "CN": -5.5, "COOR": -3.0,
    "COR": -2.6, "CHO": -3.4, "CF3": -5.8, "NO2": -7.8, "Ph": -0.77, "SR": -1.66,
    "vinyl": -0.27, "CONH2": -3.2, "NHAc": -1.1, "CH2X": -0.4, "CH2N": -0.3, "OH": -5.0,
    # 2-(aminomethyl)pyridine, its pyridine N with the ammonium formed: 2.31 against 5.23
    # (Perrin 1965, from memory)
    "CH2N+": -2.9,
    "fused": -0.35, "ethynyl": -2.5, "OAc": -3.0, "SO2R": -6.0, "SO2N": -6.0,
    "SOR": -5.0,  # our estimate, below the sulfonyl group
    # our estimates, as for the aniline increments above
    "OCF3": -3.0, "SCF3": -4.5, "SO2CF3": -7.5,
    "CHX2": -4.0,  # CF3's increment scaled by sigma_m (0.30 against 0.43)
}

# --- reaction constants ----------------------------------------------------------------------
ANILINE = {"pka0": 4.60, "rho": 2.89}  # [PDS]
PYRIDINE = {"pka0": 5.25, "rho": 5.90}  # [PDS]
# The Taft equations for amines [PDS]: pKa = a - rho* sum(sigma*) over the groups on N.
TAFT_AMINE = {
    "primary": (10.15, 3.14),
    "secondary": (10.59, 3.23),
    "tertiary": (9.61, 3.30),
}
ATTENUATION = 0.4  # per intervening carbon [PDS]
# Taft and Lewis: sigma_I(X) = 0.45 sigma*(CH2X) (R. W. Taft, I. C. Lewis, J. Am. Chem. Soc. 1958,
# 80, 2436); it turns the sigma* of a chain into the inductive sigma of a ring substituent
SIGMA_I_PER_SIGMA_STAR = 0.45
# In a 1-substituted pyrazolium or 1,2,4-triazolium ion the ring N-R beside the protonated N
# carries part of the charge (the resonance form R-N1(+)=C5); a pi-donor on C5 makes that an
# amidinium-like unit and acts with the same share of its resonance part as a donor beside the
# basic N (AZOLE_ADJACENT_RESONANCE): 5-amino-1-alkylpyrazoles and 5-amino-1-methyl-1,2,4-triazole
AZOLE_ACROSS_DONOR = 0.5
# The share of the amine rho* (about 3.1 [PDS]) that reaches an amino N conjugated with a
# protonated ring N, which carries about 0.4 of the charge (the amidinium-like cation of
# 2- and 4-aminopyridines): our estimate
AMINO_N_RHO_STAR = 1.2
# The sigma* of an electron-withdrawing group (from ester hydrolysis rates) understates its pull
# on an ammonium ion close by in water: with the Taft slopes alone, amines carrying nitrile,
# ester, halogen or alkoxy groups come out 0.5-1 unit too basic (2-chloroethylamine 8.79,
# aminoacetonitrile 5.34, CRC and PDS, from memory). Each group on N with a positive sigma*
# counts this many times. Our estimate, checked as one number against the development set.
TAFT_EWG_SCALE = 1.2
ALKYL_SIGMA_STAR = -0.10  # the contribution of one alkyl carbon on the alpha carbon (sigma*(Et))

# sigma* of CH2-Z for heteroatom groups Z [PDS Taft table]; additive on the alpha carbon
# (sigma*(CH2Z) - sigma*(CH3), sigma*(CH3) = 0). Acyloxy (with phosphate and sulfonate esters)
# and S-acyl or S-phosphoryl groups from their field constants F [HLT] (OAc 0.41, SAc 0.39, from
# memory) through sigma*(CH2Z) = F / 0.45, the ratio that links F(Cl) 0.42-0.47 to
# sigma*(CH2Cl) 1.05. The acyl group pulls the O lone pairs away, and an acyloxy group
# withdraws clearly more than a hydroxy or alkoxy group (F 0.33 and 0.29 [HLT], from memory).
SIGMA_STAR_Z: dict[str, float] = {
    "F": 1.10, "Cl": 1.05, "Br": 1.00, "I": 0.85,
    "OH": 0.555, "OR": 0.52, "OAr": 0.85, "OC(=O)": 0.91, "O-": -0.10,
    "SR": 0.62, "SH": 0.62, "SC(=O)": 0.87, "S(=O)": 1.20, "SO2": 1.32,
    "NO2": 1.40, "amine": 0.40, "amide_n": 0.80, "aryl_n": 0.60, "ammonium": 2.00,
    "quaternary": 1.90, "azide": 1.00, "heteroaryl_n": 0.90, "imine_n": 0.60, "sulfonamide_n": 0.80,
    "C=O ketone": 0.60, "C=O ester": 0.71, "C=O amide": 0.50, "C=O acid": 0.80,
    "carboxylate": 0.17, "SO3-": 1.05, "C#N": 1.30, "C=C": 0.20, "C#C": 0.64, "aryl": 0.215,
    "aza_in_aryl": 0.12, "C=N": 0.50, "Si": -0.05, "P": 0.60, "B": 0.0,
}
# The N of an amide or carbamate as a substituent (sixth round; 0.40, the amine's value, until
# then): 1-acetylpiperazine 7.94 against N-methylpiperazine 9.0 (from memory); our value, set
# from that pair.
# The anions of the zwitterions (sixth round; until then carboxylate 0.05 and sulfonate as SO2):
# a carboxylate still withdraws from an ammonium ion beside it, glycine 9.78 against
# methylamine 10.64, and a sulfonate less than a neutral sulfonyl group, taurine 9.06 (CRC, from
# memory). Our values, set from these two; beta-alanine 10.24 and GABA 10.56 follow through the
# attenuation factor.

# --- aromatic nitrogen heterocycles: the parent of each ring class [P65] ------------------
# (the pKa of the parent, and the reaction constant for substituents on ring carbons)
AZOLE_RHO = 6.5  # estimated, 5-ring azoles with sigma_m of the substituent (uncertain)
AZA_SIGMA = {"ortho": None, "meta": 0.65, "para": 0.78}  # an extra ring N as a substituent
AZA_ORTHO_INCREMENT = -2.9  # pyridazine (2.33) against pyridine (5.25)
# Diazines with an amino group ortho or para to the basic N: the cation is an amidinium-like ion
# whose charge sits partly on the exocyclic N, and the other substituents act with this share of
# rho (2-amino-5-nitropyrimidine 0.35 against 2-aminopyrimidine 3.54, P65 as recalled: 0.76 of
# the full sigma_m term). In pyridines the full rho holds (2-amino-5-nitropyridine 2.80, 2-amino-
# 5-chloropyridine 4.71 against 2-aminopyridine 6.86, from memory). Our estimate.
DIAZINE_RHO_FACTOR = 0.75
# An amino group ortho or para to the N of a pyridine (no second ring N) takes much of the
# cation's charge, as in an amidinium ion, and an alkyl group beside the ring N then adds this
# share of its ortho increment: 2-amino-6-methylpyridine 7.41 against 2-aminopyridine 6.86 (from
# memory) keeps about 0.75 of the 0.72 of 2-picoline, the 4-aminoquinaldines and the
# 4-amino-2,6-dimethylpyridines much less. Our estimate.
DONOR_ALKYL_ORTHO_SHARE = 0.6
# An alkoxy group ortho or para to the N of such an aminopyridine gives up part of its
# resonance to the stronger amino donor, which holds the cation's charge (the saturation of
# pi-donors that breaks Hammett additivity): the pKa falls by this share of the amino group's
# increment. 2-amino-4-methoxypyridine 7.62 against 8.08 from the additive terms, and
# 3,4-diamino-2-methoxypyridine 5.68 against 7.1 (Perrin's compilation, as the IUPAC
# digitization has it). Our estimate.
ALKOXY_DONOR_LOSS = 0.3
# With electron-withdrawing groups on both sides of a pyridine N the second adds this share of
# its ortho increment: 2,6-dichloropyridine -2.86 against 2-chloropyridine 0.72 and pyridine
# 5.25 (CRC, from memory), 3.58 against 4.53.
SECOND_ORTHO_EWG = 0.8
# A hydroxy group on the second or third carbon of a chain beside a pyridine N holds the N's
# lone pair in a six- or seven-membered hydrogen-bonded ring in the free base, on top of its
# inductive pull: 2-(2-hydroxyethyl)pyridine 5.31 (Perrin's compilation, as the IUPAC
# digitization has it) against 2-ethylpyridine 5.89 (CRC), where the 4-isomers differ by 0.4.
# Our estimate.
ORTHO_OH_HBOND = -0.35
# An alkylamino group beside the N whose N-H is held by a nitro group on its other side turns
# its alkyl group towards the ring N: 2-(methylamino)-3-nitropyridine 2.41 against 2.9 from
# the additive terms (Perrin's compilation, as the IUPAC digitization has it), and the same
# for the 4-(methylamino)-5-nitropyrimidines. The same N-H bond holds the NHR group of an
# N-alkyl-2-nitroaniline planar and in full conjugation with the nitro group: N-methyl-,
# N-ethyl- and N-isopropyl-2-nitroaniline lie about 0.6 below 2-nitroaniline plus the N-alkyl
# increment (same source). Our estimate, one number for both.
LOCKED_NHR = -0.5
# A third amino group on a pyrimidine ring adds this much less than the additive sum: two amino
# groups already spread the charge. Melamines, whose amino groups all sit between two ring N,
# stay additive. Our estimate, checked as one number against the development set.
THIRD_AMINO = 0.8

# Ring C=O (lactam, pyridone, pyrimidinone positions) and a ring N bearing a substituent (its
# lone pair in the pi system) in six-membered rings. No literature constants exist for these;
# the values are our estimates from the chemistry (a ring C=O acts as a vinylogous acyl group,
# a ring N-R as a ring NR2 donor) and carry a wide uncertainty.
# The para value was 0.8 until the eighth round; 0.7 does better on the development set (the
# 3-alkylpyrimidin-4-ones and the 7-oxopurines), and the constant stays an estimate.
RING_OXO = {"ortho": -3.5, "meta": 0.5, "para": 0.7}
# A ring N-R para to the site gives less than a ring NR2 donor would (-0.5): it nearly always
# sits next to a ring C=O (pyrimidinones, pteridinones), which takes a share of its lone pair.
# Our estimate, checked as one number against the development set.
RING_NR_SIGMA = {"meta": -0.16, "para": -0.3}
# rho of the benzylammonium ions against ring substituents, in sigma* units of the CH2-aryl
# group: rho(ArCH2NH3+) = 1.06 (PDS) divided by rho*(primary amines) = 3.14.
BENZYL_RING_FACTOR = 1.06 / 3.14

# Substituents on a ring fused to the ring of a pyridine-type N (quinolines, isoquinolines,
# acridines) act through the fused system at reduced strength: sigma_p at positions conjugated
# with the N (odd path length), sigma_m otherwise, times this factor per ring away. Our
# estimate from textbook cases (nitroquinolines about 2.3 units below quinoline; each amino group
# of 3,6-diaminoacridine about +2 above acridine), not a literature constant.
FUSED_RING_FACTOR = 0.5
# An alkyl group on the fused ring acts with this share of that: its hyperconjugative donation
# reaches the other ring less well than the lone pair of an amino or alkoxy group does (the
# methylquinolines lie within 0.2 of quinoline, where the full factor put a 7-methyl group
# 0.5 above it). Our estimate, checked as one number against the development set.
FUSED_ALKYL_SHARE = 0.5
# A donor on the fused ring para to the fusion atom that carries the N (C6 of a quinoline, para
# to C8a) is not conjugated with the N by the path count, but gives to C8a, which shares the
# cation's charge: it acts with sigma_m plus this share of (sigma_p - sigma_m). 6-aminoquinoline
# 5.63 against quinoline 4.90 (Albert, from memory), where sigma_m alone gives 5.37. Not for an
# acridine N, whose two outer rings share the charge. Our estimate.
FUSED_PARA_DONOR_SHARE = 0.3
# A donor meta to the ring N whose para ring atom is the fusion atom of a benzo ring (C3 of a
# quinoline, its para atom C8a) sends its resonance into the benzo ring rather than towards the
# N: its sigma moves this share of the way from sigma_m to its field constant F [HLT, from
# memory]. 3-aminoquinoline 4.91 lies at quinoline's 4.90, where 3-aminopyridine is 0.8 above
# pyridine (Albert; CRC; from memory). Our estimate.
FUSION_META_DONOR_SHARE = 0.5
# A donor beside the ring N across the ring's beta-beta bond (C3 of an isoquinoline, the bond
# opposite the benzo fusion, of low double-bond character) loses most of its resonance with the
# N: its ortho increment is lowered by this factor times (sigma_p - sigma_m), its resonance
# part. 3-aminoisoquinoline 5.05 lies below isoquinoline 5.42, where 1-aminoisoquinoline is at
# 7.62 and 2-aminopyridine 1.6 above pyridine; 3-methylisoquinoline 5.64 (Albert, from memory).
# Our estimate. Rings with a second ring N (quinazolines) are left out: their cations add water.
BETA_BOND_RHO = 4.0

# Steric inhibition of resonance in N,N-dialkylanilines with an ortho alkyl group: the ortho
# increment per crowding alkyl group. From N,N-dimethyl-o-toluidine (5.86) against
# N,N-dimethylaniline (5.07), CRC values recalled from memory.
ORTHO_ALKYL_TWIST = 0.8

# Steric inhibition of resonance of a ring substituent (NR2, NO2, COOR, COR) by groups on the
# ring atoms next to it: the share of its resonance effect lost per flanking group. Our
# estimate (a flanked NMe2 or NO2 keeps about its inductive effect, sigma_m).
TWIST_LOSS = 0.4


# --- corrections found necessary beyond the additive equations (third round) ----------------
# Each is our estimate of the size of a textbook effect; the effect is named in the docstring
# of the function that applies it, and docs/basicity.md gives the accuracy with and without.
# The sizes were set against textbook compounds (values from memory, named below) and then
# checked, as one number per effect, against the development set of the IUPAC dataset; no value
# of that set is stored here.

# Pi-donors ortho or para to a ring N: a donor para to another ring aza N loses this share of
# its increment (cross-conjugation; 4,6-diaminopyrimidine ~5.8 against 2,4-diaminopyrimidine
# 7.4, from memory). model._donor_cross. (A plain saturation term for a second donor on the
# same N was tried and made the development figures worse.)
DONOR_CROSS = 1.0
# A substituent on the ring atom next to the basic N of an azole is conjugated with it through
# the C=N: it acts with sigma_m plus this share of (sigma_p - sigma_m). 2-aminothiazole 5.36 and
# 3,5-dimethylpyrazole 4.1 against thiazole 2.53 and pyrazole 2.48 (P65; the latter from memory).
AZOLE_ADJACENT_RESONANCE = 0.5
# rho* of an alkyl group on the pyrrole-type N of an azole, two bonds from the basic N (the
# N-glycosyl and N-CH2COOR imidazoles and benzimidazoles): our estimate, about 0.6 of the
# Taft rho* of amines, as for the other two-bond transmissions here.
AZOLE_N_RHO_STAR = 2.0
# Peri group (C8 of a quinoline, C4/C5 of an acridine) next to a ring N, and the extra crowding
# when the N also has a substituent on its other side: 8-methylquinoline 4.6 and
# 2,8-dimethylquinoline 4.1 against quinoline 4.90 and quinaldine 5.8 (from memory).
PERI = -0.8
PERI_BUTTRESS = -0.6
# a peri O (C=O, OR, OH) takes the N-H of the cation in a hydrogen bond that pays for the
# crowding: no peri term (8-hydroxyquinoline 4.91 against quinoline 4.90, Albert, from memory)
PERI_ACCEPTOR = 0.0
# a peri N-H (an amino group) holds the ring N's lone pair in a hydrogen bond in the neutral
# base: 8-aminoquinoline 3.99 (Albert, from memory) against 4.6 from the peri term alone
PERI_NH_DONOR = -0.6
# Amidines: rho* of an alkyl group on either amidine N (the charge is shared by two N, so about
# 0.6 of the amine rho*), and a five-membered ring amidine (2-imidazoline, lysidine ~11.0 and
# 2-phenylimidazoline ~9.9, from memory, against acetamidine 12.4 and benzamidine 11.6).
AMIDINE_N_RHO_STAR = 2.0
AMIDINE_RING5 = -1.0
# A ring aza atom in a cyclic amidine held as an imine (1-alkyl-2-iminopyrimidine, ~11.7 from
# memory, against 1-methyl-2-iminopyridine 13.0): sigma of the aza atom, times rho 4.5.
IMINE_AZA = 0.4
# Diaryl ketimines (the C=N of 1,4-benzodiazepines): pKa = PKA0 - RHO x (sum of the sigma of the
# groups on both aryl rings, sigma_p for ortho and para, sigma_m for meta) - rho*(tertiary
# amine) x sigma*(N-substituent). Fitted on diazepam 3.4 and medazepam 6.2 (Clarke's Analysis
# of Drugs and Poisons, 4th ed., 2011, from memory); the other benzodiazepines of that table
# (oxazepam 1.7, temazepam 1.6, lorazepam 1.3, nitrazepam 3.2, clonazepam 1.5, flunitrazepam
# 1.8, prazepam 2.7) are the test (tests/test_basicity_steps.py). Our fit.
DIARYL_IMINE_PKA0 = 5.92
DIARYL_IMINE_RHO = 2.34
IMINE_RING_N_DONOR = 0.5
# rho of the N-alkyl and N,N-dialkyl anilines: 3.46 for N,N-dimethylanilines against pKa 5.07
# [PDS, from memory], used for N-monoalkyl anilines too.
ANILINE_N_ALKYL_RHO = 3.46
# Substituents and aza atoms of an N-aryl ring of an amidine or guanidine act through the
# aniline terms at this share (the cation's charge is spread over two or three N; cf. the
# 0.6 share of AMIDINE_N_RHO_STAR). Our estimate; phenylguanidine itself is the anchor.
AMIDINE_ARYL_SHARE = 0.5
# log10 of the hydration constant of the neutral base for the covalent hydration of fused
# pyrimidines (hydration.py): from quinazoline, equilibrium pKa 3.51, anhydrous 1.95, hydrated
# cation 7.77 (Albert, Armarego & Spinner 1961, from memory):
# log10(10**3.51 - 10**1.95) - 7.77 = -4.27.
HYDRATION_LOG_KN = -4.27
# The more electron-poor the ring, the more its neutral base hydrates (pteridine hydrates far
# more than quinazoline): log Kn rises by this much per unit by which the aromatic cation's pKa
# lies below anhydrous quinazoline's. Our estimate of a linear free-energy relation (0.5 until
# the fifth round; 0.8 once C4 carrying an electron-withdrawing group could hydrate too).
HYDRATION_SLOPE = 0.8
# Per carbon branch beyond the first on each alpha carbon, taken off the Taft value: a branched
# ammonium ion is less well solvated, which the sigma* of the extra alkyl groups does not see.
# Primary amines: in water alpha-branching adds nothing (ethylamine 10.65, isopropylamine 10.63,
# tert-butylamine 10.68, CRC, from memory), so the term cancels the branch's sigma* (-0.10 x
# rho* 3.14). Secondary and tertiary: 2,2,6,6-tetramethylpiperidine 11.07 against piperidine
# 11.12 (from memory), where the Taft sum alone gives about 12.4. Our estimates, per class.
CROWDED_AMMONIUM: dict[str, float] = {"primary": 0.3, "secondary": 0.3, "tertiary": 0.2}
# Pyridazine-type rings: a substituent two ring atoms from the basic N, with a ring aza N in
# between (C3 of pyridazine seen from N1), conjugates with that aza N, which is bonded to the
# basic N: it acts with sigma_m plus this share of (sigma_p - sigma_m).
ALPHA_AZA_RESONANCE = 0.75
# sigma for a group para to a pyridine-type N where sigma_p misses its resonance with the
# cation. An alkylthio group gives its sulfur lone pair to a pyridinium N as it does to a
# carbocation: sigma_p 0.00 and sigma_p+ -0.60 [HLT]; 4-(methylthio)pyridine 5.94 against
# pyridine 5.25 (from memory) puts it at about -0.12; para to a diazine N it acts a little more
# strongly. Our estimate.
# A hydroxy group para to the N: 4-hydroxypyridine is 4-pyridone in water, and the measured
# pKa (3.27, Albert, from memory) is that of the pyridone; sigma 0.34 reproduces it, as the
# ortho increment of OH (-5.0, 2-pyridone 0.75) does for the 2-isomer (sixth round).
# An alkylamino group para to the N gives more than its sigma_p (-0.70) says, as its N-alkyl
# group stabilises the amidinium-like cation: 4-(methylamino)pyridine 9.65 against
# 4-aminopyridine 9.17 (Perrin's compilation; the first value as the IUPAC digitization has it)
# puts it at -0.74, with rho 5.9 and sigma_p(NH2) -0.66.
# A nitro group para to the N: its field constant (0.65) puts 4-nitropyridine at 1.41, where it
# is 1.61 (CRC, from memory): 0.61.
AZINE_PARA_SIGMA: dict[str, float] = {"SR": -0.15, "OH": 0.34, "NHR": -0.74, "NO2": 0.61}
# Added to the ortho increment of an electronegative group that sits between the basic N and a
# second ring N (C2 of a pyrimidine, a quinazoline or a 1,3,5-triazine). The second ring N has
# already drawn electron density from that carbon, and the group's pull on the basic N is
# smaller than next to a single ring N; an alkoxy or alkylthio group also conjugates with both
# ring N (an isourea-like unit). The pyridine increments are 2-methoxypyridine 3.28,
# 2-methylthiopyridine 3.59, 2-chloropyridine 0.72 against pyridine 5.25 (CRC). Our estimates:
# one number for the halogens and CX3 groups, one each for alkoxy and alkylthio.
BETWEEN_AZA: dict[str, float] = {
    "OMe": 1.6, "SR": 0.8, "F": 1.4, "Cl": 1.4, "Br": 1.4, "I": 1.4, "CF3": 1.4, "CCl3": 1.4, "CHX2": 1.4,
}
# --- fifth round (docs/basicity.md) -----------------------------------------------------
# Share of the fused-ring term (benzo fusion and the substituents and aza atoms of the fused
# ring) that acts on an azole N when an amino group sits on the carbon between that N and the
# ring's other heteroatom: the cation is guanidinium-like and keeps much of its charge on the
# amino N. 2-aminobenzimidazole about 7.5 and 2-aminoimidazole about 8.5 (from memory) put the benzo term
# at about 0.6 of its value in the parents (benzimidazole 5.53, imidazole 6.95 [P65]). Our estimate.
AZOLE_AMIDINE_DONOR_SHARE = 0.6
# Added per fused ring next to the basic N when an amino group sits on the N's other side: the
# amidinium-like cation is conjugated with the fused ring and its N-H is no longer hindered by
# the peri C-H. 2-aminoquinoline 7.34 against 2-aminopyridine 6.86 while quinoline 4.90 lies
# below pyridine 5.25 (CRC, from memory): 0.48 + 0.35.
DONOR_FUSED_ORTHO = 0.8
# The same when the donor sits on the carbon next to the fusion and the N does not
# (1-aminoisoquinoline 7.62 against 2-aminopyridine 6.86, with isoquinoline 5.42 against
# pyridine 5.25; Albert, from memory): 0.76 - 0.17.
DONOR_ALPHA_ORTHO = 0.6
# Per carbon on the alpha carbons of the two N-alkyl groups of an N,N-dialkylaniline, added to
# its basicity (steric inhibition of resonance of the NR2 group, model.aniline). Our estimate
# from N,N-diethylaniline 6.57 against N,N-dimethylaniline 5.07 [CRC], less what sigma* gives.
ANILINE_DIALKYL_CROWD = 0.3
# --- sixth round (docs/basicity.md) -----------------------------------------------------
# Field constants F [HLT] (as recalled from the table, from memory). Used where a group can act
# by its field effect alone: a pi-acceptor para to a pyridine-type N, whose lone pair lies in
# the ring plane and cannot conjugate with it (model._sigma_for), and a group ortho to an
# N,N-dialkylamino group, which it turns out of the ring plane (model._twist).
FIELD: dict[str, float] = {
    "NO2": 0.65, "CN": 0.51, "CHO": 0.33, "COR": 0.33, "COOR": 0.34, "COOH": 0.34, "CONH2": 0.26,
    "SO2R": 0.53, "SOR": 0.52, "CF3": 0.38, "SO2N": 0.49, "ethynyl": 0.22, "SH": 0.30,
    "SCF3": 0.36, "SO2CF3": 0.73,
    "F": 0.45, "Cl": 0.42, "Br": 0.45, "I": 0.42, "OMe": 0.29, "OH": 0.33, "NH2": 0.08,
    "NR2": 0.15, "SR": 0.23, "Ph": 0.12,
}
# A pi-donor meta to the N of a pyridine that also carries a pi-donor ortho or para to the N:
# the conjugated donor already holds much of the cation's charge, and the meta donor's small
# resonance share (sigma_m of NH2 -0.16 against its field constant +0.08) is lost in a crowd of
# donors; its sigma moves this share of the way from sigma_m to its field constant F [HLT, from
# memory]. 3,4-diaminopyridine 9.08 against 4-aminopyridine 9.17 and 2,5-diaminopyridine 6.48
# against 2-aminopyridine 6.86 (from memory). Diazines are left out: their amino-diazine
# cations already take the reduced rho of DIAZINE_RHO_FACTOR. Our estimate.
DONOR_META_FIELD: dict[str, float] = {"NH2": 0.08, "NHR": 0.03, "NR2": 0.15, "OMe": 0.29, "O-": -0.26}
# the field constants of the donors that FUSION_META_DONOR_SHARE moves (the same table, with the
# alkyl groups, F(CH3) 0.01 [HLT, from memory], and SR from FIELD)
FUSION_META_DONOR_FIELD: dict[str, float] = {
    **{k: v for k, v in DONOR_META_FIELD.items() if k != "O-"}, "CH3": 0.01, "alkyl": 0.0, "SR": FIELD["SR"],
}
DONOR_META_SHARE = 0.7
# A pi-donor ortho or para to the site on a ring that carries a ring C=O two atoms away from it,
# joined through a ring carbon (N-C=C-C=O, a vinylogous amide, as in 4-amino-6-pyrimidinones):
# the donor's lone pair is partly taken by the carbonyl and it loses this share of its
# increment (half of the cross-conjugation loss to a second ring N, DONOR_CROSS). Our estimate,
# checked as one number against the development set.
DONOR_CROSS_OXO = 0.5
