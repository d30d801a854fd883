// fastjet-ref: the reference implementation the physics tests and the benchmark compare Splitfield against.
// Reference: FastJet 3.4.0 (Debian libfastjet-dev). Only for tests and the benchmark; never used at run time.
//
// Reads a `splitfield-particles` file (JSON Lines or the one-document form; content events|jets; momentum
// px,py,pz,E or pt,y,phi,m; energy unit GeV|MeV|TeV) and writes the `splitfield-declusterings` export of
// DESIGN.md: a header line, then one line a selected jet, numbers with 17 significant digits (non-finite → null).
//
// Physics (PHYSICS.md): jets with FastJet's own JetDefinition(algorithm, R) (E-scheme, strategy Best), cuts in
// order pt > ptmin, |y| < ymax, at most njets leading jets; each jet is re-clustered with FastJet's
// Cambridge/Aachen at R = JetDefinition::max_allowable_R (all constituents end in one jet) and declustered with
// ClusterSequence::has_parents: j → a, b with pt_a ≥ pt_b (primary-emission plane, arXiv:1807.04758);
// SoftDrop (arXiv:1402.2657) on the primary sequence: first splitting with z > zcut (Δ/R0)^β, groomed jet = that
// node (m_g = m_{a+b}, z_g, R_g = Δ); when none passes, grooming mode (default) keeps the last constituent of the
// harder branch (m_g = its mass, z_g = R_g = 0) and tagging mode writes null; multiplicity = primary splittings
// with kt > ktcut.
//
// Build: g++ -O2 -std=c++17 -o tests/reference/bin/fastjet-ref tests/reference/fastjet-ref.cc -lfastjettools -lfastjet
// Usage: fastjet-ref [options] input.jsonl [--out output.jsonl]
//   --R 0.4 --ptmin 20 --ymax 2.5 --njets N (default all) --algorithm antikt|kt|ca --all
//   --zcut 0.1 --beta 0 --R0 (default R) --sdmode grooming|tagging --ktcut 1
//   --debug: adds per jet "primaryFull"/"allFull" (all SPLIT_FIELDS of lib/physics/types.ts:
//            lnInvDelta, lnKt, z, delta, kt, psi, m, kappa, generation), and after each record's jets one line
//            {"rec":..,"rejected":{"pt":..,"y":..,"rank":..},"strategy":".."} (not part of the export format).

#include <fastjet/ClusterSequence.hh>
#include <nlohmann/json.hpp>

#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <fstream>
#include <iostream>
#include <sstream>
#include <string>
#include <vector>

using fastjet::ClusterSequence;
using fastjet::JetDefinition;
using fastjet::PseudoJet;
using json = nlohmann::json;

