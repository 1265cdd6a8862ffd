import { useEffect, useRef } from 'react';
import * as THREE from 'three';
import { OrbitControls } from 'three/examples/jsm/controls/OrbitControls.js';
import type { DecodedQuickLookFrame } from '../../../../shared/engine/quick-look-decode';
import { seriesColour } from '../palette';

type Scene = {
  renderer: THREE.WebGLRenderer;
  camera: THREE.PerspectiveCamera;
  scene: THREE.Scene;
  controls: OrbitControls;
  points: THREE.Points;
  render: () => void;
};

/** A round sprite so points draw as discs, not squares. */
function discTexture(): THREE.Texture {
  const c = document.createElement('canvas');
  c.width = c.height = 64;
  const g = c.getContext('2d')!;
  g.beginPath();
  g.arc(32, 32, 28, 0, Math.PI * 2);
  g.fillStyle = '#ffffff';
  g.fill();
  return new THREE.CanvasTexture(c);
}

/**
 * The sample in 3D with three.js: drag to rotate, wheel or pinch to zoom, right
 * drag to pan; the box is the sample's bounds, z points up. Calls `onFailure`
 * when WebGL cannot start so the player can fall back to a projection.
 * Renders only on change (camera move or new frame) to spare the CPU.
 */
export default function QuickLook3D({ frames, index, bounds, onFailure, resetSignal, software = false }: {
  frames: DecodedQuickLookFrame[];
  index: number;
  bounds: { min: number[]; max: number[] };
  onFailure: (reason: string) => void;
  resetSignal: number;
  /** WebGL is drawn by the CPU (no GPU). */
  software?: boolean;
}) {
  const mount = useRef<HTMLDivElement>(null);
  const state = useRef<Scene | null>(null);
  const maxN = frames.reduce((m, f) => Math.max(m, f.ids.length), 0);

  useEffect(() => {
    const host = mount.current!;
    let renderer: THREE.WebGLRenderer;
    try {
      // A software rasteriser draws on the CPU, shared with the rest of the page: no antialiasing there.
      renderer = new THREE.WebGLRenderer({ antialias: !software });
    } catch (e) {
      onFailure(e instanceof Error ? e.message : 'WebGL is not available.');
      return;
    }
    renderer.setPixelRatio(software ? 1 : Math.min(window.devicePixelRatio, 2));
    renderer.domElement.setAttribute('aria-hidden', 'true');
    renderer.domElement.style.touchAction = 'none';
    host.append(renderer.domElement);

    const min = new THREE.Vector3(...bounds.min);
    const max = new THREE.Vector3(...bounds.max);
    const centre = min.clone().add(max).multiplyScalar(0.5);
    const span = max.clone().sub(min);
    const size = Math.max(span.x, span.y, span.z, 1e-9);

    const scene = new THREE.Scene();
    scene.background = new THREE.Color('#ffffff');
    const camera = new THREE.PerspectiveCamera(40, 1, size / 1000, size * 100);
    camera.up.set(0, 0, 1);
    camera.position.copy(centre).add(new THREE.Vector3(1.2, -1.55, 0.95).multiplyScalar(size));
    const controls = new OrbitControls(camera, renderer.domElement);
    controls.target.copy(centre);
    controls.update();
    controls.saveState();

    const box = new THREE.LineSegments(new THREE.EdgesGeometry(new THREE.BoxGeometry(Math.max(span.x, 1e-9), Math.max(span.y, 1e-9), Math.max(span.z, 1e-9))), new THREE.LineBasicMaterial({ color: '#b7c3c9' }));
    box.position.copy(centre);
    scene.add(box);
    // Axis stubs from the lower corner, drawn in ink so colour is not needed to read them.
    const axes = new THREE.BufferGeometry().setFromPoints([min, min.clone().add(new THREE.Vector3(size * 0.2, 0, 0)), min, min.clone().add(new THREE.Vector3(0, size * 0.2, 0)), min, min.clone().add(new THREE.Vector3(0, 0, size * 0.2))]);
    scene.add(new THREE.LineSegments(axes, new THREE.LineBasicMaterial({ color: '#1d2a33' })));

    const geometry = new THREE.BufferGeometry();
    geometry.setAttribute('position', new THREE.BufferAttribute(new Float32Array(Math.max(1, maxN) * 3), 3));
    geometry.setAttribute('color', new THREE.BufferAttribute(new Float32Array(Math.max(1, maxN) * 3), 3));
    const texture = discTexture();
    const material = new THREE.PointsMaterial({ size: size * 0.1, vertexColors: true, map: texture, alphaTest: 0.5, sizeAttenuation: true });
    const points = new THREE.Points(geometry, material);
    points.frustumCulled = false;
    scene.add(points);

    const render = () => renderer.render(scene, camera);
    controls.addEventListener('change', render);
    const resize = () => {
      const w = host.clientWidth || 1, h = host.clientHeight || 1;
      renderer.setSize(w, h, true);
      camera.aspect = w / h;
      camera.updateProjectionMatrix();
      render();
    };
    const observer = new ResizeObserver(resize);
    observer.observe(host);
    resize();
    state.current = { renderer, camera, scene, controls, points, render };

    return () => {
      observer.disconnect();
      controls.removeEventListener('change', render);
      controls.dispose();
      geometry.dispose();
      material.dispose();
      texture.dispose();
      box.geometry.dispose();
      axes.dispose();
      renderer.dispose();
      renderer.domElement.remove();
      state.current = null;
    };
    // A new sample rebuilds the scene; onFailure is only called during set-up.
  }, [frames, bounds, maxN]);

  useEffect(() => {
    const s = state.current;
    const f = frames[index];
    if (!s || !f) return;
    const pos = s.points.geometry.getAttribute('position') as THREE.BufferAttribute;
    const col = s.points.geometry.getAttribute('color') as THREE.BufferAttribute;
    const c = new THREE.Color();
    let n = 0;
    f.ids.forEach((id, i) => {
      const x = f.positions[i * 3], y = f.positions[i * 3 + 1], z = f.positions[i * 3 + 2];
      if (!Number.isFinite(x) || !Number.isFinite(y) || !Number.isFinite(z)) return;
      pos.setXYZ(n, x, y, z);
      c.set(seriesColour(id));
      col.setXYZ(n, c.r, c.g, c.b);
      n++;
    });
    pos.needsUpdate = true;
    col.needsUpdate = true;
    s.points.geometry.setDrawRange(0, n);
    s.render();
  }, [frames, index]);

  useEffect(() => {
    if (resetSignal) state.current?.controls.reset();
  }, [resetSignal]);

  return <div ref={mount} className="h-full w-full cursor-grab active:cursor-grabbing" data-testid="quick-look-3d" />;
}
