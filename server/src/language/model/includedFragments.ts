/**
 * `structure from "base.tess" with fragments`: the fragments of another spec become this spec's,
 * so that a family of plans shares one structure and one cut.
 *
 * The rule, the same as a variant's (language/variants.ts), at the level of the typed tree:
 *
 * - The included fragments come first, in the other spec's order; this spec's own fragments follow.
 * - A fragment of this spec with the name of an included one patches it in place: each statement
 *   it gives (`atoms`, `charge`, `multiplicity`, `caps`, `tier`) replaces the included one's of the
 *   same keyword, the others stay; a `tier` of the same level is patched key by key (`active`,
 *   `mapping`, `taper`, …), a tier of another level replaces the whole tier.
 * - What is written inside the included `fragment` blocks comes, and the other spec's top-level
 *   `caps` line as the capping of its fragments that name none, unless this spec has a top-level
 *   `caps` line of its own (the cut and its capping go together). Its other top-level statements
 *   (basis lines, `embedding`, `limits`) do not come, and `rest` means the atoms no other fragment
 *   of this spec claims.
 * - `closer-than` distances are converted from the other spec's structure unit to this one's.
 *
 * An included fragment's syntax keeps no position in this spec: every span in it becomes the span of
 * the `with fragments` words, so its problems are reported there; `included` says where the
 * fragment is written in the other file (for hover and go to definition).
 */
import { toAngstrom, type LengthUnit } from '../../chemistry/units';
import type { FragmentAst, IncludedFragmentOrigin, SpecAst, TierAst } from '../ast';
import type { DiagnosticSink } from '../diagnostics';
import type { Span } from '../text';
import type { IncludedSpec } from './atoms';

/** Problems inside the included fragments listed in the report; the rest are counted. */
const LISTED_PROBLEMS = 3;

/** The fragments of this spec with those of the included spec merged in by the rule above. */
export function withIncludedFragments(ast: SpecAst, spec: IncludedSpec | undefined, sink: DiagnosticSink, units: LengthUnit): FragmentAst[] {
  const geometry = ast.geometry;
  const at = geometry?.withFragments;
  if (!geometry?.include || !at) return ast.fragments;
  if (!spec) {
    // No spec was read: an XYZ file (which has atoms only), or a spec that was refused (reported already).
    if (!geometry.include.value.toLowerCase().endsWith('.tess')) {
      sink.report('include-invalid', at, `"${geometry.include.value}" is an XYZ file, which holds atoms only; \`with fragments\` takes the fragments of another spec (a .tess file).`);
    }
    return ast.fragments;
  }
  reportProblems(spec, geometry.include.value, at, sink);
  if (spec.ast.fragments.length === 0) {
    sink.report('include-invalid', at, `"${geometry.include.value}" has no fragments to take.`, { severity: 'warning' });
    return ast.fragments;
  }
  const otherUnits = spec.ast.geometry?.unit?.value ?? spec.ast.legacyUnits?.value ?? 'angstrom';
  const distanceFactor = toAngstrom(1, otherUnits) / toAngstrom(1, units);
  const inheritedCaps = !ast.caps && spec.ast.caps ? relocate(spec.ast.caps, at, distanceFactor) : undefined;
  const merged: FragmentAst[] = spec.ast.fragments.map((fragment) => {
    const copy = relocate(fragment, at, distanceFactor);
    return { ...copy, ...(inheritedCaps && !copy.caps ? { caps: inheritedCaps } : {}), included: origin(spec, fragment, false) };
  });
  const patched = new Set<number>();
  for (const local of ast.fragments) {
    const name = local.name?.value;
    const index = name === undefined ? -1 : merged.findIndex((fragment, i) => !patched.has(i) && fragment.included !== undefined && fragment.name?.value === name);
    if (index < 0) {
      merged.push(local);
      continue;
    }
    patched.add(index);
    merged[index] = patchFragment(merged[index]!, local);
  }
  return merged;
}

/** The other spec's errors inside its fragment blocks, at `with fragments` with the place in that file. */
function reportProblems(spec: IncludedSpec, shownAs: string, at: Span, sink: DiagnosticSink): void {
  const blocks = spec.ast.fragments.map((fragment) => fragment.statement.span);
  const inside = spec.problems.filter((problem) => problem.severity === 'error' && blocks.some((span) => problem.span.start >= span.start && problem.span.end <= span.end));
  for (const problem of inside.slice(0, LISTED_PROBLEMS)) {
    const line = spec.lines.positionAt(problem.span.start).line;
    sink.report('include-invalid', at, `"${shownAs}" line ${line + 1}: ${problem.message}`, { related: [{ span: { start: 0, end: 0 }, file: spec.file, line, message: problem.message }] });
  }
  if (inside.length > LISTED_PROBLEMS) sink.report('include-invalid', at, `"${shownAs}" has ${inside.length - LISTED_PROBLEMS} more problems in its fragments.`);
}

function origin(spec: IncludedSpec, fragment: FragmentAst, patched: boolean): IncludedFragmentOrigin {
  const span = fragment.name?.span ?? fragment.statement.keyword.span;
  return { file: spec.file, start: spec.lines.positionAt(span.start), end: spec.lines.positionAt(span.end), patched };
}

/** A local fragment written over an included one of the same name (the rule in the header). */
function patchFragment(included: FragmentAst, local: FragmentAst): FragmentAst {
  const tier = patchTier(included.tier, local.tier);
  return {
    ...included,
    ...definedFields(local),
    ...(tier ? { tier } : {}),
    included: { ...included.included!, patched: true },
  };
}

function patchTier(included: TierAst | undefined, local: TierAst | undefined): TierAst | undefined {
  if (!local) return included;
  if (!included || included.level?.value !== local.level?.value) return local;
  return { ...included, ...definedFields(local) };
}

/** The fields of an object whose value is given (`{ a: undefined }` patches nothing). */
function definedFields<T extends object>(value: T): Partial<T> {
  return Object.fromEntries(Object.entries(value).filter(([key, field]) => field !== undefined && key !== 'included')) as Partial<T>;
}

function isSpan(value: object): value is Span {
  const keys = Object.keys(value);
  return keys.length === 2 && typeof (value as Span).start === 'number' && typeof (value as Span).end === 'number';
}

/**
 * A deep copy of an included fragment's tree with every span set to `at` and every `closer-than`
 * distance multiplied by `distanceFactor`. Fragment trees are small plain objects and arrays.
 */
function relocate<T>(value: T, at: Span, distanceFactor: number): T {
  if (Array.isArray(value)) return value.map((item: unknown) => relocate(item, at, distanceFactor)) as T;
  if (value === null || typeof value !== 'object') return value;
  if (isSpan(value)) return { start: at.start, end: at.end } as T;
  const copy: Record<string, unknown> = {};
  for (const [key, field] of Object.entries(value)) copy[key] = relocate(field, at, distanceFactor);
  if (copy['kind'] === 'closer-than' && typeof copy['distance'] === 'number') copy['distance'] = copy['distance'] * distanceFactor;
  return copy as T;
}
