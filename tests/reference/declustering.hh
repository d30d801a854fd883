// What both FastJet reference programs share (fastjet-ref.cc for the correctness tests, fastjet-speed.cc for the
// benchmark): the declustering of a FastJet Cambridge/Aachen tree into splittings, SoftDrop and the primary
// multiplicity, with the definitions of PHYSICS.md; the command-line options, the jet definitions, the reading of
// a particle, and the export's header line. Reference: FastJet 3.4.0 (Debian libfastjet-dev).
//
// A splitting j -> a, b (pt_a >= pt_b) is 9 doubles in the order of lib/physics/types.ts SPLIT_FIELDS:
// ln(1/Δ), ln(kt), z, Δ, kt, ψ, m, κ, generation (primary-emission plane, arXiv:1807.04758).
// SoftDrop (arXiv:1402.2657) on the primary sequence: the first splitting with z > zcut (Δ/R0)^β gives
// m_g = m_{a+b}, z_g and R_g = Δ; when none passes, grooming mode (the default, PHYSICS.md) keeps the single
// particle at the end of the harder branch (m_g its mass, z_g = R_g = 0) and tagging mode fails the jet (NaN);
// multiplicity = primary splittings with kt > ktcut.

#pragma once

#include <fastjet/ClusterSequence.hh>

#include <cmath>
#include <cstdlib>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

