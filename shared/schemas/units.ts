import { z } from 'zod';
import type { Measure } from '../reckoners/types';
import { oneLine } from './text';

const text = (label: string, max: number) => oneLine(max, { label });
const multiLine = (label: string, max: number) => z.string().trim().max(max).meta({ title: label });

/** A unit on the bench, as entered by the shop. */
export const unitBody = z
  .object({
    model: oneLine(80, { min: 1, label: 'Model' }),
    serial: oneLine(80, { min: 1, label: 'Serial' }),
    owner: text('Owner', 120).default(''),
    jobNumber: text('Job number', 40).default(''),
    notes: multiLine('Notes', 4000).default(''),
  })
  .strict();
export type UnitBody = z.input<typeof unitBody>;

export const updateUnitBody = unitBody
  .extend({ lockVersion: z.number().int().min(1).meta({ title: 'Version of the unit' }) })
  .strict();

export const unitListQuery = z
  .object({
    q: z.string().trim().max(80).meta({ title: 'Search' }).optional(),
    model: z.string().trim().max(80).meta({ title: 'Model' }).optional(),
    state: z.enum(['open-run', 'out', 'never-run']).meta({ title: 'Show' }).optional(),
  })
  .strict();

export interface UnitPhotoView {
  id: string;
  attachmentId: string;
  url: string;
  caption: string;
  addedAt: string;
}

export interface UnitView {
  id: string;
  model: string;
  serial: string;
  owner: string;
  jobNumber: string;
  notes: string;
  lockVersion: number;
  createdAt: string;
  updatedAt: string;
  createdBy: { id: string; displayName: string };
}

export interface UnitListItem extends UnitView {
  runCount: number;
  openRuns: number;
  outRuns: number;
  lastRunAt: string | null;
}

export interface UnitRunSummary {
  id: string;
  title: string;
  revisionNumber: number;
  /** The revision's state now: approved (still current), superseded or withdrawn. */
  revisionState: string;
  status: 'in_progress' | 'signed' | 'abandoned';
  outOfTolerance: boolean;
  startedAt: string;
  signedAt: string | null;
  startedBy: { id: string; displayName: string };
  params: { mainsVoltage: number; mainsFrequency: number };
}

export interface TrendPoint {
  runId: string;
  at: string;
  revisionNumber: number;
  measured: number;
  expected: number | null;
  low: number | null;
  high: number | null;
  within: boolean | null;
  mainsVoltage: number;
}

export interface TrendView {
  /** Readings recorded on this unit across runs, to pick one. */
  readings: { id: string; label: string; unit: string; measure: Measure | null; count: number }[];
  reading: { id: string; label: string; unit: string; measure: Measure | null } | null;
  points: TrendPoint[];
}
