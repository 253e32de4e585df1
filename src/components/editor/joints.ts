/** The joints of a route as choices: "J2 at 960 m (S2|S3)"; joint k follows the k-th section. */
export function jointOptions(sections: Array<{ id: string; lengthM: number }>): Array<[number, string]> {
  let chainageM = 0;
  const out: Array<[number, string]> = [[0, `J0 route start (0 m)`]];
  sections.forEach((s, i) => {
    chainageM += Number(s.lengthM) || 0;
    const next = sections[i + 1]?.id;
    out.push([i + 1, next ? `J${i + 1} at ${Math.round(chainageM * 10) / 10} m (${s.id}|${next})` : `J${i + 1} route end (${Math.round(chainageM * 10) / 10} m)`]);
  });
  return out;
}
