// The engine's own C/A re-clustering loop (lib/physics/clustering/plain-ca.ts with crosscheckNN, moveSlot and
// firstMin of plain.ts, recombine of recombination.ts and setKinematics of workspace.ts), ported line for line
// to C++, so that the benchmark can measure what the language costs on identical work (bench/engine-bench.ts,
// section "language"). Not FastJet: the same operations, order and tie-breaking as the TypeScript loop, on the
// same jets; the benchmark checks that both count the same pair distances and end with the same trees.
//
//   plain-ca PARTICLES.bin [--rounds 5] [--min-seconds 0.2]
// PARTICLES.bin: per jet an int32 count n, then n × (px, py, pz, E) float64 (little-endian), as written by
// bench/engine-timing.ts ca-loop. Prints {"records","ops","checksum","cpuSeconds"} (fastest round, per pass).
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <ctime>
#include <vector>

namespace {
const double PI = M_PI, TWO_PI = 2 * M_PI;
const double MAX_RAP = 1e5;  // FJ_MAX_RAP of lib/physics/fourvector.ts

struct Workspace {
  std::vector<double> px, py, pz, E, kt2, rap, phi, sEta, sPhi, sNND, sLB;
  std::vector<int> sNN, sNode, parent1, parent2;
  int n = 0, nNodes = 0;
  double ops = 0;
  void ensure(int m) {
    if (static_cast<int>(sEta.size()) >= m) return;
    for (auto* v : {&px, &py, &pz, &E, &kt2, &rap, &phi}) v->resize(2 * m);
    for (auto* v : {&sEta, &sPhi, &sNND, &sLB}) v->resize(m);
    for (auto* v : {&sNN, &sNode}) v->resize(m);
    for (auto* v : {&parent1, &parent2}) v->resize(2 * m);
  }
};

void setKinematics(Workspace& w, int k) {
  const double x = w.px[k], y = w.py[k], z = w.pz[k], e = w.E[k];
  const double k2 = x * x + y * y;
  w.kt2[k] = k2;
  double f = k2 == 0 ? 0 : std::atan2(y, x);
  if (f < 0) f += TWO_PI;
  if (f >= TWO_PI) f -= TWO_PI;
  w.phi[k] = f;
  const double az = std::fabs(z);
  if (e == az && k2 == 0) {
    w.rap[k] = z >= 0 ? MAX_RAP + az : -(MAX_RAP + az);
  } else {
    const double m2 = (e + z) * (e - z) - k2;
    const double ep = e + az;
    const double r = 0.5 * std::log((k2 + (m2 > 0 ? m2 : 0)) / (ep * ep));
    w.rap[k] = z > 0 ? -r : r;
  }
}

int recombine(Workspace& w, int i, int j) {
  const int k = w.nNodes++;
  w.px[k] = w.px[i] + w.px[j];
  w.py[k] = w.py[i] + w.py[j];
  w.pz[k] = w.pz[i] + w.pz[j];
  w.E[k] = w.E[i] + w.E[j];
  w.parent1[k] = i < j ? i : j;
  w.parent2[k] = i < j ? j : i;
  setKinematics(w, k);
  return k;
}

inline double dist2(double y1, double f1, double y2, double f2) {
  double dphi = std::fabs(f1 - f2);
  const double deta = y1 - y2;
  if (dphi > PI) dphi = TWO_PI - dphi;
  return dphi * dphi + deta * deta;
}

void crosscheckNN(Workspace& w, int a) {
  double *sEta = w.sEta.data(), *sPhi = w.sPhi.data(), *sNND = w.sNND.data(), *sLB = w.sLB.data();
  int* sNN = w.sNN.data();
  const double ea = sEta[a], fa = sPhi[a];
  double best = INFINITY, best2 = INFINITY;
  int bi = -1;
  for (int b = 0; b < a; b++) {
    const double dist = dist2(ea, fa, sEta[b], sPhi[b]);
    if (dist < best) {
      best2 = best;
      best = dist;
      bi = b;
    } else if (dist < best2) {
      best2 = dist;
    }
    if (dist < sNND[b]) {
      sLB[b] = sNND[b];
      sNND[b] = dist;
      sNN[b] = a;
    } else if (dist < sLB[b]) {
      sLB[b] = dist;
    }
  }
  sNN[a] = bi;
  sNND[a] = best;
  sLB[a] = best2;
}

void clusterPlainCA(Workspace& w) {
  int n = w.n;
  double *sEta = w.sEta.data(), *sPhi = w.sPhi.data(), *sNND = w.sNND.data(), *sLB = w.sLB.data();
  int *sNN = w.sNN.data(), *sNode = w.sNode.data();
  double ops = static_cast<double>(n) * (n - 1) / 2;
  for (int i = 0; i < n; i++) {
    sEta[i] = w.rap[i];
    sPhi[i] = w.phi[i];
    sNode[i] = i;
  }
  for (int a = 0; a < n; a++) crosscheckNN(w, a);
  int imin = 0;
  for (int i = 1; i < n; i++)
    if (sNND[i] < sNND[imin]) imin = i;
  while (n > 1) {
    int a = imin, b = sNN[a];
    if (a < b) std::swap(a, b);
    const int k = recombine(w, sNode[a], sNode[b]);
    sEta[b] = w.rap[k];
    sPhi[b] = w.phi[k];
    sNode[b] = k;
    const double eb = sEta[b], fb = sPhi[b];
    n--;
    const int tail = n;
    sEta[a] = sEta[tail];
    sPhi[a] = sPhi[tail];
    sNND[a] = sNND[tail];
    sLB[a] = sLB[tail];
    sNN[a] = sNN[tail];
    sNode[a] = sNode[tail];
    double bBest = INFINITY, bBest2 = INFINITY, dmin = INFINITY;
    int bBi = -1;
    imin = -1;
    ops += n;
    for (int i = 0; i < n; i++) {
      if (i == b) continue;
      const int nn = sNN[i];
      double nd = sNND[i];
      const double dist = dist2(sEta[i], sPhi[i], eb, fb);
      if (nn == a || nn == b) {
        if (dist < sLB[i]) {
          sNN[i] = b;
          sNND[i] = nd = dist;
        } else {
          const double ei = sEta[i], fi = sPhi[i];
          double best = INFINITY, best2 = INFINITY;
          int bi = -1;
          ops += n;
          for (int j = 0; j < n; j++) {
            if (j == i) continue;
            const double dd = dist2(ei, fi, sEta[j], sPhi[j]);
            if (dd < best) {
              best2 = best;
              best = dd;
              bi = j;
            } else if (dd < best2) {
              best2 = dd;
            }
          }
          sNN[i] = bi;
          sNND[i] = nd = best;
          sLB[i] = best2;
        }
      } else if (dist < nd) {
        sLB[i] = nd;
        sNND[i] = nd = dist;
        sNN[i] = b;
      } else {
        if (dist < sLB[i]) sLB[i] = dist;
        if (nn == tail) sNN[i] = a;
      }
      if (dist < bBest) {
        bBest2 = bBest;
        bBest = dist;
        bBi = i;
      } else if (dist < bBest2) {
        bBest2 = dist;
      }
      if (nd < dmin) {
        dmin = nd;
        imin = i;
      }
    }
    sNND[b] = bBest;
    sLB[b] = bBest2;
    sNN[b] = bBi;
    if (bBest < dmin || (bBest == dmin && b < imin)) imin = b;
  }
  w.ops += ops;
}

double cpuSeconds() { return static_cast<double>(std::clock()) / CLOCKS_PER_SEC; }
}  // namespace

