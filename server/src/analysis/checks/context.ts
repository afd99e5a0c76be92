/** What a check over the estimates receives: the language-level context and the document's estimates. */
import type { CheckContext } from '../../language/checks/context';
import type { Estimates } from '../estimates';

export interface EstimateCheckContext extends CheckContext {
  readonly estimates: Estimates;
}

export type EstimateCheck = (context: EstimateCheckContext) => void;
