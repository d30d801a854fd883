// fastjet-speed: the speed reference of `npm run bench`: the fastest honest C++ program on FastJet 3.4.0
// (Debian libfastjet-dev) that does Splitfield's job. Only for the benchmark; never used at run time.
//
// Same physics and export as fastjet-ref.cc (declustering.hh; PHYSICS.md): jets with FastJet's own
// JetDefinition(algorithm, R) (E-scheme, strategy Best), cuts pt > ptmin, |y| < ymax, at most njets leading jets,
// each jet re-clustered with Cambridge/Aachen at JetDefinition::max_allowable_R and declustered
// (arXiv:1807.04758), SoftDrop (arXiv:1402.2657) and the primary multiplicity. What makes it the fast one:
//  - input: JSON Lines read in 4 MiB blocks (memory bounded by the longest line), lines found with memchr,
//    each record parsed by a hand-written scanner for the record shape {"id":..,"weight":..,"particles":[[a,b,c,d],
//    ...]} with std::from_chars for the numbers (other fields are skipped); no JSON DOM library;
//  - output: numbers in their shortest round-trip form with std::to_chars, into one buffer written in 1 MiB blocks;
//  - vectors (particles, splittings) reused from record to record.
// Accepted input: the splitfield-particles JSON Lines form (plain text, content events|jets, momentum px,py,pz,E
// or pt,y,phi,m, energyUnit GeV|MeV|TeV); anything else (gzip, the one-document form) is refused with a message.
//
// Build: g++ -O2 -std=c++17 -o tests/reference/bin/fastjet-speed tests/reference/fastjet-speed.cc -lfastjet
// Usage: fastjet-speed [options] input.jsonl [--out output.jsonl]
//   --R 0.4 --ptmin 20 --ymax 2.5 --njets N (default all) --algorithm antikt|kt|ca --all
//   --zcut 0.1 --beta 0 --R0 (default R) --ktcut 1
//   --timings           stage times on stderr after the run, one JSON line (wall seconds):
//                       {"timings":{"read":s,"parse":s,"physics":s,"write":s,"total":s}}: read = fread,
//                       parse = scanning the records into PseudoJets, physics, write = formatting and fwrite
//   --physics-only      reads every record into memory (PseudoJets), then times the physics alone (jet finding,
//                       selection, C/A re-clustering, declustering, observables; no output), and prints one JSON
//                       line on stdout: {"records","particles","jets","splittings","rounds","cpuSeconds",
//                       "wallSeconds","strategy"}: the fastest round's CPU and wall seconds, and FastJet's
//                       strategy for the jet finding (or re-clustering) of the first record.
//   --rounds N          physics-only: rounds over all records (default 5); --min-seconds S: repeat the records
//                       within a round until it lasts S CPU seconds (default 0.2); the times are per pass.

#include <fastjet/ClusterSequence.hh>

#include <charconv>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <ctime>
#include <string>
#include <vector>

#include "declustering.hh"

using fastjet::ClusterSequence;
using fastjet::JetDefinition;
using fastjet::PseudoJet;
using splitfield_ref::Split;

namespace {

struct Options : splitfield_ref::CommonOptions {
  bool timings = false, physicsOnly = false;
  long rounds = 5;
  double minSeconds = 0.2;
};

[[noreturn]] void die(const std::string &msg) {
  std::fprintf(stderr, "fastjet-speed: %s\n", msg.c_str());
  std::exit(2);
}

double wallNow() {
  return std::chrono::duration<double>(std::chrono::steady_clock::now().time_since_epoch()).count();
}

double cpuNow() {
  timespec t;
  clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &t);
  return t.tv_sec + 1e-9 * t.tv_nsec;
}

// ---- output: one growing buffer, numbers by std::to_chars (shortest round trip) ----
struct Out {
  std::vector<char> b;
  size_t n = 0;
  Out() { b.resize(1 << 21); }
  void room(size_t k) {
    if (n + k > b.size()) b.resize(2 * (n + k));
  }
  void raw(const char *t, size_t k) {
    room(k);
    std::memcpy(b.data() + n, t, k);
    n += k;
  }
  void raw(const char *t) { raw(t, std::strlen(t)); }
  void num(double v) {
    if (!std::isfinite(v)) {
      raw("null", 4);
      return;
    }
    room(32);
    n = std::to_chars(b.data() + n, b.data() + n + 32, v).ptr - b.data();
  }
  void integer(long v) {
    room(24);
    n = std::to_chars(b.data() + n, b.data() + n + 24, v).ptr - b.data();
  }
};

