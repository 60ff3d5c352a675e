import { z } from "zod";
import { edgeChangesSchema, newMoveSchema } from "@/lib/character-edit";
import {
  coachErrorMap,
  outcomeCell,
  outcomeText,
  POSTURES,
  portableCancelSchema,
  portableFollowSchema,
  type PortableEdge,
  type PortableMove,
  type PortableOutcome,
} from "@/lib/character-file";
import { LEVELS } from "@/lib/engine";

/**
 * What the edit forms hold and how it becomes what the routes take. A form holds text (a number
 * field may be half typed, an outcome is `-5` or `launch` or `knockdown 3`, as in a CSV cell);
 * each schema reads the text and then checks the result with the file layer's own schemas, so a
 * form accepts what an import accepts, and an error lands on the field that caused it.
 */

/** A whole number as typed, or the text as it was, for the schema to say what is wrong with it. */
function whole(text: string): number | string {
  const t = text.trim();
  return /^[+-]?\d+$/.test(t) ? Number(t) : t;
}

const outcome = (text: string): PortableOutcome | string => outcomeCell(text.trim());

/** The move's numbers a coach fixes in place in the move list, each read from text as the form reads it. */
export const QUICK_FIELDS = {
  damage: whole,
  startup: (t: string) => (t.trim() === "" ? null : whole(t)),
  onBlock: outcome,
  onHit: outcome,
  onCounterHit: outcome,
} as const;
export type QuickField = keyof typeof QUICK_FIELDS;

/** One quick field's text as the value to save, or what is wrong with it in words. */
export function readQuickField(
  field: QuickField,
  text: string,
): { ok: true; value: unknown } | { ok: false; message: string } {
  // Checked as a field of a move, so the words name what an outcome or a number may be.
  const read = newMoveSchema
    .pick({ [field]: true } as Record<QuickField, true>)
    .safeParse({ [field]: QUICK_FIELDS[field](text) }, { error: coachErrorMap });
  return read.success
    ? { ok: true, value: (read.data as Record<string, unknown>)[field] }
    : { ok: false, message: read.error.issues[0]?.message ?? "is not valid" };
}

/** A quick field's value as the cell shows it for editing. */
export function quickFieldText(value: PortableOutcome | number | null): string {
  return value === null ? "" : typeof value === "number" ? String(value) : String(outcomeText(value));
}

export const moveFormSchema = z
  .object({
    key: z.string(),
    input: z.string(),
    name: z.string(),
    level: z.enum(LEVELS),
    damage: z.string(),
    startup: z.string(),
    onBlock: z.string(),
    onHit: z.string(),
    onCounterHit: z.string(),
    range: z.string(),
    tags: z.string(),
    notes: z.string(),
    fromPosture: z.enum(POSTURES),
  })
  .transform((f): unknown => ({
    ...(f.key.trim() === "" ? {} : { key: f.key.trim() }),
    input: f.input.trim(),
    name: f.name.trim(),
    level: f.level,
    damage: QUICK_FIELDS.damage(f.damage),
    startup: QUICK_FIELDS.startup(f.startup),
    onBlock: outcome(f.onBlock),
    onHit: outcome(f.onHit),
    onCounterHit: outcome(f.onCounterHit),
    range: f.range.trim() === "" ? null : f.range.trim(),
    tags: f.tags
      .split(";")
      .map((t) => t.trim())
      .filter((t) => t !== ""),
    notes: f.notes.trim() === "" ? null : f.notes,
    fromPosture: f.fromPosture,
  }))
  // The text read above may still be wrong (`-5x` stays text): the move's own schema says so, at its field.
  .pipe(newMoveSchema as z.ZodType<z.output<typeof newMoveSchema>, unknown>);

export type MoveForm = z.input<typeof moveFormSchema>;

/** A move's fields as the form shows them. */
export function toMoveForm(m: Partial<PortableMove> = {}): MoveForm {
  const text = (o: PortableOutcome | undefined) => (o === undefined ? "" : String(outcomeText(o)));
  return {
    key: m.key ?? "",
    input: m.input ?? "",
    name: m.name ?? "",
    level: m.level ?? "mid",
    damage: m.damage === undefined ? "" : String(m.damage),
    startup: m.startup == null ? "" : String(m.startup),
    onBlock: text(m.onBlock),
    onHit: text(m.onHit),
    onCounterHit: text(m.onCounterHit),
    range: m.range ?? "",
    tags: (m.tags ?? []).join("; "),
    notes: m.notes ?? "",
    fromPosture: m.fromPosture ?? "standing",
  };
}

/** The fields of a link as a form holds them, for every kind (a form shows its kind's). */
export const linkFormSchema = z
  .object({
    input: z.string(),
    gapOnBlock: z.string(),
    comboOnHit: z.boolean(),
    comboOnCounterHit: z.boolean(),
    onBlock: z.string(),
    onHit: z.string(),
    onCounterHit: z.string(),
    autoGuard: z.array(z.enum(LEVELS)),
  })
  .partial();

export type LinkForm = z.input<typeof linkFormSchema>;

/** The changes a link form makes to a link of this kind, checked with the link's own schema. */
export function linkChanges(kind: PortableEdge["kind"], f: LinkForm) {
  const input = f.input?.trim() ?? "";
  const changes =
    kind === "follow"
      ? {
          input,
          gapOnBlock: whole(f.gapOnBlock ?? ""),
          comboOnHit: f.comboOnHit ?? false,
          comboOnCounterHit: f.comboOnCounterHit ?? false,
        }
      : kind === "cancel"
        ? {
            input,
            onBlock: outcome(f.onBlock ?? ""),
            onHit: outcome(f.onHit ?? ""),
            onCounterHit: outcome(f.onCounterHit ?? ""),
            autoGuard: f.autoGuard ?? [],
          }
        : { input };
  const schema =
    kind === "follow"
      ? portableFollowSchema.pick({ input: true, gapOnBlock: true, comboOnHit: true, comboOnCounterHit: true })
      : kind === "cancel"
        ? portableCancelSchema.pick({ input: true, onBlock: true, onHit: true, onCounterHit: true, autoGuard: true })
        : portableFollowSchema.pick({ input: true });
  return edgeChangesSchema.pipe(schema).safeParse(changes);
}

/** A link's fields as the form shows them. */
export function toLinkForm(e?: PortableEdge): LinkForm {
  const text = (o: PortableOutcome) => String(outcomeText(o));
  if (!e)
    return {
      input: "",
      gapOnBlock: "0",
      comboOnHit: true,
      comboOnCounterHit: true,
      onBlock: "",
      onHit: "",
      onCounterHit: "",
      autoGuard: [],
    };
  return {
    input: e.input,
    ...(e.kind === "follow"
      ? { gapOnBlock: String(e.gapOnBlock), comboOnHit: e.comboOnHit, comboOnCounterHit: e.comboOnCounterHit }
      : {}),
    ...(e.kind === "cancel"
      ? { onBlock: text(e.onBlock), onHit: text(e.onHit), onCounterHit: text(e.onCounterHit), autoGuard: e.autoGuard }
      : {}),
  };
}
