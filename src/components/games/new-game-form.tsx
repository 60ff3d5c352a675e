"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { primaryButton, showRefusal, TextInput } from "@/components/forms/fields";
import { newGameSchema } from "@/lib/authoring";
import { sendJson } from "@/lib/fetcher";

const FIELDS = ["name", "summary", "fps", "fastest", "launchAt", "edition"];

/** A coach or owner starts a game of the team's own: its settings and the name of its first Edition. */
export function NewGameForm({ team }: { team: string }) {
  const router = useRouter();
  const form = useForm<z.input<typeof newGameSchema>, unknown, z.output<typeof newGameSchema>>({
    resolver: zodResolver(newGameSchema),
    defaultValues: { name: "", summary: "", fps: 60, fastest: 10, launchAt: 15, edition: "1.0" },
  });
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
