import { useEffect, useRef, useState, type FormEvent } from "react";
import { Link } from "react-router-dom";
import {
  checkedOutStatuses,
  garmentStatuses,
  garmentStatusLabels,
  type GarmentMoveResultDto,
  type GarmentStatus,
} from "@shared/schemas/garments";
import type { ScheduleKind } from "@shared/domain/schedule-labels";
import { parseTagCode } from "@shared/domain/tag-codes";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { InputField } from "@/components/ui/field";
import { ApiError } from "@/lib/api-client";
import { cn } from "@/utils/cn";
import { useMe } from "@/features/auth/api/auth";
import { enqueue } from "@/lib/offline/queue";
import { queueRunner } from "@/lib/offline/runner";
import { newClientId } from "@/lib/offline/client-id";
import { useCheckoutOptions, useScanGarment } from "../api/garments";
import { StatusBadge } from "./status-badge";
import { CheckoutFields, CheckoutSummary, checkoutFromDraft, emptyCheckout, type CheckoutDraft } from "./checkout-fields";

interface LogLine {
  at: number;
  code: string;
  ok: boolean;
  text: string;
  result?: GarmentMoveResultDto;
}

/** Camera scanning through ZXing, loaded only when someone opens the camera. */
function CameraScanner({ onCode, onClose }: { onCode: (code: string) => void; onClose: () => void }) {
  const video = useRef<HTMLVideoElement>(null);
  const [error, setError] = useState<string | null>(null);
  // The latest handler, so the camera is not restarted on every render.
  const handler = useRef(onCode);
  useEffect(() => {
    handler.current = onCode;
  });
  useEffect(() => {
    let stop: (() => void) | undefined;
    let cancelled = false;
    let last = "";
    void (async () => {
      try {
        const { BrowserQRCodeReader } = await import("@zxing/browser");
        const reader = new BrowserQRCodeReader();
        const controls = await reader.decodeFromConstraints({ video: { facingMode: "environment" } }, video.current!, (result) => {
          const text = result?.getText();
          // The camera sees the same label many times a second; act once per label.
          if (text && text !== last) {
            last = text;
            handler.current(text);
          }
        });
        if (cancelled) controls.stop();
        else stop = () => controls.stop();
      } catch (e) {
        setError(e instanceof Error ? e.message : "The camera could not be opened.");
      }
    })();
    return () => {
      cancelled = true;
      stop?.();
    };
  }, []);
  return (
    <div className="grid gap-2">
      <video ref={video} className="aspect-square w-full max-w-sm rounded-md bg-ink-900 object-cover" muted playsInline />
      {error && <p className="text-sm text-madder">{error} Type or use a USB scanner instead.</p>}
      <Button variant="secondary" size="lg" onClick={onClose}>
        Close camera
      </Button>
    </div>
  );
}

const outStatus = (s: GarmentStatus) => (checkedOutStatuses as readonly GarmentStatus[]).includes(s);

/**
 * Check in / out: pick a status and place once (and, going out, to whom, for which day and scene, due
 * back when), then scan or type tag after tag — one action per garment.
 * A QR code on the rack list opens this with the tag and status filled in (`?tag=…&to=on_set`); the
 * move still waits for one tap, so opening a link never moves a garment by itself.
 */
