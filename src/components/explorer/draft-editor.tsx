"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useEffect, useState, type ReactNode } from "react";
import { useForm, useWatch, type UseFormReturn } from "react-hook-form";
import { control, described, Field, FormEnd, showRefusal, TextInput } from "@/components/forms/fields";
import type { Dependents } from "@/lib/character-edit";
import { coachErrorMap, POSTURES, type PortableEdge, type PortableMove } from "@/lib/character-file";
import { linkChanges, moveFormSchema, toLinkForm, toMoveForm, type LinkForm, type MoveForm } from "@/lib/edit-forms";
import { LEVELS, type MoveGraph, type PathResult } from "@/lib/engine";
import { newStanceSchema } from "@/lib/authoring";
import { AppError, VersionConflict } from "@/lib/errors";
import { fetcher, sendJson } from "@/lib/fetcher";

/**
 * Changing a draft from the Explorer (coaches and owners, on a draft Edition): the node at the end
 * of the selected path, and the link into it, can be edited or deleted, and a follow-up, a cancel
 * or a stance move added from it. Each change is saved at once and the graph and every path
 * recompute. Keys, when no field has focus: E edit the move, F add a follow-up, C add a cancel,
 * S add a stance move, L edit the link, Delete delete the move; Escape closes a form.
 */

export interface DraftAddress {
  game: string;
  character: string;
  edition: string;
}

type Mode = "edit-move" | "follow-up" | "cancel" | "stance-move" | "edit-link" | "delete-move";

const KEYS: Record<string, Mode> = {
  e: "edit-move",
  f: "follow-up",
  c: "cancel",
  s: "stance-move",
  l: "edit-link",
  Delete: "delete-move",
};

const STANCE = "stance:";
const secondary = "rounded border border-ink-700 px-3 py-1.5 text-sm hover:border-ink-400";

function base(d: DraftAddress): string {
  return `/api/games/${encodeURIComponent(d.game)}/editions/${encodeURIComponent(d.edition)}/characters/${encodeURIComponent(d.character)}`;
}

const typing = (el: EventTarget | null) =>
  el instanceof HTMLElement && (el.isContentEditable || ["INPUT", "TEXTAREA", "SELECT"].includes(el.tagName));

