import { ListSkeleton } from "@/components/ui/skeleton";

export default function Loading() {
  return <ListSkeleton label="Loading the audit log" columns={5} />;
}
