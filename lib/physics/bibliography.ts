/**
 * The one bibliography. Every correlation and constant in lib/physics names a key here.
 * "from memory" marks a detail (edition, equation or table number) recalled without the
 * source at hand; see ../shared/reference/published-values.md for how sure we are.
 */
export interface Reference {
  authors: string;
  title: string;
  year: number;
  edition?: string;
  where?: string; // equation, table or section
  note?: string;
}

export const BIBLIOGRAPHY = {
  incropera6: {
    authors: "F. P. Incropera, D. P. DeWitt, T. L. Bergman, A. S. Lavine",
    title: "Fundamentals of Heat and Mass Transfer",
    year: 2007,
    edition: "6th ed., Wiley",
    note: "Equation and table numbers from memory",
  },
  incroperaLumped: {
    authors: "Incropera et al.",
    title: "Fundamentals of Heat and Mass Transfer",
    year: 2007,
    edition: "6th ed.",
    where: "§5.1–5.2, Eqs. 5.6 and 5.10 (lumped capacitance, Bi = hLc/k < 0.1 with Lc = V/As)",
    note: "from memory",
  },
  incroperaSeries: {
    authors: "Incropera et al.",
    title: "Fundamentals of Heat and Mass Transfer",
    year: 2007,
    edition: "6th ed.",
    where: "§5.5–5.6, Eqs. 5.39–5.52, Table 5.1 (exact series and one-term approximation; one-term error < 2 % for Fo > 0.2)",
    note: "numbering from memory",
  },
  incroperaProduct: {
    authors: "Incropera et al.",
    title: "Fundamentals of Heat and Mass Transfer",
    year: 2007,
    edition: "6th ed.",
    where: "§5.8 (multidimensional effects: product solutions)",
    note: "from memory",
  },
  incroperaFreeConv: {
    authors: "Incropera et al.",
    title: "Fundamentals of Heat and Mass Transfer",
    year: 2007,
    edition: "6th ed.",
    where: "§9.6 Eqs. 9.26–9.35 (vertical plate, horizontal plates with L = A/P, horizontal cylinder, sphere)",
    note: "numbering from memory",
  },
  incroperaForced: {
    authors: "Incropera et al.",
    title: "Fundamentals of Heat and Mass Transfer",
    year: 2007,
    edition: "6th ed.",
    where: "§7.2–7.4, Eqs. 7.30, 7.38, 7.41 (flat plate laminar, turbulent, mixed with Re_x,c = 5×10⁵); Eq. 7.54 Churchill–Bernstein cylinder; Eq. 7.56 Whitaker sphere",
    note: "numbering from memory",
  },
  incroperaMixed: {
    authors: "Incropera et al.",
    title: "Fundamentals of Heat and Mass Transfer",
    year: 2007,
    edition: "6th ed.",
    where: "§9.9 Eq. 9.64: Nu^n = Nu_F^n ± Nu_N^n with n = 3 (after Churchill 1977)",
    note: "from memory",
  },
  incroperaRadiation: {
    authors: "Incropera et al.",
    title: "Fundamentals of Heat and Mass Transfer",
    year: 2007,
    edition: "6th ed.",
    where: "Eq. 1.9: h_r = εσ(Ts + Tsur)(Ts² + Tsur²)",
    note: "from memory",
  },
  brent1973: {
    authors: "R. P. Brent",
    title: "Algorithms for Minimization without Derivatives",
    year: 1973,
    edition: "Prentice-Hall",
    where: "Ch. 4 (zero finding by inverse quadratic interpolation, secant and bisection with a guaranteed bracket)",
  },
  hylandWexler1983: {
    authors: "R. W. Hyland, A. Wexler",
    title: "Formulations for the thermodynamic properties of the saturated phases of H2O from 173.15 K to 473.15 K",
    year: 1983,
    where:
      "ASHRAE Trans. 89(2A):500–519; as given in ASHRAE Handbook — Fundamentals (2009), Ch. 1, Eqs. 5–6: ln p_ws = C1/T + C2 + C3T + C4T² + C5T³ + C6T⁴ + C7 ln T over ice (−100…0 °C), ln p_ws = C8/T + C9 + C10T + C11T² + C12T³ + C13 ln T over water (0…200 °C), p in Pa, T in K",
    note: "coefficients from memory; checked against the saturation pressures of the steam tables (test/reference/cooling.ref.test.ts)",
  },
  steamTables: {
    authors: "Incropera et al. (after the steam tables of Liley)",
    title: "Fundamentals of Heat and Mass Transfer, Table A.6 (saturated water)",
    year: 2007,
    edition: "6th ed.",
    where: "p_sat: 2.339 kPa at 20 °C, 19.94 kPa at 60 °C, 101.3 kPa at 100 °C; h_fg: 2454 kJ/kg at 20 °C, 2383 at 50 °C, 2309 at 80 °C, 2257 at 100 °C",
    note: "from memory",
  },
  chiltonColburn: {
    authors: "Incropera et al. (after T. H. Chilton, A. P. Colburn 1934)",
    title: "Fundamentals of Heat and Mass Transfer, §6.7.1 (the heat and mass transfer analogy)",
    year: 2007,
    edition: "6th ed.",
    where: "Eq. 6.92: h/h_m = ρ c_p Le^(2/3), Le = α/D_AB, valid 0.6 < Pr < 60 and 0.6 < Sc < 3000 for laminar and turbulent flow, low mass-transfer rates; evaporative flux n'' = h_m (ρ_A,s − ρ_A,∞) (Eq. 6.8)",
    note: "numbering from memory",
  },
  incroperaDiffusion: {
    authors: "Incropera et al.",
    title: "Fundamentals of Heat and Mass Transfer, Table A.8 (binary diffusion coefficients at 1 atm)",
    year: 2007,
    edition: "6th ed.",
    where: "H2O–air: D_AB = 0.26×10⁻⁴ m²/s at 298 K; D_AB ∝ T^(3/2) at constant pressure (Eq. 14.? after Chapman–Enskog)",
    note: "from memory",
  },
  gastronormEN631: {
    authors: "CEN",
    title: "EN 631-1: Materials and articles in contact with foodstuffs — Catering containers — Part 1: Specification for containers",
    year: 1993,
    where: "gastronorm sizes: GN 2/1 650×530, 1/1 530×325, 2/3 354×325, 1/2 325×265, 1/3 325×176, 1/4 265×162, 1/6 176×162, 1/9 176×108 mm; usual depths 20, 40, 65, 100, 150, 200 mm",
    note: "sizes as used by the trade; standard not re-read (from memory)",
  },
  incroperaSolids: {
    authors: "Incropera et al.",
    title: "Fundamentals of Heat and Mass Transfer, Tables A.1 and A.3 (solid metallic and non-metallic materials at 300 K)",
    year: 2007,
    edition: "6th ed.",
    where: "AISI 304 stainless: k 14.9 W/(m·K), ρ 7900 kg/m³, c 477 J/(kg·K); aluminium alloy 2024-T6: k 177, ρ 2770, c 875",
    note: "stainless from memory; aluminium confirmed (see shared published-values §5.2)",
  },
  dhCookChill1989: {
    authors: "UK Department of Health",
    title: "Chilled and Frozen: Guidelines on Cook-Chill and Cook-Freeze Catering Systems",
    year: 1989,
    where: "HMSO: chilling to start within 30 min of cooking, food to reach 0–3 °C within 90 min; portions or layers not more than 50 mm deep",
    note: "from memory",
  },
  churchillChu1975: {
    authors: "S. W. Churchill, H. H. S. Chu",
    title: "Correlating equations for laminar and turbulent free convection from a vertical plate (and from a horizontal cylinder)",
    year: 1975,
    where: "Int. J. Heat Mass Transfer 18:1323–1329 and 1049–1053",
  },
  churchill1983: {
    authors: "S. W. Churchill",
    title: "Free convection around immersed bodies",
    year: 1983,
    where: "Heat Exchanger Design Handbook, §2.5.7 (sphere: Nu = 2 + 0.589 Ra^¼ / [1 + (0.469/Pr)^(9/16)]^(4/9), Ra ≤ 10¹¹, Pr ≥ 0.7)",
    note: "from memory",
  },
  sutherland: {
    authors: "F. M. White",
    title: "Viscous Fluid Flow",
    year: 2006,
    edition: "3rd ed., McGraw-Hill",
    where: "Table 1-2 and Eqs. 1-36, 1-41: Sutherland laws for air, μ0 = 1.716×10⁻⁵ Pa·s, S = 110.4 K; k0 = 0.0241 W/(m·K), S = 194 K; T0 = 273.15 K",
    note: "from memory",
  },
  vogelWater: {
    authors: "Vogel equation fit for liquid water viscosity",
    title: "μ = A·10^(B/(T − C)), A = 2.414×10⁻⁵ Pa·s, B = 247.8 K, C = 140 K (0–100 °C)",
    year: 1921,
    note: "widely reprinted fit; constants from memory",
  },
  ramiresWater: {
    authors: "M. L. V. Ramires, C. A. Nieto de Castro, Y. Nagasaka, A. Nagashima, M. J. Assael, W. A. Wakeham",
    title: "Standard reference data for the thermal conductivity of water",
    year: 1995,
    where: "J. Phys. Chem. Ref. Data 24:1377: k = 0.6065(−1.48445 + 4.12292 T* − 1.63866 T*²), T* = T/298.15 K, 274–370 K",
    note: "from memory",
  },
  kellWater: {
    authors: "G. S. Kell",
    title: "Density, thermal expansivity, and compressibility of liquid water from 0 °C to 150 °C",
    year: 1975,
    where: "J. Chem. Eng. Data 20:97–105, Eq. (density of air-free water at 1 atm)",
    note: "coefficients from memory",
  },
  stefanBoltzmann: {
    authors: "CODATA (E. Tiesinga et al.)",
    title: "CODATA recommended values of the fundamental physical constants: 2018",
    year: 2021,
    where: "σ = 5.670374419×10⁻⁸ W/(m²·K⁴) (exact from SI defining constants)",
  },
  gravity: {
    authors: "BIPM / CGPM",
    title: "Standard acceleration of gravity, g_n = 9.80665 m/s² (3rd CGPM, 1901)",
    year: 1901,
  },
  ashraeSolAir: {
    authors: "ASHRAE",
    title: "ASHRAE Handbook — Fundamentals, Nonresidential cooling and heating load calculations",
    year: 2017,
    where: "sol-air temperature t_e = t_o + αI_t/h_o − εΔR/h_o; ΔR ≈ 63 W/m² for horizontal surfaces facing the sky, 0 for vertical",
    note: "chapter number from memory",
  },
  choiOkos1986: {
    authors: "Y. Choi, M. R. Okos",
    title: "Effects of temperature and composition on the thermal properties of foods",
    year: 1986,
    where: "in Food Engineering and Process Applications, Vol. 1 (Le Maguer & Jelen, eds.), Elsevier, pp. 93–101; tabulated in ASHRAE Refrigeration Handbook 2006, Ch. 9, Tables 1–2. Valid −40 to 150 °C",
  },
  ashraeFoodProps: {
    authors: "ASHRAE",
    title: "ASHRAE Handbook — Refrigeration, Thermal Properties of Foods",
    year: 2006,
    where: "Ch. 9: mixture rules (c = Σxᵢcᵢ, 1/ρ = Σxᵢ/ρᵢ), ice fraction x_ice = (x_wo − x_b)(1 − t_f/t) with bound water x_b = 0.4 x_p (Schwartzberg 1976), L = 333.6 kJ/kg × x_wo, Table 3 compositions",
    note: "equation numbers from memory",
  },
  schwartzberg1976: {
    authors: "H. G. Schwartzberg",
    title: "Effective heat capacities for the freezing and thawing of food",
    year: 1976,
    where: "J. Food Sci. 41:152–156 (bound water ≈ 0.4 × protein mass fraction)",
    note: "from memory",
  },
  pham1996Tf: {
    authors: "Q. T. Pham",
    title: "Prediction of calorimetric properties and freezing time of foods from composition data",
    year: 1996,
    where: "J. Food Eng. 30:95–107: meat initial freezing point θ_F = −4.66 x_o/x_w − 46.4 x_a/x_w",
  },
  maxwellEucken: {
    authors: "A. Eucken (after J. C. Maxwell)",
    title: "Allgemeine Gesetzmäßigkeiten für das Wärmeleitvermögen verschiedener Stoffarten und Aggregatzustände",
    year: 1940,
    where: "Forsch. Gebiete Ingenieurwes. 11:6–20; Maxwell–Eucken model as given in ASHRAE Refrigeration Handbook 2006, Ch. 9",
    note: "from memory",
  },
  latentWater: {
    authors: "ASHRAE",
    title: "ASHRAE Handbook — Refrigeration, Thermal Properties of Foods: L0 = 333.6 kJ/kg (latent heat of fusion of water)",
    year: 2006,
  },
  plank1913: {
    authors: "R. Plank",
    title: "Die Gefrierdauer von Eisblöcken",
    year: 1913,
    where: "Z. ges. Kälte-Ind. 20:109–114; shape factors P, R = 1/2, 1/8 (slab), 1/4, 1/16 (cylinder), 1/6, 1/24 (sphere) as given in ASHRAE Refrigeration Handbook, Cooling and Freezing Times of Foods",
  },
  pham1986: {
    authors: "Q. T. Pham",
    title: "Simplified equation for predicting the freezing time of foodstuffs",
    year: 1986,
    where: "J. Food Technol. 21:209–219: t = (R/(E h))(ΔH1/ΔT1 + ΔH2/ΔT2)(1 + Bi/2), T_fm = 1.8 + 0.263 T_c + 0.105 T_a",
    note: "formula from memory; collapses to Plank when ΔH1 = 0",
  },
  ashraeEHTD: {
    authors: "ASHRAE",
    title: "ASHRAE Handbook — Refrigeration, Cooling and Freezing Times of Foods",
    year: 2010,
    where: "Ch. 20, Eq. 20: equivalent heat-transfer dimensionality at Bi → 0, E0 = 1 + 1/β1 + 1/β2",
  },
  goral2016: {
    authors: "D. Góral, F. Kluza, W. E. L. Spiess, U. Kozłowicz",
    title: "Review of thawing time prediction models depending on process conditions and product characteristics",
    year: 2016,
    where: "Food Technol. Biotechnol. 54(1):3–12",
  },
  carslawJaeger: {
    authors: "H. S. Carslaw, J. C. Jaeger",
    title: "Conduction of Heat in Solids",
    year: 1959,
    edition: "2nd ed., Oxford",
    where: "§11.2 (Neumann's solution for melting and freezing of a semi-infinite region)",
  },
  patankar1980: {
    authors: "S. V. Patankar",
    title: "Numerical Heat Transfer and Fluid Flow",
    year: 1980,
    where: "Ch. 4 (implicit finite-volume conduction, harmonic-mean interface conductance, TDMA)",
  },
  voller1990: {
    authors: "V. R. Voller",
    title: "Fast implicit finite-difference method for the analysis of phase change problems",
    year: 1990,
    where: "Numer. Heat Transfer B 17:155–169 (enthalpy formulation solved implicitly)",
    note: "from memory",
  },
  smith1995Monotone: {
    authors: "H. L. Smith",
    title: "Monotone Dynamical Systems: An Introduction to the Theory of Competitive and Cooperative Systems",
    year: 1995,
    edition: "AMS Mathematical Surveys and Monographs 41",
    where: "Ch. 3 (cooperative systems of ODEs; Kamke's comparison theorem)",
    note: "from memory",
  },
  globeDropkin1959: {
    authors: "S. Globe, D. Dropkin",
    title: "Natural-convection heat transfer in liquids confined by two horizontal plates and heated from below",
    year: 1959,
    where: "J. Heat Transfer 81:24–28; Nu = 0.069 Ra^(1/3) Pr^0.074 for 3×10⁵ < Ra < 7×10⁹ (as Incropera et al. 6th ed. Eq. 9.49)",
    note: "from memory",
  },
  incroperaEnclosure: {
    authors: "Incropera et al.",
    title: "Fundamentals of Heat and Mass Transfer",
    year: 2007,
    edition: "6th ed.",
    where: "§9.8 (horizontal cavities: heated from below, convection sets in above Ra = 1708; heated from above, or cooled from below, the layer is stable and heat crosses by conduction, Nu = 1)",
    note: "numbering from memory",
  },
} as const satisfies Record<string, Reference>;

export type SourceKey = keyof typeof BIBLIOGRAPHY;

export function cite(key: SourceKey): string {
  const r: Reference = BIBLIOGRAPHY[key];
  return [r.authors, `“${r.title}”`, r.edition, String(r.year), r.where].filter(Boolean).join(", ");
}
