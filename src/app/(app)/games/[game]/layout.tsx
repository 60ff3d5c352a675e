import { loadGame } from "../data";

export default async function GameLayout({ children, params }: LayoutProps<"/games/[game]">) {
  await loadGame((await params).game);
  return children;
}
