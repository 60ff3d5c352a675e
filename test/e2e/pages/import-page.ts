import type { FileChooser, Locator, Page } from "@playwright/test";

/** A character file as the browser picks it. */
export interface PickedFile {
  name: string;
  mimeType: string;
  buffer: Buffer;
}

/** /games/[game]/[character]/import: a character file into a draft Edition. */
export class ImportPage {
  readonly heading: Locator;
  readonly dropzone: Locator;
  readonly input: Locator;
  readonly refusal: Locator;
  readonly problems: Locator;
  readonly preview: Locator;
  readonly done: Locator;
  readonly progress: Locator;

  constructor(private readonly page: Page) {
    this.heading = page.getByRole("heading", { level: 1 });
    this.dropzone = page.getByRole("button", { name: /^Choose a character file/ });
    this.input = page.getByLabel("Character file (.csv or .json)");
    this.refusal = page.getByRole("region", { name: /Nothing was imported|That did not work/ });
    this.problems = page.getByRole("list", { name: "Problems in the file" }).getByRole("listitem");
    this.preview = page.getByRole("region", { name: /^What importing/ });
    this.done = page.getByRole("region", { name: /^Imported / });
    this.progress = page.getByRole("progressbar");
  }

  async goto(game: string, character: string, edition?: string) {
    await this.page.goto(`/games/${game}/${character}/import${edition ? `?edition=${edition}` : ""}`);
  }

  /** Through the hidden file input, as a drop or the picker hands it over. */
  async choose(file: PickedFile) {
    await this.input.setInputFiles(file);
  }

  /** With the keyboard: focus the drop area, press Enter, pick the file in the chooser. */
  async chooseWithKeyboard(file: PickedFile, key: "Enter" | "Space" = "Enter") {
    await this.dropzone.focus();
    const [chooser]: [FileChooser, void] = await Promise.all([
      this.page.waitForEvent("filechooser"),
      this.page.keyboard.press(key),
    ]);
    await chooser.setFiles(file);
  }

  /** The list of keys added, changed or removed in a part ("Moves", "Stances", "Connections"). */
  keys(part: "Moves" | "Stances" | "Connections", what: "added" | "changed" | "removed"): Locator {
    return this.preview.getByRole("list", { name: `${part}: ${what}` }).getByRole("listitem");
  }

  async confirm(editionName: string) {
    await this.page.getByRole("button", { name: `Import into ${editionName}`, exact: true }).click();
  }
}
