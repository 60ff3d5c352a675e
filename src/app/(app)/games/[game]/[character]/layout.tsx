import { loadCharacter } from "../../data";

export default async function CharacterLayout({ children, params }: LayoutProps<"/games/[game]/[character]">) {
  const { game, character } = await params;
  await loadCharacter(game, character);
  return children;
}