export function DraftEditor({
  draft,
  graph,
  path,
  root,
  onChanged,
}: {
  draft: DraftAddress;
  graph: MoveGraph;
  /** The selected path; without one, the root. */
  path: PathResult | null;
  root: string;
  /** After a save: reload the graph, then select the path with these edges (or keep the selection). */
  onChanged: (select?: string[]) => Promise<void>;
}) {
  // An open form belongs to the node it was opened on: selecting another closes it.
  const [open, setOpen] = useState<{ mode: Mode; at: string } | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const nodeId = path ? path.nodes[path.nodes.length - 1]! : root;
  const node = graph.nodes.find((n) => n.id === nodeId);
  const edgeId = path?.edges[path.edges.length - 1];
  const edge = edgeId === undefined ? undefined : graph.edges.find((e) => e.id === edgeId);
  const isStance = node?.kind === "stance";
  const pathEdges = path ? [...path.edges] : [];

  const allowed = (m: Mode) =>
    m === "stance-move" ? isStance : m === "edit-link" ? edge !== undefined : !isStance && node !== undefined;

  const at = `${nodeId} ${edgeId ?? ""}`;
  const mode = open?.at === at ? open.mode : null;
  const setMode = (m: Mode | null) => setOpen(m === null ? null : { mode: m, at });

  useEffect(() => {
    const onKey = (event: KeyboardEvent) => {
      if (mode !== null || event.altKey || event.ctrlKey || event.metaKey || typing(event.target)) return;
      const wanted = KEYS[event.key];
      if (wanted && allowed(wanted)) {
        event.preventDefault();
        setDone(null);
        setMode(wanted);
      }
    };
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  });

  const finish = async (message: string, select?: string[]) => {
    setMode(null);
    setDone(message);
    await onChanged(select);
  };

  if (!node) return null;
  const label = isStance ? (node.kind === "stance" ? node.name : nodeId) : nodeId;
  const close = () => setMode(null);
  const common = { draft, onCancel: close };

  return (
    <section
      aria-labelledby="draft-editor"
      className="space-y-3 rounded-lg border border-accent-muted/60 p-3 text-sm"
      data-testid="draft-editor"
      onKeyDown={(e) => {
        if (e.key === "Escape" && mode !== null) {
          e.stopPropagation();
          close();
        }
      }}
    >
      <h2 id="draft-editor" className="text-xs font-semibold tracking-wider text-ink-400 uppercase">
        Change this draft · <span className="font-mono normal-case">{label}</span>
      </h2>
      {mode === null && (
        <div className="flex flex-wrap gap-2">
          {!isStance && (
            <>
              <Action keyHint="E" onClick={() => setMode("edit-move")}>
                Edit move
              </Action>
              <Action keyHint="F" onClick={() => setMode("follow-up")}>
                Add follow-up
              </Action>
              <Action keyHint="C" onClick={() => setMode("cancel")}>
                Add cancel
              </Action>
              <Action keyHint="Del" onClick={() => setMode("delete-move")}>
                Delete move…
              </Action>
            </>
          )}
          {isStance && (
            <Action keyHint="S" onClick={() => setMode("stance-move")}>
              Add stance move
            </Action>
          )}
          {edge && (
            <Action keyHint="L" onClick={() => setMode("edit-link")}>
              Edit link into it
            </Action>
          )}
        </div>
      )}
      {done && mode === null && (
        <p role="status" className="text-ink-300">
          {done}
        </p>
      )}
      {mode === "edit-move" && <EditMove {...common} moveKey={nodeId} onSaved={(m) => finish(m)} />}
      {mode === "follow-up" && (
        <NewMove
          {...common}
          via={{ kind: "follow", from: nodeId }}
          onSaved={(m, edgeKey) => finish(m, edgeKey ? [...pathEdges, edgeKey] : undefined)}
        />
      )}
      {mode === "stance-move" && (
        <NewMove
          {...common}
          via={{ kind: "enter", from: nodeId.slice(STANCE.length) }}
          onSaved={(m, edgeKey) => finish(m, edgeKey ? [...pathEdges, edgeKey] : undefined)}
        />
      )}
      {mode === "cancel" && (
        <NewCancel
          {...common}
          from={nodeId}
          stances={graph.nodes.flatMap((n) =>
            n.kind === "stance" ? [{ key: n.id.slice(STANCE.length), name: n.name }] : [],
          )}
          onSaved={(m, edgeKey) => finish(m, [...pathEdges, edgeKey])}
        />
      )}
      {mode === "edit-link" && edge && (
        <EditLink
          {...common}
          linkKey={edge.id}
          onSaved={(m, deleted) => finish(m, deleted ? pathEdges.slice(0, -1) : undefined)}
        />
      )}
      {mode === "delete-move" && (
        <DeleteMove {...common} moveKey={nodeId} onDeleted={(m) => finish(m, pathEdges.slice(0, -1))} />
      )}
    </section>
  );
}

function Action({ keyHint, onClick, children }: { keyHint: string; onClick: () => void; children: ReactNode }) {
  return (
    <button
      type="button"
      className={secondary}
      onClick={onClick}
      aria-keyshortcuts={keyHint === "Del" ? "Delete" : keyHint}
    >
      {children} <kbd className="ml-1 font-mono text-xs text-ink-400">{keyHint}</kbd>
    </button>
  );
}

/** Loads what a form edits (with its version), showing loading and errors. */
function useLoaded<T>(url: string) {
  const [state, setState] = useState<{ data: T | null; error: string | null }>({ data: null, error: null });
  useEffect(() => {
    let live = true;
    fetcher<T>(url).then(
      (data) => live && setState({ data, error: null }),
      (e: unknown) =>
        live && setState({ data: null, error: e instanceof AppError ? e.message : "It could not be loaded." }),
    );
    return () => {
      live = false;
    };
  }, [url]);
  return state;
}

function Loading({ error, onCancel }: { error: string | null; onCancel: () => void }) {
  return error ? (
    <div role="alert" className="space-y-2">
      <p>{error}</p>
      <button type="button" className={secondary} onClick={onCancel}>
        Close
      </button>
    </div>
  ) : (
    <p role="status" className="text-ink-400">
      Loading…
    </p>
  );
}

/**
 * The version a form's save is based on, and the row someone saved over it when a save was refused
 * (409). `rebase` takes their row as the new base, whichever values the coach then keeps.
 */
