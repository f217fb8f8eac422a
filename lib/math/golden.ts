/** The golden mean τ = (1 + √5)/2, the irrational of every five-fold model (chain, Penrose, icosahedral). */
export const TAU = (1 + Math.sqrt(5)) / 2;
