/**
 * Maximum overall diameters (mm) of enamelled round copper winding wire by grade, held as data.
 *
 * A copy of `enamelled-round-copper-overall-diameters.csv` beside this file (itself a copy of the
 * project's reference table), row for row; a test checks that the two agree. Sources, as the CSV
 * header gives them: IEC 60317-0-1 Table 1 as reproduced in winding-wire suppliers' published
 * technical data (rows 0.018–0.100 mm), and IS 13730-0-1, the Indian adoption of IEC 60317-0-1,
 * in suppliers' published tables for metric intermediate sizes and for SWG sizes (rows with an
 * SWG number). SWG 12, 14 and 32 were left out of the CSV because their printed values were
 * inconsistent. `null`: the table gives no value.
 *
 * Row: [nominal bare diameter mm, SWG number or null, grade 1 max mm, grade 2 max mm, grade 3 max mm].
 */
export type ReferenceRow = readonly [
  nominal_mm: number,
  swg: string | null,
  grade1_max_mm: number | null,
  grade2_max_mm: number | null,
  grade3_max_mm: number | null,
];

export const REFERENCE_ROWS: readonly ReferenceRow[] = [
  [0.018, null, 0.022, 0.024, 0.026],
  [0.02, null, 0.024, 0.027, 0.03],
  [0.022, null, 0.027, 0.03, 0.033],
  [0.025, null, 0.031, 0.034, 0.037],
  [0.028, null, 0.034, 0.038, 0.042],
  [0.032, null, 0.039, 0.043, 0.047],
  [0.036, null, 0.044, 0.049, 0.053],
  [0.04, null, 0.049, 0.054, 0.058],
  [0.045, null, 0.055, 0.061, 0.066],
  [0.05, null, 0.06, 0.066, 0.072],
  [0.056, null, 0.067, 0.074, 0.081],
  [0.063, null, 0.076, 0.083, 0.09],
  [0.071, "45", 0.084, 0.091, 0.098],
  [0.075, null, 0.089, 0.095, 0.102],
  [0.08, null, 0.094, 0.101, 0.108],
  [0.081, "44", 0.096, 0.103, 0.11],
  [0.085, null, 0.1, 0.107, 0.114],
  [0.09, null, 0.105, 0.113, 0.12],
  [0.091, "43", 0.107, 0.115, 0.122],
  [0.095, null, 0.111, 0.119, 0.126],
  [0.1, null, 0.117, 0.125, 0.132],
  [0.102, "42", 0.119, 0.128, 0.136],
  [0.106, null, 0.123, 0.132, 0.14],
  [0.112, "41", 0.13, 0.139, 0.147],
  [0.118, null, 0.136, 0.145, 0.154],
  [0.122, "40", 0.141, 0.151, 0.16],
  [0.125, null, 0.144, 0.154, 0.163],
  [0.132, "39", 0.152, 0.162, 0.171],
  [0.14, null, 0.16, 0.171, 0.181],
  [0.15, null, 0.171, 0.182, 0.193],
  [0.152, "38", 0.174, 0.186, 0.197],
  [0.16, null, 0.182, 0.194, 0.205],
  [0.17, null, 0.194, 0.208, 0.217],
  [0.173, "37", 0.197, 0.21, 0.222],
  [0.193, "36", 0.219, 0.232, 0.245],
  [0.213, "35", 0.241, 0.255, 0.269],
  [0.234, "34", 0.265, 0.281, 0.296],
  [0.254, "33", 0.286, 0.303, 0.319],
  [0.295, "31", 0.329, 0.347, 0.364],
  [0.315, "30", 0.349, 0.367, 0.384],
  [0.345, "29", 0.382, 0.401, 0.418],
  [0.376, "28", 0.417, 0.435, 0.454],
  [0.417, "27", 0.458, 0.48, 0.5],
  [0.457, "26", 0.501, 0.523, 0.544],
  [0.508, "25", 0.554, 0.578, 0.601],
  [0.559, "24", 0.605, 0.629, 0.652],
  [0.61, "23", 0.659, 0.684, 0.708],
  [0.711, "22", 0.766, 0.795, 0.822],
  [0.813, "21", 0.872, 0.902, 0.931],
  [0.914, "20", 0.976, 1.008, 1.038],
  [1.016, "19", 1.08, 1.113, 1.144],
  [1.219, "18", 1.285, 1.318, 1.35],
  [1.422, "17", 1.492, 1.528, 1.562],
  [1.626, "16", 1.698, 1.735, 1.77],
  [1.829, "15", 1.903, 1.941, 1.977],
  [2.337, "13", 2.415, 2.455, 2.493],
  [2.946, "11", 3.029, 3.072, 3.112],
];
