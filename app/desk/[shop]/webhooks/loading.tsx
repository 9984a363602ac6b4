import { ListSkeleton } from "@/components/ui/skeleton";

export default function Loading() {
  return <ListSkeleton label="Loading the webhook endpoints" columns={5} />;
}
