import { lazy, Suspense, useEffect, useId, useMemo, useRef, useState, type KeyboardEvent } from 'react';
import type { QuickLook } from '../../../../shared/engine/quick-look';
import { decodeQuickLook } from '../../../../shared/engine/quick-look-decode';
import { formatNumber } from '../../../lib/format';
import { seriesColour } from '../palette';
import { QuickLook2D } from './quick-look-2d';

// three.js is fetched only when a 3D sample is shown in a browser with WebGL.
const QuickLook3D = lazy(() => import('./quick-look-3d'));

/**
 * Whether this browser can draw WebGL, and whether on a GPU or with a software
 * rasteriser (SwiftShader, llvmpipe: headless browsers, machines without a GPU
 * driver), which gets cheaper settings.
 */
function webglSupport(): 'gpu' | 'software' | 'none' {
  try {
    const gl = document.createElement('canvas').getContext('webgl');
    if (!gl) return 'none';
    const info = gl.getExtension('WEBGL_debug_renderer_info');
    const name = info ? String(gl.getParameter(info.UNMASKED_RENDERER_WEBGL)) : '';
    gl.getExtension('WEBGL_lose_context')?.loseContext();
    return /swiftshader|llvmpipe|softpipe|software/i.test(name) ? 'software' : 'gpu';
  } catch {
    return 'none';
  }
}

const TRAIL_FRAMES = 10;

/** Plays the engine's quick-look sample: 3D (rotatable) for 3D files, the x–y plane for 2D ones. Loaded lazily. */
export default function QuickLookPlayer({ quickLook }: { quickLook: QuickLook }) {
  const frames = useMemo(() => decodeQuickLook(quickLook), [quickLook]);
  const [index, setIndex] = useState(0);
  const [playing, setPlaying] = useState(false);
  const [trail, setTrail] = useState(true);
  const [reset, setReset] = useState(0);
  const [support] = useState(() => (quickLook.dims === 3 ? webglSupport() : 'none'));
  const [noWebgl, setNoWebgl] = useState<string | null>(() => (support === 'none' ? 'this browser offers no WebGL' : null));
  const sliderId = useId();
  const last = frames.length - 1;
  const fps = quickLook.fps > 0 ? quickLook.fps : 20;
  const clock = useRef<{ start: number; from: number } | null>(null);

  useEffect(() => {
    if (!playing || last < 1) return;
    let raf = 0;
    clock.current = { start: performance.now(), from: index >= last ? 0 : index };
    const step = (now: number) => {
      const c = clock.current!;
      // Loop the sample; time follows the wall clock, not the display's refresh rate.
      // A frame's timestamp can precede the moment play was pressed: never step back.
      const next = Math.floor(c.from + (Math.max(0, now - c.start) / 1000) * fps) % (last + 1);
      setIndex(next);
      raf = requestAnimationFrame(step);
    };
    raf = requestAnimationFrame(step);
    return () => cancelAnimationFrame(raf);
    // Restarting the clock only when play starts, not on every frame.
  }, [playing, fps, last]);

  if (!frames.length) return <p className="text-sm text-ink/70">The sample holds no frames.</p>;
  const shown = Math.max(0, Math.min(index, last));
  const frame = frames[shown];
  const t0 = frames[0].t;
  const tEnd = frames[last].t;
  const threeD = quickLook.dims === 3 && !noWebgl;

  function onKeyDown(e: KeyboardEvent<HTMLDivElement>) {
    // A focused button already answers space with a click.
    if (e.key === ' ' && !(e.target instanceof HTMLButtonElement) && !(e.target instanceof HTMLInputElement && e.target.type === 'checkbox')) {
      e.preventDefault();
      setPlaying((p) => !p);
    }
  }

  const tracksShown = new Set(frame.ids).size;
  return (
    <div
      className="flex flex-col gap-2 rounded-lg border border-mist bg-white p-3 focus-within:border-dusk/50"
      role="region"
      aria-label="Quick-look player"
      tabIndex={0}
      onKeyDown={onKeyDown}
      data-testid="quick-look-player"
    >
      <div className="relative h-[380px] w-full overflow-hidden rounded border border-mist bg-white sm:h-[440px]">
        {threeD ? (
          <Suspense fallback={<p className="p-4 text-sm text-ink/70">Loading the 3D view…</p>}>
            <QuickLook3D frames={frames} index={shown} bounds={quickLook.bounds} onFailure={(r) => setNoWebgl(r)} resetSignal={reset} software={support === 'software'} />
          </Suspense>
        ) : (
          <QuickLook2D frames={frames} index={shown} dims={quickLook.dims} bounds={quickLook.bounds} trail={trail ? TRAIL_FRAMES : 0} />
        )}
      </div>
      {quickLook.dims === 3 && noWebgl ? (
        <p className="text-xs text-ink/75" role="note" data-testid="quick-look-fallback">
          <span aria-hidden>ℹ </span>The 3D view needs WebGL ({noWebgl}); showing the x–y projection instead.
        </p>
      ) : null}
      <div className="flex flex-wrap items-center gap-3">
        <button
          type="button"
          className="inline-flex w-24 items-center justify-center gap-1.5 rounded-md border border-dusk bg-dusk px-3 py-1.5 text-sm font-medium text-paper hover:bg-[#1b3f55]"
          onClick={() => setPlaying((p) => !p)}
          aria-label={playing ? 'Pause' : 'Play'}
          data-testid="quick-look-play"
        >
          <span aria-hidden>{playing ? '❚❚' : '▶'}</span>
          {playing ? 'Pause' : 'Play'}
        </button>
        <label htmlFor={sliderId} className="sr-only">Frame</label>
        <input
          id={sliderId}
          type="range"
          min={0}
          max={last}
          step={1}
          value={shown}
          onChange={(e) => {
            setPlaying(false);
            setIndex(Number(e.target.value));
          }}
          aria-valuetext={`t = ${formatNumber(frame.t)} s, frame ${shown + 1} of ${frames.length}`}
          className="min-w-40 flex-1 accent-dusk"
          data-testid="quick-look-slider"
        />
        <output className="w-44 text-sm tabular-nums" data-testid="quick-look-time" aria-label="Time">
          t = {frame.t.toFixed(2)} s <span className="text-ink/60">/ {tEnd.toFixed(2)} s</span>
        </output>
      </div>
      <div className="flex flex-wrap items-center gap-x-4 gap-y-1 text-xs text-ink/75">
        <span className="tabular-nums">frame {shown + 1} of {frames.length}, {formatNumber(fps)} frames/s shown, first {formatNumber(tEnd - t0 + 1 / fps)} s of the file</span>
        <span className="tabular-nums">{tracksShown} of {quickLook.tracks.length} tracks in view</span>
        {threeD ? (
          <>
            <span>Drag to rotate, wheel or pinch to zoom, right-drag to pan; z points up.</span>
            <button type="button" className="text-dusk underline" onClick={() => setReset((n) => n + 1)}>Reset view</button>
          </>
        ) : (
          <label className="flex items-center gap-1">
            <input type="checkbox" checked={trail} onChange={(e) => setTrail(e.target.checked)} className="accent-dusk" />
            Trails ({TRAIL_FRAMES} frames)
          </label>
        )}
        <span className="flex items-center gap-1" aria-hidden>
          {quickLook.tracks.slice(0, 8).map((name, i) => (
            <span key={name} className="inline-block h-2.5 w-2.5 rounded-full" style={{ background: seriesColour(i) }} title={`track ${name}`} />
          ))}
        </span>
        <span>Space plays and pauses.</span>
      </div>
    </div>
  );
}
