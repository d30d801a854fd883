// fastjet-ref: the reference implementation the physics tests compare Splitfield against.
// Reference: FastJet 3.4.0 (Debian libfastjet-dev). Only for tests; never used at run time. It reads its input
// with a JSON DOM library (nlohmann-json), which accepts every form of the input format and lets the tests ask
// for extras (--debug); the benchmark's speed reference is fastjet-speed.cc (same physics, declustering.hh).
//
// Reads a `splitfield-particles` file (JSON Lines or the one-document form; content events|jets; momentum
// px,py,pz,E or pt,y,phi,m; energy unit GeV|MeV|TeV) and writes the `splitfield-declusterings` export of
// DESIGN.md: a header line, then one line a selected jet, numbers with 17 significant digits (non-finite → null).
//
// Physics (PHYSICS.md, shared with fastjet-speed.cc in declustering.hh): jets with FastJet's own JetDefinition(algorithm, R) (E-scheme, strategy Best), cuts in
// order pt > ptmin, |y| < ymax, at most njets leading jets; each jet is re-clustered with FastJet's
// Cambridge/Aachen at R = JetDefinition::max_allowable_R (all constituents end in one jet) and declustered with
// ClusterSequence::has_parents: j → a, b with pt_a ≥ pt_b (primary-emission plane, arXiv:1807.04758);
// SoftDrop (arXiv:1402.2657) on the primary sequence: first splitting with z > zcut (Δ/R0)^β, groomed jet = that
// node (m_g = m_{a+b}, z_g, R_g = Δ); when none passes, grooming mode (default) keeps the last constituent of the
// harder branch (m_g = its mass, z_g = R_g = 0) and tagging mode writes null; multiplicity = primary splittings
// with kt > ktcut.
//
// Build: g++ -O2 -std=c++17 -o tests/reference/bin/fastjet-ref tests/reference/fastjet-ref.cc -lfastjettools -lfastjetplugins -lfastjet
// Usage: fastjet-ref [options] input.jsonl [--out output.jsonl]
//   --R 0.4 --ptmin 20 --ymax 2.5 --njets N (default all) --algorithm antikt|kt|ca --all
//   --zcut 0.1 --beta 0 --R0 (default R) --sdmode grooming|tagging --ktcut 1
//   Exclusive jets (kt or ca): --exclusive-n N | --dcut D  (ClusterSequence::exclusive_jets_up_to / exclusive_jets)
//   Constituent selection (before jet finding; rules in the order of lib/physics/constituent-selection.ts, the
//   removed particles counted by the first rule failed): --drop-neutrinos --pid-exclude a,b --pid-include a,b
//   --charged-only (from each record's "charge") --constituent-ptmin X --constituent-rapmax X [--constituent-eta]
//   e+e- (--collision ee): --ee-algorithm durham|cambridge|genkt, --ee-p P (genkt), --emin E, with --exclusive-n N
//   or --ycut Y: Durham = ee_kt_algorithm (exclusive_jets_up_to(n) / exclusive_jets_ycut), Cambridge =
//   EECambridgePlugin(ycut) inclusive jets, genkt = ee_genkt_algorithm(R, p) inclusive jets; jets sorted by E,
//   cut E > emin; each jet re-clustered with EECambridgePlugin(ycut = 1e300: one tree) and declustered with
//   has_parents, the harder branch the more energetic one; jet lines carry E, theta, phi, m (PHYSICS.md).
//   --debug: adds per jet "primaryFull"/"allFull" (all SPLIT_FIELDS of lib/physics/types.ts:
//            lnInvDelta, lnKt, z, delta, kt, psi, m, kappa, generation), and after each record's jets one line
//            {"rec":..,"rejected":{"pt":..,"y":..,"rank":..},"strategy":".."} (not part of the export format).

#include <fastjet/ClusterSequence.hh>
#include <fastjet/EECambridgePlugin.hh>
#include <nlohmann/json.hpp>

#include "declustering.hh"

#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <fstream>
#include <iostream>
#include <set>
#include <sstream>
#include <string>
#include <vector>

using fastjet::ClusterSequence;
using fastjet::JetDefinition;
using fastjet::PseudoJet;
using json = nlohmann::json;
using splitfield_ref::Split;

namespace {

struct Options : splitfield_ref::CommonOptions {
  bool debug = false;
  long exclusiveN = -1;
  double dcut = -1, ycut = -1;
  bool ee = false;
  std::string eeAlgorithm = "durham";
  double eeP = -1, emin = 0;
  bool dropNeutrinos = false, chargedOnly = false, useEta = false;
  std::set<long> pidInclude, pidExclude;
  double cptmin = 0, crapmax = -1;
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

struct Context {
  Options o;
  bool ptForm = false;
  double k = 1;
  bool events = true;
  JetDefinition jetdef;
  JetDefinition cadef;
  JetDefinition eeJetdef;
  JetDefinition eeTreedef;
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
  const PseudoJet end = splitfield_ref::primary_sequence(ca, root, prim, c.o.ee);
  if (c.o.all) splitfield_ref::full_tree(ca, root, 1, all, c.o.ee);
  const splitfield_ref::Observables obs = splitfield_ref::observables(prim, end, c.o);
  const double mg = obs.mg, zg = obs.zg, rg = obs.rg;
  const long mult = obs.mult;

