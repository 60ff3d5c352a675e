export { ExplorerSkeleton as default } from "@/app/_shared/explorer-page";
