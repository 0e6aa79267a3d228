// Contracts: the shape of every API answer, written once as a zod schema and shared by the server
// (which sends through it), the client (which types its calls with it) and the API tests (which
// parse every answer with it).
//
// The pattern (see also DEVELOPERS.md, "Contracts"):
//   - Layout: shared/contracts/<domain>.ts beside the input schemas of shared/schemas/<domain>.ts.
//     A record schema is PascalCase and named for who may read it: `PartForMoney` (owner, producer),
//     `PartForRetail` (marketing), `PartForCrew` (installer); a record without money has one schema
//     (`LabourEntry`). Its type is `export type PartForMoney = z.infer<typeof PartForMoney>`.
//     Answers wrap records: `PartAnswer = z.object({ part: … })`, `PartPage`, `PartList`.
//   - Per-role answers are an `Audiences` triple made by `audiences(money, crew, retail?)`; a
//     wrapper answer is a small generic factory applied to each: `const partAnswer = <S extends
//     z.ZodType>(p: S) => z.object({ part: p })`, `PartAnswer = audiences(partAnswer(PartForMoney), …)`.
//   - The server answers with `send(res, Contract, value)` or `sendFor(req, res, Audiences, value)`
//     (server/routes/send.ts): the value is typed against the contract, and only the fields the
//     contract names leave the server (`allow` below: an object contract IS the allow-list, so a
//     field added to a record later is hidden from everyone until a contract names it).
//   - Each domain file ends with its route table: `export const partRoutes = { 'GET /api/builds/
//     :buildId/parts': PartPage, … }` and shared/contracts/index.ts spreads every table into `API`.
//     The API tests' agents (tests/helpers/contract.ts) parse every answer with its route's
//     contract (for the agent's role) and fail on a field outside it.
//   - The client imports the inferred types (`import type { PartSeen } from '@shared/contracts/part'`);
//     `Seen<Money, Crew>` is the type a screen holds: crew fields present, money fields optional.
import { z } from 'zod';
import type { Role } from '../domain';

/** Who reads an answer: money (shop cost and every money figure), retail (retail prices only), crew (neither). */
export type Audience = 'money' | 'retail' | 'crew';

/** The one place a role is mapped to what it may read (DESIGN §2). Anonymous callers read as crew. */
export const ROLE_AUDIENCE: Record<Role, Audience> = {
  owner: 'money',
  producer: 'money',
  marketing: 'retail',
  installer: 'crew',
};
const WIDEST_FIRST: readonly Audience[] = ['money', 'retail', 'crew'];

/** The widest audience of a person's roles. */
export function audienceOf(roles: readonly string[] | undefined): Audience {
  const mine = new Set((roles ?? []).map((r) => ROLE_AUDIENCE[r as Role]).filter(Boolean));
  return WIDEST_FIRST.find((a) => mine.has(a)) ?? 'crew';
}

/** One contract per audience: each is the allow-list of the roles that read as that audience. */
export interface Audiences<
  M extends z.ZodType = z.ZodType,
  R extends z.ZodType = z.ZodType,
  C extends z.ZodType = z.ZodType,
> {
  money: M;
  retail: R;
  crew: C;
}
export function audiences<M extends z.ZodType, C extends z.ZodType, R extends z.ZodType = C>(
  money: M,
  crew: C,
  retail?: R,
): Audiences<M, R, C> {
  return { money, retail: (retail ?? crew) as R, crew };
}
export function isAudiences(c: unknown): c is Audiences {
  return !!c && typeof c === 'object' && 'money' in c && 'crew' in c && !(c instanceof z.ZodType);
}
/** The contract of one answer for one person. */
export function contractFor(c: z.ZodType | Audiences, roles: readonly string[] | undefined): z.ZodType {
  return isAudiences(c) ? c[audienceOf(roles)] : c;
}

/** What a screen holds of a per-role record: the crew's fields, and money fields when sent. */
export type Seen<Money, Crew> = Crew & Partial<Omit<Money, keyof Crew>>;

type Def = {
  type: string;
  shape?: Record<string, z.ZodType>;
  element?: z.ZodType;
  innerType?: z.ZodType;
  options?: z.ZodType[];
  valueType?: z.ZodType;
  in?: z.ZodType;
  getter?: () => z.ZodType;
  catchall?: z.ZodType;
};
const defOf = (s: z.ZodType) => (s as unknown as { _zod: { def: Def } })._zod.def;
const isPlain = (v: unknown): v is Record<string, unknown> =>
  !!v && typeof v === 'object' && !Array.isArray(v) && !(v instanceof Date);

/**
 * A copy of `value` holding only what `contract` names, at every depth (nothing is checked or
 * converted: it is the cheap allow-list the server sends through; tests parse with the contract).
 */
export function allow<S extends z.ZodType>(contract: S, value: z.input<S>): z.output<S>;
export function allow(contract: z.ZodType, value: unknown): unknown {
  const d = defOf(contract);
  switch (d.type) {
    case 'object': {
      if (!isPlain(value)) return value;
      const out: Record<string, unknown> = {};
      for (const [k, s] of Object.entries(d.shape!))
        if (k in value && value[k] !== undefined) out[k] = allow(s, value[k]);
      if (d.catchall && defOf(d.catchall).type !== 'never')
        for (const k of Object.keys(value)) if (!(k in d.shape!)) out[k] = allow(d.catchall, value[k]);
      return out;
    }
    case 'array':
      return Array.isArray(value) ? value.map((v) => allow(d.element!, v)) : value;
    case 'record':
      return isPlain(value)
        ? Object.fromEntries(Object.entries(value).map(([k, v]) => [k, allow(d.valueType!, v)]))
        : value;
    case 'optional':
    case 'nullable':
    case 'default':
    case 'prefault':
    case 'readonly':
    case 'nonoptional':
    case 'catch':
      return value === undefined || value === null ? value : allow(d.innerType!, value);
    case 'pipe':
      return allow(d.in!, value);
    case 'lazy':
      return allow(d.getter!(), value);
    case 'union': {
      if (!isPlain(value) && !Array.isArray(value)) return value;
      const fits = d.options!.find((o) => o.safeParse(value).success) ?? d.options![0]!;
      return allow(fits, value);
    }
    default:
      return value;
  }
}

// ---- Answers every domain uses

/** Every failure: { error: { code, message, fields? } } (server/middleware/errors.ts). */
export const ErrorAnswer = z.object({
  error: z.looseObject({
    code: z.string(),
    message: z.string(),
    fields: z.array(z.looseObject({ path: z.string(), message: z.string() })).optional(),
    requestId: z.string().optional(),
  }),
});
export type ErrorAnswer = z.infer<typeof ErrorAnswer>;

export const OkAnswer = z.object({ ok: z.literal(true) });
export type OkAnswer = z.infer<typeof OkAnswer>;

/** A 204: no body. */
export const NoContent = z.undefined();

/** An ISO timestamp as JSON carries it. */
export const timestamp = z.string().refine((s) => !Number.isNaN(Date.parse(s)), 'must be a timestamp');
/** YYYY-MM-DD. */
export const day = z.string().regex(/^\d{4}-\d{2}-\d{2}$/);
export const idNumber = z.number().int().positive();
export const centsOut = z.number().int();

/**
 * A route table: 'METHOD /api/path/:param' → the contract of its 2xx answer; 'METHOD /api/path 400' →
 * the contract of an error answer that carries more than ErrorAnswer.
 */
export type RouteTable = Record<string, z.ZodType | Audiences>;
