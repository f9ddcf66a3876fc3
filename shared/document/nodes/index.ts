/**
 * Every node a procedure document may hold, listed once. Each entry's module holds its attribute
 * schema, defaults, plain text, HTML and run step; the document schema, search extraction, the
 * server's HTML, run steps, the editor and the reader all read this list.
 */
import type { z } from 'zod';
import { checkStep } from './check-step';
import type { NodeDef } from './define';
import { file } from './file';
import { hazardNote } from './hazard-note';
import { image } from './image';
import * as prose from './prose';
import { reading } from './reading';
import { reckoner } from './reckoner';

/** The structured blocks: nodes with an id the procedure check, runs and the editor point at. */
export const BLOCKS = { reckoner, reading, checkStep, hazardNote, image, file } satisfies Record<
  string,
  NodeDef
>;
export const NODES = { ...prose, ...BLOCKS } satisfies Record<string, NodeDef>;

export type NodeType = keyof typeof NODES;
export type BlockType = keyof typeof BLOCKS;
export const NODE_TYPES = Object.keys(NODES) as NodeType[];
export const BLOCK_TYPES = Object.keys(BLOCKS) as BlockType[];
export const INLINE_TYPES: NodeType[] = ['text', 'hardBreak'];

/** A node's attributes as stored (after its schema), e.g. `AttrsOf<'reading'>`; none for a plain list. */
export type AttrsOf<T extends NodeType> = (typeof NODES)[T]['attrs'] extends z.ZodTypeAny
  ? z.output<(typeof NODES)[T]['attrs']>
  : Record<string, never>;

export const isNodeType = (type: unknown): type is NodeType =>
  typeof type === 'string' && Object.prototype.hasOwnProperty.call(NODES, type);

/** The node's definition, typed loosely for code that walks any node. */
export const nodeDef = (type: string): NodeDef | undefined =>
  isNodeType(type) ? (NODES[type] as NodeDef) : undefined;

export * from './define';
export * from './reckoner';
export * from './reading';
export * from './check-step';
export * from './hazard-note';
export * from './image';
export * from './file';