function useBasedOn<R extends { version: number }>(start: number) {
  const [version, setVersion] = useState(start);
  const [theirs, setTheirs] = useState<R | null>(null);
  const rebase = (): R => {
    const row = theirs!;
    setVersion(row.version);
    setTheirs(null);
    return row;
  };
  return { version, theirs, setTheirs, rebase };
}

// ---------------------------------------------------------------------------
// Moves

/** The move form's fields, where a refusal from the server may land. */
const MOVE_FIELDS = Object.keys(toMoveForm());

const FIELD_LABEL: Record<string, string> = {
  key: "Key",
  input: "Input",
  name: "Name",
  level: "Level",
  damage: "Damage",
  startup: "Startup",
  onBlock: "On block",
  onHit: "On hit",
  onCounterHit: "On counter hit",
  range: "Range",
  tags: "Tags",
  notes: "Notes",
  fromPosture: "Done from",
  gapOnBlock: "Gap on block",
  comboOnHit: "Combos on hit",
  comboOnCounterHit: "Combos on counter hit",
  autoGuard: "Auto-guard",
};

const OUTCOME_HINT = "-5, +3, launch, knockdown 4";

function MoveFields({
  form,
  prefix,
  withKey,
}: {
  form: UseFormReturn<MoveForm, unknown, ParsedMove>;
  prefix: string;
  withKey: boolean;
}) {
  const errors = form.formState.errors;
  return (
    <div className="grid grid-cols-2 gap-2">
      <TextInput form={form} name="input" id={`${prefix}-input`} label="Input" hint="e.g. n.v or drift:t" />
      <TextInput form={form} name="name" id={`${prefix}-name`} label="Name" />
      {withKey && (
        <TextInput form={form} name="key" id={`${prefix}-key`} label="Key (optional)" hint="Defaults to the input" />
      )}
      <Field id={`${prefix}-level`} label="Level" error={errors.level}>
        <select {...form.register("level")} {...described(`${prefix}-level`, errors.level)} className={control}>
          {LEVELS.map((l) => (
            <option key={l}>{l}</option>
          ))}
        </select>
      </Field>
      <TextInput form={form} name="damage" id={`${prefix}-damage`} label="Damage" />
      <TextInput form={form} name="startup" id={`${prefix}-startup`} label="Startup" hint="Frames; empty if unknown" />
      <TextInput form={form} name="onBlock" id={`${prefix}-on-block`} label="On block" hint={OUTCOME_HINT} />
      <TextInput form={form} name="onHit" id={`${prefix}-on-hit`} label="On hit" />
      <TextInput form={form} name="onCounterHit" id={`${prefix}-on-counter-hit`} label="On counter hit" />
      <Field id={`${prefix}-posture`} label="Done from" error={errors.fromPosture}>
        <select
          {...form.register("fromPosture")}
          {...described(`${prefix}-posture`, errors.fromPosture)}
          className={control}
        >
          {POSTURES.map((p) => (
            <option key={p}>{p}</option>
          ))}
        </select>
      </Field>
      <TextInput form={form} name="range" id={`${prefix}-range`} label="Range (optional)" />
      <TextInput form={form} name="tags" id={`${prefix}-tags`} label="Tags" hint="Separated by ;" />
      <div className="col-span-2">
        <TextInput form={form} name="notes" id={`${prefix}-notes`} label="Notes" />
      </div>
    </div>
  );
}

const moveResolver = zodResolver(moveFormSchema, { error: coachErrorMap });
type ParsedMove = Omit<PortableMove, "key" | "stance"> & { key?: string; stance?: string | null };
const useMoveForm = (values: MoveForm) =>
  useForm<MoveForm, unknown, ParsedMove>({ resolver: moveResolver as never, defaultValues: values });

interface EditableMove {
  key: string;
  version: number;
  move: PortableMove;
}

function EditMove({
  draft,
  moveKey,
  onCancel,
  onSaved,
}: {
  draft: DraftAddress;
  moveKey: string;
  onCancel: () => void;
  onSaved: (message: string) => Promise<void>;
}) {
  const loaded = useLoaded<EditableMove>(`${base(draft)}/moves/${encodeURIComponent(moveKey)}`);
  if (!loaded.data) return <Loading error={loaded.error} onCancel={onCancel} />;
  return <EditMoveForm draft={draft} start={loaded.data} onCancel={onCancel} onSaved={onSaved} />;
}

