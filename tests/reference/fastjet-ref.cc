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
// node (m_g = m_{a+b}, z_g, R_g = Δ), null when none passes; multiplicity = primary splittings with kt > ktcut.
//
// Build: g++ -O2 -std=c++17 -o tests/reference/bin/fastjet-ref tests/reference/fastjet-ref.cc -lfastjettools -lfastjet
// Usage: fastjet-ref [options] input.jsonl [--out output.jsonl]
//   --R 0.4 --ptmin 20 --ymax 2.5 --njets N (default all) --algorithm antikt|kt|ca --all
//   --zcut 0.1 --beta 0 --R0 (default R) --ktcut 1
//   --debug: adds per jet "primaryFull"/"allFull" (all SPLIT_FIELDS of lib/physics/types.ts:
//            lnInvDelta, lnKt, z, delta, kt, psi, m, kappa, generation), and after each record's jets one line
//            {"rec":..,"rejected":{"pt":..,"y":..,"rank":..},"strategy":".."} (not part of the export format).

#include <fastjet/ClusterSequence.hh>
#include <nlohmann/json.hpp>

#include "declustering.hh"

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
using splitfield_ref::Split;

namespace {

struct Options : splitfield_ref::CommonOptions {
  bool debug = false;
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
  splitfield_ref::primary_sequence(ca, root, prim);
  if (c.o.all) splitfield_ref::full_tree(ca, root, 1, all);
  const splitfield_ref::Observables obs =
      splitfield_ref::observables(prim, c.o.zcut, c.o.beta, c.o.R0 > 0 ? c.o.R0 : c.o.R, c.o.ktcut);
  const double mg = obs.mg, zg = obs.zg, rg = obs.rg;
  const long mult = obs.mult;

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
    particles.push_back(splitfield_ref::particle(p[0].get<double>(), p[1].get<double>(), p[2].get<double>(), p[3].get<double>(), c.ptForm, c.k));
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

}  // namespace

int main(int argc, char **argv) {
  Context c;
  Options &o = c.o;
  try {
    const auto extra = [&](const std::string &a, int &) {
      if (a != "--debug") return false;
      o.debug = true;
      return true;
    };
    splitfield_ref::parse_options(o, argc, argv, extra, "usage: fastjet-ref [options] input.jsonl [--out output.jsonl]");
    c.jetdef = splitfield_ref::jet_definition(o);
  } catch (const std::runtime_error &e) {
    die(e.what());
  }
  c.cadef = splitfield_ref::reclustering_definition();
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
