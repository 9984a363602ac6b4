import { DocumentSkeleton } from "@/components/ui/skeleton";

export default function Loading() {
  return <DocumentSkeleton label="Loading the request and the workbench" />;
}