export function CheckInOut({
  productionId,
  kind,
  initialTag,
  initialStatus,
}: {
  productionId: string;
  kind: ScheduleKind;
  initialTag?: string;
  initialStatus?: GarmentStatus;
}) {
  const scan = useScanGarment(productionId);
  const me = useMe();
  const options = useCheckoutOptions(productionId);
  const [status, setStatus] = useState<GarmentStatus>(initialStatus ?? "on_set");
  const [checkout, setCheckout] = useState<CheckoutDraft>(emptyCheckout);
  const [rack, setRack] = useState("");
  const [bin, setBin] = useState("");
  const [code, setCode] = useState(initialTag ?? "");
  const [log, setLog] = useState<LogLine[]>([]);
  const [camera, setCamera] = useState(false);
  const input = useRef<HTMLInputElement>(null);

  const submitCode = (raw: string) => {
    const parsed = parseTagCode(raw);
    if (!parsed.ok) {
      setLog((l) => [{ at: Date.now(), code: raw, ok: false, text: parsed.reason }, ...l].slice(0, 30));
      return;
    }
    const to = outStatus(status) ? checkoutFromDraft(checkout) : null;
    scan.mutate(
      {
        tagCode: parsed.code,
        status,
        ...(rack.trim() ? { locationRack: rack.trim() } : {}),
        ...(bin.trim() ? { locationBin: bin.trim() } : {}),
        ...(to ? { checkout: to } : {}),
      },
      {
        onSuccess: (r) =>
          setLog((l) =>
            [
              {
                at: Date.now(),
                code: parsed.code,
                ok: true,
                text: r.event ? `${r.garment.name} → ${garmentStatusLabels[r.garment.status]}` : `${r.garment.name} was already there`,
                result: r,
              },
              ...l,
            ].slice(0, 30),
          ),
        onError: (e) => {
          const userId = me.data?.id;
          // No signal: the move waits on this phone and is sent with the continuity queue.
          if (e instanceof ApiError && e.status === 0 && userId) {
            const payload = {
              tagCode: parsed.code,
              status,
              ...(rack.trim() ? { locationRack: rack.trim() } : {}),
              ...(bin.trim() ? { locationBin: bin.trim() } : {}),
              ...(to ? { checkout: to } : {}),
            };
            void enqueue({
              clientId: newClientId(),
              userId,
              productionId,
              kind: "garment-scan",
              summary: `${parsed.code} → ${garmentStatusLabels[status]}`,
              queuedAt: new Date().toISOString(),
              payload,
              photos: [],
            })
              .then(() => {
                setLog((l) =>
                  [
                    {
                      at: Date.now(),
                      code: parsed.code,
                      ok: true,
                      text: `No signal: kept on this phone, moves to ${garmentStatusLabels[status]} when sent`,
                    },
                    ...l,
                  ].slice(0, 30),
                );
                queueRunner.kick();
              })
              .catch((err: unknown) =>
                setLog((l) => [{ at: Date.now(), code: parsed.code, ok: false, text: `Not kept: ${String(err)}` }, ...l].slice(0, 30)),
              );
            return;
          }
          setLog((l) =>
            [{ at: Date.now(), code: parsed.code, ok: false, text: e instanceof ApiError ? e.message : String(e) }, ...l].slice(0, 30),
          );
        },
      },
    );
  };
  const onSubmit = (e: FormEvent) => {
    e.preventDefault();
    if (!code.trim()) return;
    submitCode(code);
    setCode("");
    input.current?.focus();
  };

  return (
    <div className="grid gap-4 md:grid-cols-2">
      <Card className="grid gap-3">
        <fieldset>
          <legend className="mb-2 text-sm font-semibold text-ink">Move to</legend>
          <div className="grid grid-cols-2 gap-2 sm:grid-cols-3">
            {garmentStatuses.map((s) => (
              <button
                key={s}
                type="button"
                aria-pressed={status === s}
                onClick={() => setStatus(s)}
                className={cn(
                  "min-h-12 rounded-md border px-3 py-2 text-base font-semibold",
                  status === s ? "border-ink bg-ink text-chalk" : "border-ink-100 bg-white text-ink",
                )}
              >
                {garmentStatusLabels[s]}
              </button>
            ))}
          </div>
        </fieldset>
        {outStatus(status) && <CheckoutFields options={options.data} kind={kind} value={checkout} onChange={setCheckout} />}
        <div className="grid grid-cols-2 gap-2">
          <InputField
            label="Rack"
            value={rack}
            onChange={(e) => setRack(e.target.value)}
            placeholder="unchanged"
            hint="Leave empty to keep each garment's rack"
          />
          <InputField label="Bin" value={bin} onChange={(e) => setBin(e.target.value)} placeholder="unchanged" />
        </div>
        <form onSubmit={onSubmit} className="grid gap-2" aria-label="Scan a tag">
          {initialTag && code === initialTag && (
            <p className="rounded-md bg-ink-50 px-3 py-2 text-sm text-ink-900" role="note">
              From the rack list: press the button to move <span className="font-mono font-semibold">{initialTag}</span> to{" "}
              {garmentStatusLabels[status]}.
            </p>
          )}
          <InputField
            ref={input}
            label="Tag code"
            value={code}
            onChange={(e) => setCode(e.target.value)}
            autoFocus={!initialTag}
            autoComplete="off"
            autoCapitalize="characters"
            spellCheck={false}
            className="[&_input]:py-3 [&_input]:font-mono [&_input]:text-xl"
            hint="Scan with a USB scanner (it types and presses Enter) or type the code."
          />
          <Button type="submit" size="lg" busy={scan.isPending} autoFocus={Boolean(initialTag)}>
            {outStatus(status) && checkout.to ? `Check out (${garmentStatusLabels[status]})` : `Move to ${garmentStatusLabels[status]}`}
          </Button>
        </form>
        {camera ? (
          <CameraScanner onCode={submitCode} onClose={() => setCamera(false)} />
        ) : (
          <Button variant="secondary" size="lg" onClick={() => setCamera(true)}>
            Scan with the camera
          </Button>
        )}
      </Card>
      <Card>
        <h2 className="mb-2 font-semibold text-ink">This session</h2>
        {log.length === 0 ? (
          <p className="text-sm text-slate">Nothing scanned yet.</p>
        ) : (
          <ul className="grid gap-2" aria-label="Scanned garments" aria-live="polite">
            {log.map((l) => (
              <li
                key={l.at + l.code}
                className={cn(
                  "rounded-md border px-3 py-2 text-sm",
                  l.ok ? "border-chalk-200" : "border-madder/40 bg-madder-50 text-madder",
                )}
              >
                <span className="font-mono font-semibold">{l.code}</span> — {l.text}
                {l.result && (
                  <span className="ml-2 inline-flex flex-wrap items-center gap-2">
                    <StatusBadge status={l.result.garment.status} />
                    {l.result.garment.checkout && <CheckoutSummary checkout={l.result.garment.checkout} kind={kind} compact />}
                    <Link to={`../garments/${l.result.garment.id}`} relative="path" className="text-ink underline">
                      open
                    </Link>
                  </span>
                )}
              </li>
            ))}
          </ul>
        )}
      </Card>
    </div>
  );
}