int main(int argc, char** argv) {
  if (argc < 2) {
    std::fprintf(stderr, "usage: plain-ca PARTICLES.bin [--rounds N] [--min-seconds S]\n");
    return 2;
  }
  int rounds = 5;
  double minSeconds = 0.2;
  for (int i = 2; i + 1 < argc; i += 2) {
    if (!std::strcmp(argv[i], "--rounds")) rounds = std::atoi(argv[i + 1]);
    else if (!std::strcmp(argv[i], "--min-seconds")) minSeconds = std::atof(argv[i + 1]);
  }
  FILE* f = std::fopen(argv[1], "rb");
  if (!f) {
    std::perror(argv[1]);
    return 1;
  }
  std::vector<std::vector<double>> jets;
  int n;
  while (std::fread(&n, 4, 1, f) == 1) {
    std::vector<double> p(4 * static_cast<size_t>(n));
    if (std::fread(p.data(), 8, p.size(), f) != p.size()) {
      std::fprintf(stderr, "%s: truncated\n", argv[1]);
      return 1;
    }
    jets.push_back(std::move(p));
  }
  std::fclose(f);
  Workspace w;
  double best = INFINITY, ops = 0, checksum = 0;
  for (int round = 0; round < rounds; round++) {
    const double c0 = cpuSeconds();
    int passes = 0;
    do {
      w.ops = 0;
      checksum = 0;
      for (const auto& p : jets) {
        const int m = static_cast<int>(p.size() / 4);
        if (m == 0) continue;
        w.ensure(m);
        for (int i = 0; i < m; i++) {
          w.px[i] = p[4 * i];
          w.py[i] = p[4 * i + 1];
          w.pz[i] = p[4 * i + 2];
          w.E[i] = p[4 * i + 3];
          setKinematics(w, i);
        }
        w.n = m;
        w.nNodes = m;
        clusterPlainCA(w);
        // The tree's shape and the last merged jet's rapidity.
        for (int k = m; k < w.nNodes; k++) checksum += (w.parent1[k] + 2.0 * w.parent2[k]) * 1e-6;
        checksum += w.rap[w.nNodes - 1];
      }
      ops = w.ops;
      passes++;
    } while (cpuSeconds() - c0 < minSeconds);
    const double t = (cpuSeconds() - c0) / passes;
    if (t < best) best = t;
  }
  std::printf("{\"records\":%zu,\"ops\":%.0f,\"checksum\":%.17g,\"cpuSeconds\":%.9g}\n", jets.size(), ops, checksum, best);
  return 0;
}
