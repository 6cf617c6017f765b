// Every default the engine uses, with its unit and where it comes from, so the UI can show the origin.

/** A default value with its unit and its origin. */
export interface SourcedValue {
  readonly value: number
  readonly unit: string
  readonly source: string
}

/** The constriction types the engine compares. */
export type ConstrictionType = 'venturi' | 'short-nozzle' | 'sharp-plate'

const v = (value: number, unit: string, source: string): SourcedValue => ({ value, unit, source })

/** Diffuser efficiency η_d by constriction type (fraction of the ideal pressure recovery). */
export const DIFFUSER_EFFICIENCY: Readonly<Record<ConstrictionType, SourcedValue>> = {
  'venturi': v(0.88, '-', 'from memory: conical 5–8° diffusers reach about 0.85–0.90; Blevins, Applied Fluid Dynamics Handbook §7.4 effectiveness definition'),
  'short-nozzle': v(0.4, '-', 'from memory: short abrupt diffuser; Blevins effectiveness definition'),
  'sharp-plate': v(0, '-', 'common practice: a sharp-edged plate has no diffuser, so no designed recovery'),
}

/** Flow (velocity or contraction) coefficient C applied to the throat area, by constriction type. */
export const FLOW_COEFFICIENT: Readonly<Record<ConstrictionType, SourcedValue>> = {
  'venturi': v(0.98, '-', 'ISO 5167-4:2003 §5.5: classical venturi C 0.984–0.995, taken as a guide'),
  'short-nozzle': v(0.96, '-', 'from memory: short nozzles 0.95–0.99'),
  'sharp-plate': v(0.61, '-', 'common practice: sharp-edged plate contraction coefficient about 0.6 (ISO 5167-2 C ≈ 0.60–0.62)'),
}

/** All scalar defaults of an assessment. */
export const DEFAULTS = {
  inletLoss: v(0.04, '-', 'from memory (well-rounded entry)'),
  jetPumpEfficiency: v(0.25, '-', 'illustrative: liquid-jet gas pumps reach 0.4–0.5 when optimised (Cunningham 1974, 1995); a river venturi is far from optimised'),
  maxGasLiquidRatio: v(1.0, '-', 'illustrative'),
  airPipeLossK: v(1.5, '-', 'common practice (intake, bends and valve)'),
  airPipeFrictionFactor: v(0.02, '-', 'common practice'),
  turbineEfficiency: v(0.6, '-', 'illustrative: Wells-type air turbines peak at about 0.75 (Curran & Gato 1997)'),
  generatorEfficiency: v(0.92, '-', 'from memory: small generators 0.90–0.97'),
  turbineCutInFraction: v(0.1, '-', 'illustrative (fraction of rating)'),
  allowedDrawdown: v(0.05, 'm', 'illustrative: how far below its ordinary level the head pool may be drawn while units run'),
  acceptableOxygenLoss: v(0.1, 'mg/L', "illustrative; the regulator's figure replaces it"),
  availability: v(0.95, '-', 'illustrative'),
  minCavitationMargin: v(2.5, 'm', 'common practice'),
  sotePerMetre: v(0.04, '1/m', 'from memory: clean-water SOTE of jet aerators 15–24 % at 4.5 m (US EPA/625/1-89/023), i.e. 3.3–5.3 % per metre; range 2–8 %/m'),
  inDeviceTransfer: v(0.02, '-', 'illustrative: a depth-independent share transferred in the device itself (range 0–5 %); nozzle depth 0.2–0.6 m showed no effect in one venturi study (Therrien, Vanrolleghem & Dorea 2019)'),
  alpha: v(0.9, '-', 'from memory: α for clean river water 0.8–1.0'),
  beta: v(0.98, '-', 'from memory: β for fresh water 0.95–0.99'),
  theta: v(1.024, '-', 'ASCE/EWRI 2-06'),
  oxygenTarget: v(6, 'mg/L', "common practice; the regulator's figure replaces it"),
  tdgLimit: v(1.1, '-', 'most US water-quality standards: 110 % of saturation (Washington WAC 173-201A-200(1)(f))'),
  tdgExcessLimit: v(76, 'mmHg', 'British Columbia guideline for water 1 m deep or more: ΔP ≤ 76 mmHg (Fidler & Miller 1994)'),
  upstreamNitrogenSaturation: v(1.0, '-', 'illustrative: river nitrogen taken at equilibrium with the air'),
  bubbleDiameter: v(0.003, 'm', 'judgement: a river venturi at 5–7 m/s throat velocity with a high gas fraction gives roughly 1–5 mm bubbles (coalescence expected); range 1–6 mm'),
  plumeVelocity: v(0.1, 'm/s', 'illustrative: upward water velocity of the bubble plume in the tail pool'),
  oxygenDiffusivity20: v(2.1e-9, 'm²/s', 'from memory: D of O₂ in water at 20 °C'),
  diffuserHalfAngle: v(3.5, '°', 'common practice: 7° included-angle conical diffuser'),
  airTemperatureOffset: v(0, 'K', 'illustrative: intake air taken at the water temperature'),
  salinity: v(0, 'g/kg', 'common practice: fresh water'),
  weirA: v(1.8, '-', 'Butts & Evans (1983): clean water'),
  weirB: v(0.8, '-', 'Butts & Evans (1983): sharp-crested weir, vertical face'),
  discountRate: v(0.08, '1/yr', 'illustrative'),
  life: v(25, 'yr', 'illustrative'),
  opexFraction: v(0.03, '1/yr', 'illustrative (fraction of capex a year)'),
  monteCarloDraws: v(200, 'draws', 'illustrative: P10, P50 and P90 of 200 draws lie within about 5 % of those of 2,400 (checked in the tests)'),
  monteCarloSeed: v(1, '-', 'illustrative: any whole number will do; the same seed gives the same draws'),
} as const satisfies Record<string, SourcedValue>

/** Most Monte Carlo draws one assessment may ask for (each re-runs the year). */
export const MAX_MONTE_CARLO_DRAWS = 2000

/** Name of a scalar default. */
export type DefaultName = keyof typeof DEFAULTS