function EditMoveForm({
  draft,
  start,
  onCancel,
  onSaved,
}: {
  draft: DraftAddress;
  start: EditableMove;
  onCancel: () => void;
  onSaved: (message: string) => Promise<void>;
}) {
  const based = useBasedOn<EditableMove>(start.version);
  const form = useMoveForm(toMoveForm(start.move));
  const save = async ({ key: _key, stance: _stance, ...changes }: ParsedMove, basedOn = based.version) => {
    try {
      await sendJson("PATCH", `${base(draft)}/moves/${encodeURIComponent(start.key)}`, { version: basedOn, changes });
      await onSaved(`Saved ${start.key}.`);
    } catch (error) {
      if (error instanceof VersionConflict) based.setTheirs(error.current as EditableMove);
      else showRefusal(error, form.setError, MOVE_FIELDS);
    }
  };
  return (
    <form
      onSubmit={form.handleSubmit((v) => save(v))}
      aria-label={`Edit ${start.key}`}
      className="space-y-3"
      noValidate
    >
      <MoveFields form={form} prefix="edit-move" withKey={false} />
      {based.theirs ? (
        <Conflict
          what={start.key}
          theirs={toMoveForm(based.theirs.move)}
          yours={form.getValues()}
          onTheirs={() => form.reset(toMoveForm(based.rebase().move))}
          onYours={form.handleSubmit((v) => save(v, based.rebase().version))}
        />
      ) : (
        <FormEnd busy={form.formState.isSubmitting} label="Save move" error={form.formState.errors.root?.message}>
          <button type="button" className={secondary} onClick={onCancel}>
            Cancel
          </button>
        </FormEnd>
      )}
    </form>
  );
}

type ViaStart = { kind: "follow"; from: string } | { kind: "enter"; from: string };

function NewMove({
  draft,
  via,
  onCancel,
  onSaved,
}: {
  draft: DraftAddress;
  via: ViaStart;
  onCancel: () => void;
  onSaved: (message: string, edgeKey: string | null) => Promise<void>;
}) {
  const form = useMoveForm(toMoveForm());
  const link = useForm<LinkForm>({ defaultValues: toLinkForm() });
  const submit = form.handleSubmit(async (move) => {
    const parsed = linkChanges(via.kind, link.getValues());
    if (!parsed.success) {
      for (const issue of parsed.error.issues)
        link.setError(String(issue.path[0]) as keyof LinkForm, { message: issue.message });
      return;
    }
    try {
      const made = await sendJson<{ move: { key: string }; edge: { key: string } | null }>(
        "POST",
        `${base(draft)}/moves`,
        { move, via: { kind: via.kind, from: via.from, ...parsed.data } },
      );
      await onSaved(`Added ${made?.move.key ?? "the move"}.`, made?.edge?.key ?? null);
    } catch (error) {
      showRefusal(error, form.setError, MOVE_FIELDS);
    }
  });
  const title = via.kind === "follow" ? `A follow-up of ${via.from}` : `A move from the stance ${via.from}`;
  return (
    <form onSubmit={submit} aria-label={title} className="space-y-3" noValidate>
      <h3 className="font-medium">{title}</h3>
      <LinkFields form={link} kind={via.kind} prefix="new-link" />
      <MoveFields form={form} prefix="new-move" withKey />
      <FormEnd busy={form.formState.isSubmitting} label="Add move" error={form.formState.errors.root?.message}>
        <button type="button" className={secondary} onClick={onCancel}>
          Cancel
        </button>
      </FormEnd>
    </form>
  );
}

