/** Rounding and number formatting the inspection modules share. */

export function round1(n: number) {
  return Math.round(n * 10) / 10;
}
export function round2(n: number) {
  return Math.round(n * 100) / 100;
}
export function fmt(n: number) {
  return (Math.round(n * 10) / 10).toFixed(1);
}