namespace {

struct Options {
  double R = 0.4, ptmin = 20, ymax = 2.5;
  long njets = -1;
  std::string algorithm = "antikt";
  bool all = false;
  double zcut = 0.1, beta = 0, R0 = -1, ktcut = 1;
  bool tagging = false;
  bool debug = false;
  std::string in, out;
};

[[noreturn]] void die(const std::string &msg) {
  std::cerr << "fastjet-ref: " << msg << "\n";
  std::exit(2);
}

// ---- output buffer with %.17g numbers ----
struct Out {
  std::string s;
  void num(double v) {
    if (!std::isfinite(v)) {
      s += "null";
      return;
    }
    char b[40];
    int n = std::snprintf(b, sizeof b, "%.17g", v);
    s.append(b, n);
  }
  void integer(long v) { s += std::to_string(v); }
  void raw(const char *t) { s += t; }
  void raw(const std::string &t) { s += t; }
};

const double PI = 3.141592653589793238462643383279502884197;
const double TWOPI = 2 * PI;

// One splitting j -> a, b (pt_a >= pt_b), fields in the order of lib/physics/types.ts SPLIT_FIELDS.
struct Split {
  double f[9];
};

// has_parents already orders the parents by decreasing pt (parent1 = earlier history entry on a tie);
// the swap below is a no-op kept for clarity. Returns the harder branch in `harder`, the softer in `softer`.
Split make_split(const PseudoJet &j, PseudoJet a, PseudoJet b, int gen, PseudoJet &harder, PseudoJet &softer) {
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

// Returns the single particle at the end of the harder branch.
PseudoJet primary_sequence(const ClusterSequence &cs, const PseudoJet &root, std::vector<Split> &out) {
  PseudoJet j = root, p1, p2, a, b;
  while (cs.has_parents(j, p1, p2)) {
    out.push_back(make_split(j, p1, p2, 1, a, b));
    j = a;
  }
  return j;
}

// Depth first, harder branch first; generation = 1 + softer branches followed from the root.
void full_tree(const ClusterSequence &cs, const PseudoJet &j, int gen, std::vector<Split> &out) {
  PseudoJet p1, p2, a, b;
  if (!cs.has_parents(j, p1, p2)) return;
  out.push_back(make_split(j, p1, p2, gen, a, b));
  full_tree(cs, a, gen, out);
  full_tree(cs, b, gen + 1, out);
}

double to_gev(const std::string &unit) {
  if (unit == "GeV") return 1;
  if (unit == "MeV") return 1e-3;
  if (unit == "TeV") return 1e3;
  die("unknown energyUnit " + unit);
}

struct Context {
  Options o;
  bool ptForm = false;
  double k = 1;
  bool events = true;
  JetDefinition jetdef;
  JetDefinition cadef;
  Out out;
  std::FILE *f = stdout;
};

void flush(Context &c, bool force) {
  if (force || c.out.s.size() > (1u << 20)) {
    std::fwrite(c.out.s.data(), 1, c.out.s.size(), c.f);
    c.out.s.clear();
  }
}

void write_splits(Out &o, const std::vector<Split> &v, const int *fields, int nf) {
  o.raw("[");
  for (size_t i = 0; i < v.size(); i++) {
    if (i) o.raw(",");
    o.raw("[");
    for (int q = 0; q < nf; q++) {
      if (q) o.raw(",");
      if (fields[q] == 8) o.integer(static_cast<long>(v[i].f[8]));
      else o.num(v[i].f[fields[q]]);
    }
    o.raw("]");
  }
  o.raw("]");
}

void write_jet(Context &c, const std::string &rec, int index, const PseudoJet &jet, size_t n, double weight,
               const ClusterSequence &ca, const PseudoJet &root) {
  std::vector<Split> prim, all;
  const PseudoJet end = primary_sequence(ca, root, prim);
  if (c.o.all) full_tree(ca, root, 1, all);
  // SoftDrop on the primary sequence.
  double mg = NAN, zg = NAN, rg = NAN;
  if (!c.o.tagging) {
    mg = end.m();
    zg = 0;
    rg = 0;
  }
  const double R0 = c.o.R0 > 0 ? c.o.R0 : c.o.R;
  for (const Split &s : prim) {
    if (s.f[2] > c.o.zcut * std::pow(s.f[3] / R0, c.o.beta)) {
      mg = s.f[6];
      zg = s.f[2];
      rg = s.f[3];
      break;
    }
  }
  long mult = 0;
  for (const Split &s : prim)
    if (s.f[4] > c.o.ktcut) mult++;

  Out &o = c.out;
  o.raw("{\"rec\":");
  o.raw(rec);
  o.raw(",\"jet\":");
  o.integer(index);
  o.raw(",\"pt\":");
  o.num(jet.pt());
  o.raw(",\"y\":");
  o.num(jet.rap());
  o.raw(",\"phi\":");
  o.num(jet.phi());
  o.raw(",\"m\":");
  o.num(jet.m());
  o.raw(",\"n\":");
  o.integer(static_cast<long>(n));
  o.raw(",\"weight\":");
  o.num(weight);
  static const int PRIMARY[] = {0, 1, 2, 3, 4, 5, 6};
  static const int ALL[] = {8, 0, 1, 2};
  static const int FULL[] = {0, 1, 2, 3, 4, 5, 6, 7, 8};
  o.raw(",\"primary\":");
  write_splits(o, prim, PRIMARY, 7);
  if (c.o.all) {
    o.raw(",\"all\":");
    write_splits(o, all, ALL, 4);
  }
  o.raw(",\"sd\":[");
  o.num(mg);
  o.raw(",");
  o.num(zg);
  o.raw(",");
  o.num(rg);
  o.raw("],\"mult\":");
  o.integer(mult);
  if (c.o.debug) {
    o.raw(",\"primaryFull\":");
    write_splits(o, prim, FULL, 9);
    if (c.o.all) {
      o.raw(",\"allFull\":");
      write_splits(o, all, FULL, 9);
    }
  }
  o.raw("}\n");
}

void process_record(Context &c, const json &r, long defaultId) {
  std::string rec;
  if (r.contains("id") && !r["id"].is_null()) rec = r["id"].dump();
  else rec = std::to_string(defaultId);
  const double weight = r.contains("weight") ? r["weight"].get<double>() : 1.0;
  const json &ps = r.at("particles");
  std::vector<PseudoJet> particles;
  particles.reserve(ps.size());
  for (const json &p : ps) {
    const double a = p[0].get<double>(), b = p[1].get<double>(), cc = p[2].get<double>(), d = p[3].get<double>();
    if (c.ptForm) {
      // Same arithmetic as lib/physics/fourvector.ts fromPtYPhiM.
      const double pt = a * c.k, m = d * c.k;
      const double mt = std::sqrt(pt * pt + m * m);
      particles.emplace_back(pt * std::cos(cc), pt * std::sin(cc), mt * std::sinh(b), mt * std::cosh(b));
    } else {
      particles.emplace_back(a * c.k, b * c.k, cc * c.k, d * c.k);
    }
  }
  long rejPt = 0, rejY = 0, rejRank = 0;
  std::string strategy = "-";
  if (!particles.empty()) {
    if (c.events) {
      ClusterSequence cs(particles, c.jetdef);
      strategy = cs.strategy_string();
      std::vector<PseudoJet> jets = fastjet::sorted_by_pt(cs.inclusive_jets());
      long kept = 0;
      for (const PseudoJet &jet : jets) {
        if (!(jet.pt() > c.o.ptmin)) {
          rejPt++;
          continue;
        }
        if (!(std::abs(jet.rap()) < c.o.ymax)) {
          rejY++;
          continue;
        }
        if (c.o.njets >= 0 && kept >= c.o.njets) {
          rejRank++;
          continue;
        }
        std::vector<PseudoJet> constituents = jet.constituents();
        ClusterSequence ca(constituents, c.cadef);
        std::vector<PseudoJet> roots = ca.inclusive_jets();
        if (roots.size() != 1) die("C/A reclustering did not give one jet");
        write_jet(c, rec, static_cast<int>(kept), jet, constituents.size(), weight, ca, roots[0]);
        kept++;
      }
    } else {
      ClusterSequence ca(particles, c.cadef);
      strategy = ca.strategy_string();
      std::vector<PseudoJet> roots = ca.inclusive_jets();
      if (roots.size() != 1) die("C/A reclustering did not give one jet");
      const PseudoJet &jet = roots[0];
      if (!(jet.pt() > c.o.ptmin)) rejPt++;
      else if (!(std::abs(jet.rap()) < c.o.ymax)) rejY++;
      else if (c.o.njets == 0) rejRank++;
      else write_jet(c, rec, 0, jet, particles.size(), weight, ca, jet);
    }
  }
  if (c.o.debug) {
    Out &o = c.out;
    o.raw("{\"rec\":");
    o.raw(rec);
    o.raw(",\"rejected\":{\"pt\":");
    o.integer(rejPt);
    o.raw(",\"y\":");
    o.integer(rejY);
    o.raw(",\"rank\":");
    o.integer(rejRank);
    o.raw("},\"strategy\":\"");
    o.raw(strategy);
    o.raw("\"}\n");
  }
  flush(c, false);
}

double num_arg(int &i, int argc, char **argv) {
  if (i + 1 >= argc) die(std::string("missing value after ") + argv[i]);
  char *end = nullptr;
  const double v = std::strtod(argv[++i], &end);
  if (!end || *end) die(std::string("not a number: ") + argv[i]);
  return v;
}

}  // namespace

int main(int argc, char **argv) {
  Context c;
  Options &o = c.o;
  for (int i = 1; i < argc; i++) {
    const std::string a = argv[i];
    if (a == "--R") o.R = num_arg(i, argc, argv);
    else if (a == "--ptmin") o.ptmin = num_arg(i, argc, argv);
    else if (a == "--ymax") o.ymax = num_arg(i, argc, argv);
    else if (a == "--njets") o.njets = static_cast<long>(num_arg(i, argc, argv));
    else if (a == "--algorithm") {
      if (i + 1 >= argc) die("missing value after --algorithm");
      o.algorithm = argv[++i];
    } else if (a == "--all") o.all = true;
    else if (a == "--zcut") o.zcut = num_arg(i, argc, argv);
    else if (a == "--beta") o.beta = num_arg(i, argc, argv);
    else if (a == "--R0") o.R0 = num_arg(i, argc, argv);
    else if (a == "--ktcut") o.ktcut = num_arg(i, argc, argv);
    else if (a == "--sdmode") {
      if (i + 1 >= argc) die("missing value after --sdmode");
      const std::string mode = argv[++i];
      if (mode != "grooming" && mode != "tagging") die("--sdmode must be grooming or tagging");
      o.tagging = mode == "tagging";
    }
    else if (a == "--debug") o.debug = true;
    else if (a == "--out") {
      if (i + 1 >= argc) die("missing value after --out");
      o.out = argv[++i];
    } else if (!a.empty() && a[0] == '-' && a != "-") die("unknown option " + a);
    else o.in = a;
  }
  if (o.in.empty()) die("usage: fastjet-ref [options] input.jsonl [--out output.jsonl]");

  fastjet::JetAlgorithm alg;
  if (o.algorithm == "antikt") alg = fastjet::antikt_algorithm;
  else if (o.algorithm == "kt") alg = fastjet::kt_algorithm;
  else if (o.algorithm == "ca") alg = fastjet::cambridge_algorithm;
  else die("unknown algorithm " + o.algorithm);
  c.jetdef = JetDefinition(alg, o.R);
  c.cadef = JetDefinition(fastjet::cambridge_algorithm, JetDefinition::max_allowable_R);
  ClusterSequence::set_fastjet_banner_stream(nullptr);

  std::ifstream fin;
  std::istream *in = &std::cin;
  if (o.in != "-") {
    fin.open(o.in, std::ios::binary);
    if (!fin) die("cannot open " + o.in);
    in = &fin;
  }
  if (!o.out.empty()) {
    c.f = std::fopen(o.out.c_str(), "wb");
    if (!c.f) die("cannot write " + o.out);
  }

  // Header: the first non-empty line, or (one-document form) the whole file.
  std::string line;
  long lineNo = 0;
  json header;
  bool oneDoc = false;
  while (std::getline(*in, line)) {
    lineNo++;
    if (line.find_first_not_of(" \t\r") != std::string::npos) break;
  }
  {
    json h = json::parse(line, nullptr, false);
    if (h.is_discarded() || (h.is_object() && h.contains("records"))) {
      std::stringstream rest;
      rest << line << "\n" << in->rdbuf();
      header = json::parse(rest.str());
      oneDoc = true;
    } else {
      header = h;
    }
  }
  if (!header.is_object() || header.value("format", "") != "splitfield-particles") die("not a splitfield-particles file");
  const std::string content = header.value("content", "events");
  const std::string momentum = header.value("momentum", "px,py,pz,E");
  c.events = content == "events";
  if (!c.events && content != "jets") die("unknown content " + content);
  if (momentum == "pt,y,phi,m") c.ptForm = true;
  else if (momentum != "px,py,pz,E") die("unknown momentum " + momentum);
  c.k = to_gev(header.value("energyUnit", "GeV"));

  {
    // Same header layout as lib/ingest/export.ts (exportHeader), software = this program.
    Out &h = c.out;
    h.raw("{\"format\":\"splitfield-declusterings\",\"version\":1,\"content\":\"");
    h.raw(content);
    h.raw("\",\"jetDefinition\":{\"algorithm\":\"");
    h.raw(o.algorithm);
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
    h.raw("\"sd\":[\"mg\",\"zg\",\"Rg\"]},\"software\":{\"name\":\"fastjet-ref\",\"version\":\"");
    h.raw(FASTJET_VERSION);
    h.raw("\",\"library\":\"FastJet ");
    h.raw(FASTJET_VERSION);
    h.raw(" (Debian libfastjet-dev)\"}}\n");
  }

  if (oneDoc) {
    const json &recs = header.at("records");
    long idx = 0;
    for (const json &r : recs) process_record(c, r, ++idx);
  } else {
    while (std::getline(*in, line)) {
      lineNo++;
      if (line.find_first_not_of(" \t\r") == std::string::npos) continue;
      process_record(c, json::parse(line), lineNo);
    }
  }
  flush(c, true);
  if (c.f != stdout) std::fclose(c.f);
  return 0;
}