// ---- input: a hand-written scanner of one record line ----
struct Record {
  std::string id;  // JSON text of the id (number or string), empty when absent
  double weight = 1;
  std::vector<double> p;  // 4 numbers a particle, as written
};

struct Scanner {
  const char *s, *e;
  long line;
  [[noreturn]] void fail(const char *what) const {
    die("line " + std::to_string(line) + ": " + what + " (this reference reads the usual record shape only)");
  }
  void ws() {
    while (s < e && (*s == ' ' || *s == '\t' || *s == '\r' || *s == '\n')) s++;
  }
  void expect(char c) {
    ws();
    if (s >= e || *s != c) fail("unexpected character");
    s++;
  }
  bool peek(char c) {
    ws();
    return s < e && *s == c;
  }
  double number() {
    ws();
    double v;
    auto r = std::from_chars(s, e, v);
    if (r.ec != std::errc()) fail("a number expected");
    s = r.ptr;
    return v;
  }
  // A string token (with its quotes); escapes are kept as written.
  std::pair<const char *, const char *> string() {
    ws();
    if (s >= e || *s != '"') fail("a string expected");
    const char *b = s++;
    while (s < e && *s != '"') s += (*s == '\\') ? 2 : 1;
    if (s >= e) fail("unterminated string");
    s++;
    return {b, s};
  }
  // Skips any JSON value (fields the reference does not need).
  void skip() {
    ws();
    if (s >= e) fail("a value expected");
    if (*s == '"') {
      string();
      return;
    }
    if (*s == '[' || *s == '{') {
      int depth = 0;
      while (s < e) {
        const char c = *s;
        if (c == '"') {
          string();
          continue;
        }
        s++;
        if (c == '[' || c == '{') depth++;
        else if ((c == ']' || c == '}') && --depth == 0) return;
      }
      fail("unterminated value");
    }
    while (s < e && *s != ',' && *s != '}' && *s != ']') s++;
  }
  void record(Record &r) {
    r.id.clear();
    r.weight = 1;
    r.p.clear();
    expect('{');
    if (peek('}')) {
      s++;
      return;
    }
    for (;;) {
      auto k = string();
      const size_t kl = k.second - k.first;
      expect(':');
      if (kl == 11 && std::memcmp(k.first, "\"particles\"", 11) == 0) {
        expect('[');
        if (!peek(']')) {
          for (;;) {
            expect('[');
            for (int q = 0; q < 4; q++) {
              if (q) expect(',');
              r.p.push_back(number());
            }
            expect(']');
            if (peek(',')) {
              s++;
              continue;
            }
            break;
          }
        }
        expect(']');
      } else if (kl == 4 && std::memcmp(k.first, "\"id\"", 4) == 0) {
        ws();
        const char *b = s;
        if (peek('"')) {
          auto v = string();
          r.id.assign(v.first, v.second);
        } else if (peek('n')) {
          skip();  // null: the line number
        } else {
          skip();
          r.id.assign(b, s);
        }
      } else if (kl == 8 && std::memcmp(k.first, "\"weight\"", 8) == 0) {
        r.weight = number();
      } else {
        skip();
      }
      if (peek(',')) {
        s++;
        continue;
      }
      expect('}');
      return;
    }
  }
};

// The value of a top-level string field of the header line (the header is read once: not the hot path).
std::string headerField(const std::string &line, const char *key, const char *def) {
  Scanner sc{line.data(), line.data() + line.size(), 1};
  sc.expect('{');
  if (sc.peek('}')) return def;
  for (;;) {
    auto k = sc.string();
    sc.expect(':');
    if (std::string(k.first + 1, k.second - 1) == key) {
      sc.ws();
      if (sc.peek('"')) {
        auto v = sc.string();
        return std::string(v.first + 1, v.second - 1);
      }
      sc.fail("a string field expected in the header");
    }
    sc.skip();
    if (sc.peek(',')) {
      sc.s++;
      continue;
    }
    return def;
  }
}

