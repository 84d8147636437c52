import Link from "next/link";

export default function NotFound() {
  return (
    <div className="mx-auto max-w-lg card space-y-3">
      <h1 className="text-xl font-bold">Nothing here</h1>
      <p>This page does not exist, or you do not have access to it.</p>
      <Link href="/home" className="btn-quiet">
        Go to your home
      </Link>
    </div>
  );
}
