/**
 * Generates Lariat's demo dataset: an invented scenario, not real data and not a real organisation.
 *
 * "Harbour Creamery" is a made-up cheese dairy that logs every vat it makes. For each vat it records
 * the milk that went in, the process settings, the plant's sensor readings and the outcome:
 *   - yield_kg_per_100l (numeric): kilograms of cheese per 100 litres of milk;
 *   - top_grade (yes/no): whether the vat's cheese passed top-grade inspection.
 * Of the 44 numeric candidate predictors only a handful drive the outcomes (listed in TRUE_EFFECTS);
 * the rest are noise, some of it correlated with the real drivers. Three categorical predictors
 * (milk_supplier, starter_culture, shift) form natural groups. A vat id column is an identifier, so
 * the intake's type inference has something to exclude; a notes column holds a few short remarks
 * (inferred as categorical) and is blank in about half the rows, where blank means "nothing to report".
 *
 * Seeded and deterministic: `npm run demo:generate` rewrites datasets/demo/harbour-creamery-vats.csv
 * byte for byte.
 */
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { createRng } from '../../server/engine/random';

export const DEMO_SEED = 20261201;
export const DEMO_ROWS = 1200;

const SUPPLIERS = ['North Ridge', 'Saltmarsh', 'Three Oaks', 'Kestrel Farm', 'Lowfield'];
const SUPPLIER_EFFECT = [0.35, -0.25, 0.0, 0.15, -0.3];
const CULTURES = ['C-Alpha', 'C-Beta', 'C-Gamma', 'C-Delta'];
const CULTURE_EFFECT = [0.0, 0.4, -0.2, 0.1];
const SHIFTS = ['early', 'late', 'night'];
const NOTES = ['', '', '', 'vat lid resealed', 'new operator', 'milk delivery late', 'cleaning ran long', ''];

/** The effects used to generate the outcomes (per unit of each predictor), for the demo's own docs. */
export const TRUE_EFFECTS = {
  milk_fat_pct: 1.9,
  milk_protein_pct: 2.6,
  somatic_cells_k_per_ml: -0.004,
  coagulation_temp_c: 0.22,
  curd_cut_minutes: -0.05,
  'milk_supplier (group)': 'North Ridge +0.35, Saltmarsh -0.25, Kestrel Farm +0.15, Lowfield -0.30',
  'starter_culture (group)': 'C-Beta +0.40, C-Gamma -0.20, C-Delta +0.10',
} as const;

function round(x: number, digits: number): number {
  const f = 10 ** digits;
  return Math.round(x * f) / f;
}

export function generateDemoCsv(seed = DEMO_SEED, rows = DEMO_ROWS): string {
  const rng = createRng(seed);
  const pick = <T,>(items: readonly T[]) => items[Math.floor(rng.next() * items.length)];
  const header = [
    'vat_id', 'yield_kg_per_100l', 'top_grade', 'milk_supplier', 'starter_culture', 'shift',
    'milk_fat_pct', 'milk_protein_pct', 'somatic_cells_k_per_ml', 'coagulation_temp_c', 'curd_cut_minutes',
    'milk_ph', 'lactose_pct', 'rennet_ml', 'salt_kg', 'stir_rpm', 'press_hours', 'ambient_temp_c',
    'ambient_humidity_pct', 'milk_age_hours', 'tank_level_pct', 'pump_pressure_bar',
  ];
  const noiseCount = 44 - (header.length - 6);
  for (let k = 1; k <= noiseCount; k++) header.push(`sensor_${String(k).padStart(2, '0')}`);
  header.push('notes');

  const lines = [header.join(',')];
  for (let i = 0; i < rows; i++) {
    const supplier = Math.floor(rng.next() * SUPPLIERS.length);
    const culture = Math.floor(rng.next() * CULTURES.length);
    const shift = pick(SHIFTS);
    const season = Math.sin((2 * Math.PI * i) / 365);
    const fat = 3.9 + 0.25 * season + 0.18 * rng.normal();
    const protein = 3.3 + 0.55 * (fat - 3.9) + 0.12 * rng.normal();
    const somatic = Math.max(40, 210 + 60 * rng.normal());
    const coagTemp = 32 + 1.1 * rng.normal();
    const cutMin = 35 + 6 * rng.normal();
    const ph = 6.65 + 0.05 * rng.normal() - 0.0002 * (somatic - 210);
    const lactose = 4.7 + 0.1 * rng.normal();
    const rennet = 22 + 2.5 * rng.normal();
    const salt = 2.1 + 0.2 * rng.normal();
    const stir = 14 + 2 * rng.normal();
    const press = 6 + 0.8 * rng.normal();
    const ambientT = 18 + 6 * season + 2 * rng.normal();
    const humidity = 65 + 8 * rng.normal();
    const milkAge = 20 + 8 * rng.next();
    const tank = 40 + 55 * rng.next();
    const pump = 2.2 + 0.15 * rng.normal() + 0.01 * (tank - 67);

    const signal =
      TRUE_EFFECTS.milk_fat_pct * (fat - 3.9) +
      TRUE_EFFECTS.milk_protein_pct * (protein - 3.3) +
      TRUE_EFFECTS.somatic_cells_k_per_ml * (somatic - 210) +
      TRUE_EFFECTS.coagulation_temp_c * (coagTemp - 32) +
      TRUE_EFFECTS.curd_cut_minutes * (cutMin - 35) +
      SUPPLIER_EFFECT[supplier] +
      CULTURE_EFFECT[culture];
    const yieldKg = 10.2 + signal + 0.35 * rng.normal();
    const gradeLogit = -0.3 + 2.2 * signal - 0.004 * (somatic - 210) * 2;
    const topGrade = rng.next() < 1 / (1 + Math.exp(-gradeLogit)) ? 'yes' : 'no';

    const sensors: number[] = [];
    for (let k = 0; k < noiseCount; k++) {
      // A few sensors echo real drivers (correlated noise), the rest are independent.
      const base = k % 7 === 0 ? 0.6 * (fat - 3.9) / 0.18 : k % 11 === 0 ? 0.5 * (coagTemp - 32) : 0;
      sensors.push(round(base + rng.normal(), 3));
    }
    // Roughly 1% of readings go missing, as real loggers do.
    const maybe = (x: number, digits: number) => (rng.next() < 0.01 ? 'NA' : String(round(x, digits)));
    const row = [
      `HC-${String(24001 + i)}`, round(yieldKg, 3), topGrade, SUPPLIERS[supplier], CULTURES[culture], shift,
      round(fat, 3), round(protein, 3), round(somatic, 1), round(coagTemp, 2), round(cutMin, 1),
      maybe(ph, 3), round(lactose, 3), round(rennet, 2), round(salt, 3), round(stir, 2), round(press, 2),
      round(ambientT, 2), maybe(humidity, 1), round(milkAge, 2), round(tank, 1), round(pump, 3),
      ...sensors, pick(NOTES),
    ];
    lines.push(row.join(','));
  }
  return `${lines.join('\n')}\n`;
}

export const DEMO_CSV_PATH = fileURLToPath(new URL('./harbour-creamery-vats.csv', import.meta.url));

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  writeFileSync(DEMO_CSV_PATH, generateDemoCsv());
  console.error(`[lariat] wrote ${DEMO_CSV_PATH}`);
}