// ---- the physics of one record ----
struct Context {
  Options o;
  bool ptForm = false, events = true;
  double k = 1;
  JetDefinition jetdef, cadef;
  std::vector<PseudoJet> particles;
  // The selected jets of the current record (reused: their vectors keep their capacity).
  struct Jet {
    double pt, y, phi, m;
    size_t n;
    std::vector<Split> prim, all;
    splitfield_ref::Observables obs;
  };
  std::vector<Jet> jetOut;
  size_t nJetOut = 0;
  long jets = 0, splittings = 0;
  std::string firstStrategy;
};

void toPseudoJets(Context &c, const std::vector<double> &p, std::vector<PseudoJet> &out) {
  out.clear();
  out.reserve(p.size() / 4);
  for (size_t i = 0; i + 3 < p.size(); i += 4) {
    out.push_back(splitfield_ref::particle(p[i], p[i + 1], p[i + 2], p[i + 3], c.ptForm, c.k));
  }
}

void writeSplits(Out &o, const std::vector<Split> &v, bool all) {
  o.raw("[", 1);
  for (size_t i = 0; i < v.size(); i++) {
    if (i) o.raw(",", 1);
    const double *f = v[i].f;
    if (all) {
      o.raw("[", 1);
      o.integer(static_cast<long>(f[8]));
      for (int q = 0; q < 3; q++) {
        o.raw(",", 1);
        o.num(f[q]);
      }
    } else {
      o.raw("[", 1);
      for (int q = 0; q < 7; q++) {
        if (q) o.raw(",", 1);
        o.num(f[q]);
      }
    }
    o.raw("]", 1);
  }
  o.raw("]", 1);
}

// Declusters one selected jet into the record's next jet result.
void decluster(Context &c, const PseudoJet &jet, size_t n, const ClusterSequence &ca, const PseudoJet &root) {
  if (c.nJetOut == c.jetOut.size()) c.jetOut.emplace_back();
  Context::Jet &j = c.jetOut[c.nJetOut++];
  j.pt = jet.pt();
  j.y = jet.rap();
  j.phi = jet.phi();
  j.m = jet.m();
  j.n = n;
  j.prim.clear();
  j.all.clear();
  const PseudoJet end = splitfield_ref::primary_sequence(ca, root, j.prim);
  if (c.o.all) splitfield_ref::full_tree(ca, root, 1, j.all);
  j.obs = splitfield_ref::observables(j.prim, end, c.o);
  c.jets++;
  c.splittings += j.prim.size() + j.all.size();
}

// The export lines of the record's jet results.
void writeJets(Context &c, const std::string &rec, double weight, Out &o) {
  for (size_t index = 0; index < c.nJetOut; index++) {
    const Context::Jet &j = c.jetOut[index];
    o.raw("{\"rec\":");
    o.raw(rec.data(), rec.size());
    o.raw(",\"jet\":");
    o.integer(static_cast<long>(index));
    o.raw(",\"pt\":");
    o.num(j.pt);
    o.raw(",\"y\":");
    o.num(j.y);
    o.raw(",\"phi\":");
    o.num(j.phi);
    o.raw(",\"m\":");
    o.num(j.m);
    o.raw(",\"n\":");
    o.integer(static_cast<long>(j.n));
    o.raw(",\"weight\":");
    o.num(weight);
    o.raw(",\"primary\":");
    writeSplits(o, j.prim, false);
    if (c.o.all) {
      o.raw(",\"all\":");
      writeSplits(o, j.all, true);
    }
    o.raw(",\"sd\":[");
    o.num(j.obs.mg);
    o.raw(",", 1);
    o.num(j.obs.zg);
    o.raw(",", 1);
    o.num(j.obs.rg);
    o.raw("],\"mult\":");
    o.integer(j.obs.mult);
    o.raw("}\n", 2);
  }
}

