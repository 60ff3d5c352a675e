"use client";

import { useRouter } from "next/navigation";
import { useState, type FormEvent, type ReactNode } from "react";
import useSWR from "swr";
import { AppError } from "@/lib/errors";
import { fetcher, sendJson } from "@/lib/fetcher";
import type { AuditEntryDto, InviteDto, MemberDto, TeamDto, TeamPermalinkDto } from "@/lib/dto";
import { canRevoke, VISIBILITY_TEXT } from "@/lib/permalink";
import { atLeast, mayInvite, ROLES, type Role } from "@/lib/roles";
import { RoleTag, ROLE_HINT } from "./role-tag";

const control = "rounded border border-ink-700 bg-ink-900 px-2 py-1 text-sm text-ink-100";
const button = "rounded border border-ink-700 px-2 py-1 text-xs text-ink-200 hover:border-ink-500 disabled:opacity-40";

const date = (iso: string) =>
  new Date(iso).toLocaleDateString(undefined, { year: "numeric", month: "short", day: "numeric" });

/** The words of the team log, one line per action. */
function describe(e: AuditEntryDto): string {
  const d = e.detail as Record<string, string | undefined>;
  switch (e.action) {
    case "team.created":
      return `created the team “${d.name ?? ""}”`;
    case "member.invited":
      return `invited ${d.email} as ${d.role}`;
    case "invite.revoked":
      return `withdrew the invite to ${d.email}${REVOKED_BECAUSE[d.reason ?? ""] ?? ""}`;
    case "invite.accepted":
      return `joined as ${d.role}`;
    case "member.role_changed":
      return `changed a member from ${d.from} to ${d.to}`;
    case "member.removed":
      return `removed a member (${d.role})`;
    case "member.left":
      return `left the team`;
    case "permalink.created":
      return `shared a link${d.title ? ` “${d.title}”` : ""}`;
    case "permalink.revoked":
      return `revoked a shared link${d.title ? ` “${d.title}”` : ""}`;
    case "game.created":
      return `created the game “${d.name ?? ""}”`;
    case "character.created":
      return `added the character “${d.name ?? ""}”`;
    case "stance.created":
      return `added the stance “${d.key ?? ""}”`;
    case "character.imported":
      return `imported a file into “${d.character ?? ""}” (${d.edition ?? ""}): moves ${d.moves_added ?? 0} added, ${d.moves_changed ?? 0} changed, ${d.moves_removed ?? 0} removed`;
    case "edition.started":
      return `started the Edition “${d.name ?? ""}”${d.from ? ` from ${d.from}` : ""}`;
    case "move.changed":
      return `changed ${d.fields ?? "a move"} of the move ${d.move ?? ""}`;
    case "move.added":
      return `added the move ${d.move ?? ""}${d.from ? ` after ${d.from}` : ""}`;
    case "move.deleted":
      return `deleted the move ${d.move ?? ""}${Number(d.moves_with_it ?? 0) > 0 ? ` and ${d.moves_with_it} move(s) reached only through it` : ""}`;
    case "edge.added":
      return `added a ${d.kind ?? ""} link from ${d.from ?? ""} to ${d.to ?? ""}`;
    case "edge.changed":
      return `changed ${d.fields ?? "a link"} of the link ${d.edge ?? ""}`;
    case "edge.deleted":
      return `deleted the link ${d.edge ?? ""}`;
    case "board.created":
      return `made the Mix-up board “${d.title ?? ""}”`;
    case "board.saved":
      return `saved the Mix-up board “${d.title ?? ""}” (version ${d.version ?? ""})`;
    case "board.deleted":
      return `deleted the Mix-up board “${d.title ?? ""}”`;
    case "edition.published":
      return `published the Edition “${d.name ?? ""}”`;
    default:
      return e.action;
  }
}

/** Why an invite was withdrawn without anyone asking: its sender left, was removed, or may no longer send it. */
const REVOKED_BECAUSE: Record<string, string> = {
  sender_left: " (they left the team)",
  sender_removed: " (its sender was removed)",
  sender_demoted: " (its sender's new role cannot send it)",
};

/** What to say when an invite is refused: a rate limit says which limit, and how long to wait. */
function inviteProblem(err: unknown): string {
  if (!(err instanceof AppError)) return "That did not work. Try again.";
  if (err.code === "rate_limited")
    return `You or this team reached the limit on invites for the last hour. ${err.message}`;
  return err.message;
}

function Section({ title, id, children }: { title: string; id: string; children: ReactNode }) {
  return (
    <section aria-labelledby={id} className="space-y-2 rounded-lg border border-ink-800 p-4" data-testid={id}>
      <h2 id={id} className="text-sm font-medium tracking-wider text-ink-400 uppercase">
        {title}
      </h2>
      {children}
    </section>
  );
}

