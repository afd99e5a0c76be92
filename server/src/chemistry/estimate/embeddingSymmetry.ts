/**
 * Which point group a fragment's solver problem is counted in, per embedding.
 *
 * A fragment that stands alone keeps its own point group (detected from its atoms alone). A
 * fragment that sees its environment keeps only the operations of the whole system's group that
 * map the fragment onto itself — the stabiliser of the fragment's atoms in the system's group
 * (group theory of a group acting on sets; "site symmetry" in F. A. Cotton, Chemical Applications
 * of Group Theory, 1990): the environment's atoms, and so the potential or the bath they give, are
 * invariant under those operations only. The stabiliser is a subgroup of both the system's group
 * and the fragment's own group, so it never allows fewer integrals than either.
 */

export type EmbeddingName = 'dmet' | 'projection' | 'subtractive' | 'none';

/** `in-system`: the stabiliser of the fragment in the system's group; `own`: the fragment's own group. */
export type SymmetryScope = 'in-system' | 'own';

export const EMBEDDING_SYMMETRY: Readonly<Record<EmbeddingName, { readonly scope: SymmetryScope; readonly reason: string }>> = {
  dmet: {
    scope: 'in-system',
    reason: "DMET: the bath orbitals come from the whole system's mean field, so the impurity keeps only the operations of the system's group that map the fragment onto itself",
  },
  projection: {
    scope: 'in-system',
    reason: "projection-based embedding: the frozen environment's potential acts on the fragment, so it keeps only the operations of the system's group that map the fragment onto itself",
  },
  subtractive: {
    scope: 'own',
    reason: 'subtractive embedding: the fragment is computed alone (link atoms not counted), so its own point group applies',
  },
  none: {
    scope: 'own',
    reason: 'no embedding: the fragment is planned on its own, so its own point group applies',
  },
};

/**
 * The embedding as the symmetry rule reads it. Throws on a word that is not an embedding: the
 * language reports unknown words and leaves the model's default (`none`), so anything else here is
 * a bug, and counting it as `none` without a word would give the wrong point group.
 */
export function embeddingName(written: string): EmbeddingName {
  if (!Object.hasOwn(EMBEDDING_SYMMETRY, written)) throw new RangeError(`'${written}' is not an embedding (${Object.keys(EMBEDDING_SYMMETRY).join(', ')})`);
  return written as EmbeddingName;
}

export function symmetryScope(embedding: string): SymmetryScope {
  return EMBEDDING_SYMMETRY[embeddingName(embedding)].scope;
}
