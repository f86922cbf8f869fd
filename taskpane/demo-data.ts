/**
 * Built-in demo data, invented for Reshuffle (no real variety, place or person):
 *  - a growers' cooperative's trial of four barley lines (made-up codes HB-07, HB-12,
 *    HB-19, HB-23) on five farms used as blocks, two plots per line and farm, yield in
 *    t/ha, right-skewed with one outlying plot (HB-12 on Creek field, 6.59 t/ha);
 *  - the grain quality of the same trial (protein, screenings, height), one sample per
 *    line and farm;
 *  - a lab's paired readings of twelve samples before and after a treatment.
 */

/** Header + rows: farm, line, plot, yield (t/ha). */
export const BARLEY_TRIAL: (string | number)[][] = [
  ["Farm", "Line", "Plot", "Yield (t/ha)"],
  ["North plot", "HB-07", 1, 4.08],
  ["North plot", "HB-12", 1, 4.86],
  ["North plot", "HB-19", 1, 4.64],
  ["North plot", "HB-23", 1, 4.06],
  ["North plot", "HB-07", 2, 4.06],
  ["North plot", "HB-12", 2, 4.3],
  ["North plot", "HB-19", 2, 5.64],
  ["North plot", "HB-23", 2, 4.52],
  ["Creek field", "HB-07", 1, 4.05],
  ["Creek field", "HB-12", 1, 4.18],
  ["Creek field", "HB-19", 1, 4.92],
  ["Creek field", "HB-23", 1, 4.11],
  ["Creek field", "HB-07", 2, 3.7],
  ["Creek field", "HB-12", 2, 6.59],
  ["Creek field", "HB-19", 2, 4.69],
  ["Creek field", "HB-23", 2, 3.84],
  ["Hill farm", "HB-07", 1, 3.31],
  ["Hill farm", "HB-12", 1, 4.45],
  ["Hill farm", "HB-19", 1, 4.26],
  ["Hill farm", "HB-23", 1, 3.31],
  ["Hill farm", "HB-07", 2, 3.95],
  ["Hill farm", "HB-12", 2, 3.72],
  ["Hill farm", "HB-19", 2, 4.26],
  ["Hill farm", "HB-23", 2, 3.78],
  ["Home block", "HB-07", 1, 4.05],
  ["Home block", "HB-12", 1, 4.96],
  ["Home block", "HB-19", 1, 5.11],
  ["Home block", "HB-23", 1, 4.37],
  ["Home block", "HB-07", 2, 4.02],
  ["Home block", "HB-12", 2, 4.33],
  ["Home block", "HB-19", 2, 6.2],
  ["Home block", "HB-23", 2, 4.64],
  ["East strip", "HB-07", 1, 4.05],
  ["East strip", "HB-12", 1, 3.89],
  ["East strip", "HB-19", 1, 5.21],
  ["East strip", "HB-23", 1, 3.76],
  ["East strip", "HB-07", 2, 4.47],
  ["East strip", "HB-12", 2, 4.41],
  ["East strip", "HB-19", 2, 6.27],
  ["East strip", "HB-23", 2, 4.24],
];

/** Header + rows: sample, reading before, reading after (mg/L). */
export const LAB_PAIRED: (string | number)[][] = [
  ["Sample", "Before (mg/L)", "After (mg/L)"],
  ["S01", 16.5, 15.4],
  ["S02", 12.1, 10.5],
  ["S03", 12.2, 9.6],
  ["S04", 17.5, 14.0],
  ["S05", 14.9, 12.1],
  ["S06", 13.1, 13.2],
  ["S07", 19.0, 19.3],
  ["S08", 16.2, 13.1],
  ["S09", 11.5, 9.5],
  ["S10", 19.8, 17.2],
  ["S11", 18.4, 14.6],
  ["S12", 12.1, 10.7],
];

/**
 * Header + rows: farm, line, grain protein (%), screenings (% of grain through the
 * sieve), plant height (cm) — one sample per line and farm from the same invented
 * trial, for the "several traits at once" question.
 */
export const BARLEY_QUALITY: (string | number)[][] = [
  ["Farm", "Line", "Protein (%)", "Screenings (%)", "Height (cm)"],
  ["North plot", "HB-07", 12.1, 3.8, 79],
  ["North plot", "HB-12", 11.6, 4.9, 85],
  ["North plot", "HB-19", 10.6, 6.8, 90],
  ["North plot", "HB-23", 12.3, 4.1, 76],
  ["Creek field", "HB-07", 11.9, 4.2, 81],
  ["Creek field", "HB-12", 11.2, 5.6, 87],
  ["Creek field", "HB-19", 10.4, 7.4, 92],
  ["Creek field", "HB-23", 12.6, 3.7, 75],
  ["Hill farm", "HB-07", 12.4, 3.5, 78],
  ["Hill farm", "HB-12", 11.8, 4.4, 84],
  ["Hill farm", "HB-19", 10.9, 6.1, 88],
  ["Hill farm", "HB-23", 12.0, 4.6, 79],
  ["Home block", "HB-07", 11.8, 4.0, 80],
  ["Home block", "HB-12", 11.5, 5.2, 86],
  ["Home block", "HB-19", 10.2, 7.9, 91],
  ["Home block", "HB-23", 12.2, 4.3, 77],
  ["East strip", "HB-07", 12.2, 3.6, 82],
  ["East strip", "HB-12", 11.9, 5.8, 85],
  ["East strip", "HB-19", 10.7, 6.5, 89],
  ["East strip", "HB-23", 12.5, 3.9, 74],
];