function DeleteMove({
  draft,
  moveKey,
  onCancel,
  onDeleted,
}: {
  draft: DraftAddress;
  moveKey: string;
  onCancel: () => void;
  onDeleted: (message: string) => Promise<void>;
}) {
  const url = `${base(draft)}/moves/${encodeURIComponent(moveKey)}`;
  const loaded = useLoaded<EditableMove & { dependents: Dependents }>(url);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  if (!loaded.data) return <Loading error={loaded.error} onCancel={onCancel} />;
  const { dependents, version } = loaded.data;
  const remove = async () => {
    setBusy(true);
    try {
      await sendJson("DELETE", `${url}?version=${version}`);
      await onDeleted(`Deleted ${moveKey}.`);
    } catch (e) {
      setError(e instanceof AppError ? e.message : "That did not work. Try again.");
      setBusy(false);
    }
  };
  const goes = dependents.moves.length + dependents.edges.length;
  return (
    <div role="alertdialog" aria-labelledby="delete-move-title" className="space-y-2">
      <h3 id="delete-move-title" className="font-medium">
        Delete {moveKey}?
      </h3>
      {goes === 0 ? (
        <p className="text-ink-300">Nothing else depends on it.</p>
      ) : (
        <div className="space-y-1 text-ink-300">
          <p>These go with it:</p>
          <ul className="list-inside list-disc font-mono text-xs" data-testid="delete-dependents">
            {dependents.moves.map((m) => (
              <li key={`m-${m}`}>move {m}</li>
            ))}
            {dependents.edges.map((e) => (
              <li key={`e-${e}`}>link {e}</li>
            ))}
          </ul>
        </div>
      )}
      <div className="flex flex-wrap gap-2">
        <button
          type="button"
          className="rounded bg-block-launch-punishable px-3 py-1.5 text-sm text-ink-950"
          disabled={busy}
          onClick={() => void remove()}
          autoFocus
        >
          {busy ? "Deleting…" : goes === 0 ? `Delete ${moveKey}` : `Delete ${moveKey} and ${goes} more`}
        </button>
        <button type="button" className={secondary} onClick={onCancel}>
          Keep it
        </button>
      </div>
      {error && <p role="alert">{error}</p>}
    </div>
  );
}

// ---------------------------------------------------------------------------
// Links

function LinkFields({
  form,
  kind,
  prefix,
}: {
  form: UseFormReturn<LinkForm>;
  kind: PortableEdge["kind"];
  prefix: string;
}) {
  const errors = form.formState.errors;
  return (
    <div className="grid grid-cols-2 gap-2">
      <TextInput
        form={form}
        name="input"
        id={`${prefix}-input`}
        label={kind === "cancel" ? "Cancel input" : "Link input"}
        hint={kind === "follow" ? "e.g. ,2" : kind === "cancel" ? "e.g. ~b" : "e.g. 3"}
      />
      {kind === "follow" && (
        <>
          <TextInput
            form={form}
            name="gapOnBlock"
            id={`${prefix}-gap`}
            label="Gap on block"
            hint="Frames the defender is free"
          />
          <Check form={form} name="comboOnHit" id={`${prefix}-combo-hit`} label="Combos on hit" />
          <Check form={form} name="comboOnCounterHit" id={`${prefix}-combo-ch`} label="Combos on counter hit" />
        </>
      )}
      {kind === "cancel" && (
        <>
          <TextInput form={form} name="onBlock" id={`${prefix}-on-block`} label="On block" hint={OUTCOME_HINT} />
          <TextInput form={form} name="onHit" id={`${prefix}-on-hit`} label="On hit" />
          <TextInput form={form} name="onCounterHit" id={`${prefix}-on-counter-hit`} label="On counter hit" />
          <fieldset className="col-span-2 flex flex-wrap gap-3">
            <legend className="text-ink-400">Auto-guard</legend>
            {LEVELS.map((l) => (
              <label key={l} className="flex items-center gap-1">
                <input type="checkbox" value={l} {...form.register("autoGuard")} /> {l}
              </label>
            ))}
            {errors.autoGuard?.message && <span role="alert">{errors.autoGuard.message}</span>}
          </fieldset>
        </>
      )}
    </div>
  );
}

function Check({
  form,
  name,
  id,
  label,
}: {
  form: UseFormReturn<LinkForm>;
  name: "comboOnHit" | "comboOnCounterHit";
  id: string;
  label: string;
}) {
  return (
    <label htmlFor={id} className="flex items-center gap-2 self-end py-1">
      <input id={id} type="checkbox" {...form.register(name)} /> {label}
    </label>
  );
}

/** The choice in the cancel form's stance list that makes a new stance first. */
const NEW_STANCE = "";

