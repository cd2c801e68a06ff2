/**
 * A uniform grid of cubic cells over space, rebuilt at every time step of the index: objects are
 * linked into the cell holding their position, cells are found by open-addressing hashing of the
 * cell coordinates (typed arrays only; a Map per step costs several times more, measured).
 *
 * Cell coordinates are clamped to ±CELL_COORD_LIMIT. Clamping maps space monotonically, so two
 * positions less than one cell apart still land in the same or neighbouring cells: far objects
 * (beyond ~500 cells) merely share edge cells and are compared more often, never less.
 */
const CELL_COORD_LIMIT = 511;
const COORD_BITS = 10;
const COORD_OFFSET = 512;

/** The 13 neighbour offsets of a "half" neighbourhood: each unordered pair of neighbouring
 *  cells is visited once, from the lower cell. */
export const HALF_NEIGHBOURS: readonly (readonly [number, number, number])[] = (() => {
  const out: [number, number, number][] = [];
  for (let dx = -1; dx <= 1; dx++)
    for (let dy = -1; dy <= 1; dy++)
      for (let dz = -1; dz <= 1; dz++) {
        if (dx > 0 || (dx === 0 && dy > 0) || (dx === 0 && dy === 0 && dz > 0)) out.push([dx, dy, dz]);
      }
  return out;
})();

export class CellGrid {
  private readonly shift: number;
  private readonly mask: number;
  private readonly keys: Int32Array;
  private readonly stamps: Int32Array;
  /** first object of each slot's cell */
  readonly head: Int32Array;
  /** next object in the same cell, or −1 */
  readonly next: Int32Array;
  /** slots in use this step, and their cell coordinates */
  readonly used: Int32Array;
  readonly usedCx: Int32Array;
  readonly usedCy: Int32Array;
  readonly usedCz: Int32Array;
  usedCount = 0;
  private stamp = 0;
  cellKm = 1;

  constructor(objects: number) {
    let bits = 10;
    while (1 << bits < 4 * objects) bits++;
    this.shift = 32 - bits;
    this.mask = (1 << bits) - 1;
    this.keys = new Int32Array(1 << bits);
    this.stamps = new Int32Array(1 << bits);
    this.head = new Int32Array(1 << bits);
    this.next = new Int32Array(objects);
    this.used = new Int32Array(objects);
    this.usedCx = new Int32Array(objects);
    this.usedCy = new Int32Array(objects);
    this.usedCz = new Int32Array(objects);
  }

  /** Starts a new step with cells of the given size (km). */
  reset(cellKm: number): void {
    this.cellKm = cellKm;
    this.usedCount = 0;
    this.stamp++;
  }

  private static key(cx: number, cy: number, cz: number): number {
    return (((cx + COORD_OFFSET) << (2 * COORD_BITS)) | ((cy + COORD_OFFSET) << COORD_BITS) | (cz + COORD_OFFSET)) >>> 0;
  }

  private static clamp(c: number): number {
    return c < -CELL_COORD_LIMIT ? -CELL_COORD_LIMIT : c > CELL_COORD_LIMIT ? CELL_COORD_LIMIT : c;
  }

  insert(obj: number, x: number, y: number, z: number): void {
    const inv = 1 / this.cellKm;
    const cx = CellGrid.clamp(Math.floor(x * inv)), cy = CellGrid.clamp(Math.floor(y * inv)), cz = CellGrid.clamp(Math.floor(z * inv));
    const key = CellGrid.key(cx, cy, cz);
    let slot = Math.imul(key, 0x9e3779b1) >>> this.shift;
    for (;;) {
      if (this.stamps[slot] !== this.stamp) {
        this.stamps[slot] = this.stamp;
        this.keys[slot] = key;
        this.head[slot] = obj;
        this.next[obj] = -1;
        const u = this.usedCount++;
        this.used[u] = slot;
        this.usedCx[u] = cx;
        this.usedCy[u] = cy;
        this.usedCz[u] = cz;
        return;
      }
      if (this.keys[slot] === key) {
        this.next[obj] = this.head[slot]!;
        this.head[slot] = obj;
        return;
      }
      slot = (slot + 1) & this.mask;
    }
  }

  /** Slot of the cell at these coordinates this step, or −1 when it holds no object. */
  find(cx: number, cy: number, cz: number): number {
    if (cx < -CELL_COORD_LIMIT || cx > CELL_COORD_LIMIT || cy < -CELL_COORD_LIMIT || cy > CELL_COORD_LIMIT) return -1;
    if (cz < -CELL_COORD_LIMIT || cz > CELL_COORD_LIMIT) return -1;
    const key = CellGrid.key(cx, cy, cz);
    let slot = Math.imul(key, 0x9e3779b1) >>> this.shift;
    for (;;) {
      if (this.stamps[slot] !== this.stamp) return -1;
      if (this.keys[slot] === key) return slot;
      slot = (slot + 1) & this.mask;
    }
  }
}
