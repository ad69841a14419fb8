"use client";

import { useRouter } from "next/navigation";
import { useCallback, useEffect, useId, useMemo, useRef, useState, useTransition, type KeyboardEvent, type PointerEvent } from "react";
import { Button, Callout, Field, Input, Select, Skeleton, Spinner, cn, formatMetric } from "@/components/ui";
import { errorMessage, fetchJson } from "@/lib/api/fetch-json";
import { METHOD_CHOICES, METHOD_LABELS, type MethodChoiceKey, type MethodKey, type RoiJson, type ScanJsonView } from "./scan-types";

export interface ScanImageViewerProps {
  scanId: number;
  /** ROI of the current analysis, pixels of the original frame. */
  roi: RoiJson;
  method: MethodKey;
  /** [row, column] spacing, mm: shows the ROI size in mm. */
  pixelSpacingMm: [number, number];
  /** Physicists and admins may re-run the analysis (the server checks again). */
  canReanalyse: boolean;
}

interface LoadedImage {
  data: Float32Array;
  width: number;
  height: number;
  /** Original pixels per preview sample, along each axis. */
  scale: number;
  min: number;
  max: number;
  p01: number;
  p99: number;
}

type Load = { state: "loading" } | { state: "error"; message: string } | { state: "ready"; image: LoadedImage };

type DragMode = "move" | "pan" | "n" | "s" | "e" | "w" | "ne" | "nw" | "se" | "sw";

interface Drag {
  mode: DragMode;
  pointerId: number;
  startX: number;
  startY: number;
  roi: RoiJson;
  panX: number;
  panY: number;
}

interface View {
  zoom: number;
  panX: number;
  panY: number;
}

const MIN_ROI_PX = 8;
const HANDLE_PX = 7;
const MAX_ZOOM = 40;
const ROI_COLOUR = "#F2B705";
const CURSORS: Record<DragMode, string> = {
  move: "move", pan: "grab", n: "ns-resize", s: "ns-resize", e: "ew-resize", w: "ew-resize", ne: "nesw-resize", sw: "nesw-resize", nw: "nwse-resize", se: "nwse-resize",
};

/** 1st and 99th percentiles of a sample of at most 2¹⁸ values. */
function percentiles(data: Float32Array): { p01: number; p99: number } {
  const stride = Math.max(1, Math.floor(data.length / 262_144));
  const sample = new Float32Array(Math.ceil(data.length / stride));
  let n = 0;
  for (let i = 0; i < data.length; i += stride) if (Number.isFinite(data[i]!)) sample[n++] = data[i]!;
  const sorted = sample.subarray(0, n).sort();
  if (n === 0) return { p01: 0, p99: 1 };
  return { p01: sorted[Math.floor(0.01 * (n - 1))]!, p99: sorted[Math.ceil(0.99 * (n - 1))]! };
}

async function loadImage(scanId: number, signal: AbortSignal): Promise<LoadedImage> {
  const res = await fetch(`/api/scans/${scanId}/image`, { signal, credentials: "same-origin" });
  if (!res.ok) {
    let message = `The image could not be loaded (HTTP ${res.status}).`;
    try {
      const body = (await res.json()) as { error?: string };
      if (body.error) message = body.error;
    } catch {
      /* keep the generic message */
    }
    throw new Error(message);
  }
  const header = (name: string) => Number(res.headers.get(name));
  const width = header("x-width");
  const height = header("x-height");
  const scale = header("x-scale") || 1;
  const buffer = await res.arrayBuffer();
  if (!(width > 0 && height > 0) || buffer.byteLength < width * height * 4) throw new Error("The image answer was incomplete. Reload the page to try again.");
  // Float32Array reads the platform's byte order; every current browser platform is little-endian, like the payload.
  const data = new Float32Array(buffer, 0, width * height);
  let min = header("x-min");
  let max = header("x-max");
  if (!Number.isFinite(min) || !Number.isFinite(max)) {
    min = Infinity;
    max = -Infinity;
    for (const v of data) {
      if (v < min) min = v;
      if (v > max) max = v;
    }
  }
  return { data, width, height, scale, min, max, ...percentiles(data) };
}

