/**
 * zod schemas for the arguments of every HostApi call, shared by both adapters (IPC in
 * Electron, HTTP in browser mode). Nothing reaches a host service unvalidated.
 * Errors read like: `saveFile: argument 1 .suggestedName: expected string, received number`.
 */
import { z } from 'zod';
import { HOST_CALLS, type HostApi, type HostCall } from '../../shared-types/host-api.ts';
import { FILE_ID_PATTERN } from './opened-files.ts';

const path = z.string().min(1, 'must not be empty').max(4096, 'is too long').refine((p) => !p.includes('\0'), 'contains a NUL byte');
const fileId = z.string().regex(FILE_ID_PATTERN, 'is not a file id handed out by the host');
const purpose = z.enum(['tracking', 'events', 'footage', 'mapping', 'project', 'any']);

export const saveRequestSchema = z.strictObject({
  suggestedName: z.string().min(1).max(255),
  directory: path.optional(),
  bytes: z.instanceof(Uint8Array),
  overwrite: z.boolean().optional(),
});

/** The save request without its bytes: browser mode sends those as the raw body. */
export const saveMetaSchema = saveRequestSchema.omit({ bytes: true });

const sessionId = z.string().regex(/^[A-Za-z0-9_-]{8,64}$/, 'is not an export session id handed out by the host');
const positive = z.number().finite().positive();

export const nativeClipStartSchema = z.strictObject({
  fileId,
  inT: z.number().finite().min(0),
  frames: z.number().int().positive().max(10_000_000),
  fps: positive.max(1000),
  width: z.number().int().positive().max(8192),
  height: z.number().int().positive().max(8192),
  cardFrames: z.number().int().min(0).max(100_000).optional(),
  overlay: z.boolean(),
  directory: path,
  name: z.string().min(1).max(255),
  overwrite: z.boolean().optional(),
});

export const HOST_ARG_SCHEMAS = {
  info: z.tuple([]),
  chooseFiles: z.tuple([purpose, z.boolean()]),
  listDirectory: z.tuple([path.optional()]),
  openPaths: z.tuple([z.array(path).min(1, 'needs at least one path').max(1000)]),
  demoMatch: z.tuple([]),
  probeFootage: z.tuple([fileId]),
  playableFootage: z.tuple([fileId]),
  saveFile: z.tuple([saveRequestSchema]),
  nativeClipStart: z.tuple([nativeClipStartSchema]),
  nativeClipFrames: z.tuple([sessionId, z.instanceof(Uint8Array)]),
  nativeClipFinish: z.tuple([sessionId]),
  nativeClipCancel: z.tuple([sessionId]),
} satisfies Record<HostCall, z.ZodType>;

export type HostArgs<C extends HostCall> = Parameters<HostApi[C]>;

export function isHostCall(name: string): name is HostCall {
  return (HOST_CALLS as readonly string[]).includes(name);
}

/** A validation failure the adapters turn into a 400 / rejected IPC promise. */
export class HostArgumentError extends Error {
  override name = 'HostArgumentError';
}

function describe(issue: z.core.$ZodIssue): string {
  const [index, ...rest] = issue.path;
  const where = index === undefined ? 'arguments' : `argument ${Number(index) + 1}${rest.length ? ' .' + rest.join('.') : ''}`;
  return `${where}: ${issue.message}`;
}

/** Validates `args` for `call`; throws HostArgumentError naming the call and argument. */
export function validateArgs<C extends HostCall>(call: C, args: unknown): HostArgs<C> {
  if (!Array.isArray(args)) throw new HostArgumentError(`${call}: arguments: expected a list of arguments, received ${typeof args}`);
  const schema = HOST_ARG_SCHEMAS[call];
  // Arity first, in words: "expected 2 arguments, got 1" reads better than a tuple error.
  const items = (schema.def as { items: { safeParse(v: unknown): { success: boolean } }[] }).items;
  const required = items.filter((item) => !item.safeParse(undefined).success).length;
  if (args.length < required || args.length > items.length) {
    const expected = required === items.length ? `${items.length}` : `${required} to ${items.length}`;
    throw new HostArgumentError(`${call}: expected ${expected} argument${items.length === 1 ? '' : 's'}, got ${args.length}`);
  }
  const result = schema.safeParse(args);
  if (!result.success) {
    throw new HostArgumentError(`${call}: ${result.error.issues.map(describe).join('; ')}`);
  }
  return result.data as HostArgs<C>;
}
