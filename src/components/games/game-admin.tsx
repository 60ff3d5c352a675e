"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { FormEnd, primaryButton, showRefusal, TextInput } from "@/components/forms/fields";
import { newCharacterSchema, newEditionSchema } from "@/lib/authoring";
import { AppError } from "@/lib/errors";
import { sendJson } from "@/lib/fetcher";

interface EditionRow {
  slug: string;
  name: string;
  status: "draft" | "published";
}

/** What a coach or owner changes on a team's game: characters, and the Editions' lifecycle. */
export function GameAdmin({ game, editions }: { game: string; editions: EditionRow[] }) {
  const newest = editions[0];
  return (
    <div className="grid gap-6 md:grid-cols-2">
      <NewCharacterForm game={game} />
      {newest?.status === "draft" ? (
        <PublishDraft game={game} draft={newest} />
      ) : (
        <NextEditionForm game={game} from={newest?.name ?? null} />
      )}
    </div>
  );
}

function NewCharacterForm({ game }: { game: string }) {
  const router = useRouter();
  const form = useForm<z.input<typeof newCharacterSchema>, unknown, z.output<typeof newCharacterSchema>>({
    resolver: zodResolver(newCharacterSchema),
    defaultValues: { name: "", summary: "" },
  });
  const submit = form.handleSubmit(async (values) => {
    try {
      await sendJson("POST", `/api/games/${encodeURIComponent(game)}/characters`, values);
      form.reset();
      router.refresh();
    } catch (error) {
      showRefusal(error, form.setError, ["name", "summary"]);
    }
  });
  return (
    <form onSubmit={submit} aria-label="Add a character" className="space-y-3" noValidate>
      <h3 className="font-medium">Add a character</h3>
      <TextInput form={form} name="name" id="character-name" label="Name" />
      <TextInput form={form} name="summary" id="character-summary" label="Summary (optional)" />
      <FormEnd busy={form.formState.isSubmitting} label="Add character" error={form.formState.errors.root?.message} />
    </form>
  );
}

function NextEditionForm({ game, from }: { game: string; from: string | null }) {
  const router = useRouter();
  const form = useForm<z.input<typeof newEditionSchema>, unknown, z.output<typeof newEditionSchema>>({
    resolver: zodResolver(newEditionSchema),
    defaultValues: { name: "", releasedOn: "", notes: "" },
  });
  const submit = form.handleSubmit(async (values) => {
    try {
      await sendJson("POST", `/api/games/${encodeURIComponent(game)}/editions`, values);
      router.refresh();
    } catch (error) {
      showRefusal(error, form.setError, ["name", "releasedOn", "notes"]);
    }
  });
  return (
    <form onSubmit={submit} aria-label="Start the next Edition" className="space-y-3" noValidate>
      <h3 className="font-medium">Start the next Edition</h3>
      <p className="text-sm text-ink-300">
        {from
          ? `A draft copy of ${from}: enter the patch's changes, then publish it.`
          : "The first Edition of this game, as a draft."}
      </p>
      <TextInput form={form} name="name" id="edition-name" label="Name" hint="The patch it is, e.g. 1.04" />
      <TextInput form={form} name="releasedOn" id="edition-date" label="Released on (optional)" type="date" />
      <FormEnd busy={form.formState.isSubmitting} label="Start the draft" error={form.formState.errors.root?.message} />
    </form>
  );
}

function PublishDraft({ game, draft }: { game: string; draft: EditionRow }) {
  const router = useRouter();
  const [confirming, setConfirming] = useState(false);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const publish = async () => {
    setBusy(true);
    setError(null);
    try {
      await sendJson(
        "POST",
        `/api/games/${encodeURIComponent(game)}/editions/${encodeURIComponent(draft.slug)}/publish`,
      );
      setConfirming(false);
      router.refresh();
    } catch (e) {
      setError(e instanceof AppError ? e.message : "That did not work. Try again.");
    } finally {
      setBusy(false);
    }
  };
  return (
    <section aria-labelledby="publish-draft" className="space-y-3">
      <h3 id="publish-draft" className="font-medium">
        Publish {draft.name}
      </h3>
      <p className="text-sm text-ink-300">
        {draft.name} is a draft: only your team sees it, and it can still change. Publishing freezes it for good, so
        links and boards can be pinned to it; the next patch starts as a new draft.
      </p>
      {confirming ? (
        <div className="flex flex-wrap items-center gap-2">
          <button type="button" className={primaryButton} disabled={busy} onClick={() => void publish()}>
            {busy ? "Publishing…" : `Yes, publish ${draft.name}`}
          </button>
          <button
            type="button"
            className="rounded border border-ink-700 px-3 py-1.5 text-sm"
            onClick={() => setConfirming(false)}
          >
            Not yet
          </button>
        </div>
      ) : (
        <button type="button" className={primaryButton} onClick={() => setConfirming(true)}>
          Publish…
        </button>
      )}
      {error && (
        <p role="alert" className="text-sm text-ink-100">
          {error}
        </p>
      )}
    </section>
  );
}
