import Link from "next/link";

/** A list page's title with, for those allowed, the button that adds one (e.g. "New capture"). */
export function PageHeader({ title, add }: { title: string; add: { href: string; label: string; testId: string } | null }) {
  return (
    <div className="flex flex-wrap items-center justify-between gap-3">
      <h1>{title}</h1>
      {add && (
        <Link href={add.href} className="btn-primary" data-testid={add.testId}>
          {add.label}
        </Link>
      )}
    </div>
  );
}
