"use client";

import type { ComponentPropsWithRef } from "react";
import { useHydrated } from "@/lib/client/use-hydrated";

/**
 * Every form that holds its state in the page's script (controlled boxes, choices and ticks,
 * react-hook-form, a submit handler that sends JSON): a `<form>` taking the usual props, whose
 * controls stay disabled until the script has run. A page can paint before that; a choice made
 * then would be set back by hydration (and the form sent on the first option without a word), and
 * a press of its button would send the form the browser's own way, to nowhere. The controls sit in
 * a `<fieldset>` that takes the form's `className` (a card, a grid, the spacing between its
 * children: the fieldset is the only child of the `<form>`, so the form's classes given to the form
 * itself would space the fieldset alone), with no border or padding of its own; nothing changes on
 * screen but the browser's look of a disabled control, for the moment before the script runs. A
 * form that works without script (a plain GET, or a server action with no client state) stays a
 * plain `<form>`.
 */
export function ClientForm({ className, children, ...form }: ComponentPropsWithRef<"form">) {
  const hydrated = useHydrated();
  return (
    // min-w-0 on both: a fieldset is as wide as its content at least, a form in a grid or flex row
    // too, and a wide table or chart inside must not widen the page.
    <form {...form} className="min-w-0">
      <fieldset disabled={!hydrated} className={className ? `min-w-0 ${className}` : "min-w-0"}>
        {children}
      </fieldset>
    </form>
  );
}
