import type { HTMLAttributes } from "react";
import { cn } from "@/utils/cn";

/** A white panel on the chalk background. */
export function Card({ className, ...rest }: HTMLAttributes<HTMLDivElement>) {
  return <div className={cn("rounded-lg border border-chalk-200 bg-white p-4 shadow-sm", className)} {...rest} />;
}
