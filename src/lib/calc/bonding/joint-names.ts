import type { BondingStudy } from '../../schemas/bonding-study.schema';

// Joints are numbered along the route (0 at the start, k after the k-th section); a joint bay
// may also carry the name the drawings give it. Without names every label is as before.

type Named = Pick<BondingStudy, 'jointNames'>;

/** The designer's name of joint `j`, if given. */
export function jointName(study: Named, j: number): string | undefined {
  return study.jointNames?.find((n) => n.jointIndex === j)?.name;
}

/** Short label for screens and strips: the name, or "J<j>" as joints were always shown. */
export function jointShortLabel(study: Named, j: number): string {
  return jointName(study, j) ?? `J${j}`;
}

/** In a sentence: "joint bay JB-3 (joint 3)", or "joint 3" when the joint has no name. */
export function jointInWords(study: Named, j: number): string {
  const name = jointName(study, j);
  return name === undefined ? `joint ${j}` : `joint bay ${name} (joint ${j})`;
}
