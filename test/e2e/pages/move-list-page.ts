import type { Locator, Page } from "@playwright/test";

/** The character move list: /games/[game]/[character]: one row per string, opening into its steps. */
export class MoveListPage {
  readonly heading: Locator;
  /** Every step that is a hit, open or not (a closed string's steps are in the page, hidden). */
  readonly rows: Locator;
  readonly cancelRows: Locator;
  /** One row per string: its first hit's input, level chips and endings. */
  readonly strings: Locator;
  readonly filters: Locator;
  readonly count: Locator;

  constructor(private readonly page: Page) {
    this.heading = page.getByRole("heading", { level: 1 });
    this.rows = page.locator("tr[data-move-key]");
    this.cancelRows = page.locator("tr[data-cancel-key]");
    this.strings = page.locator("tr[data-string-key]");
    this.filters = page.getByRole("form", { name: "Filter and order the strings" });
    this.count = page.getByTestId("strings-count");
  }

  row(key: string): Locator {
    return this.page.locator(`tr[data-move-key="${key}"]`);
  }

  string(key: string): Locator {
    return this.page.locator(`tr[data-string-key="${key}"]`);
  }

  field(key: string, field: "onBlock" | "onHit" | "onCounterHit"): Locator {
    return this.row(key).locator(`[data-field="${field}"]`);
  }

  /** Opens the string that starts with this move, so its steps show. */
  async open(key: string) {
    const button = this.string(key).getByRole("button", { name: /^Steps of / });
    if ((await button.getAttribute("aria-expanded")) !== "true") await button.click();
  }

  async openAll() {
    await this.page.getByRole("button", { name: "Open every string" }).click();
  }

  /** The string that holds this step (a hit or a cancel), by its key. */
  async openStringOf(stepKey: string) {
    const root = await this.page.locator(`tbody[data-steps~="${stepKey}"]`).first().getAttribute("data-string");
    if (root !== null) await this.open(root);
  }

  /**
   * Every figure the list shows, as the eye reads it: each stance's heading, the count, each
   * string's input, level chips, endings by block class, startup and best damage, and each open
   * step's outcomes, gap, startup and damage, with each row's whole visible text. Addresses of
   * links are left out: they name the game.
   */
  async figures() {
    return this.page.evaluate(() => {
      const text = (e: Element | null) => (e as HTMLElement | null)?.innerText.trim() ?? null;
      const shown = (row: Element, field: string) =>
        [...row.querySelectorAll<HTMLElement>(`[data-field="${field}"]`)]
          .filter((e) => e.checkVisibility())
          .map((e) => e.innerText.trim());
      return {
        sections: [...document.querySelectorAll("section:has(tr[data-string-key]) h2")].map(text),
        count: text(document.querySelector('[data-testid="strings-count"]')),
        strings: [...document.querySelectorAll("tr[data-string-key]")].map((row) => ({
          key: row.getAttribute("data-string-key"),
          input: text(row.querySelector("th a")),
          levels: [...row.querySelectorAll('[data-field="levels"] [data-level]')].map((e) =>
            e.getAttribute("data-level"),
          ),
          endings: [...row.querySelectorAll('[data-field="endings"] li')].map(
            (e) =>
              `${e.getAttribute("data-block-class")}${e.hasAttribute("data-via-cancel") ? " via cancel" : ""}: ${text(e)}`,
          ),
          startup: text(row.querySelector('[data-field="startup"]')),
          bestDamage: text(row.querySelector('[data-field="bestDamage"]')),
          text: (row as HTMLElement).innerText,
        })),
        steps: [...document.querySelectorAll("tr[data-move-key], tr[data-cancel-key]")].map((row) => ({
          key: row.getAttribute("data-move-key") ?? `cancel ${row.getAttribute("data-cancel-key")}`,
          level: row.querySelector("[data-level]")?.getAttribute("data-level") ?? null,
          onBlock: shown(row, "onBlock"),
          onHit: shown(row, "onHit"),
          onCounterHit: shown(row, "onCounterHit"),
          gapOnBlock: shown(row, "gapOnBlock"),
          framesSaved: shown(row, "framesSaved"),
          startup: shown(row, "startup"),
          damage: shown(row, "damage"),
          text: (row as HTMLElement).innerText,
        })),
      };
    });
  }

  async chooseEdition(name: string) {
    await this.page.getByRole("navigation", { name: "Edition" }).getByRole("link", { name }).click();
  }
}
