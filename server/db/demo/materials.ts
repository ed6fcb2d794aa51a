import type { MaterialInput } from '../../../shared/schemas/material'

/**
 * The starting materials library of the demo shop (Kestrel Bay Heat Treat).
 *
 * Density ρ, specific heat c_p and conductivity k come from
 *   Incropera, DeWitt, Bergman & Lavine, Fundamentals of Heat and Mass Transfer,
 *   Table A.1, "Thermophysical properties of selected metallic solids",
 * quoted from memory (the book is not at hand), so each value carries that note.
 * The table lists ρ only at 300 K; the elevated-temperature rows keep the 300 K
 * density, as the table itself does when it gives α at 300 K only.
 * Every value is editable: a shop with certified data for its own heats should use it.
 */
const TABLE_A1 = 'Incropera et al., Fundamentals of Heat and Mass Transfer, Table A.1 (thermophysical properties of selected metallic solids), from memory'

/** Table A.1's temperature columns in °C (T/°C = T/K − 273.15). */
const TABLE_A1_C = { '300 K': 26.85, '400 K': 126.85, '600 K': 326.85, '800 K': 526.85, '1000 K': 726.85 }

type Row = { T_C: number; k: number; cp: number }
/** The Table A.1 columns of one alloy, [k, c_p] at 300, 400, 600, 800 and 1000 K (from memory; ρ only at 300 K). */
const a1Columns = (columns: [number, number][]): Row[] =>
  Object.values(TABLE_A1_C).map((T_C, i) => ({ T_C, k: columns[i]![0], cp: columns[i]![1] }))

/**
 * Plain and low-alloy steels: c_p climbs to a sharp peak at the magnetic change
 * (about 750 °C, several times the room value) and falls back once austenitic, while k
 * levels off near 27 W/m·K. Common practice, from memory: the peak is smoothed into
 * one row, and the austenite rows are typical of these steels, not of one table.
 */
const ferriticToAustenite = (k750: number): Row[] => [
  { T_C: 750, k: k750, cp: 1300 },
  { T_C: 800, k: 26, cp: 750 },
  { T_C: 900, k: 27, cp: 650 },
]
const RISE_NOTE = '750–900 °C rows: common practice, from memory (c_p peak at the magnetic change, about 750 °C, then austenite)'

const AT_300_K = TABLE_A1_C['300 K']
const AT_600_K = TABLE_A1_C['600 K']
const AT_1000_K = TABLE_A1_C['1000 K']

// AISI 1010 at 300 K, the base of the case-hardened demo bar below.
const AISI_1010 = {
  k_W_mK: 63.9, // Table A.1, AISI 1010, 300 K, from memory
  density_kg_m3: 7832, // Table A.1, AISI 1010, from memory
  specificHeat_J_kgK: 434, // Table A.1, AISI 1010, 300 K, from memory
}

/**
 * Illustrative only: a carburised case is martensite with more carbon than the core,
 * which conducts somewhat less. 0.9 × the core conductivity is an assumption for the
 * demo, not a measurement; ρc_p is kept at the core value.
 */
const CASE_K_FACTOR = 0.9
const CASE_START = 0.9 // case from 0.9 to 1.0 of the radius (outer tenth)
const coreRhoCp = AISI_1010.density_kg_m3 * AISI_1010.specificHeat_J_kgK
const caseK = Math.round(AISI_1010.k_W_mK * CASE_K_FACTOR * 10) / 10