function clampRoi(roi: RoiJson, fullWidth: number, fullHeight: number): RoiJson {
  const width = Math.max(MIN_ROI_PX, Math.min(Math.round(roi.width), fullWidth));
  const height = Math.max(MIN_ROI_PX, Math.min(Math.round(roi.height), fullHeight));
  const x = Math.max(0, Math.min(Math.round(roi.x), fullWidth - width));
  const y = Math.max(0, Math.min(Math.round(roi.y), fullHeight - height));
  return { x, y, width, height };
}

function sameRoi(a: RoiJson, b: RoiJson): boolean {
  return a.x === b.x && a.y === b.y && a.width === b.width && a.height === b.height;
}

/**
 * The analysed frame on a canvas with window/level, zoom and pan, and the analysis ROI as a rectangle that can be
 * moved and resized (pointer, arrow keys, or the numeric fields). Re-running the analysis with the edited ROI (or
 * another method) creates a new revision and refreshes the page.
 */
export function ScanImageViewer({ scanId, roi: analysedRoi, method, pixelSpacingMm, canReanalyse }: ScanImageViewerProps) {
  const router = useRouter();
  const [load, setLoad] = useState<Load>({ state: "loading" });
  const [attempt, setAttempt] = useState(0);
  const [windowing, setWindowing] = useState<{ width: number; level: number } | null>(null);
  const [view, setView] = useState<View | null>(null);
  const [roi, setRoi] = useState<RoiJson>(analysedRoi);
  const [hover, setHover] = useState<{ x: number; y: number; value: number } | null>(null);
  const [rerunMethod, setRerunMethod] = useState<MethodChoiceKey>(method);
  const [reason, setReason] = useState("");
  const [pending, setPending] = useState<"roi" | "auto" | null>(null);
  const [rerunError, setRerunError] = useState<string | null>(null);
  const [rerunDone, setRerunDone] = useState<string | null>(null);
  const [refreshing, startRefresh] = useTransition();
  const [viewport, setViewport] = useState<{ width: number; height: number }>({ width: 0, height: 0 });
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const boxRef = useRef<HTMLDivElement>(null);
  const drag = useRef<Drag | null>(null);
  const helpId = useId();

  // A new analysis revision brings a new ROI: follow it.
  const { x: ax, y: ay, width: aw, height: ah } = analysedRoi;
  useEffect(() => {
    setRoi({ x: ax, y: ay, width: aw, height: ah });
    setRerunMethod(method);
  }, [ax, ay, aw, ah, method]);

  useEffect(() => {
    const controller = new AbortController();
    setLoad({ state: "loading" });
    loadImage(scanId, controller.signal)
      .then((image) => {
        setLoad({ state: "ready", image });
        setWindowing({ width: Math.max(image.max - image.min, 1e-6), level: (image.max + image.min) / 2 });
      })
      .catch((err: unknown) => {
        if (err instanceof DOMException && err.name === "AbortError") return;
        setLoad({ state: "error", message: err instanceof Error ? err.message : "The image could not be loaded." });
      });
    return () => controller.abort();
  }, [scanId, attempt]);

  const image = load.state === "ready" ? load.image : null;
  const fullWidth = image ? image.width * image.scale : 0;
  const fullHeight = image ? image.height * image.scale : 0;

  // Viewport size follows the container width; height keeps the image's aspect within 260–560 px.
  useEffect(() => {
    const box = boxRef.current;
    if (!box || !image) return;
    const measure = () => {
      const width = Math.floor(box.clientWidth);
      const height = Math.round(Math.max(260, Math.min(560, (width * image.height) / image.width)));
      setViewport((v) => (v.width === width && v.height === height ? v : { width, height }));
    };
    measure();
    const observer = new ResizeObserver(measure);
    observer.observe(box);
    return () => observer.disconnect();
  }, [image]);

  const fitView = useCallback((): View | null => {
    if (!image || viewport.width === 0) return null;
    const zoom = Math.min(viewport.width / image.width, viewport.height / image.height);
    return { zoom, panX: (viewport.width - image.width * zoom) / 2, panY: (viewport.height - image.height * zoom) / 2 };
  }, [image, viewport]);

  useEffect(() => {
    if (view === null) {
      const fitted = fitView();
      if (fitted) setView(fitted);
    }
  }, [fitView, view]);

  // Grey-level rendering at the preview's own resolution; the canvas scales it.
  const rendered = useMemo(() => {
    if (!image || !windowing || typeof document === "undefined") return null;
    const off = document.createElement("canvas");
    off.width = image.width;
    off.height = image.height;
    const ctx = off.getContext("2d");
    if (!ctx) return null;
    const pixels = ctx.createImageData(image.width, image.height);
    const low = windowing.level - windowing.width / 2;
    const k = 255 / windowing.width;
    for (let i = 0; i < image.data.length; i++) {
      const g = Math.max(0, Math.min(255, (image.data[i]! - low) * k));
      const o = i * 4;
      pixels.data[o] = g;
      pixels.data[o + 1] = g;
      pixels.data[o + 2] = g;
      pixels.data[o + 3] = 255;
    }
    ctx.putImageData(pixels, 0, 0);
    return off;
  }, [image, windowing]);

  // Canvas coordinates (CSS px) of the ROI rectangle's edges.
  const roiBox = useCallback(
    (r: RoiJson, v: View, img: LoadedImage) => ({
      left: v.panX + (r.x / img.scale) * v.zoom,
      top: v.panY + (r.y / img.scale) * v.zoom,
      right: v.panX + ((r.x + r.width) / img.scale) * v.zoom,
      bottom: v.panY + ((r.y + r.height) / img.scale) * v.zoom,
    }),
    [],
  );

  useEffect(() => {
    const canvas = canvasRef.current;
    const ctx = canvas?.getContext("2d");
    if (!canvas || !ctx || !image || !view || !rendered || viewport.width === 0) return;
    const dpr = Math.max(1, Math.min(3, window.devicePixelRatio || 1));
    canvas.width = Math.round(viewport.width * dpr);
    canvas.height = Math.round(viewport.height * dpr);
    ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
    ctx.fillStyle = "#15181C";
    ctx.fillRect(0, 0, viewport.width, viewport.height);
    ctx.imageSmoothingEnabled = view.zoom < 1;
    ctx.drawImage(rendered, view.panX, view.panY, image.width * view.zoom, image.height * view.zoom);
    const b = roiBox(roi, view, image);
    ctx.lineWidth = 3;
    ctx.strokeStyle = "rgba(0,0,0,0.7)";
    ctx.strokeRect(b.left, b.top, b.right - b.left, b.bottom - b.top);
    ctx.lineWidth = 1.5;
    ctx.strokeStyle = ROI_COLOUR;
    ctx.strokeRect(b.left, b.top, b.right - b.left, b.bottom - b.top);
    if (!canReanalyse) return; // handles only where the ROI can be edited
    const mx = (b.left + b.right) / 2;
    const my = (b.top + b.bottom) / 2;
    const handles: [number, number][] = [
      [b.left, b.top], [mx, b.top], [b.right, b.top], [b.right, my], [b.right, b.bottom], [mx, b.bottom], [b.left, b.bottom], [b.left, my],
    ];
    for (const [hx, hy] of handles) {
      ctx.fillStyle = "rgba(0,0,0,0.7)";
      ctx.fillRect(hx - 4, hy - 4, 8, 8);
      ctx.fillStyle = ROI_COLOUR;
      ctx.fillRect(hx - 3, hy - 3, 6, 6);
    }
  }, [image, view, rendered, roi, viewport, roiBox, canReanalyse]);

  const zoomAt = useCallback(
    (factor: number, cx: number, cy: number) => {
      setView((v) => {
        if (!v || !image) return v;
        const fit = Math.min(viewport.width / image.width, viewport.height / image.height);
        const zoom = Math.max(fit * 0.5, Math.min(MAX_ZOOM, v.zoom * factor));
        const k = zoom / v.zoom;
        return { zoom, panX: cx - (cx - v.panX) * k, panY: cy - (cy - v.panY) * k };
      });
    },
    [image, viewport],
  );

  // Wheel zoom around the pointer; the listener is not passive so the page does not scroll meanwhile.
  useEffect(() => {
    const canvas = canvasRef.current;
    if (!canvas) return;
    const onWheel = (event: WheelEvent) => {
      event.preventDefault();
      const rect = canvas.getBoundingClientRect();
      zoomAt(Math.exp(-event.deltaY * 0.0015), event.clientX - rect.left, event.clientY - rect.top);
    };
    canvas.addEventListener("wheel", onWheel, { passive: false });
    return () => canvas.removeEventListener("wheel", onWheel);
  }, [zoomAt, image]);

  const hitTest = (px: number, py: number): DragMode => {
    // Only users who may re-run the analysis edit the ROI; everyone else pans and zooms.
    if (!image || !view || !canReanalyse) return "pan";
    const b = roiBox(roi, view, image);
    const nearL = Math.abs(px - b.left) <= HANDLE_PX;
    const nearR = Math.abs(px - b.right) <= HANDLE_PX;
    const nearT = Math.abs(py - b.top) <= HANDLE_PX;
    const nearB = Math.abs(py - b.bottom) <= HANDLE_PX;
    const withinX = px >= b.left - HANDLE_PX && px <= b.right + HANDLE_PX;
    const withinY = py >= b.top - HANDLE_PX && py <= b.bottom + HANDLE_PX;
    if (nearT && nearL) return "nw";
    if (nearT && nearR) return "ne";
    if (nearB && nearL) return "sw";
    if (nearB && nearR) return "se";
    if (nearT && withinX) return "n";
    if (nearB && withinX) return "s";
    if (nearL && withinY) return "w";
    if (nearR && withinY) return "e";
    if (px > b.left && px < b.right && py > b.top && py < b.bottom) return "move";
    return "pan";
  };

  const pointerPosition = (event: PointerEvent<HTMLCanvasElement>) => {
    const rect = event.currentTarget.getBoundingClientRect();
    return { px: event.clientX - rect.left, py: event.clientY - rect.top };
  };

  const onPointerDown = (event: PointerEvent<HTMLCanvasElement>) => {
    if (!view || event.button !== 0) return;
    const { px, py } = pointerPosition(event);
    const mode = hitTest(px, py);
    drag.current = { mode, pointerId: event.pointerId, startX: px, startY: py, roi, panX: view.panX, panY: view.panY };
    event.currentTarget.setPointerCapture(event.pointerId);
    event.currentTarget.style.cursor = mode === "pan" ? "grabbing" : CURSORS[mode];
  };

  const onPointerMove = (event: PointerEvent<HTMLCanvasElement>) => {
    if (!image || !view) return;
    const { px, py } = pointerPosition(event);
    const d = drag.current;
    if (!d || d.pointerId !== event.pointerId) {
      event.currentTarget.style.cursor = CURSORS[hitTest(px, py)];
      const ix = Math.floor((px - view.panX) / view.zoom);
      const iy = Math.floor((py - view.panY) / view.zoom);
      if (ix >= 0 && iy >= 0 && ix < image.width && iy < image.height) setHover({ x: ix * image.scale, y: iy * image.scale, value: image.data[iy * image.width + ix]! });
      else setHover(null);
      return;
    }
    const dxCss = px - d.startX;
    const dyCss = py - d.startY;
    if (d.mode === "pan") {
      setView({ ...view, panX: d.panX + dxCss, panY: d.panY + dyCss });
      return;
    }
    const dx = (dxCss / view.zoom) * image.scale;
    const dy = (dyCss / view.zoom) * image.scale;
    const r = d.roi;
    let left = r.x;
    let top = r.y;
    let right = r.x + r.width;
    let bottom = r.y + r.height;
    if (d.mode === "move") {
      setRoi(clampRoi({ x: r.x + dx, y: r.y + dy, width: r.width, height: r.height }, fullWidth, fullHeight));
      return;
    }
    if (d.mode.includes("w")) left = Math.max(0, Math.min(right - MIN_ROI_PX, r.x + dx));
    if (d.mode.includes("e")) right = Math.min(fullWidth, Math.max(left + MIN_ROI_PX, r.x + r.width + dx));
    if (d.mode.includes("n")) top = Math.max(0, Math.min(bottom - MIN_ROI_PX, r.y + dy));
    if (d.mode.includes("s")) bottom = Math.min(fullHeight, Math.max(top + MIN_ROI_PX, r.y + r.height + dy));
    const x = Math.round(left);
    const y = Math.round(top);
    setRoi(clampRoi({ x, y, width: Math.round(right) - x, height: Math.round(bottom) - y }, fullWidth, fullHeight));
  };

  const endDrag = (event: PointerEvent<HTMLCanvasElement>) => {
    if (drag.current?.pointerId === event.pointerId) {
      drag.current = null;
      const { px, py } = pointerPosition(event);
      event.currentTarget.style.cursor = CURSORS[hitTest(px, py)];
    }
  };

  const onKeyDown = (event: KeyboardEvent<HTMLCanvasElement>) => {
    const step = event.shiftKey ? 10 : 1;
    const moves: Record<string, [number, number]> = { ArrowLeft: [-step, 0], ArrowRight: [step, 0], ArrowUp: [0, -step], ArrowDown: [0, step] };
    const move = moves[event.key];
    if (move && image && canReanalyse) {
      event.preventDefault();
      setRoi((r) => clampRoi({ ...r, x: r.x + move[0], y: r.y + move[1] }, fullWidth, fullHeight));
    } else if ((event.key === "+" || event.key === "=") && viewport.width) {
      event.preventDefault();
      zoomAt(1.25, viewport.width / 2, viewport.height / 2);
    } else if (event.key === "-" && viewport.width) {
      event.preventDefault();
      zoomAt(0.8, viewport.width / 2, viewport.height / 2);
    }
  };

  const zoomToRoi = () => {
    if (!image || viewport.width === 0) return;
    const w = roi.width / image.scale;
    const h = roi.height / image.scale;
    const zoom = Math.min(MAX_ZOOM, 0.7 * Math.min(viewport.width / w, viewport.height / h));
    const cx = (roi.x + roi.width / 2) / image.scale;
    const cy = (roi.y + roi.height / 2) / image.scale;
    setView({ zoom, panX: viewport.width / 2 - cx * zoom, panY: viewport.height / 2 - cy * zoom });
  };

  const rerun = async (withRoi: boolean) => {
    setPending(withRoi ? "roi" : "auto");
    setRerunError(null);
    setRerunDone(null);
    try {
      const body = { method: rerunMethod, roi: withRoi ? roi : null, ...(reason.trim() ? { reason: reason.trim() } : {}) };
      const result = await fetchJson<ScanJsonView>(`/api/scans/${scanId}/analyses`, { method: "POST", body });
      const a = result.analysis;
      setRerunDone(a ? `Revision ${a.revision} analysed (${METHOD_LABELS[a.method]}): ${a.evaluation?.headline ?? "done"}.` : "Analysed.");
      setReason("");
      startRefresh(() => router.refresh());
    } catch (err) {
      setRerunError(errorMessage(err));
    } finally {
      setPending(null);
    }
  };

  const [rowMm, colMm] = pixelSpacingMm;
  const roiChanged = !sameRoi(roi, analysedRoi);

  if (load.state === "loading") {
    return (
      <div className="flex flex-col gap-3" data-testid="scan-image-viewer" aria-busy="true">
        <div className="relative">
          <Skeleton className="h-80 rounded-control" />
          <span className="absolute inset-0 flex items-center justify-center gap-2 text-body text-ink-muted">
            <Spinner size="sm" decorative /> Loading the image…
          </span>
        </div>
      </div>
    );
  }
  if (load.state === "error") {
    return (
      <div data-testid="scan-image-viewer">
        <Callout
          tone="error"
          title="The image could not be shown"
          actions={
            <Button size="sm" variant="secondary" onClick={() => setAttempt((n) => n + 1)}>
              Try again
            </Button>
          }
        >
          {load.message}
        </Callout>
      </div>
    );
  }

  const img = load.image;
  const range = Math.max(img.max - img.min, 1e-6);
  const wl = windowing ?? { width: range, level: (img.max + img.min) / 2 };
  const levelStep = range / 500;
  const digits = range >= 100 ? 0 : range >= 1 ? 2 : 4;

  return (
    <div className="flex flex-col gap-4" data-testid="scan-image-viewer">
      <div className="flex flex-wrap items-center gap-2">
        <Button size="sm" variant="secondary" aria-label="Zoom in" onClick={() => zoomAt(1.25, viewport.width / 2, viewport.height / 2)}>
          +
        </Button>
        <Button size="sm" variant="secondary" aria-label="Zoom out" onClick={() => zoomAt(0.8, viewport.width / 2, viewport.height / 2)}>
          −
        </Button>
        <Button size="sm" variant="secondary" onClick={() => setView(fitView())}>
          Fit
        </Button>
        <Button size="sm" variant="secondary" onClick={zoomToRoi}>
          Zoom to ROI
        </Button>
        <span className="ml-auto text-caption text-ink-muted tnum" aria-live="off">
          {view ? `${formatMetric(view.zoom * 100 / img.scale, 0)} %` : ""}
          {hover ? ` · x ${hover.x}, y ${hover.y}: ${formatMetric(hover.value, digits)}` : ""}
        </span>
      </div>

      <div ref={boxRef} className="w-full overflow-hidden rounded-control border border-line bg-[#15181C]">
        <canvas
          ref={canvasRef}
          tabIndex={0}
          role="application"
          aria-roledescription="image viewer"
          aria-label={`Scan image, ${fullWidth} × ${fullHeight} pixels, with the analysis ROI at x ${roi.x}, y ${roi.y}, ${roi.width} × ${roi.height} pixels`}
          aria-describedby={helpId}
          style={{ width: viewport.width || "100%", height: viewport.height || 320, touchAction: "none" }}
          className="block"
          onPointerDown={onPointerDown}
          onPointerMove={onPointerMove}
          onPointerUp={endDrag}
          onPointerCancel={endDrag}
          onPointerLeave={() => setHover(null)}
          onKeyDown={onKeyDown}
        />
      </div>
      <p id={helpId} className="-mt-2 text-caption text-ink-subtle">
        {canReanalyse
          ? "Drag inside the yellow ROI to move it, its edges or corners to resize it, elsewhere to pan; the wheel zooms. With the image focused, arrow keys move the ROI (Shift: 10 px) and + / − zoom."
          : "The yellow rectangle is the analysed region. Drag to pan; the wheel or + / − zoom."}
        {img.scale > 1 ? ` Shown at 1/${img.scale} resolution; coordinates are in pixels of the original image.` : ""}
      </p>

      <fieldset className="grid gap-3 sm:grid-cols-2">
        <legend className="mb-2 text-body font-semibold text-ink">Window and level</legend>
        <WindowControl label="Window width" value={wl.width} min={levelStep} max={range * 2} step={levelStep} digits={digits} onChange={(width) => setWindowing({ ...wl, width })} />
        <WindowControl label="Level" value={wl.level} min={img.min} max={img.max} step={levelStep} digits={digits} onChange={(level) => setWindowing({ ...wl, level })} />
        <div className="flex flex-wrap gap-2 sm:col-span-2">
          <Button size="sm" variant="secondary" onClick={() => setWindowing({ width: range, level: (img.max + img.min) / 2 })}>
            Full range (min–max)
          </Button>
          <Button size="sm" variant="secondary" onClick={() => setWindowing({ width: Math.max(img.p99 - img.p01, levelStep), level: (img.p99 + img.p01) / 2 })}>
            Auto (1st–99th percentile)
          </Button>
        </div>
      </fieldset>

      {canReanalyse ? (
        <fieldset className="flex flex-col gap-3">
          <legend className="mb-2 text-body font-semibold text-ink">Region of interest (pixels of the original image)</legend>
          <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
            <RoiNumber label="x" value={roi.x} onCommit={(x) => setRoi(clampRoi({ ...roi, x }, fullWidth, fullHeight))} />
            <RoiNumber label="y" value={roi.y} onCommit={(y) => setRoi(clampRoi({ ...roi, y }, fullWidth, fullHeight))} />
            <RoiNumber label="Width" value={roi.width} onCommit={(width) => setRoi(clampRoi({ ...roi, width }, fullWidth, fullHeight))} />
            <RoiNumber label="Height" value={roi.height} onCommit={(height) => setRoi(clampRoi({ ...roi, height }, fullWidth, fullHeight))} />
          </div>
          <p className="text-caption text-ink-muted tnum">
            {formatMetric(roi.width * colMm, 1)} × {formatMetric(roi.height * rowMm, 1)} mm
            {roiChanged ? " · changed from the analysed ROI" : " · the ROI of the current analysis"}
            {roiChanged ? (
              <>
                {" "}
                <button type="button" className="font-medium text-accent underline underline-offset-2" onClick={() => setRoi(analysedRoi)}>
                  Reset
                </button>
              </>
            ) : null}
          </p>
        </fieldset>
      ) : (
        <p className="text-body text-ink" data-testid="roi-readout">
          <span className="font-semibold">Analysed region:</span> x {roi.x}, y {roi.y}, {roi.width} × {roi.height} px ({formatMetric(roi.width * colMm, 1)} ×{" "}
          {formatMetric(roi.height * rowMm, 1)} mm)
        </p>
      )}

      {canReanalyse ? (
        <fieldset className="flex flex-col gap-3 rounded-control border border-line bg-surface-canvas p-3">
          <legend className="px-1 text-body font-semibold text-ink">Re-run the analysis</legend>
          <div className="grid gap-3 sm:grid-cols-[minmax(0,12rem)_minmax(0,1fr)]">
            <Field label="Method">
              <Select controlSize="sm" value={rerunMethod} onChange={(event) => setRerunMethod(event.target.value as MethodChoiceKey)}>
                {METHOD_CHOICES.map((m) => (
                  <option key={m} value={m}>
                    {METHOD_LABELS[m]}
                  </option>
                ))}
              </Select>
            </Field>
            <Field label="Reason" hint="Optional; kept in the analysis history.">
              <Input controlSize="sm" value={reason} maxLength={500} onChange={(event) => setReason(event.target.value)} />
            </Field>
          </div>
          <div className="flex flex-wrap gap-2">
            <Button size="sm" onClick={() => void rerun(true)} loading={pending === "roi"} loadingText="Analysing…" disabled={pending === "auto"}>
              Re-run with this ROI
            </Button>
            <Button size="sm" variant="secondary" onClick={() => void rerun(false)} loading={pending === "auto"} loadingText="Analysing…" disabled={pending === "roi"}>
              Re-run with automatic ROI
            </Button>
          </div>
          {rerunError ? <Callout tone="error">{rerunError}</Callout> : null}
          {rerunDone ? (
            <Callout tone="success" role="status">
              {rerunDone}
              {refreshing ? " Updating the page…" : ""}
            </Callout>
          ) : null}
        </fieldset>
      ) : null}
    </div>
  );
}

