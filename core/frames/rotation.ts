/**
 * 3×3 rotation matrices in the passive ("coordinate") convention of Vallado's Fundamentals:
 * rot3(a) turns the axes by +a about z, so a vector's components turn by −a. Row-major,
 * 9 numbers, to keep the frame code allocation-light and easy to read side by side with the
 * published equations.
 */
export type Mat3 = readonly [number, number, number, number, number, number, number, number, number];

export const rot1 = (a: number): Mat3 => {
  const c = Math.cos(a), s = Math.sin(a);
  return [1, 0, 0, 0, c, s, 0, -s, c];
};
export const rot2 = (a: number): Mat3 => {
  const c = Math.cos(a), s = Math.sin(a);
  return [c, 0, -s, 0, 1, 0, s, 0, c];
};
export const rot3 = (a: number): Mat3 => {
  const c = Math.cos(a), s = Math.sin(a);
  return [c, s, 0, -s, c, 0, 0, 0, 1];
};

export function mul(a: Mat3, b: Mat3): Mat3 {
  const m: number[] = new Array<number>(9);
  for (let i = 0; i < 3; i++)
    for (let j = 0; j < 3; j++)
      m[3 * i + j] = a[3 * i]! * b[j]! + a[3 * i + 1]! * b[3 + j]! + a[3 * i + 2]! * b[6 + j]!;
  return m as unknown as Mat3;
}

/** Product of several matrices, left to right. */
export const chain = (...ms: Mat3[]): Mat3 => ms.reduce((acc, m) => mul(acc, m));

export const transpose = (a: Mat3): Mat3 => [a[0], a[3], a[6], a[1], a[4], a[7], a[2], a[5], a[8]];

export const apply = (a: Mat3, x: number, y: number, z: number): [number, number, number] => [
  a[0] * x + a[1] * y + a[2] * z,
  a[3] * x + a[4] * y + a[5] * z,
  a[6] * x + a[7] * y + a[8] * z,
];

/** Arcseconds to radians. */
export const ARCSEC = Math.PI / (180 * 3600);
