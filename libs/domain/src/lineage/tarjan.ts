/**
 * Tarjan's strongly connected components, written with an explicit stack: a 200,000-part chain
 * would overflow the call stack of the recursive textbook form.
 *
 * Visits every node reachable from `roots` through `successors`. Components are returned in the
 * order Tarjan completes them, which is a reverse topological order of the condensation: a
 * component comes before every component that can reach it.
 */
export function stronglyConnected(
  roots: Iterable<number>,
  successors: (node: number) => readonly number[],
): number[][] {
  // Visited nodes get dense local slots, so a local query costs only what it visits (no arrays
  // the size of the catalogue) and the per-node state lives in plain arrays, not in Maps.
  const slotOf = new Map<number, number>();
  const low: number[] = [];
  const onStack: boolean[] = [];
  const stack: number[] = [];
  const components: number[][] = [];

  // The call stack, as parallel arrays: node slot, its successors, the next successor to try.
  const callSlot: number[] = [];
  const callNode: number[] = [];
  const callNext: Array<readonly number[]> = [];
  const callAt: number[] = [];

  const enter = (node: number): void => {
    const slot = low.length;
    slotOf.set(node, slot);
    low.push(slot);
    onStack.push(true);
    stack.push(node);
    callSlot.push(slot);
    callNode.push(node);
    callNext.push(successors(node));
    callAt.push(0);
  };

  for (const root of roots) {
    if (slotOf.has(root)) continue;
    enter(root);
    while (callSlot.length > 0) {
      const top = callSlot.length - 1;
      const slot = callSlot[top]!;
      const next = callNext[top]!;
      const at = callAt[top]!;
      if (at < next.length) {
        callAt[top] = at + 1;
        const target = next[at]!;
        const targetSlot = slotOf.get(target);
        if (targetSlot === undefined) enter(target);
        else if (onStack[targetSlot] && targetSlot < low[slot]!) low[slot] = targetSlot;
        continue;
      }
      const node = callNode[top]!;
      callSlot.pop();
      callNode.pop();
      callNext.pop();
      callAt.pop();
      // A slot is the node's discovery index, so low === slot marks a component's root.
      if (low[slot] === slot) {
        const component: number[] = [];
        let member: number;
        do {
          member = stack.pop()!;
          onStack[slotOf.get(member)!] = false;
          component.push(member);
        } while (member !== node);
        components.push(component);
      }
      if (top > 0) {
        const parent = callSlot[top - 1]!;
        if (low[slot]! < low[parent]!) low[parent] = low[slot]!;
      }
    }
  }
  return components;
}
