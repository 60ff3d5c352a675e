import type { Locator, Page } from "@playwright/test";

/** The character move list: /games/[game]/[character]. */
export class MoveListPage {
  readonly heading: Locator;
  readonly rows: Locator;
  readonly cancelRows: Locator;

  constructor(private readonly page: Page) {
    this.heading = page.getByRole("heading", { level: 1 });
    this.rows = page.locator("tr[data-move-key]");
    this.cancelRows = page.locator("tr[data-cancel-key]");
  }

  row(key: string): Locator {
    return this.page.locator(`tr[data-move-key="${key}"]`);
  }

  field(key: string, field: "onBlock" | "onHit" | "onCounterHit"): Locator {
    return this.row(key).locator(`[data-field="${field}"]`);
  }

  async chooseEdition(name: string) {
    await this.page.getByRole("navigation", { name: "Edition" }).getByRole("link", { name }).click();
  }
}