function WindowControl({ label, value, min, max, step, digits, onChange }: { label: string; value: number; min: number; max: number; step: number; digits: number; onChange: (v: number) => void }) {
  const id = useId();
  return (
    <div className="flex flex-col gap-1.5">
      <label htmlFor={id} className="text-caption font-medium text-ink-muted">
        {label}
      </label>
      <div className="flex items-center gap-2">
        <input
          id={id}
          type="range"
          min={min}
          max={max}
          step={step}
          value={Math.min(max, Math.max(min, value))}
          onChange={(event) => onChange(Number(event.target.value))}
          className={cn("min-w-0 flex-1 accent-accent")}
        />
        <span className="w-28 shrink-0">
          <Input
            aria-label={`${label}, image units`}
            type="number"
            controlSize="sm"
            step={step}
            value={Number(value.toFixed(digits))}
            onChange={(event) => {
              const v = Number(event.target.value);
              if (Number.isFinite(v) && event.target.value !== "" && (label !== "Window width" || v > 0)) onChange(v);
            }}
          />
        </span>
      </div>
    </div>
  );
}

/** A whole-pixel field that commits on blur or Enter, so typing "16" does not clamp at "1". */
function RoiNumber({ label, value, onCommit }: { label: string; value: number; onCommit: (v: number) => void }) {
  const [draft, setDraft] = useState(String(value));
  useEffect(() => setDraft(String(value)), [value]);
  const commit = () => {
    const v = Number(draft);
    if (draft.trim() !== "" && Number.isFinite(v)) onCommit(Math.round(v));
    else setDraft(String(value));
  };
  return (
    <Field label={`ROI ${label} (px)`}>
      <Input
        type="number"
        inputMode="numeric"
        controlSize="sm"
        step={1}
        value={draft}
        onChange={(event) => setDraft(event.target.value)}
        onBlur={commit}
        onKeyDown={(event) => {
          if (event.key === "Enter") {
            event.preventDefault();
            commit();
          }
        }}
      />
    </Field>
  );
}
