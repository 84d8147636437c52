"use client";

export function PrintButton() {
  return (
    <button type="button" className="btn-quiet" data-print="hide" onClick={() => window.print()}>
      Print
    </button>
  );
}
