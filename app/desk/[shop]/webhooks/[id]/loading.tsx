import { ListSkeleton } from "@/components/ui/skeleton";

export default function Loading() {
  return <ListSkeleton label="Loading the delivery log" columns={7} />;
}
