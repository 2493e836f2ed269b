import { LoadingNote } from "@/components/ui/loading-note";

export default function Loading() {
  return <LoadingNote what="the cycler tokens" />;
}
