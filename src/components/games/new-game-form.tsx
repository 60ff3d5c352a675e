"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useForm, useWatch } from "react-hook-form";
import type { z } from "zod";
import { control, described, Field, primaryButton, showRefusal, TextInput } from "@/components/forms/fields";
import { newGameSchema } from "@/lib/authoring";
import { sendJson } from "@/lib/fetcher";

const FIELDS = ["name", "summary", "fps", "fastest", "launchAt", "rangeKind", "rangeUnit", "edition"];

/** A coach or owner starts a game of the team's own: its settings and the name of its first Edition. */
export function NewGameForm({ team }: { team: string }) {
  const router = useRouter();
  const form = useForm<z.input<typeof newGameSchema>, unknown, z.output<typeof newGameSchema>>({
    resolver: zodResolver(newGameSchema),
    defaultValues: {
      name: "",
      summary: "",
      fps: 60,
      fastest: 10,
      launchAt: 15,
      rangeKind: "label",
      rangeUnit: "",
      edition: "1.0",
    },
  });
  const rangeKind = useWatch({ control: form.control, name: "rangeKind" });
  const { errors, isSubmitting } = form.formState;

  const submit = form.handleSubmit(async (values) => {
    try {
      const made = await sendJson<{ game: { slug: string } }>(
        "POST",
        `/api/teams/${encodeURIComponent(team)}/games`,
        values,
      );
      router.push(`/games/${made!.game.slug}`);
    } catch (error) {
      showRefusal(error, form.setError, FIELDS);
    }
  });

  const input = { form } as const;
  return (
    <form onSubmit={submit} aria-label="Start a game" className="grid max-w-2xl gap-3 sm:grid-cols-2" noValidate>
      <TextInput {...input} name="name" id="game-name" label="Game name" />
      <TextInput
        {...input}
        name="edition"
        id="game-edition"
        label="First Edition"
        hint="The patch you start from, e.g. 1.0"
      />
      <TextInput {...input} name="fps" id="game-fps" label="Frames per second" type="number" />
      <TextInput
        {...input}
        name="fastest"
        id="game-fastest"
        label="Fastest attack (frames)"
        hint="The opponent's quickest button: it decides what is safe"
        type="number"
      />
      <TextInput
        {...input}
        name="launchAt"
        id="game-launch"
        label="Launch punish from (frames)"
        hint="The disadvantage from which a launcher is assumed to punish"
        type="number"
      />
      <Field
        id="game-range-kind"
        label="Range is measured as"
        hint="Numbers let the move list and stance sheets find what reaches at a distance"
        error={errors.rangeKind}
      >
        <select {...form.register("rangeKind")} {...described("game-range-kind", errors.rangeKind)} className={control}>
          <option value="label">labels (close, far…)</option>
          <option value="number">numbers in a unit</option>
        </select>
      </Field>
      {rangeKind === "number" && (
        <TextInput {...input} name="rangeUnit" id="game-range-unit" label="Unit of range" hint="e.g. m" />
      )}
      <TextInput {...input} name="summary" id="game-summary" label="Summary (optional)" />
      <div className="flex items-center gap-3 sm:col-span-2">
        <button type="submit" disabled={isSubmitting} className={primaryButton}>
          {isSubmitting ? "Starting…" : "Start the game"}
        </button>
        {errors.root?.message && (
          <p role="alert" className="text-sm text-ink-100">
            {errors.root.message}
          </p>
        )}
      </div>
    </form>
  );
}