// Jet finding, selection, re-clustering and declustering of one record: its jet results in c.jetOut[0..nJetOut).
void processRecord(Context &c, const std::vector<PseudoJet> &particles) {
  c.nJetOut = 0;
  if (particles.empty()) return;
  if (c.events) {
    ClusterSequence cs(particles, c.jetdef);
    if (c.firstStrategy.empty()) c.firstStrategy = cs.strategy_string();
    const std::vector<PseudoJet> jets = fastjet::sorted_by_pt(cs.inclusive_jets());
    long kept = 0;
    for (const PseudoJet &jet : jets) {
      if (!(jet.pt() > c.o.ptmin) || !(std::abs(jet.rap()) < c.o.ymax)) continue;
      if (c.o.njets >= 0 && kept >= c.o.njets) break;
      const std::vector<PseudoJet> constituents = jet.constituents();
      ClusterSequence ca(constituents, c.cadef);
      const std::vector<PseudoJet> roots = ca.inclusive_jets();
      if (roots.size() != 1) die("C/A reclustering did not give one jet");
      decluster(c, jet, constituents.size(), ca, roots[0]);
      kept++;
    }
  } else {
    ClusterSequence ca(particles, c.cadef);
    if (c.firstStrategy.empty()) c.firstStrategy = ca.strategy_string();
    const std::vector<PseudoJet> roots = ca.inclusive_jets();
    if (roots.size() != 1) die("C/A reclustering did not give one jet");
    const PseudoJet &jet = roots[0];
    if (jet.pt() > c.o.ptmin && std::abs(jet.rap()) < c.o.ymax && c.o.njets != 0)
      decluster(c, jet, particles.size(), ca, jet);
  }
}

// ---- streaming lines ----
struct LineReader {
  std::FILE *f;
  std::vector<char> buf;
  size_t begin = 0, end = 0;
  bool eof = false;
  double readSeconds = 0;
  explicit LineReader(std::FILE *file) : f(file), buf(4 << 20) {}
  // The next line (without its newline) as [b, e); false at the end of the input.
  bool next(const char *&b, const char *&e) {
    for (;;) {
      const char *nl = static_cast<const char *>(std::memchr(buf.data() + begin, '\n', end - begin));
      if (nl) {
        b = buf.data() + begin;
        e = nl;
        begin = nl - buf.data() + 1;
        return true;
      }
      if (eof) {
        if (begin == end) return false;
        b = buf.data() + begin;
        e = buf.data() + end;
        begin = end;
        return true;
      }
      // Keep the partial line, read more behind it (the buffer grows only for a line longer than itself).
      std::memmove(buf.data(), buf.data() + begin, end - begin);
      end -= begin;
      begin = 0;
      if (end == buf.size()) buf.resize(2 * buf.size());
      const double t0 = wallNow();
      const size_t got = std::fread(buf.data() + end, 1, buf.size() - end, f);
      readSeconds += wallNow() - t0;
      if (got == 0) eof = true;
      end += got;
    }
  }
};

bool blank(const char *b, const char *e) {
  for (; b < e; b++)
    if (*b != ' ' && *b != '\t' && *b != '\r') return false;
  return true;
}

}  // namespace

