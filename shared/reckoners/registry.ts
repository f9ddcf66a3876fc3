/** The one registry of reckoners, keyed by their stable kind ids. */
import { bleeder } from './bleeder';
import { chokeInput } from './choke-input';
import { dropperLadder } from './dropper-ladder';
import { heaterBudget } from './heater-budget';
import { loadedBplus } from './loaded-bplus';
import { mainsConversion } from './mains-conversion';
import { mainsFuse } from './mains-fuse';
import { partRatings } from './part-ratings';
import { peakNoLoad } from './peak-no-load';
import { readingTolerance } from './reading-tolerance';
import { rectifierSubstitution } from './rectifier-substitution';
import { switchOnSurge } from './switch-on-surge';
import { transformerLoading } from './transformer-loading';
import type { AnyReckoner } from './types';

export const reckoners = {
  'mains-fuse': mainsFuse,
  'peak-no-load': peakNoLoad,
  'loaded-bplus': loadedBplus,
  'dropper-ladder': dropperLadder,
  'choke-input': chokeInput,
  bleeder,
  'heater-budget': heaterBudget,
  'reading-tolerance': readingTolerance,
  'mains-conversion': mainsConversion,
  'switch-on-surge': switchOnSurge,
  'transformer-loading': transformerLoading,
  'rectifier-substitution': rectifierSubstitution,
  'part-ratings': partRatings,
} as const satisfies Record<string, AnyReckoner>;

export type ReckonerKind = keyof typeof reckoners;
export const RECKONER_KINDS = Object.keys(reckoners) as ReckonerKind[];

export function isReckonerKind(kind: unknown): kind is ReckonerKind {
  return typeof kind === 'string' && Object.prototype.hasOwnProperty.call(reckoners, kind);
}

export function getReckoner(kind: string): AnyReckoner | undefined {
  return isReckonerKind(kind) ? reckoners[kind] : undefined;
}

export function listReckoners(): AnyReckoner[] {
  return RECKONER_KINDS.map((k) => reckoners[k]);
}
