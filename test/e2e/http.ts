import { spawn } from "node:child_process";
import { randomUUID } from "node:crypto";
import { once } from "node:events";
import { readFileSync } from "node:fs";
import { hash } from "@node-rs/argon2";
import { freePort } from "../fixtures/free-port";
import { query } from "./db";

/** A Set-Cookie line read into its name, value and attributes (attribute names lower-cased). */
export interface SetCookie {
  name: string;
  value: string;
  attributes: Map<string, string>;
}

export function parseSetCookie(line: string): SetCookie {
  const [pair = "", ...rest] = line.split(";").map((part) => part.trim());
  const at = pair.indexOf("=");
  const attributes = new Map<string, string>();
  for (const attribute of rest) {
    const eq = attribute.indexOf("=");
    if (eq === -1) attributes.set(attribute.toLowerCase(), "");
    else attributes.set(attribute.slice(0, eq).toLowerCase(), attribute.slice(eq + 1));
  }
  return { name: pair.slice(0, at), value: pair.slice(at + 1), attributes };
}

/** A person with a password, written straight into the database (the sign-up form has its own tests). */
export async function personWithPassword(tag: string): Promise<{ id: string; email: string; password: string }> {
  const id = randomUUID();
  const email = `${tag}-${id.slice(0, 8)}@example.test`;
  const password = "frame-advantage-notes";
  await query("insert into users (id, email, name, password_hash, email_verified) values (?, ?, ?, ?, now())", [
    id,
    email,
    `${tag} ${id.slice(0, 4)}`,
    await hash(password),
  ]);
  return { id, email, password };
}

/**
 * Signs in with e-mail and password the way the sign-in form does, over plain HTTP:
 * next-auth's CSRF token first, then the credentials. Returns every cookie the app set.
 */
export async function signInOverHttp(
  base: string,
  person: { email: string; password: string },
): Promise<{ csrf: SetCookie[]; session: SetCookie[] }> {
  const csrfAnswer = await fetch(`${base}/api/auth/csrf`);
  const csrf = csrfAnswer.headers.getSetCookie().map(parseSetCookie);
  const { csrfToken } = (await csrfAnswer.json()) as { csrfToken: string };
  const signedIn = await fetch(`${base}/api/auth/callback/credentials`, {
    method: "POST",
    redirect: "manual",
    headers: {
      "content-type": "application/x-www-form-urlencoded",
      cookie: csrf.map((c) => `${c.name}=${c.value}`).join("; "),
    },
    body: new URLSearchParams({ csrfToken, email: person.email, password: person.password, json: "true" }),
  });
  return { csrf, session: signedIn.headers.getSetCookie().map(parseSetCookie) };
}

/**
 * Runs `fn` against a second `next start` of the same build, with other settings (e.g. an
 * https NEXTAUTH_URL, as behind a TLS-terminating proxy), and stops it afterwards.
 */
export async function withSecondServer(
  settings: (base: string) => Record<string, string>,
  fn: (base: string) => Promise<void>,
): Promise<void> {
  const port = await freePort();
  const base = `http://127.0.0.1:${port}`;
  const child = spawn(
    process.execPath,
    ["node_modules/next/dist/bin/next", "start", "-p", String(port), "-H", "127.0.0.1"],
    { env: { ...process.env, ...settings(base) }, stdio: "ignore" },
  );
  try {
    const started = Date.now();
    for (;;) {
      const up = await fetch(`${base}/api/health`).then(
        (r) => r.ok,
        () => false,
      );
      if (up) break;
      if (child.exitCode !== null) throw new Error(`the second server exited with ${child.exitCode}`);
      if (Date.now() - started > 45_000) throw new Error("the second server did not answer in 45 s");
      await new Promise((done) => setTimeout(done, 250));
    }
    await fn(base);
  } finally {
    if (child.exitCode === null) {
      child.kill();
      await once(child, "exit");
    }
  }
}

/** The id of a server action in this build, from Next's manifest of them. */
export function actionId(file: string, name: string): string {
  const manifest = JSON.parse(readFileSync(".next/server/server-reference-manifest.json", "utf8")) as {
    node: Record<string, { filename?: string; exportedName?: string }>;
  };
  const found = Object.entries(manifest.node).find(([, a]) => a.filename === file && a.exportedName === name);
  if (!found) throw new Error(`no server action ${name} in ${file} in this build`);
  return found[0];
}

/**
 * Posts a form to a server action of src/app/(auth)/actions.ts as React posts it from a form
 * with useActionState (the fields as _1_<name>, the arguments in field 0), from the app's own
 * origin. Returns the status and the body (React's wire format, which carries the action's state).
 */
export async function postAuthAction(
  base: string,
  page: string,
  name: string,
  fields: Record<string, string>,
  cookie = "",
): Promise<{ status: number; text: string }> {
  const form = new FormData();
  for (const [key, value] of Object.entries(fields)) form.set(`_1_${key}`, value);
  form.set("0", '[null,"$K1"]');
  const res = await fetch(`${base}${page}`, {
    method: "POST",
    redirect: "manual",
    headers: {
      origin: new URL(base).origin,
      "next-action": actionId("src/app/(auth)/actions.ts", name),
      accept: "text/x-component",
      ...(cookie ? { cookie } : {}),
    },
    body: form,
  });
  return { status: res.status, text: await res.text() };
}
