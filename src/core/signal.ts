/**
 * A minimal typed signal for core objects (core may not depend on Lumino):
 * connect a slot, emit to every connected slot in order, disconnect.
 */

/** A slot receives the sender and the payload. */
export type Slot<S, T> = (sender: S, args: T) => void;

/** A signal owned by `sender`. */
export class CoreSignal<S, T> {
  constructor(private readonly _sender: S) {}

  connect(slot: Slot<S, T>): void {
    if (!this._slots.includes(slot)) {
      this._slots.push(slot);
    }
  }

  disconnect(slot: Slot<S, T>): void {
    this._slots = this._slots.filter(s => s !== slot);
  }

  /** Call every slot; a slot that throws does not stop the others (the error is rethrown asynchronously). */
  emit(args: T): void {
    for (const slot of [...this._slots]) {
      try {
        slot(this._sender, args);
      } catch (error) {
        setTimeout(() => {
          throw error;
        }, 0);
      }
    }
  }

  /** Drop every slot. */
  clear(): void {
    this._slots = [];
  }

  private _slots: Slot<S, T>[] = [];
}
