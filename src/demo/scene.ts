// The Kestrel Quay scene: every object once, in world metres, with its instance id and true class.
// Built from the seed alone (cached), so each frame, in any worker, sees the same world.
import { DRAW_SKIP, type Drawer } from './draw.ts';
import { Rng } from './random.ts';
import { containersAdd } from './sceneYard.ts';
import { cranesAdd } from './sceneCranes.ts';
import { trucksAdd } from './sceneTrucks.ts';
import { peopleAdd } from './scenePeople.ts';
import { propsAdd } from './sceneProps.ts';
import { buildingsAdd } from './sceneBuildings.ts';
import { ghostsAdd, type GhostName } from './sceneGhosts.ts';

/** One object of the scene: bounding sphere at time 0 and straight-line motion per frame (m). */
export interface SceneObject {
  inst: number;
  /** Class in the true scene; 255 for unlabelled clutter. */
  cls: number;
  /** For ghosts (hallucinations, never in the true scene): the class a prediction gives them; else -1. */
  ghostCls: number;
  /** For unlabelled clutter: the class a prediction gives it (models do not predict void); else -1. */
  voidAs: number;
  x: number;
  y: number;
  z: number;
  r: number;
  vx: number;
  vz: number;
  /** Draws the object moved by (ox, oz) m. */
  draw(d: Drawer, ox: number, oz: number): void;
}

/** The whole world of one seed. */
export interface DemoScene {
  seed: number;
  objects: SceneObject[];
  /** Instance id → true class (DRAW_SKIP for ghosts); index 0 is the background. */
  baseClass: Uint8Array;
  /** Instance ids of the ghosts by name. */
  ghosts: Record<GhostName, number>;
}

type Optional = 'ghostCls' | 'voidAs' | 'vx' | 'vz';

/** Collects objects while the scene is being built, handing out instance ids from 1. */
export class SceneBuilder {
  readonly objects: SceneObject[] = [];

  constructor(readonly rng: Rng) {}

  /** Adds an object and returns its instance id. */
  add(o: Omit<SceneObject, 'inst' | Optional> & Partial<Pick<SceneObject, Optional>>): number {
    const inst = this.objects.length + 1;
    this.objects.push({ ghostCls: -1, voidAs: -1, vx: 0, vz: 0, ...o, inst });
    return inst;
  }
}

const cache = new Map<number, DemoScene>();

/** Returns the scene of `seed` (built once per seed and kept). */
export function demoScene(seed: number): DemoScene {
  const hit = cache.get(seed);
  if (hit) return hit;
  const b = new SceneBuilder(new Rng(seed));
  containersAdd(b);
  cranesAdd(b);
  trucksAdd(b);
  peopleAdd(b);
  propsAdd(b);
  buildingsAdd(b);
  const ghosts = ghostsAdd(b);
  if (b.objects.length >= 65535) throw new Error('demo scene has too many objects for 16-bit instance ids');
  const baseClass = new Uint8Array(b.objects.length + 1);
  for (const o of b.objects) baseClass[o.inst] = o.ghostCls >= 0 ? DRAW_SKIP : o.cls;
  const scene = { seed, objects: b.objects, baseClass, ghosts };
  if (cache.size > 8) cache.delete(cache.keys().next().value!);
  cache.set(seed, scene);
  return scene;
}
