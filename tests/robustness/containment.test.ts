/**
 * Containment: the geometry and symmetry code are total over any coordinates, analysis reports a
 * failure of one of its stages as an `internal-error` and still runs the others, and the server's
 * guard turns a failing request into an error answer that the user is told about once.
 */
import { describe, expect, it } from 'vitest';
import { ErrorCodes, ResponseError, type Connection } from 'vscode-languageserver/node';
import { analyseContacts, COORDINATE_LIMIT } from '../../server/src/chemistry/geometry';
import { detectSymmetry } from '../../server/src/chemistry/symmetry';
import { analyze } from '../../server/src/language/analyze';
import { FailureReporter } from '../../server/src/lsp/guard';
import * as M from '../chemistry/symmetry/molecules';

const HOSTILE_VALUES = [1e155, -1e300, Number.MAX_VALUE, Infinity, -Infinity, NaN, COORDINATE_LIMIT * 1.0001];

describe('point-group detection is total', () => {
  for (const value of HOSTILE_VALUES) {
    it(`water with one coordinate ${value}: C1, every atom its own set, no exception`, () => {
      const coordinates = [...M.water.coordinates];
      coordinates[3] = value;
      const result = detectSymmetry(M.water.numbers, coordinates);
      expect(result.fullGroup).toBe('C1');
      expect(result.abelianGroup).toBe('C1');
      expect(result.equivalentSets).toEqual([[0], [1], [2]]);
      expect(result.abelianOperations.map((operation) => operation.permutation)).toEqual([[0, 1, 2]]);
      expect(result.frame.origin.every(Number.isFinite)).toBe(true);
    });
  }

  it('water moved 90,000 Å along x (inside the range) is still C2v', () => {
    // Textbook group of water: Cotton, Chemical Applications of Group Theory, 3rd ed. (1990), ch. 3.
    const coordinates = M.water.coordinates.map((value, k) => (k % 3 === 0 ? value + 9e4 : value));
    expect(detectSymmetry(M.water.numbers, coordinates).fullGroup).toBe('C2v');
  });
});

describe('the neighbour search leaves atoms out of range out', () => {
  it('2,000 atoms on a grid plus one at 1e155 Å: the same bonds as without it, in linear time', () => {
    const side = 10;
    const coordinates: number[] = [];
    for (let i = 0; i < side; i++) for (let j = 0; j < side; j++) for (let k = 0; k < 20; k++) coordinates.push(1.0 * i, 1.0 * j, 1.0 * k);
    const radii = new Float64Array(2000).fill(0.5);
    const without = analyseContacts(Float64Array.from(coordinates), radii);
    const withFar = analyseContacts(Float64Array.from([...coordinates, 1e155, 0, 0]), new Float64Array(2001).fill(0.5));
    expect(withFar.bonds).toEqual(without.bonds);
    expect(withFar.nearestDistance[2000]).toBe(Infinity);
    // 1.0 Å spacing, bonds below 1.2 × (0.5 + 0.5) = 1.2 Å: the grid's nearest-neighbour edges.
    expect(without.bonds.length).toBe(9 * 10 * 20 + 10 * 9 * 20 + 10 * 10 * 19);
  });
});

describe('analysis stages are contained', () => {
  it('a spec with a coordinate of 1e155 Å is analysed: one error, the other atoms still checked', () => {
    const analysis = analyze('basis sto-3g\nstructure {\n  H a 0 0 0\n  H b 0 0 0.3\n  H c 1e155 0 0\n}\n');
    expect(analysis.diagnostics.map((d) => d.code).sort()).toEqual(['atoms-too-close', 'coordinate-out-of-range']);
    expect(analysis.model.atoms).toHaveLength(3);
  });
});

/** A connection that records what the reporter sends. */
function recordingConnection(): { connection: Connection; logged: string[]; shown: string[] } {
  const logged: string[] = [];
  const shown: string[] = [];
  const connection = {
    console: { error: (text: string) => logged.push(text) },
    window: { showErrorMessage: (text: string) => (shown.push(text), Promise.resolve(undefined)) },
  } as unknown as Connection;
  return { connection, logged, shown };
}

describe('the server guard', () => {
  it('turns an exception into an InternalError answer, logs the stack, tells the user once per version', () => {
    const { connection, logged, shown } = recordingConnection();
    const reporter = new FailureReporter(connection);
    const failing = reporter.guard('hover', (params: { uri: string; version: number }) => params, () => {
      throw new TypeError('x is undefined');
    });
    for (const version of [1, 1, 2]) {
      let caught: unknown;
      try {
        failing({ uri: 'file:///work/a%20b.tess', version });
      } catch (error) {
        caught = error;
      }
      expect(caught).toBeInstanceOf(ResponseError);
      expect((caught as ResponseError<unknown>).code).toBe(ErrorCodes.InternalError);
      expect((caught as Error).message).toContain('hover failed (TypeError: x is undefined)');
    }
    expect(logged).toHaveLength(3);
    expect(logged[0]).toContain('at ');
    expect(shown).toHaveLength(2);
    expect(shown[0]).toContain('hover failed for a b.tess');
    expect(shown[0]).toContain('other files are not affected');
  });

  it('lets the errors a handler throws on purpose through unchanged', () => {
    const { connection, logged } = recordingConnection();
    const guarded = new FailureReporter(connection).guard('rename', () => ({}), () => {
      throw new ResponseError(0, 'not a label');
    });
    expect(() => guarded({})).toThrow('not a label');
    expect(logged).toEqual([]);
  });
});
