import type { ReactNode } from "react";

import type { FlashTone } from "~/utils/flashTone";

export type { FlashTone };

const tones: Record<FlashTone, string> = {
  success: "border-moss bg-moss-pale text-moss",
  info: "border-tide bg-tide-pale text-tide-dark",
  error: "border-brick bg-brick-pale text-brick",
};

export function FlashMessage({ tone = "info", children }: { tone?: FlashTone; children: ReactNode }) {
  return (
    <div
      role={tone === "error" ? "alert" : "status"}
      className={`rounded-md border-l-4 px-4 py-3 text-sm ${tones[tone]}`}
    >
      {children}
    </div>
  );
}
