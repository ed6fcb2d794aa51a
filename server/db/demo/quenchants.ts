import type { QuenchantInput } from '../../../shared/schemas/quenchant'

/**
 * The starting quench media of the demo shop (Kestrel Bay Heat Treat).
 *
 * A heat-transfer coefficient h is not a property of the medium alone: it changes
 * with agitation, bath temperature and age, the part's surface and how it is
 * fixtured, and for liquids it swings through film boiling, nucleate boiling and
 * convection during one quench. These are starting points for a shop to replace
 * with its own calibration (probe or thermocouple data), which is why every entry is
 * editable. Where a number is a published range it is named; where it is common
 * shop practice it says so. All are quoted from memory.
 *
 * Published ranges used:
 *  - Incropera et al., Fundamentals of Heat and Mass Transfer, Table 1.1 (typical
 *    convection coefficients): free convection of gases 2–25 W/m²·K, forced
 *    convection of gases 25–250 W/m²·K.
 *  - Totten, Bates & Clinton, Handbook of Quenchants and Quenching Technology (ASM
 *    International, 1993), the widely reproduced table of mean coefficients:
 *    still air 50–80 (hot part, radiation included), nitrogen at 1 bar 100–150,
 *    salt bath or fluidised bed 350–500, nitrogen at 10 bar 400–500, still oil
 *    1000–1500, agitated oil 1800–2200, water 3000–3500 W/m²·K.
 */
const INCROPERA_T11 = 'Incropera et al., Fundamentals of Heat and Mass Transfer, Table 1.1, from memory'
const TOTTEN = 'Totten, Bates & Clinton, Handbook of Quenchants and Quenching Technology (ASM, 1993), table of mean coefficients, from memory'

type Curve = { T_C: number; h: number }[]
const curve = (points: [number, number][]): Curve => points.map(([T_C, h]) => ({ T_C, h }))
/** The band as curves: the typical curve scaled down and up by the published range's ends over its middle. */
const band = (typical: [number, number][], lowFactor: number, highFactor: number) => ({
  low: curve(typical.map(([T, h]) => [T, Math.round(h * lowFactor)])),
  typical: curve(typical),
  high: curve(typical.map(([T, h]) => [T, Math.round(h * highFactor)])),
})

/*
 * Cooling-power curves, h against surface temperature: common practice, from memory.
 * Liquids that boil show a vapour blanket while the surface is far above boiling
 * (low h), a nucleate-boiling peak, then plain convection; salt does not boil, so its
 * curve is convection, rising slightly with temperature. Air and gas curves are
 * convection alone; radiation is added through the emissivity.
 */
const OIL_CURVE: [number, number][] = [[60, 300], [200, 350], [300, 500], [400, 1500], [500, 3000], [600, 3500], [700, 1500], [800, 600], [900, 500]]
/** Agitation breaks the vapour blanket sooner and lifts convection: the still-oil shape × 1.6, as the means' ratio 2000/1250. */
const AGITATED_OIL_CURVE = OIL_CURVE.map(([T, h]): [number, number] => [T, h * 1.6])
const WATER_CURVE: [number, number][] = [[20, 1000], [100, 2500], [200, 8000], [300, 12000], [400, 10000], [500, 6000], [600, 3000], [700, 1200], [900, 800]]
const POLYMER_CURVE: [number, number][] = [[30, 800], [100, 1500], [200, 4000], [300, 6000], [400, 5000], [500, 3500], [600, 2000], [700, 1000], [900, 700]]
const SALT_CURVE: [number, number][] = [[200, 380], [500, 425], [900, 470]]
const STILL_AIR_CURVE: [number, number][] = [[25, 3], [100, 7], [300, 9], [600, 10], [900, 11]]
const FORCED_AIR_CURVE: [number, number][] = [[25, 95], [300, 100], [900, 110]]
const GAS_10_BAR_CURVE: [number, number][] = [[40, 420], [400, 450], [1000, 480]]
const GAS_1_BAR_CURVE: [number, number][] = [[40, 115], [400, 125], [1000, 135]]
const CURVES_SOURCE = 'Common practice, from memory: the usual shape for this kind of medium, scaled to its mean coefficient; replace with a cooling-curve probe test of the shop’s own bath.'
/** Common practice, from memory: oxidised steel in shop air about 0.8; bright steel in a vacuum furnace about 0.35. */
const OXIDISED_STEEL_EMISSIVITY = 0.8
const BRIGHT_STEEL_EMISSIVITY = 0.35

