/** Engine micro-benchmarks of the weld families beyond fillets (filled in as each family lands). */
export const benches: Array<{ name: string; fn: () => unknown; targetNs?: number }> = [];
