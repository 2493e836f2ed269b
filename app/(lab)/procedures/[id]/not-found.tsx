import { TextLink } from "@/components/ui/text-link";

export default function ProcedureNotFound() {
  return (
    <div>
      <h1 className="mb-2 text-2xl font-bold">No such procedure</h1>
      <p className="mb-4">The procedure or version you asked for does not exist, or is not released yet.</p>
      <TextLink href="/procedures">
        All procedures
      </TextLink>
    </div>
  );
}
