import "server-only";
import { readFile } from "node:fs/promises";
import path from "node:path";
import { ImageResponse } from "next/og";
import type { Level } from "@/lib/engine";
import config from "../../../tailwind.config";
import type { PermalinkImageSummary } from "./summary";

export const PERMALINK_IMAGE_SIZE = { width: 1200, height: 630 } as const;

// The app's own palette (tailwind.config.ts): ink for the ground, accent for the brand, one colour per level.
const palette = config.theme?.extend?.colors as {
  ink: Record<"950" | "850" | "700" | "300" | "100", string>;
  accent: { DEFAULT: string };
  level: Record<Level, string>;
};
const INK = {
  ground: palette.ink["950"],
  panel: palette.ink["850"],
  line: palette.ink["700"],
  text: palette.ink["100"],
  muted: palette.ink["300"],
};
const ACCENT = palette.accent.DEFAULT;
const LEVEL_COLOUR = palette.level;

// satori reads ttf, otf and woff (not woff2): the woff files of the font the app ships.
const FONT_DIR = path.join(process.cwd(), "node_modules", "@fontsource", "jetbrains-mono", "files");
let fonts: Promise<{ name: string; data: Buffer; weight: 400 | 700; style: "normal" }[]> | undefined;
function loadFonts() {
  fonts ??= Promise.all(
    ([400, 700] as const).map(async (weight) => ({
      name: "JetBrains Mono",
      data: await readFile(path.join(FONT_DIR, `jetbrains-mono-latin-${weight}-normal.woff`)),
      weight,
      style: "normal" as const,
    })),
  );
  return fonts;
}

/** The link preview of a permalink: its path in outline, or a card that says only what Framefork is. */
export async function renderPermalinkImage(summary: PermalinkImageSummary): Promise<ImageResponse> {
  const card =
    summary.kind === "path" ? (
      <PathCard summary={summary} />
    ) : summary.kind === "stance" ? (
      <StanceCard summary={summary} />
    ) : (
      <PrivateCard />
    );
  return new ImageResponse(card, {
    ...PERMALINK_IMAGE_SIZE,
    fonts: await loadFonts(),
  });
}

function Frame({ children }: { children: React.ReactNode }) {
  return (
    <div
      style={{
        display: "flex",
        flexDirection: "column",
        justifyContent: "space-between",
        width: "100%",
        height: "100%",
        padding: 64,
        background: INK.ground,
        color: INK.text,
        fontFamily: "JetBrains Mono",
      }}
    >
      {children}
      <div style={{ display: "flex", alignItems: "center", fontSize: 30, color: ACCENT, fontWeight: 700 }}>
        Framefork
      </div>
    </div>
  );
}

/** The figures' bar at the foot of a card. */
function Panel({ children }: { children: React.ReactNode }) {
  return (
    <div
      style={{
        display: "flex",
        alignItems: "baseline",
        gap: 24,
        padding: "20px 28px",
        borderRadius: 12,
        background: INK.panel,
        border: `2px solid ${INK.line}`,
        fontSize: 40,
      }}
    >
      {children}
    </div>
  );
}

function PathCard({ summary }: { summary: Extract<PermalinkImageSummary, { kind: "path" }> }) {
  const input = summary.input.length > 40 ? `${summary.input.slice(0, 39)}…` : summary.input;
  return (
    <Frame>
      <div style={{ display: "flex", flexDirection: "column", gap: 28 }}>
        <div style={{ display: "flex", fontSize: 30, color: INK.muted }}>{summary.title}</div>
        <div style={{ display: "flex", fontSize: 96, fontWeight: 700 }}>{input}</div>
        <div style={{ display: "flex", flexWrap: "wrap", gap: 14 }}>
          {summary.levels.slice(0, 10).map((level, i) => (
            <div
              key={i}
              style={{
                display: "flex",
                padding: "6px 16px",
                borderRadius: 8,
                border: `3px solid ${LEVEL_COLOUR[level]}`,
                color: LEVEL_COLOUR[level],
                fontSize: 30,
              }}
            >
              {level}
            </div>
          ))}
        </div>
      </div>
      <Panel>
        <span style={{ color: INK.muted }}>on block</span>
        <span style={{ fontWeight: 700 }}>{summary.onBlock}</span>
        {summary.blockClass ? <span style={{ color: ACCENT }}>{summary.blockClass}</span> : null}
      </Panel>
    </Frame>
  );
}

function StanceCard({ summary }: { summary: Extract<PermalinkImageSummary, { kind: "stance" }> }) {
  const name = summary.stance.length > 28 ? `${summary.stance.slice(0, 27)}…` : summary.stance;
  const best = summary.best;
  return (
    <Frame>
      <div style={{ display: "flex", flexDirection: "column", gap: 28 }}>
        <div style={{ display: "flex", fontSize: 30, color: INK.muted }}>{summary.title}</div>
        <div style={{ display: "flex", fontSize: 88, fontWeight: 700 }}>{name}</div>
        <div style={{ display: "flex", fontSize: 36, color: INK.muted }}>
          {summary.waysIn === 1 ? "1 way in" : `${summary.waysIn} ways in`}
        </div>
      </div>
      <Panel>
        {best ? (
          <>
            <span style={{ color: INK.muted }}>best way in</span>
            <span style={{ fontWeight: 700 }}>
              {best.input.length > 24 ? `${best.input.slice(0, 23)}…` : best.input}
            </span>
            <span style={{ fontWeight: 700 }}>{best.onBlock}</span>
            {best.blockClass ? <span style={{ color: ACCENT }}>{best.blockClass}</span> : null}
          </>
        ) : (
          <span style={{ color: INK.muted }}>nothing cancels into it</span>
        )}
      </Panel>
    </Frame>
  );
}

function PrivateCard() {
  return (
    <Frame>
      <div style={{ display: "flex", flexDirection: "column", gap: 24 }}>
        <div style={{ display: "flex", fontSize: 64, fontWeight: 700 }}>A shared Explorer view</div>
        <div style={{ display: "flex", fontSize: 32, color: INK.muted }}>
          Open the link to see it (sign-in may be needed).
        </div>
      </div>
    </Frame>
  );
}