export const DEMO_QUENCHANTS: QuenchantInput[] = [
  {
    name: 'Still air',
    kind: 'still-air',
    hLow_W_m2K: 5, // Incropera Table 1.1, free convection of gases 2–25; 5 for a part near handling temperature
    hTypical_W_m2K: 15, // common practice, from memory: free convection plus radiation for a part at 100–200 °C
    hHigh_W_m2K: 80, // Totten et al., still air 50–80 for a part still red or black hot (radiation dominates)
    bath_C: 25, // shop air, common practice
    notes: 'Radiation makes h several times larger while the part is hot; near handling temperature it is the low end. Drafts from doors and fans raise it.',
    source: `Low: ${INCROPERA_T11} (free convection, gases 2–25). High: ${TOTTEN} (still air 50–80). Typical: common practice, from memory.`,
    coolingCurves: band(STILL_AIR_CURVE, 0.7, 1.5),
    emissivity: OXIDISED_STEEL_EMISSIVITY,
    curveSource: CURVES_SOURCE,
  },
  {
    name: 'Forced air (fan)',
    kind: 'forced-air',
    hLow_W_m2K: 25, // Incropera Table 1.1, forced convection of gases, lower end 25
    hTypical_W_m2K: 100, // common practice, from memory: a floor fan a metre or two from the load
    hHigh_W_m2K: 250, // Incropera Table 1.1, forced convection of gases, upper end 250
    bath_C: 25, // shop air, common practice
    notes: 'Depends on air speed at the part and on how the load shields itself; measure at the fixture position.',
    source: `Range: ${INCROPERA_T11} (forced convection, gases 25–250). Typical: common practice, from memory.`,
    coolingCurves: band(FORCED_AIR_CURVE, 0.25, 2.5),
    emissivity: OXIDISED_STEEL_EMISSIVITY,
    curveSource: CURVES_SOURCE,
  },
  {
    name: 'Fast quench oil, still',
    kind: 'oil',
    hLow_W_m2K: 1000, // Totten et al., still oil 1000–1500, lower end
    hTypical_W_m2K: 1250, // middle of the Totten et al. still-oil range
    hHigh_W_m2K: 1500, // Totten et al., still oil, upper end
    bath_C: 60, // common practice for fast (accelerated) oils, from memory
    notes: 'Mean over the quench. Oil ages (oxidation, water pick-up) and its cooling power drifts: recheck with a probe on the shop’s schedule.',
    source: `${TOTTEN} (still oil 1000–1500). Bath temperature: common practice, from memory.`,
    coolingCurves: band(OIL_CURVE, 0.8, 1.2),
    emissivity: null,
    curveSource: CURVES_SOURCE,
  },
  {
    name: 'Fast quench oil, agitated',
    kind: 'oil',
    hLow_W_m2K: 1800, // Totten et al., agitated oil 1800–2200, lower end
    hTypical_W_m2K: 2000, // middle of the Totten et al. agitated-oil range
    hHigh_W_m2K: 2200, // Totten et al., agitated oil, upper end
    bath_C: 60, // common practice for fast (accelerated) oils, from memory
    notes: 'Agitator speed and the part’s position in the tank matter as much as the oil.',
    source: `${TOTTEN} (agitated oil 1800–2200). Bath temperature: common practice, from memory.`,
    coolingCurves: band(AGITATED_OIL_CURVE, 0.9, 1.1),
    emissivity: null,
    curveSource: CURVES_SOURCE,
  },
  {
    name: 'Water',
    kind: 'water',
    hLow_W_m2K: 3000, // Totten et al., water 3000–3500, lower end
    hTypical_W_m2K: 3500, // Totten et al., water, upper end of the mean range
    hHigh_W_m2K: 6000, // common practice, from memory: strongly agitated or sprayed water, mean over the quench
    bath_C: 20, // common practice, from memory
    notes: 'Local peaks in nucleate boiling are far above the mean. Warm water holds a vapour film longer and cools much more slowly: keep the tank cool.',
    source: `Low and typical: ${TOTTEN} (water 3000–3500). High: common practice for agitated water, from memory.`,
    coolingCurves: band(WATER_CURVE, 0.85, 1.7),
    emissivity: null,
    curveSource: CURVES_SOURCE,
  },
  {
    name: 'Polymer solution 10–20 %',
    kind: 'polymer',
    hLow_W_m2K: 1500, // common practice, from memory: 20 % solution, mild agitation
    hTypical_W_m2K: 2500, // common practice, from memory
    hHigh_W_m2K: 4000, // common practice, from memory: 10 % solution, strong agitation
    bath_C: 30, // common practice, from memory
    notes: 'Cooling power falls as the concentration rises; check concentration (refractometer) and calibrate per concentration.',
    source: 'Common practice for PAG-type polymer quenchants between oil and water, from memory; no single published table.',
    coolingCurves: band(POLYMER_CURVE, 0.6, 1.6),
    emissivity: null,
    curveSource: CURVES_SOURCE,
  },
  {
    name: 'Nitrate salt bath',
    kind: 'salt',
    hLow_W_m2K: 350, // Totten et al., salt bath or fluidised bed 350–500, lower end
    hTypical_W_m2K: 425, // middle of the Totten et al. salt-bath range
    hHigh_W_m2K: 500, // Totten et al., salt bath, upper end
    bath_C: 200, // common practice for martempering and austempering salts, from memory
    notes: 'Agitation and small water additions raise the coefficient above this range; the bath temperature sets where the part ends up.',
    source: `${TOTTEN} (salt bath or fluidised bed 350–500). Bath temperature: common practice, from memory.`,
    coolingCurves: band(SALT_CURVE, 0.82, 1.18),
    emissivity: null,
    curveSource: CURVES_SOURCE,
  },
  {
    name: 'Nitrogen gas, 10 bar',
    kind: 'gas',
    hLow_W_m2K: 400, // Totten et al., nitrogen at 10 bar 400–500, lower end
    hTypical_W_m2K: 450, // middle of the Totten et al. range
    hHigh_W_m2K: 500, // Totten et al., nitrogen at 10 bar, upper end
    bath_C: 40, // gas temperature after the furnace's heat exchanger, common practice, from memory
    notes: 'Vacuum-furnace gas quench. Loading density and gas flow direction change h across the load.',
    source: `${TOTTEN} (nitrogen, 10 bar: 400–500). Gas temperature: common practice, from memory.`,
    coolingCurves: band(GAS_10_BAR_CURVE, 0.89, 1.11),
    emissivity: BRIGHT_STEEL_EMISSIVITY,
    curveSource: CURVES_SOURCE,
  },
  {
    name: 'Nitrogen gas, 1 bar',
    kind: 'gas',
    hLow_W_m2K: 100, // Totten et al., nitrogen at 1 bar 100–150, lower end
    hTypical_W_m2K: 125, // middle of the Totten et al. range
    hHigh_W_m2K: 150, // Totten et al., nitrogen at 1 bar, upper end
    bath_C: 40, // gas temperature after the furnace's heat exchanger, common practice, from memory
    notes: 'Near-atmospheric backfill: slow, for low-distortion cooling of high-hardenability steels.',
    source: `${TOTTEN} (nitrogen, 1 bar: 100–150). Gas temperature: common practice, from memory.`,
    coolingCurves: band(GAS_1_BAR_CURVE, 0.8, 1.2),
    emissivity: BRIGHT_STEEL_EMISSIVITY,
    curveSource: CURVES_SOURCE,
  },
]
