import { ListSkeleton } from "@/components/ui/skeleton";

export default function Loading() {
  return <ListSkeleton label="Loading your quotes" columns={7} />;
}
