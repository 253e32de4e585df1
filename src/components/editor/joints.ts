import { jointName } from '../../lib/calc/bonding/joint-names';

type JointNames = Array<{ jointIndex: number; name: string }> | undefined;

/**
 * The joints of a route as choices: "J2 at 960 m (S2|S3)", or "Mill Lane (J2) at 960 m (S2|S3)"
 * for a named joint bay; joint k follows the k-th section.
 */
export function jointOptions(sections: Array<{ id: string; lengthM: number }>, jointNames?: JointNames): Array<[number, string]> {
  let chainageM = 0;
  const called = (j: number) => {
    const name = jointName({ jointNames }, j);
    return name === undefined ? `J${j}` : `${name} (J${j})`;
  };
  const out: Array<[number, string]> = [[0, `${called(0)} route start (0 m)`]];
  sections.forEach((s, i) => {
    chainageM += Number(s.lengthM) || 0;
    const next = sections[i + 1]?.id;
    const at = Math.round(chainageM * 10) / 10;
    out.push([i + 1, next ? `${called(i + 1)} at ${at} m (${s.id}|${next})` : `${called(i + 1)} route end (${at} m)`]);
  });
  return out;
}
