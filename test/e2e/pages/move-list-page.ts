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

  async chooseEdition(name: string) {
    await this.page.getByRole("navigation", { name: "Edition" }).getByRole("link", { name }).click();
  }
}