namespace splitfield_ref {

using fastjet::ClusterSequence;
using fastjet::PseudoJet;

const double PI = 3.141592653589793238462643383279502884197;
const double TWOPI = 2 * PI;

struct Split {
  double f[9];
};

// has_parents already orders the parents by decreasing pt (parent1 = earlier history entry on a tie);
// the swap below is a no-op kept for clarity. Returns the harder branch in `harder`, the softer in `softer`.
inline Split make_split(const PseudoJet &j, PseudoJet a, PseudoJet b, int gen, PseudoJet &harder, PseudoJet &softer) {
  if (a.pt2() < b.pt2()) std::swap(a, b);
  const double delta = a.delta_R(b);
  const double pta = a.pt(), ptb = b.pt();
  const double z = ptb / (pta + ptb);
  const double kt = ptb * delta;
  double sphi = b.phi() - a.phi();
  if (sphi > PI) sphi -= TWOPI;
  else if (sphi <= -PI) sphi += TWOPI;
  Split s;
  s.f[0] = std::log(1.0 / delta);
  s.f[1] = std::log(kt);
  s.f[2] = z;
  s.f[3] = delta;
  s.f[4] = kt;
  s.f[5] = std::atan2(b.rap() - a.rap(), sphi);
  s.f[6] = j.m();
  s.f[7] = z * delta;
  s.f[8] = gen;
  harder = a;
  softer = b;
  return s;
}

// e+e- splitting (PHYSICS.md "Lepton-collider events"): E_a >= E_b (on a tie has_parents' order), θ = opening
// angle, kt = E_b sin θ, z = E_b/(E_a+E_b), ψ = atan2(-p_b·ê_θ(a), p_b·ê_φ(a)); the same nine fields with θ for Δ.
inline Split make_split_ee(const PseudoJet &j, PseudoJet a, PseudoJet b, int gen, PseudoJet &harder, PseudoJet &softer) {
  if (a.E() < b.E()) std::swap(a, b);
  const double ax = a.px(), ay = a.py(), az = a.pz(), bx = b.px(), by = b.py(), bz = b.pz();
  const double cx = ay * bz - az * by, cy = az * bx - ax * bz, cz = ax * by - ay * bx;
  const double cross = std::sqrt(cx * cx + cy * cy + cz * cz);
  const double dot = ax * bx + ay * by + az * bz;
  const double theta = std::atan2(cross, dot);
  const double magA = std::sqrt(ax * ax + ay * ay + az * az), magB = std::sqrt(bx * bx + by * by + bz * bz);
  const double z = b.E() / (a.E() + b.E());
  const double kt = b.E() * (cross / (magA * magB));
  const double ptA = std::sqrt(a.pt2());
  const double cosPhi = ptA > 0 ? ax / ptA : 1, sinPhi = ptA > 0 ? ay / ptA : 0;
  const double cosTheta = az / magA, sinTheta = ptA / magA;
  const double alongTheta = cosTheta * (cosPhi * bx + sinPhi * by) - sinTheta * bz;
  const double alongPhi = -sinPhi * bx + cosPhi * by;
  Split s;
  s.f[0] = std::log(1.0 / theta);
  s.f[1] = std::log(kt);
  s.f[2] = z;
  s.f[3] = theta;
  s.f[4] = kt;
  s.f[5] = std::atan2(-alongTheta, alongPhi);
  s.f[6] = j.m();
  s.f[7] = z * theta;
  s.f[8] = gen;
  harder = a;
  softer = b;
  return s;
}

inline Split split_of(bool ee, const PseudoJet &j, const PseudoJet &p1, const PseudoJet &p2, int gen, PseudoJet &a, PseudoJet &b) {
  return ee ? make_split_ee(j, p1, p2, gen, a, b) : make_split(j, p1, p2, gen, a, b);
}

// Primary sequence: undo the last clustering, follow the harder branch (`ee`: e+e- splittings). Returns the
// single particle at the end of the harder branch.
inline PseudoJet primary_sequence(const ClusterSequence &cs, const PseudoJet &root, std::vector<Split> &out, bool ee = false) {
  PseudoJet j = root, p1, p2, a, b;
  while (cs.has_parents(j, p1, p2)) {
    out.push_back(split_of(ee, j, p1, p2, 1, a, b));
    j = a;
  }
  return j;
}

// Depth first, harder branch first; generation = 1 + softer branches followed from the root.
inline void full_tree(const ClusterSequence &cs, const PseudoJet &j, int gen, std::vector<Split> &out, bool ee = false) {
  PseudoJet p1, p2, a, b;
  if (!cs.has_parents(j, p1, p2)) return;
  out.push_back(split_of(ee, j, p1, p2, gen, a, b));
  full_tree(cs, a, gen, out, ee);
  full_tree(cs, b, gen + 1, out, ee);
}

struct Observables {
  double mg = NAN, zg = NAN, rg = NAN;
  long mult = 0;
};

// The options both programs take: jet definition, cuts, observables, --all, input and --out.
struct CommonOptions {
  double R = 0.4, ptmin = 20, ymax = 2.5;
  long njets = -1;
  std::string algorithm = "antikt";
  bool all = false;
  double zcut = 0.1, beta = 0, R0 = -1, ktcut = 1;
  bool tagging = false;  // SoftDrop mode (--sdmode grooming|tagging)
  std::string in, out;
};

// SoftDrop and the primary multiplicity of a jet's primary sequence; `end` is where the sequence ended.
inline Observables observables(const std::vector<Split> &prim, const PseudoJet &end, const CommonOptions &opts) {
  Observables o;
  if (!opts.tagging) {
    o.mg = end.m();
    o.zg = 0;
    o.rg = 0;
  }
  const double R0 = opts.R0 > 0 ? opts.R0 : opts.R;
  for (const Split &s : prim) {
    if (s.f[2] > opts.zcut * std::pow(s.f[3] / R0, opts.beta)) {
      o.mg = s.f[6];
      o.zg = s.f[2];
      o.rg = s.f[3];
      break;
    }
  }
  for (const Split &s : prim)
    if (s.f[4] > opts.ktcut) o.mult++;
  return o;
}

inline double number_arg(int &i, int argc, char **argv) {
  if (i + 1 >= argc) throw std::runtime_error(std::string("missing value after ") + argv[i]);
  char *end = nullptr;
  const double v = std::strtod(argv[++i], &end);
  if (!end || *end) throw std::runtime_error(std::string("not a number: ") + argv[i]);
  return v;
}

// Takes argv[i] (and its value) when it is a common option or the input; false for anything else. Throws
// std::runtime_error on a missing or bad value.
inline bool common_option(CommonOptions &o, int &i, int argc, char **argv) {
  const std::string a = argv[i];
  if (a == "--R") o.R = number_arg(i, argc, argv);
  else if (a == "--ptmin") o.ptmin = number_arg(i, argc, argv);
  else if (a == "--ymax") o.ymax = number_arg(i, argc, argv);
  else if (a == "--njets") o.njets = static_cast<long>(number_arg(i, argc, argv));
  else if (a == "--algorithm" || a == "--out") {
    if (i + 1 >= argc) throw std::runtime_error("missing value after " + a);
    (a == "--out" ? o.out : o.algorithm) = argv[++i];
  } else if (a == "--all") o.all = true;
  else if (a == "--zcut") o.zcut = number_arg(i, argc, argv);
  else if (a == "--beta") o.beta = number_arg(i, argc, argv);
  else if (a == "--R0") o.R0 = number_arg(i, argc, argv);
  else if (a == "--ktcut") o.ktcut = number_arg(i, argc, argv);
  else if (a == "--sdmode") {
    if (i + 1 >= argc) throw std::runtime_error("missing value after --sdmode");
    const std::string mode = argv[++i];
    if (mode != "grooming" && mode != "tagging") throw std::runtime_error("--sdmode must be grooming or tagging");
    o.tagging = mode == "tagging";
  }
  else if (a.empty() || a[0] != '-' || a == "-") o.in = a;
  else return false;
  return true;
}

// The input's reading: GeV per unit of the file's energyUnit (std::runtime_error for an unknown one), and a
// particle from its four numbers, (px, py, pz, E) or (pt, y, phi, m), times that factor (the same arithmetic as
// lib/physics/fourvector.ts fromPtYPhiM).
inline double to_gev(const std::string &unit) {
  if (unit == "GeV") return 1;
  if (unit == "MeV") return 1e-3;
  if (unit == "TeV") return 1e3;
  throw std::runtime_error("unknown energyUnit " + unit);
}

inline PseudoJet particle(double a, double b, double c, double d, bool ptForm, double k) {
  if (!ptForm) return PseudoJet(a * k, b * k, c * k, d * k);
  const double pt = a * k, m = d * k;
  const double mt = std::sqrt(pt * pt + m * m);
  return PseudoJet(pt * std::cos(c), pt * std::sin(c), mt * std::sinh(b), mt * std::cosh(b));
}

// Reads argv into o: the common options, then extra(a, i) for the program's own (false: not one of them).
// Throws std::runtime_error for a bad or unknown option, and with `usage` when no input is named.
template <class Options, class Extra>
void parse_options(Options &o, int argc, char **argv, Extra extra, const char *usage) {
  for (int i = 1; i < argc; i++) {
    if (common_option(o, i, argc, argv)) continue;
    const std::string a = argv[i];
    if (!extra(a, i)) throw std::runtime_error("unknown option " + a);
  }
  if (o.in.empty()) throw std::runtime_error(usage);
}

// FastJet's JetDefinition of the options (strategy Best); throws std::runtime_error for an unknown algorithm.
inline fastjet::JetDefinition jet_definition(const CommonOptions &o) {
  if (o.algorithm == "antikt") return fastjet::JetDefinition(fastjet::antikt_algorithm, o.R);
  if (o.algorithm == "kt") return fastjet::JetDefinition(fastjet::kt_algorithm, o.R);
  if (o.algorithm == "ca") return fastjet::JetDefinition(fastjet::cambridge_algorithm, o.R);
  throw std::runtime_error("unknown algorithm " + o.algorithm);
}

// The re-clustering: Cambridge/Aachen at JetDefinition::max_allowable_R (all constituents end in one jet).
inline fastjet::JetDefinition reclustering_definition() {
  return fastjet::JetDefinition(fastjet::cambridge_algorithm, fastjet::JetDefinition::max_allowable_R);
}

// The export's header line (same layout as lib/ingest/export.ts exportHeader), `software` = the program's name.
// Out: raw(const char *), num(double), integer(long).
template <class Out>
void write_export_header(Out &h, const CommonOptions &o, const std::string &content, const char *software) {
  h.raw("{\"format\":\"splitfield-declusterings\",\"version\":1,\"content\":\"");
  h.raw(content.c_str());
  h.raw("\",\"jetDefinition\":{\"algorithm\":\"");
  h.raw(o.algorithm.c_str());
  h.raw("\",\"R\":");
  h.num(o.R);
  h.raw(",\"recombination\":\"E\"},\"cuts\":{\"ptMin\":");
  h.num(o.ptmin);
  h.raw(",\"yMax\":");
  h.num(o.ymax);
  h.raw(",\"maxJets\":");
  if (o.njets >= 0) h.integer(o.njets);
  else h.raw("null");
  h.raw("},\"reclustering\":\"ca\",\"softDrop\":{\"zCut\":");
  h.num(o.zcut);
  h.raw(",\"beta\":");
  h.num(o.beta);
  h.raw(",\"R0\":");
  h.num(o.R0 > 0 ? o.R0 : o.R);
  h.raw(o.tagging ? ",\"mode\":\"tagging\"" : ",\"mode\":\"grooming\"");
  h.raw("},\"multiplicityKtCut\":");
  h.num(o.ktcut);
  h.raw(",\"fullTree\":");
  h.raw(o.all ? "true" : "false");
  h.raw(",\"columns\":{\"primary\":[\"lnInvDelta\",\"lnKt\",\"z\",\"delta\",\"kt\",\"psi\",\"m\"],");
  if (o.all) h.raw("\"all\":[\"generation\",\"lnInvDelta\",\"lnKt\",\"z\"],");
  h.raw("\"sd\":[\"mg\",\"zg\",\"Rg\"]},\"software\":{\"name\":\"");
  h.raw(software);
  h.raw("\",\"version\":\"");
  h.raw(FASTJET_VERSION);
  h.raw("\",\"library\":\"FastJet ");
  h.raw(FASTJET_VERSION);
  h.raw(" (Debian libfastjet-dev)\"}}\n");
}

}  // namespace splitfield_ref
