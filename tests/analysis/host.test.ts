/** The host keeps one analysis per document version; late results are kept by their inputs. */
import { describe, expect, it } from 'vitest';
import { AnalysisHost, fragmentInputKey, LateResults, type OpenDocument } from '../../server/src/analysis';

function documents() {
  const open = new Map<string, OpenDocument>();
  const set = (uri: string, version: number, text: string) => open.set(uri, { version, getText: () => text });
  const host = new AnalysisHost({ open: (uri) => open.get(uri), pathOf: (uri) => (uri.startsWith('file://') ? uri.slice(7) : undefined), uriOf: (file) => `file://${file}` });
  return { host, set, open };
}

const SPEC = 'basis sto-3g\nstructure from "h2.xyz"\nfragment h2 { atoms rest; tier quantum { method vqe } }\n';
const H2 = '2\nhydrogen\nH 0 0 0\nH 0 0 0.74\n';

describe('the analysis host', () => {
  it('analyses a version once and a new version anew', () => {
    const { host, set } = documents();
    set('file:///w/a.tess', 1, 'basis sto-3g\nstructure { H 0 0 0; H 0 0 0.74 }\n');
    const first = host.get('file:///w/a.tess')!;
    expect(host.get('file:///w/a.tess')).toBe(first);
    set('file:///w/a.tess', 2, 'basis sto-3g\nstructure { H 0 0 0; H 0 0 0.75 }\n');
    expect(host.isCurrent('file:///w/a.tess')).toBe(false);
    expect(host.get('file:///w/a.tess')).not.toBe(first);
    expect(host.get('file:///nowhere.tess')).toBeUndefined();
  });

  it('reads included files from open buffers and knows who depends on them', () => {
    const { host, set } = documents();
    set('file:///w/h2.xyz', 1, H2);
    set('file:///w/spec.tess', 1, SPEC);
    expect(host.get('file:///w/spec.tess')!.model.atoms).toHaveLength(2);
    expect(host.dependents('/w/h2.xyz')).toEqual(['file:///w/spec.tess']);
    set('file:///w/h2.xyz', 2, '3\nthree\nH 0 0 0\nH 0 0 0.74\nH 0 0 1.48\n');
    host.invalidate('file:///w/spec.tess');
    expect(host.get('file:///w/spec.tess')!.model.atoms).toHaveLength(3);
  });

  it('shares one store of late results between versions', () => {
    const { host, set } = documents();
    set('file:///w/h2.xyz', 1, H2);
    set('file:///w/spec.tess', 1, SPEC);
    const first = host.get('file:///w/spec.tess')!;
    set('file:///w/spec.tess', 2, `# a comment\n${SPEC}`);
    const second = host.get('file:///w/spec.tess')!;
    expect(second.late).toBe(first.late);
    // A comment changes nothing a computed result depends on.
    expect(fragmentInputKey(second.model, 0)).toBe(fragmentInputKey(first.model, 0));
  });
});

describe('late results', () => {
  it('go from absent through pending to ready, and tell their listeners', () => {
    const late = new LateResults();
    const seen: string[] = [];
    const subscription = late.onDidChange((change) => seen.push(`${change.kind}:${change.key}:${late.get(change.kind, change.key).state}`));
    expect(late.get('mean-field', 'k').state).toBe('absent');
    late.pending('mean-field', 'k', 0.5);
    expect(late.get('mean-field', 'k')).toEqual({ state: 'pending', progress: 0.5 });
    late.ready('mean-field', 'k', { energy: -1.1 });
    expect(late.get<{ energy: number }>('mean-field', 'k')).toEqual({ state: 'ready', value: { energy: -1.1 } });
    late.failed('mean-field', 'other', 'no convergence');
    subscription.dispose();
    late.forget('mean-field', 'k');
    expect(late.get('mean-field', 'k').state).toBe('absent');
    expect(seen).toEqual(['mean-field:k:pending', 'mean-field:k:ready', 'mean-field:other:failed']);
  });

  it('are keyed by what determines them: a moved atom changes the key, a label does not', () => {
    const { host, set } = documents();
    set('file:///w/a.tess', 1, 'basis sto-3g\nstructure { H a 0 0 0; H b 0 0 0.74 }\nfragment h2 { atoms rest; tier quantum { method vqe } }\n');
    const before = fragmentInputKey(host.get('file:///w/a.tess')!.model, 0);
    set('file:///w/a.tess', 2, 'basis sto-3g\nstructure { H x 0 0 0; H y 0 0 0.74 }\nfragment h2 { atoms rest; tier quantum { method vqe } }\n');
    expect(fragmentInputKey(host.get('file:///w/a.tess')!.model, 0)).toBe(before);
    set('file:///w/a.tess', 3, 'basis sto-3g\nstructure { H x 0 0 0; H y 0 0 0.75 }\nfragment h2 { atoms rest; tier quantum { method vqe } }\n');
    expect(fragmentInputKey(host.get('file:///w/a.tess')!.model, 0)).not.toBe(before);
  });
});