/** Everything about one team a member may see, and the changes their role allows. */
export function TeamAdmin({
  team,
  me,
  initial,
}: {
  team: TeamDto;
  me: { id: string; role: Role };
  initial: { members: MemberDto[]; invites: InviteDto[]; audit: AuditEntryDto[]; permalinks: TeamPermalinkDto[] };
}) {
  const router = useRouter();
  const base = `/api/teams/${team.slug}`;
  const owner = me.role === "owner";
  const manages = atLeast(me.role, "coach");
  const members = useSWR<{ members: MemberDto[] }, AppError>(`${base}/members`, fetcher, {
    fallbackData: { members: initial.members },
  });
  const invites = useSWR<{ invites: InviteDto[] }, AppError>(manages ? `${base}/invites` : null, fetcher, {
    fallbackData: { invites: initial.invites },
  });
  const audit = useSWR<{ entries: AuditEntryDto[] }, AppError>(manages ? `${base}/audit` : null, fetcher, {
    fallbackData: { entries: initial.audit },
  });
  const links = useSWR<{ permalinks: TeamPermalinkDto[] }, AppError>(`${base}/permalinks`, fetcher, {
    fallbackData: { permalinks: initial.permalinks },
  });
  const [error, setError] = useState<string | null>(null);
  const [notice, setNotice] = useState<string | null>(null);

  /** Runs one change; the server's message is shown when it refuses (at the top, or by `onError`). */
  const run = async (change: () => Promise<unknown>, done?: string, onError?: (err: unknown) => void) => {
    setError(null);
    setNotice(null);
    try {
      await change();
      if (done) setNotice(done);
      await Promise.all([
        members.mutate(),
        links.mutate(),
        manages ? invites.mutate() : null,
        manages ? audit.mutate() : null,
      ]);
    } catch (err) {
      if (onError) onError(err);
      else setError(err instanceof AppError ? err.message : "That did not work. Try again.");
    }
  };

  const [email, setEmail] = useState("");
  const [inviteRole, setInviteRole] = useState<Role>("player");
  const [inviteError, setInviteError] = useState<string | null>(null);
  const [sending, setSending] = useState(false);
  const invite = (e: FormEvent) => {
    e.preventDefault();
    setInviteError(null);
    setSending(true);
    void run(
      async () => {
        await sendJson("POST", `${base}/invites`, { email, role: inviteRole });
        setEmail("");
      },
      `Invite sent to ${email}.`,
      (err) => setInviteError(inviteProblem(err)),
    ).finally(() => setSending(false));
  };

  const leave = () =>
    void run(async () => {
      await sendJson("DELETE", `${base}/members/${encodeURIComponent(me.id)}`);
      router.push("/teams");
    });

  const invitable = ROLES.filter((r) => mayInvite(me.role, r));
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h1 className="text-xl font-semibold">{team.name}</h1>
        <p className="text-sm text-ink-400">
          You are <RoleTag role={me.role} />
        </p>
      </div>
      <div aria-live="polite">
        {error && (
          <p role="alert" className="rounded border border-block-launch-punishable/50 px-3 py-2 text-sm text-ink-100">
            {error}
          </p>
        )}
        {notice && (
          <p role="status" className="rounded border border-block-plus/40 px-3 py-2 text-sm text-ink-100">
            {notice}
          </p>
        )}
      </div>

      <Section title="Members" id="team-members">
        {members.error && (
          <p role="alert" className="text-sm">
            The members could not be loaded: {members.error.message}
          </p>
        )}
        <div className="overflow-x-auto">
          <table className="min-w-full text-sm">
            <thead>
              <tr className="text-left text-xs text-ink-400">
                <th scope="col" className="py-1 pr-3 font-medium">
                  Name
                </th>
                <th scope="col" className="py-1 pr-3 font-medium">
                  E-mail
                </th>
                <th scope="col" className="py-1 pr-3 font-medium">
                  Role
                </th>
                <th scope="col" className="py-1 pr-3 font-medium">
                  Joined
                </th>
                <th scope="col" className="py-1 font-medium">
                  <span className="sr-only">Actions</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {(members.data?.members ?? []).map((m) => (
                <tr key={m.userId} className="border-t border-ink-850" data-member={m.email}>
                  <td className="py-1.5 pr-3 text-ink-100">
                    {m.name ?? "—"}
                    {m.userId === me.id && <span className="ml-1 text-ink-400">(you)</span>}
                  </td>
                  <td className="py-1.5 pr-3 text-ink-300">{m.email}</td>
                  <td className="py-1.5 pr-3">
                    {owner ? (
                      <select
                        aria-label={`Role of ${m.name ?? m.email}`}
                        value={m.role}
                        onChange={(e) =>
                          void run(
                            () =>
                              sendJson("PATCH", `${base}/members/${encodeURIComponent(m.userId)}`, {
                                role: e.target.value,
                              }),
                            "Role changed.",
                          )
                        }
                        className={control}
                      >
                        {ROLES.map((r) => (
                          <option key={r} value={r} title={ROLE_HINT[r]}>
                            {r}
                          </option>
                        ))}
                      </select>
                    ) : (
                      <RoleTag role={m.role} />
                    )}
                  </td>
                  <td className="py-1.5 pr-3 text-ink-400">{date(m.joinedAt)}</td>
                  <td className="py-1.5 text-right">
                    {owner && m.userId !== me.id && (
                      <button
                        type="button"
                        className={button}
                        onClick={() =>
                          void run(
                            () => sendJson("DELETE", `${base}/members/${encodeURIComponent(m.userId)}`),
                            `${m.email} was removed.`,
                          )
                        }
                      >
                        Remove
                      </button>
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        <button type="button" className={button} onClick={leave}>
          Leave this team
        </button>
      </Section>

      {manages && (
        <Section title="Invite someone" id="team-invite">
          <form onSubmit={invite} className="flex flex-wrap items-end gap-2">
            <label className="flex flex-col gap-1 text-sm">
              <span className="text-ink-400">E-mail</span>
              <input
                type="email"
                required
                value={email}
                onChange={(e) => setEmail(e.target.value)}
                className={`${control} w-64`}
                autoComplete="off"
              />
            </label>
            <label className="flex flex-col gap-1 text-sm">
              <span className="text-ink-400">Role</span>
              <select value={inviteRole} onChange={(e) => setInviteRole(e.target.value as Role)} className={control}>
                {invitable.map((r) => (
                  <option key={r} value={r}>
                    {r}
                  </option>
                ))}
              </select>
            </label>
            <button
              type="submit"
              disabled={sending}
              className="rounded bg-accent px-3 py-1.5 text-sm font-medium text-ink-950 disabled:opacity-60"
            >
              Send invite
            </button>
          </form>
          {inviteError && (
            <p role="alert" className="rounded border border-block-launch-punishable/50 px-3 py-2 text-sm text-ink-100">
              {inviteError}
            </p>
          )}
          <p className="text-xs text-ink-400">
            {ROLE_HINT[inviteRole]}. The link in the e-mail works once and expires in 7 days.
          </p>
          <h3 className="pt-2 text-xs tracking-wider text-ink-400 uppercase">Waiting for an answer</h3>
          {(invites.data?.invites ?? []).length === 0 ? (
            <p className="text-sm text-ink-400">No invites are waiting.</p>
          ) : (
            <ul className="divide-y divide-ink-850 text-sm" data-testid="pending-invites">
              {(invites.data?.invites ?? []).map((i) => (
                <li key={i.id} className="flex flex-wrap items-center justify-between gap-2 py-1.5">
                  <span>
                    <span className="text-ink-100">{i.email}</span> as <RoleTag role={i.role} />{" "}
                    <span className="text-ink-400">until {date(i.expiresAt)}</span>
                  </span>
                  <button
                    type="button"
                    className={button}
                    onClick={() =>
                      void run(
                        () => sendJson("DELETE", `${base}/invites/${i.id}`),
                        `The invite to ${i.email} was withdrawn.`,
                      )
                    }
                  >
                    Withdraw
                  </button>
                </li>
              ))}
            </ul>
          )}
        </Section>
      )}

      <Section title="Shared links" id="team-links">
        {(links.data?.permalinks ?? []).length === 0 ? (
          <p className="text-sm text-ink-400">
            No links yet. Open a string in the Explorer and choose Share to make one.
          </p>
        ) : (
          <ul className="divide-y divide-ink-850 text-sm">
            {(links.data?.permalinks ?? []).map((p) => (
              <li
                key={p.slug}
                className="flex flex-wrap items-center justify-between gap-2 py-1.5"
                data-permalink={p.slug}
              >
                <span className="min-w-0">
                  {p.revoked ? (
                    <span className="text-ink-400 line-through">{p.title}</span>
                  ) : (
                    <a href={p.path} className="text-ink-100 underline-offset-2 hover:underline">
                      {p.title}
                    </a>
                  )}{" "}
                  <span className="text-ink-400">
                    · {VISIBILITY_TEXT[p.visibility].label} · by {p.createdBy.name ?? "a team member"},{" "}
                    {date(p.createdAt)}
                    {p.revoked && " · revoked"}
                  </span>
                </span>
                {!p.revoked && canRevoke({ role: me.role, isCreator: p.createdBy.id === me.id }) && (
                  <button
                    type="button"
                    className={button}
                    onClick={() =>
                      void run(() => sendJson("DELETE", `/api/permalinks/${p.slug}`), "The link was revoked.")
                    }
                  >
                    Revoke
                  </button>
                )}
              </li>
            ))}
          </ul>
        )}
      </Section>

      {manages && (
        <Section title="Team log" id="team-log">
          <ol className="space-y-1 text-sm">
            {(audit.data?.entries ?? []).map((e) => (
              <li key={e.id} className="flex flex-wrap gap-x-2">
                <time dateTime={e.createdAt} className="font-mono text-xs text-ink-400">
                  {new Date(e.createdAt).toLocaleString()}
                </time>
                <span className="text-ink-100">{e.actorName ?? e.actorEmail ?? "someone"}</span>
                <span className="text-ink-300">{describe(e)}</span>
              </li>
            ))}
          </ol>
        </Section>
      )}
    </div>
  );
}
