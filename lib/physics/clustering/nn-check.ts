// Tests only (ws.verify): a brute-force check, after every step of the tiled and grid strategies, that every
// active jet's NN distance is the true one and that the tile bounds and the grid's far list hold.

import { dist2 } from './brief-jets';
import type { ClusterWorkspace } from './workspace';

/**
 * Brute-force check of the NN bookkeeping (tests: ws.verify). `alive(i)` tells the active slots; `R2` is the
 * NN range (Infinity for the C/A grid); `grid` selects the grid strategy's near/far rules.
 */
export function verifyState(ws: ClusterWorkspace, n: number, isAlive: (i: number) => boolean, R2: number, grid: boolean): void {
  const { sEta, sPhi, sNND, sNN, sTile, tileMax } = ws;
  for (let i = 0; i < n; i++) {
    if (!isAlive(i)) continue;
    let best = R2;
    for (let j = 0; j < n; j++) {
      if (j === i || !isAlive(j)) continue;
      const dist = dist2(sEta[i], sPhi[i], sEta[j], sPhi[j]);
      if (dist < best) best = dist;
    }
    if (sNND[i] !== best) throw new Error(`NN check: slot ${i} has NN distance ${sNND[i]} (NN ${sNN[i]}), true ${best}`);
    if (sNN[i] >= 0 && !isAlive(sNN[i])) throw new Error(`NN check: slot ${i} has a dead NN ${sNN[i]}`);
    const near = grid ? sNND[i] < ws.gR2 : true;
    if (near && sNND[i] > tileMax[sTile[i]]) throw new Error(`NN check: tile ${sTile[i]} bound ${tileMax[sTile[i]]} < NN distance ${sNND[i]} of slot ${i}`);
    if (grid && !near && ws.farPos[i] < 0) throw new Error(`NN check: slot ${i} is far but not in the far list`);
  }
}
