/** The vertices of an "M x,y L x,y …" path, for specs that check where a line was drawn. */
export function pathPoints(d: string): [number, number][] {
  return [...d.matchAll(/[ML](-?[\d.]+),(-?[\d.]+)/g)].map((m) => [Number(m[1]), Number(m[2])]);
}