int main(int argc, char **argv) {
  const double tStart = wallNow();
  Context c;
  Options &o = c.o;
  try {
    const auto extra = [&](const std::string &a, int &i) {
      if (a == "--timings") o.timings = true;
      else if (a == "--physics-only") o.physicsOnly = true;
      else if (a == "--rounds") o.rounds = static_cast<long>(splitfield_ref::number_arg(i, argc, argv));
      else if (a == "--min-seconds") o.minSeconds = splitfield_ref::number_arg(i, argc, argv);
      else return false;
      return true;
    };
    splitfield_ref::parse_options(o, argc, argv, extra, "usage: fastjet-speed [options] input.jsonl [--out output.jsonl]");
    c.jetdef = splitfield_ref::jet_definition(o);
  } catch (const std::runtime_error &e) {
    die(e.what());
  }
  c.cadef = splitfield_ref::reclustering_definition();
  ClusterSequence::set_fastjet_banner_stream(nullptr);

  std::FILE *in = o.in == "-" ? stdin : std::fopen(o.in.c_str(), "rb");
  if (!in) die("cannot open " + o.in);
  LineReader lines(in);
  const char *b, *e;
  long lineNo = 0;
  std::string header;
  while (lines.next(b, e)) {
    lineNo++;
    if (!blank(b, e)) {
      header.assign(b, e);
      break;
    }
  }
  if (header.size() >= 2 && static_cast<unsigned char>(header[0]) == 0x1f && static_cast<unsigned char>(header[1]) == 0x8b)
    die("gzip input: this reference reads plain JSON Lines only");
  if (header.find("\"records\"") != std::string::npos) die("the one-document form: this reference reads JSON Lines only");
  if (headerField(header, "format", "") != "splitfield-particles") die("not a splitfield-particles file");
  const std::string content = headerField(header, "content", "events");
  const std::string momentum = headerField(header, "momentum", "px,py,pz,E");
  c.events = content == "events";
  if (!c.events && content != "jets") die("unknown content " + content);
  if (momentum == "pt,y,phi,m") c.ptForm = true;
  else if (momentum != "px,py,pz,E") die("unknown momentum " + momentum);
  try {
    c.k = splitfield_ref::to_gev(headerField(header, "energyUnit", "GeV"));
  } catch (const std::runtime_error &e) {
    die(e.what());
  }

  Record r;
  if (o.physicsOnly) {
    // Every record in memory first; then the physics alone, timed.
    std::vector<std::vector<PseudoJet>> records;
    long particles = 0;
    while (lines.next(b, e)) {
      lineNo++;
      if (blank(b, e)) continue;
      Scanner sc{b, e, lineNo};
      sc.record(r);
      records.emplace_back();
      toPseudoJets(c, r.p, records.back());
      particles += records.back().size();
    }
    double bestCpu = INFINITY, bestWall = INFINITY;
    long jets = 0, splittings = 0;
    for (long round = 0; round < o.rounds; round++) {
      const double c0 = cpuNow(), w0 = wallNow();
      long passes = 0;
      do {
        c.jets = c.splittings = 0;
        for (const auto &p : records) processRecord(c, p);
        passes++;
      } while (cpuNow() - c0 < o.minSeconds);
      bestCpu = std::min(bestCpu, (cpuNow() - c0) / passes);
      bestWall = std::min(bestWall, (wallNow() - w0) / passes);
      jets = c.jets;
      splittings = c.splittings;
    }
    std::printf(
        "{\"records\":%zu,\"particles\":%ld,\"jets\":%ld,\"splittings\":%ld,\"rounds\":%ld,\"cpuSeconds\":%.9g,"
        "\"wallSeconds\":%.9g,\"strategy\":\"%s\"}\n",
        records.size(), particles, jets, splittings, o.rounds, bestCpu, bestWall, c.firstStrategy.c_str());
    return 0;
  }

  std::FILE *outFile = stdout;
  if (!o.out.empty() && o.out != "-") {
    outFile = std::fopen(o.out.c_str(), "wb");
    if (!outFile) die("cannot write " + o.out);
  }
  Out out;
  splitfield_ref::write_export_header(out, c.o, content, "fastjet-speed");
  double tParse = 0, tPhysics = 0, tWrite = 0;
  const bool timed = o.timings;
  while (lines.next(b, e)) {
    lineNo++;
    if (blank(b, e)) continue;
    const double t0 = timed ? wallNow() : 0;
    Scanner sc{b, e, lineNo};
    sc.record(r);
    toPseudoJets(c, r.p, c.particles);
    if (r.id.empty()) r.id = std::to_string(lineNo);
    const double t1 = timed ? wallNow() : 0;
    processRecord(c, c.particles);
    const double t2 = timed ? wallNow() : 0;
    writeJets(c, r.id, r.weight, out);
    if (out.n >= (1u << 20)) {
      std::fwrite(out.b.data(), 1, out.n, outFile);
      out.n = 0;
    }
    if (timed) {
      tParse += t1 - t0;
      tPhysics += t2 - t1;
      tWrite += wallNow() - t2;
    }
  }
  const double tw = wallNow();
  std::fwrite(out.b.data(), 1, out.n, outFile);
  if (outFile != stdout) std::fclose(outFile);
  tWrite += wallNow() - tw;
  if (timed) {
    std::fprintf(stderr,
                 "{\"timings\":{\"read\":%.6f,\"parse\":%.6f,\"physics\":%.6f,\"write\":%.6f,\"total\":%.6f}}\n",
                 lines.readSeconds, tParse, tPhysics, tWrite, wallNow() - tStart);
  }
  return 0;
}