  Out &o = c.out;
  o.raw("{\"rec\":");
  o.raw(rec);
  o.raw(",\"jet\":");
  o.integer(index);
  if (c.o.ee) {
    o.raw(",\"E\":");
    o.num(jet.E());
    o.raw(",\"theta\":");
    o.num(std::atan2(jet.pt(), jet.pz()));
  } else {
    o.raw(",\"pt\":");
    o.num(jet.pt());
    o.raw(",\"y\":");
    o.num(jet.rap());
  }
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

// The constituent selection; counts removed particles by the first rule failed (lib/physics/constituent-selection.ts).
struct Removed {
  long neutrino = 0, pidExcluded = 0, pidNotIncluded = 0, neutral = 0, pt = 0, rapidity = 0;
};

std::vector<PseudoJet> select_particles(const Options &o, const std::vector<PseudoJet> &in, const json &r, Removed &rm) {
  const bool hasPid = r.contains("pid"), hasCharge = r.contains("charge");
  std::vector<PseudoJet> out;
  for (size_t i = 0; i < in.size(); i++) {
    const PseudoJet &p = in[i];
    if (hasPid) {
      const long pid = r["pid"][i].get<long>(), apid = std::labs(pid);
      if (o.dropNeutrinos && (apid == 12 || apid == 14 || apid == 16 || apid == 18)) { rm.neutrino++; continue; }
      if (o.pidExclude.count(apid)) { rm.pidExcluded++; continue; }
      if (!o.pidInclude.empty() && !o.pidInclude.count(apid)) { rm.pidNotIncluded++; continue; }
    }
    if (o.chargedOnly) {
      if (!hasCharge) die("--charged-only needs \"charge\" in every record");
      if (r["charge"][i].get<double>() == 0) { rm.neutral++; continue; }
    }
    if (o.cptmin > 0 && !(p.pt2() > o.cptmin * o.cptmin)) { rm.pt++; continue; }
    if (o.crapmax >= 0) {
      const double v = o.useEta ? std::asinh(p.pz() / std::sqrt(p.pt2())) : 0.5 * std::log((p.E() + p.pz()) / (p.E() - p.pz()));
      if (!(std::abs(v) < o.crapmax)) { rm.rapidity++; continue; }
    }
    out.push_back(p);
  }
  return out;
}

bool selection_active(const Options &o) {
  return o.dropNeutrinos || o.chargedOnly || !o.pidInclude.empty() || !o.pidExclude.empty() || o.cptmin > 0 || o.crapmax >= 0;
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
    particles.push_back(splitfield_ref::particle(p[0].get<double>(), p[1].get<double>(), p[2].get<double>(), p[3].get<double>(), c.ptForm, c.k));
  }
  Removed rm;
  if (selection_active(c.o)) particles = select_particles(c.o, particles, r, rm);
  long rejPt = 0, rejY = 0, rejRank = 0;
  std::string strategy = "-";
  const Options &o = c.o;
  if (!particles.empty()) {
    if (c.events) {
      ClusterSequence cs(particles, o.ee ? c.eeJetdef : c.jetdef);
      strategy = cs.strategy_string();
      std::vector<PseudoJet> found;
      if (o.exclusiveN >= 0) found = cs.exclusive_jets_up_to(static_cast<int>(o.exclusiveN));
      else if (o.dcut >= 0) found = cs.exclusive_jets(o.dcut);
      else if (o.ee && o.ycut >= 0 && o.eeAlgorithm == "durham") found = cs.exclusive_jets_ycut(o.ycut);
      else found = cs.inclusive_jets();
      std::vector<PseudoJet> jets = o.ee ? fastjet::sorted_by_E(found) : fastjet::sorted_by_pt(found);
      long kept = 0;
      for (const PseudoJet &jet : jets) {
        if (o.ee) {
          if (!(jet.E() > o.emin)) {
            rejPt++;
            continue;
          }
        } else {
          if (!(jet.pt() > o.ptmin)) {
            rejPt++;
            continue;
          }
          if (!(std::abs(jet.rap()) < o.ymax)) {
            rejY++;
            continue;
          }
        }
        if (o.njets >= 0 && kept >= o.njets) {
          rejRank++;
          continue;
        }
        std::vector<PseudoJet> constituents = jet.constituents();
        ClusterSequence ca(constituents, o.ee ? c.eeTreedef : c.cadef);
        std::vector<PseudoJet> roots = ca.inclusive_jets();
        if (roots.size() != 1) die("reclustering did not give one jet");
        write_jet(c, rec, static_cast<int>(kept), jet, constituents.size(), weight, ca, roots[0]);
        kept++;
      }
    } else {
      ClusterSequence ca(particles, o.ee ? c.eeTreedef : c.cadef);
      strategy = ca.strategy_string();
      std::vector<PseudoJet> roots = ca.inclusive_jets();
      if (roots.size() != 1) die("reclustering did not give one jet");
      const PseudoJet &jet = roots[0];
      if (o.ee ? !(jet.E() > o.emin) : !(jet.pt() > o.ptmin)) rejPt++;
      else if (!o.ee && !(std::abs(jet.rap()) < o.ymax)) rejY++;
      else if (o.njets == 0) rejRank++;
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
    o.raw("},\"removed\":{\"neutrino\":");
    o.integer(rm.neutrino);
    o.raw(",\"pidExcluded\":");
    o.integer(rm.pidExcluded);
    o.raw(",\"pidNotIncluded\":");
    o.integer(rm.pidNotIncluded);
    o.raw(",\"neutral\":");
    o.integer(rm.neutral);
    o.raw(",\"pt\":");
    o.integer(rm.pt);
    o.raw(",\"rapidity\":");
    o.integer(rm.rapidity);
    o.raw("},\"strategy\":\"");
    o.raw(strategy);
    o.raw("\"}\n");
  }
  flush(c, false);
}

std::set<long> id_list(int &i, int argc, char **argv) {
  if (i + 1 >= argc) die(std::string("missing value after ") + argv[i]);
  std::set<long> out;
  std::stringstream ss(argv[++i]);
  std::string item;
  while (std::getline(ss, item, ',')) out.insert(std::labs(std::stol(item)));
  return out;
}

std::string text_arg(int &i, int argc, char **argv) {
  if (i + 1 >= argc) die(std::string("missing value after ") + argv[i]);
  return argv[++i];
}

// The options of this program beyond the common ones (declustering.hh): false when `a` is none of them.
bool own_option(Options &o, const std::string &a, int &i, int argc, char **argv) {
  using splitfield_ref::number_arg;
  if (a == "--debug") o.debug = true;
  else if (a == "--exclusive-n") o.exclusiveN = static_cast<long>(number_arg(i, argc, argv));
  else if (a == "--dcut") o.dcut = number_arg(i, argc, argv);
  else if (a == "--ycut") o.ycut = number_arg(i, argc, argv);
  else if (a == "--collision") o.ee = text_arg(i, argc, argv) == "ee";
  else if (a == "--ee-algorithm") o.eeAlgorithm = text_arg(i, argc, argv);
  else if (a == "--ee-p") o.eeP = number_arg(i, argc, argv);
  else if (a == "--emin") o.emin = number_arg(i, argc, argv);
  else if (a == "--drop-neutrinos") o.dropNeutrinos = true;
  else if (a == "--charged-only") o.chargedOnly = true;
  else if (a == "--constituent-ptmin") o.cptmin = number_arg(i, argc, argv);
  else if (a == "--constituent-rapmax") o.crapmax = number_arg(i, argc, argv);
  else if (a == "--constituent-eta") o.useEta = true;
  else if (a == "--pid-include") o.pidInclude = id_list(i, argc, argv);
  else if (a == "--pid-exclude") o.pidExclude = id_list(i, argc, argv);
  else return false;
  return true;
}

}  // namespace

int main(int argc, char **argv) {
  Context c;
  Options &o = c.o;
  try {
    const auto extra = [&](const std::string &a, int &i) { return own_option(o, a, i, argc, argv); };
    splitfield_ref::parse_options(o, argc, argv, extra, "usage: fastjet-ref [options] input.jsonl [--out output.jsonl]");
    // Exclusive jets: FastJet's N2Plain, whose order of equal distances (C/A: every d_iB = 1) the engine follows.
    const bool exclusive = o.exclusiveN >= 0 || o.dcut >= 0;
    const JetDefinition best = splitfield_ref::jet_definition(o);
    c.jetdef = exclusive ? JetDefinition(best.jet_algorithm(), o.R, fastjet::E_scheme, fastjet::N2Plain) : best;
  } catch (const std::runtime_error &e) {
    die(e.what());
  }
  c.cadef = splitfield_ref::reclustering_definition();
  static fastjet::EECambridgePlugin eeTreePlugin(1e300);
  static fastjet::EECambridgePlugin eeJetPlugin(o.ycut);
  c.eeTreedef = JetDefinition(&eeTreePlugin);
  if (o.ee) {
    if (o.eeAlgorithm == "durham") c.eeJetdef = JetDefinition(fastjet::ee_kt_algorithm);
    else if (o.eeAlgorithm == "cambridge") c.eeJetdef = JetDefinition(&eeJetPlugin);
    else if (o.eeAlgorithm == "genkt") c.eeJetdef = JetDefinition(fastjet::ee_genkt_algorithm, o.R, o.eeP);
    else die("unknown e+e- algorithm " + o.eeAlgorithm);
  }
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
  try {
    c.k = splitfield_ref::to_gev(header.value("energyUnit", "GeV"));
  } catch (const std::runtime_error &e) {
    die(e.what());
  }

  splitfield_ref::write_export_header(c.out, o, content, "fastjet-ref");

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
