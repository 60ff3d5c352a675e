import { expect, type Locator, type Page } from "@playwright/test";

/** The Explorer: /games/[game]/[character]/explore/[move]. */
export class ExplorerPage {
  readonly graph: Locator;
  readonly card: Locator;
  readonly emptyCard: Locator;

  constructor(private readonly page: Page) {
    this.graph = page.getByTestId("graph");
    this.card = page.getByTestId("path-card");
    this.emptyCard = page.getByTestId("path-card-empty");
  }

  node(id: string): Locator {
    return this.graph.locator(`[data-node-id="${id}"]`);
  }

  /**
   * Selects the path to a node with a click, as a player does, and waits until the path overlay
   * marks it. A click that lands while a slow phone still lays the page out is tried again.
   */
  async select(id: string) {
    await expect(async () => {
      await this.node(id).click({ timeout: 5_000 });
      await expect(this.pathMark(id)).toBeAttached({ timeout: 2_000 });
    }).toPass({ timeout: 20_000 });
  }

  /** The ring the path overlay draws around a node of the selected path. */
  pathMark(id: string): Locator {
    return this.graph.locator(`[data-path-node="${id}"]`);
  }

  /** The dashed ring at the keyboard's place in the graph. */
  get focusMark(): Locator {
    return this.graph.locator("[data-focus-node]");
  }

  /** A figure of the Path card by its PathResult field name. */
  field(name: string): Locator {
    return this.card.locator(`[data-field="${name}"]`).first();
  }

  /** The explanation of a Path card figure: the tooltip that describes it. */
  explanation(name: string): Locator {
    return this.field(name).locator("xpath=..").getByRole("tooltip");
  }

  async setOption(label: string, value: number) {
    const input = this.page.getByRole("spinbutton", { name: label });
    await input.fill(String(value));
  }
}