export const DEMO_MATERIALS: MaterialInput[] = [
  {
    name: 'Plain carbon steel (Mn ≤ 1 %, Si ≤ 0.1 %)',
    k_W_mK: 60.5, // Table A.1, plain carbon steel, 300 K, from memory
    density_kg_m3: 7854, // Table A.1, plain carbon steel, from memory
    specificHeat_J_kgK: 434, // Table A.1, plain carbon steel, 300 K, from memory
    propertiesAt_C: AT_300_K,
    notes: 'Room-temperature values. Conductivity falls and specific heat rises as the steel heats; see the 600 K and 1000 K entries.',
    source: `${TABLE_A1}; 300 K row.`,
    // Table A.1, plain carbon steel, 300–1000 K columns, from memory
    propertyTable: [...a1Columns([[60.5, 434], [56.7, 487], [48.0, 559], [39.2, 685], [30.0, 1169]]), ...ferriticToAustenite(29)],
    propertyTableSource: `300–1000 K rows: ${TABLE_A1}, plain carbon steel (density at 300 K). ${RISE_NOTE}.`,
  },
  {
    name: 'AISI 1010',
    ...AISI_1010,
    propertiesAt_C: AT_300_K,
    notes: 'Low-carbon steel, the usual core of carburised parts.',
    source: `${TABLE_A1}; 300 K row.`,
    // Table A.1, AISI 1010, 300–1000 K columns, from memory
    propertyTable: [...a1Columns([[63.9, 434], [58.7, 487], [48.8, 559], [39.2, 685], [31.3, 1168]]), ...ferriticToAustenite(29)],
    propertyTableSource: `300–1000 K rows: ${TABLE_A1}, AISI 1010 (density at 300 K). ${RISE_NOTE}.`,
  },
  {
    name: '1 Cr–½ Mo low-alloy steel',
    k_W_mK: 42.3, // Table A.1, 1 Cr–½ Mo (0.16 % C, 1 % Cr, 0.54 % Mo, 0.39 % Si), 300 K, from memory
    density_kg_m3: 7858, // Table A.1, 1 Cr–½ Mo, from memory
    specificHeat_J_kgK: 442, // Table A.1, 1 Cr–½ Mo, 300 K, from memory
    propertiesAt_C: AT_300_K,
    notes: 'Chromium–molybdenum low-alloy steel (0.16 % C, 1 % Cr, 0.54 % Mo).',
    source: `${TABLE_A1}; chromium (low) steels, 1 Cr–½ Mo, 300 K row.`,
    // Table A.1, 1 Cr–½ Mo, 300–1000 K columns, from memory
    propertyTable: [...a1Columns([[42.3, 442], [42.0, 492], [39.1, 575], [34.5, 688], [27.4, 969]]), ...ferriticToAustenite(27)],
    propertyTableSource: `300–1000 K rows: ${TABLE_A1}, 1 Cr–½ Mo (density at 300 K). ${RISE_NOTE}.`,
  },
  {
    name: 'AISI 302 stainless',
    k_W_mK: 15.1, // Table A.1, AISI 302, 300 K, from memory
    density_kg_m3: 8055, // Table A.1, AISI 302, from memory
    specificHeat_J_kgK: 480, // Table A.1, AISI 302, 300 K, from memory
    propertiesAt_C: AT_300_K,
    notes: 'Austenitic stainless: about a quarter of the conductivity of carbon steel, so sections heat and cool far more slowly.',
    source: `${TABLE_A1}; stainless steels, AISI 302, 300 K row.`,
    // Table A.1, AISI 302, 300–1000 K columns, from memory; austenitic, so no c_p peak
    propertyTable: a1Columns([[15.1, 480], [17.3, 512], [20.0, 559], [22.8, 585], [25.4, 606]]),
    propertyTableSource: `${TABLE_A1}, AISI 302, 300–1000 K columns (density at 300 K).`,
  },
  {
    name: 'AISI 304 stainless',
    k_W_mK: 14.9, // Table A.1, AISI 304, 300 K, from memory
    density_kg_m3: 7900, // Table A.1, AISI 304, from memory
    specificHeat_J_kgK: 477, // Table A.1, AISI 304, 300 K, from memory
    propertiesAt_C: AT_300_K,
    notes: null,
    source: `${TABLE_A1}; stainless steels, AISI 304, 300 K row.`,
    // Table A.1, AISI 304, 300–1000 K columns, from memory; austenitic, so no c_p peak
    propertyTable: a1Columns([[14.9, 477], [16.6, 515], [19.8, 557], [22.6, 582], [25.4, 611]]),
    propertyTableSource: `${TABLE_A1}, AISI 304, 300–1000 K columns (density at 300 K).`,
  },
  {
    name: 'AISI 316 stainless',
    k_W_mK: 13.4, // Table A.1, AISI 316, 300 K, from memory
    density_kg_m3: 8238, // Table A.1, AISI 316, from memory
    specificHeat_J_kgK: 468, // Table A.1, AISI 316, 300 K, from memory
    propertiesAt_C: AT_300_K,
    notes: null,
    source: `${TABLE_A1}; stainless steels, AISI 316, 300 K row.`,
    // Table A.1, AISI 316, 300–1000 K columns, from memory; austenitic, so no c_p peak
    propertyTable: a1Columns([[13.4, 468], [15.2, 504], [18.3, 550], [21.3, 576], [24.2, 602]]),
    propertyTableSource: `${TABLE_A1}, AISI 316, 300–1000 K columns (density at 300 K).`,
  },
  {
    name: 'Plain carbon steel at 600 K',
    k_W_mK: 48.0, // Table A.1, plain carbon steel, 600 K column, from memory
    density_kg_m3: 7854, // Table A.1 gives ρ at 300 K only
    specificHeat_J_kgK: 559, // Table A.1, plain carbon steel, 600 K column, from memory
    propertiesAt_C: AT_600_K,
    notes: 'For the hot end of a cooldown (about 330 °C). Density is the 300 K value.',
    source: `${TABLE_A1}; plain carbon steel, 600 K columns (density at 300 K).`,
  },
  {
    name: 'Plain carbon steel at 1000 K',
    k_W_mK: 30.0, // Table A.1, plain carbon steel, 1000 K column, from memory
    density_kg_m3: 7854, // Table A.1 gives ρ at 300 K only
    specificHeat_J_kgK: 1169, // Table A.1, plain carbon steel, 1000 K column, from memory
    propertiesAt_C: AT_1000_K,
    notes: 'About 727 °C: the specific heat peaks near the ferrite–austenite change, so treat this entry as a rough average only.',
    source: `${TABLE_A1}; plain carbon steel, 1000 K columns (density at 300 K).`,
  },
  {
    name: 'AISI 304 stainless at 600 K',
    k_W_mK: 19.8, // Table A.1, AISI 304, 600 K column, from memory
    density_kg_m3: 7900, // Table A.1 gives ρ at 300 K only
    specificHeat_J_kgK: 557, // Table A.1, AISI 304, 600 K column, from memory
    propertiesAt_C: AT_600_K,
    notes: 'Unlike carbon steel, austenitic stainless conducts better as it heats. Density is the 300 K value.',
    source: `${TABLE_A1}; AISI 304, 600 K columns (density at 300 K).`,
  },
  {
    name: 'AISI 304 stainless at 1000 K',
    k_W_mK: 25.4, // Table A.1, AISI 304, 1000 K column, from memory
    density_kg_m3: 7900, // Table A.1 gives ρ at 300 K only
    specificHeat_J_kgK: 611, // Table A.1, AISI 304, 1000 K column, from memory
    propertiesAt_C: AT_1000_K,
    notes: 'About 727 °C, near solution-annealing furnace temperatures. Density is the 300 K value.',
    source: `${TABLE_A1}; AISI 304, 1000 K columns (density at 300 K).`,
  },
  {
    name: 'Case-hardened AISI 1010 bar (demo)',
    ...AISI_1010,
    propertiesAt_C: AT_300_K,
    gradedProfile: [
      { x: 0, k: AISI_1010.k_W_mK, rhoCp: coreRhoCp },
      { x: CASE_START, k: AISI_1010.k_W_mK, rhoCp: coreRhoCp },
      { x: CASE_START, k: caseK, rhoCp: coreRhoCp },
      { x: 1, k: caseK, rhoCp: coreRhoCp },
    ],
    notes:
      'DEMO / ILLUSTRATIVE: a two-layer profile, core 0–0.9 of the radius with the AISI 1010 values, case 0.9–1.0 with ' +
      `k = ${CASE_K_FACTOR} × the core value (${caseK} W/m·K, an assumption, not a measurement) and the core ρc_p. Replace with measured case data before relying on it.`,
    source: `Core: ${TABLE_A1}; AISI 1010, 300 K row. Case layer: illustrative 0.9 × core conductivity (demo assumption).`,
  },
]
