/**
 * Straight-line kernels for the vertical recurrence: a class's instruction list (programs.ts),
 * written out once as JavaScript with every index a constant and compiled with `new Function`, so
 * that the per-primitive work runs without decoding instructions or branching. The arithmetic is
 * exactly that of the interpreted loop in engine.ts (same operations in the same order), which
 * remains in use for the large classes whose unrolled text would be too long to compile well.
 */
import { OP_FIELDS, type VrrProgram } from './programs';

/**
 * Runs the recurrence of one primitive quartet on `v` ([00|00]^(m) already in v[0 … L]) and adds
 * the targets into `acc`. `g`: PA, WP, QC, WQ (x, y, z each); `c`: 1/(2ζ), ρ/ζ, 1/(2η), ρ/η, 1/(2(ζ+η)).
 */
export type VrrKernel = (v: Float64Array, g: Float64Array, c: Float64Array, acc: Float64Array) => void;

/** Classes whose unrolled text has more statements than this are interpreted instead. */
const MAX_STATEMENTS = 600;

function term(coefficient: number, name: string): string {
  return coefficient === 1 ? name : `${coefficient} * ${name}`;
}

export function compileVrr(program: VrrProgram): VrrKernel | null {
  const ops = program.ops;
  const braEnd = program.braOps * OP_FIELDS;
  const allEnd = braEnd + program.ketOps * OP_FIELDS;
  let statements = program.targets.length;
  for (let o = 0; o < allEnd; o += OP_FIELDS) statements += ops[o + 7]!;
  if (statements > MAX_STATEMENTS) return null;
  const axis = ['x', 'y', 'z'];
  const lines: string[] = [
    '"use strict";',
    'const pax = g[0], pay = g[1], paz = g[2], wpx = g[3], wpy = g[4], wpz = g[5];',
    'const qcx = g[6], qcy = g[7], qcz = g[8], wqx = g[9], wqy = g[10], wqz = g[11];',
    'const hz = c[0], rz = c[1], he = c[2], re = c[3], hs = c[4];',
  ];
  for (let o = 0; o < braEnd; o += OP_FIELDS) {
    const d = axis[ops[o]!]!;
    const dst = ops[o + 1]!;
    const s1 = ops[o + 2]!;
    const s2 = ops[o + 3]!;
    const a = ops[o + 5]!;
    const mCount = ops[o + 7]!;
    for (let m = 0; m < mCount; m++) {
      let rhs = `pa${d} * v[${s1 + m}] + wp${d} * v[${s1 + m + 1}]`;
      if (s2 >= 0) rhs += ` + ${term(a, 'hz')} * (v[${s2 + m}] - rz * v[${s2 + m + 1}])`;
      lines.push(`v[${dst + m}] = ${rhs};`);
    }
  }
  for (let o = braEnd; o < allEnd; o += OP_FIELDS) {
    const d = axis[ops[o]!]!;
    const dst = ops[o + 1]!;
    const s1 = ops[o + 2]!;
    const s2 = ops[o + 3]!;
    const s3 = ops[o + 4]!;
    const a = ops[o + 5]!;
    const b = ops[o + 6]!;
    const mCount = ops[o + 7]!;
    for (let m = 0; m < mCount; m++) {
      let rhs = `qc${d} * v[${s1 + m}] + wq${d} * v[${s1 + m + 1}]`;
      if (s2 >= 0) rhs += ` + ${term(a, 'he')} * (v[${s2 + m}] - re * v[${s2 + m + 1}])`;
      if (s3 >= 0) rhs += ` + ${term(b, 'hs')} * v[${s3 + m + 1}]`;
      lines.push(`v[${dst + m}] = ${rhs};`);
    }
  }
  program.targets.forEach((target, k) => lines.push(`acc[${k}] += v[${target}];`));
  return new Function('v', 'g', 'c', 'acc', lines.join('\n')) as VrrKernel;
}