function NewCancel({
  draft,
  from,
  stances,
  onCancel,
  onSaved,
}: {
  draft: DraftAddress;
  from: string;
  stances: { key: string; name: string }[];
  onCancel: () => void;
  onSaved: (message: string, edgeKey: string) => Promise<void>;
}) {
  type CancelForm = LinkForm & { to: string; stanceKey: string; stanceName: string; stanceLabel: string };
  const form = useForm<CancelForm>({
    defaultValues: {
      ...toLinkForm(),
      to: stances[0]?.key ?? NEW_STANCE,
      stanceKey: "",
      stanceName: "",
      stanceLabel: "",
    },
  });
  const making = useWatch({ control: form.control, name: "to" }) === NEW_STANCE;
  const submit = form.handleSubmit(async ({ to, stanceKey, stanceName, stanceLabel, ...values }) => {
    const parsed = linkChanges("cancel", values);
    if (!parsed.success) {
      for (const issue of parsed.error.issues)
        form.setError(String(issue.path[0]) as "input", { message: issue.message });
      return;
    }
    let into = to;
    if (making) {
      // The stance is made first; if the cancel is then refused, the stance stays and can be chosen next time.
      const stance = newStanceSchema.safeParse({ key: stanceKey, name: stanceName, abbreviation: stanceLabel });
      if (!stance.success) {
        const field = { key: "stanceKey", name: "stanceName", abbreviation: "stanceLabel" } as const;
        for (const issue of stance.error.issues)
          form.setError(field[String(issue.path[0]) as keyof typeof field] ?? "root", { message: issue.message });
        return;
      }
      try {
        await sendJson("POST", `${base(draft)}/stances`, stance.data);
      } catch (error) {
        showRefusal(error, form.setError, []);
        return;
      }
      into = stance.data.key;
    }
    try {
      const made = await sendJson<{ key: string }>("POST", `${base(draft)}/edges`, {
        edge: { kind: "cancel", from, to: into, ...parsed.data },
      });
      await onSaved(`Added the cancel ${made?.key ?? ""}.`, made!.key);
    } catch (error) {
      showRefusal(error, form.setError, ["input", "onBlock", "onHit", "onCounterHit", "autoGuard", "to"]);
    }
  });
  return (
    <form onSubmit={submit} aria-label={`A cancel from ${from}`} className="space-y-3" noValidate>
      <h3 className="font-medium">A cancel from {from}</h3>
      <Field id="new-cancel-to" label="Into the stance" error={form.formState.errors.to}>
        <select id="new-cancel-to" {...form.register("to")} className={control}>
          {stances.map((s) => (
            <option key={s.key} value={s.key}>
              {s.name}
            </option>
          ))}
          <option value={NEW_STANCE}>A new stance…</option>
        </select>
      </Field>
      {making && (
        <div className="grid grid-cols-3 gap-2">
          <TextInput form={form} name="stanceName" id="new-stance-name" label="Stance name" />
          <TextInput form={form} name="stanceLabel" id="new-stance-label" label="Short label" hint="e.g. drift" />
          <TextInput
            form={form}
            name="stanceKey"
            id="new-stance-key"
            label="Stance key"
            hint="Stays the same across Editions"
          />
        </div>
      )}
      <LinkFields form={form as unknown as UseFormReturn<LinkForm>} kind="cancel" prefix="new-cancel" />
      <FormEnd busy={form.formState.isSubmitting} label="Add cancel" error={form.formState.errors.root?.message}>
        <button type="button" className={secondary} onClick={onCancel}>
          Cancel
        </button>
      </FormEnd>
    </form>
  );
}

interface EditableEdge {
  key: string;
  version: number;
  edge: PortableEdge;
}

function EditLink({
  draft,
  linkKey,
  onCancel,
  onSaved,
}: {
  draft: DraftAddress;
  linkKey: string;
  onCancel: () => void;
  onSaved: (message: string, deleted: boolean) => Promise<void>;
}) {
  const loaded = useLoaded<EditableEdge>(`${base(draft)}/edges/${encodeURIComponent(linkKey)}`);
  if (!loaded.data) return <Loading error={loaded.error} onCancel={onCancel} />;
  return <EditLinkForm draft={draft} start={loaded.data} onCancel={onCancel} onSaved={onSaved} />;
}

