/**
 * Small typed arrays carved out of shared 64 KiB buffers. A typed array of more than 64 bytes gets
 * a backing store of its own outside the JavaScript heap, which costs about a microsecond or two to
 * create and to collect (measured on Node 20); the live path makes tens of thousands a second (one per
 * sample message, one per frame). A slab hands out views at 8-byte aligned offsets instead, and
 * takes a fresh buffer when the current one is full: memory is never handed out twice, so a view
 * may be kept as long as any typed array (it keeps its buffer alive).
 */
export class Slab {
  private buffer: ArrayBuffer;
  private used = 0;

  constructor(private readonly size = 64 * 1024) {
    this.buffer = new ArrayBuffer(size);
  }

  /** Where `byteLength` bytes go: the current buffer, a fresh one when it is full, or one of their own when larger than a quarter of a buffer. */
  private place(byteLength: number): { buffer: ArrayBuffer; offset: number } {
    if (byteLength > this.size / 4) return { buffer: new ArrayBuffer(byteLength), offset: 0 };
    if (this.used + byteLength > this.size) {
      this.buffer = new ArrayBuffer(this.size);
      this.used = 0;
    }
    const offset = this.used;
    this.used += (byteLength + 7) & ~7;
    return { buffer: this.buffer, offset };
  }

  /** `count` zeroed float64 values. */
  float64(count: number): Float64Array {
    const { buffer, offset } = this.place(8 * count);
    return new Float64Array(buffer, offset, count);
  }

  /** `byteLength` zeroed bytes, their start 8-byte aligned. */
  bytes(byteLength: number): Uint8Array {
    const { buffer, offset } = this.place(byteLength);
    return new Uint8Array(buffer, offset, byteLength);
  }
}
