/** k! for the small k used in derivative conversions. */
export function factorial(k: number): number {
  let f = 1;
  for (let j = 2; j <= k; j++) f *= j;
  return f;
}