function EditLinkForm({
  draft,
  start,
  onCancel,
  onSaved,
}: {
  draft: DraftAddress;
  start: EditableEdge;
  onCancel: () => void;
  onSaved: (message: string, deleted: boolean) => Promise<void>;
}) {
  const url = `${base(draft)}/edges/${encodeURIComponent(start.key)}`;
  const kind = start.edge.kind;
  const based = useBasedOn<EditableEdge>(start.version);
  const form = useForm<LinkForm>({ defaultValues: toLinkForm(start.edge) });
  const save = async (values: LinkForm, basedOn = based.version) => {
    const parsed = linkChanges(kind, values);
    if (!parsed.success) {
      for (const issue of parsed.error.issues)
        form.setError(String(issue.path[0]) as keyof LinkForm, { message: issue.message });
      return;
    }
    try {
      await sendJson("PATCH", url, { version: basedOn, changes: parsed.data });
      await onSaved(`Saved the link ${start.key}.`, false);
    } catch (error) {
      if (error instanceof VersionConflict) based.setTheirs(error.current as EditableEdge);
      else showRefusal(error, form.setError, Object.keys(FIELD_LABEL));
    }
  };
  const remove = async () => {
    try {
      await sendJson("DELETE", `${url}?version=${based.version}`);
      await onSaved(`Deleted the link ${start.key}.`, true);
    } catch (error) {
      if (error instanceof VersionConflict) based.setTheirs(error.current as EditableEdge);
      else showRefusal(error, form.setError, []);
    }
  };
  return (
    <form
      onSubmit={form.handleSubmit((v) => save(v))}
      aria-label={`Edit the link ${start.key}`}
      className="space-y-3"
      noValidate
    >
      <h3 className="font-medium">
        The {kind} <span className="font-mono">{start.key}</span>
      </h3>
      <LinkFields form={form} kind={kind} prefix="edit-link" />
      {based.theirs ? (
        <Conflict
          what={start.key}
          theirs={toLinkForm(based.theirs.edge)}
          yours={form.getValues()}
          onTheirs={() => form.reset(toLinkForm(based.rebase().edge))}
          onYours={form.handleSubmit((v) => save(v, based.rebase().version))}
        />
      ) : (
        <FormEnd busy={form.formState.isSubmitting} label="Save link" error={form.formState.errors.root?.message}>
          <button type="button" className={secondary} onClick={onCancel}>
            Cancel
          </button>
          <button type="button" className={secondary} onClick={() => void remove()}>
            Delete link
          </button>
        </FormEnd>
      )}
    </form>
  );
}

// ---------------------------------------------------------------------------
// Someone saved first

/**
 * Someone saved the row after this editor opened it: their values and yours side by side, the
 * fields that differ marked, and the coach chooses which to keep. Nothing is saved until they do.
 */
function Conflict({
  what,
  theirs,
  yours,
  onTheirs,
  onYours,
}: {
  what: string;
  theirs: Record<string, unknown>;
  yours: Record<string, unknown>;
  onTheirs: () => void;
  onYours: () => void;
}) {
  const show = (v: unknown) =>
    Array.isArray(v) ? v.join(", ") : v === true ? "yes" : v === false ? "no" : String(v ?? "");
  const fields = Object.keys(theirs).filter((f) => f in FIELD_LABEL && show(theirs[f]) !== show(yours[f]));
  return (
    <div role="alert" className="space-y-2 rounded border border-block-punishable/60 p-2" data-testid="conflict">
      <p>
        Someone saved {what} after you opened it.{" "}
        {fields.length === 0 ? "Their values are the same as yours." : "Choose which values to keep:"}
      </p>
      {fields.length > 0 && (
        <table className="w-full text-left text-xs">
          <thead>
            <tr className="text-ink-400">
              <th scope="col">Field</th>
              <th scope="col">Theirs (saved)</th>
              <th scope="col">Yours</th>
            </tr>
          </thead>
          <tbody className="font-mono">
            {fields.map((f) => (
              <tr key={f}>
                <th scope="row" className="font-sans font-normal">
                  {FIELD_LABEL[f]}
                </th>
                <td>{show(theirs[f])}</td>
                <td>{show(yours[f])}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      <div className="flex flex-wrap gap-2">
        <button type="button" className={secondary} onClick={onTheirs}>
          Keep theirs
        </button>
        <button type="button" className={secondary} onClick={onYours}>
          Save mine over theirs
        </button>
      </div>
    </div>
  );
}
