// The IIS search (docs/explaining.md): the support of an exact Farkas certificate, shrunk to an
// irreducible subsystem by a deletion filter over adaptive blocks, every sub-solve certified on one
// solve session; then the subsystem's certificate, checked independently.
#include "plumb/explain/explain.hpp"

#include "entries.hpp"
#include "plumb/exact/session.hpp"

#include <algorithm>
#include <chrono>
#include <map>
#include <optional>
#include <stdexcept>

namespace plumb::explain {

namespace {

using certificate::EntryKind;
using certificate::Limit;
using detail::Entries;
using Terms = std::vector<std::pair<int, Rational>>;  // entry id, non-negative multiplier

// What one sub-solve proved about the entries active at the time.
struct Answer {
  bool infeasible = false;
  Terms farkas;             // infeasible: the certificate's terms, all on active entries
  std::vector<Rational> x;  // feasible: a point meeting every active entry
  bool earlier = false;     // the session answered with an earlier proof
};

// The session and which entries are active in it.  Every answer comes from a certified solve (or,
// for a crossed row or column, from its own two entries, which prove themselves).
class Prober {
 public:
  Prober(const model::Model& model, const Entries& entries, const Options& options, Explanation& figures)
      : entries_(entries),
        options_(options),
        figures_(figures),
        session_(model),
        active_(static_cast<std::size_t>(entries.size()), true) {
    session_.set_goal(exact::Goal::feasibility);
  }

  bool active(int id) const { return active_[static_cast<std::size_t>(id)]; }
  // The next probe is a new search even where the session's last proof still stands: an order's
  // first probe, so that each order meets its own proofs (with the last order's proof, every
  // order after the first found that one's subsystem again: gran 6 members against 2).
  void ask_afresh() { afresh_ = true; }
  void set_active(int id, bool on) {
    if (active(id) == on) return;
    active_[static_cast<std::size_t>(id)] = on;
    const Member& m = entries_[id];
    model::Side value = on ? model::Side(m.value) : std::nullopt;
    bool lower = m.entry.limit == Limit::lower;
    if (m.entry.kind == EntryKind::row) {
      if (lower)
        session_.set_row_lower(m.index, value);
      else
        session_.set_row_upper(m.index, value);
    } else if (lower) {
      session_.set_column_lower(m.index, value);
    } else {
      session_.set_column_upper(m.index, value);
    }
  }

  Answer probe(const std::string& phase) {
    phase_ = phase;
    for (const auto& [lower, upper] : entries_.crossed())
      if (active(lower) && active(upper)) return {true, {{lower, Rational(1)}, {upper, Rational(1)}}, {}};
    exact::SolveOptions solve;
    solve.budget = options_.budget;
    // Each Farkas support replaces the candidates, so few multipliers pay for the slower proof:
    // the 27 infeasible Netlib models took 29.6 s with them, 45.7 s with rows of B^-1 (bgindy's first
    // support 1 036 entries against 154), and 85 s (gran stopped at 60 s) with few multipliers
    // asked for the first solve only.
    solve.few_multipliers = true;
    solve.earlier_proof = !afresh_;
    solve.certificate_extras = false;  // only the outcome and its values are used
    afresh_ = false;
    exact::CertifiedSolution result = session_.solve(solve);
    ++figures_.sub_solves;
    const exact::Solution& s = result.solution;
    figures_.float_seconds += s.stats.float_seconds;
    figures_.exact_seconds += s.stats.certify_seconds + s.stats.exact_seconds;
    if (s.outcome == exact::Outcome::stopped) throw run::Stopped{s.stop_reason, phase};
    if (!result.certified())
      throw std::runtime_error("the independent checker rejected every result of a sub-solve (" +
                               result.verdict.failure + "); this is a bug, please report it");
    if (s.outcome == exact::Outcome::infeasible)
      return {true, entries_.farkas_terms(session_.current(), s.y), {}, s.stats.proof == "earlier proof"};
    return {false, {}, s.x};  // optimal under the feasibility goal: a feasible point
  }

  void report(long candidates) const {
    if (!options_.progress) return;
    double elapsed = std::chrono::duration<double>(std::chrono::steady_clock::now() - start_).count();
    options_.progress({phase_, candidates, figures_.sub_solves, elapsed});
  }
  const std::string& phase() const { return phase_; }

 private:
  const Entries& entries_;
  const Options& options_;
  bool afresh_ = false;
  Explanation& figures_;
  exact::Session session_;
  std::vector<bool> active_;
  std::string phase_ = "first solve";
  std::chrono::steady_clock::time_point start_ = std::chrono::steady_clock::now();
};

// What may be relaxed: units of entries dropped and restored together (one entry, or one group's
// soft entries under --by-group); entries in no unit are always active.
struct Units {
  std::vector<std::vector<int>> entries;  // per unit, its entry ids ascending
  std::vector<std::string> group;         // per unit, the group it stands for; "" for a single entry
  std::vector<int> of;                    // per entry, its unit or -1
};

// Under --by-group every group is one unit, except the one opened by --within, whose entries stand alone.
Units soft_units(const Entries& entries, const Options& options) {
  Units units;
  units.of.assign(static_cast<std::size_t>(entries.size()), -1);
  std::map<std::string, int> group_unit;
  for (int id = 0; id < entries.size(); ++id) {
    const Member& m = entries[id];
    if (m.hard) continue;
    int unit = static_cast<int>(units.entries.size());
    bool grouped = options.by_group && !m.group.empty() && m.group != options.within;
    if (grouped) unit = group_unit.try_emplace(m.group, unit).first->second;
    if (unit == static_cast<int>(units.entries.size())) {
      units.entries.emplace_back();
      units.group.push_back(grouped ? m.group : "");
    }
    units.entries[static_cast<std::size_t>(unit)].push_back(id);
    units.of[static_cast<std::size_t>(id)] = unit;
  }
  return units;
}

// Every hard entry a unit of its own, for when the hard entries alone conflict.
Units hard_units(const Entries& entries) {
  Units units;
  units.of.assign(static_cast<std::size_t>(entries.size()), -1);
  for (int id = 0; id < entries.size(); ++id) {
    if (!entries[id].hard) continue;
    units.of[static_cast<std::size_t>(id)] = static_cast<int>(units.entries.size());
    units.entries.push_back({id});
    units.group.emplace_back();
  }
  return units;
}

// The units a Farkas combination touches, ascending.
std::vector<int> support(const Terms& farkas, const Units& units) {
  std::vector<int> touched;
  for (const auto& [id, multiplier] : farkas)
    if (int unit = units.of[static_cast<std::size_t>(id)]; unit >= 0) touched.push_back(unit);
  std::sort(touched.begin(), touched.end());
  touched.erase(std::unique(touched.begin(), touched.end()), touched.end());
  return touched;
}

// An irreducible subset of units, its Farkas terms and, per unit, the point that proves it needed.
struct Found {
  std::vector<int> units;
  Terms farkas;
  std::map<int, std::vector<Rational>> witness;
  long sub_solves = 0;
  long earlier_proofs = 0;  // of those, answered by the session's earlier proof
};

// The deletion filter (Chinneck & Dravnieks 1991) over blocks of candidates, in the
// divide-and-conquer spirit of QuickXplain (Junker 2004): drop the next block of untested units; if
// the rest is still infeasible, the new Farkas certificate's support replaces the candidates (it
// usually drops far more than the block) and the block doubles; if it turns feasible, a block of
// one is proven needed (the feasible point is its witness) and a larger block is halved.  A unit
// proven needed stays needed in every infeasible subset, so it survives every later support.
Found deletion_filter(Prober& prober, const Units& units, std::vector<int> candidates, Terms farkas,
                      const std::string& phase) {
  Found found;
  long solves_before = 0;
  auto set_unit = [&](int unit, bool on) {
    for (int id : units.entries[static_cast<std::size_t>(unit)]) prober.set_active(id, on);
  };
  std::size_t needed = 0, block = 1;
  while (needed < candidates.size()) {
    std::size_t size = std::min(block, candidates.size() - needed);
    for (std::size_t k = needed; k < needed + size; ++k) set_unit(candidates[k], false);
    Answer answer = prober.probe(phase);
    ++solves_before;
    found.earlier_proofs += answer.earlier;
    if (answer.infeasible) {
      std::vector<int> kept = support(answer.farkas, units);
      std::vector<int> next;
      for (int unit : candidates) {
        if (std::binary_search(kept.begin(), kept.end(), unit))
          next.push_back(unit);
        else
          set_unit(unit, false);
      }
      candidates = std::move(next);
      farkas = std::move(answer.farkas);
      block *= 2;
    } else {
      for (std::size_t k = needed; k < needed + size; ++k) set_unit(candidates[k], true);
      if (size == 1)
        found.witness[candidates[needed++]] = std::move(answer.x);
      else
        block = size / 2;
    }
    prober.report(static_cast<long>(candidates.size() - needed));
  }
  found.units = std::move(candidates);
  found.farkas = std::move(farkas);
  found.sub_solves = solves_before;
  return found;
}

// The member orders tried.  The deletion filter drops what it tests first whenever it can, so an
// order decides which of overlapping subsystems is found: "bounds first" tends to keep rows (the
// requirements people state) and lean less on bounds, "rows first" the reverse.
struct Order {
  const char* name;
  bool bounds_first;
};
constexpr Order orders[] = {{"bounds first", true}, {"rows first", false}};

std::vector<int> in_order(std::vector<int> units, const Units& all, const Entries& entries,
                          bool bounds_first) {
  auto is_bound = [&](int unit) {
    return entries[all.entries[static_cast<std::size_t>(unit)].front()].entry.kind == EntryKind::column;
  };
  std::stable_sort(units.begin(), units.end(), [&](int a, int b) {
    return is_bound(a) == is_bound(b) ? false : is_bound(a) == bounds_first;
  });
  return units;
}

// Activates exactly the given units and every entry in no unit.
void activate(Prober& prober, const Entries& entries, const Units& units, const std::vector<int>& on) {
  std::vector<bool> wanted(units.entries.size(), false);
  for (int unit : on) wanted[static_cast<std::size_t>(unit)] = true;
  for (int id = 0; id < entries.size(); ++id) {
    int unit = units.of[static_cast<std::size_t>(id)];
    prober.set_active(id, unit < 0 || wanted[static_cast<std::size_t>(unit)]);
  }
}

certificate::NamedValues named(const model::Model& model, const std::vector<Rational>& x) {
  certificate::NamedValues values;
  for (int j = 0; j < model.column_count(); ++j)
    if (x[static_cast<std::size_t>(j)] != 0)
      values.emplace_back(model.columns[static_cast<std::size_t>(j)].name, x[static_cast<std::size_t>(j)]);
  return values;
}

// The certificate of a found subsystem: its members (each unit's entries), every hard entry, the
// Farkas terms and one witness per unit; and the members and hard entries for the renderings.
void certify_subsystem(const model::Model& model, const Entries& entries, const Units& units,
                       const Found& found, bool members_are_soft, bool by_group, Explanation& out) {
  certificate::Certificate& c = out.certificate;
  c.model = certificate::identify(model);
  c.status = certificate::Status::infeasible_subsystem;
  std::map<int, Rational> multiplier;
  for (const auto& [id, value] : found.farkas) multiplier[id] += value;
  auto member = [&](int id) {
    Member m = entries[id];
    if (auto it = multiplier.find(id); it != multiplier.end()) m.multiplier = it->second;
    return m;
  };
  // In model order (rows, then columns), whichever order found them.
  std::vector<int> in_model_order = found.units;
  std::sort(in_model_order.begin(), in_model_order.end(), [&units](int a, int b) {
    return units.entries[static_cast<std::size_t>(a)].front() <
           units.entries[static_cast<std::size_t>(b)].front();
  });
  for (int unit : in_model_order) {
    certificate::Witness witness;
    for (int id : units.entries[static_cast<std::size_t>(unit)]) {
      witness.drop.push_back(out.members.size());
      out.members.push_back(member(id));
    }
    if (!members_are_soft) continue;
    witness.x = named(model, found.witness.at(unit));
    c.witnesses.push_back(std::move(witness));
    if (by_group) out.groups.push_back(units.group[static_cast<std::size_t>(unit)]);
  }
  if (members_are_soft) {
    for (int id = 0; id < entries.size(); ++id)
      if (entries[id].hard) out.hard.push_back(member(id));
  } else {
    out.hard = std::move(out.members);
    out.members.clear();
  }
  for (const Member& m : out.members) c.members.push_back(m.entry);
  for (const Member& m : out.hard) c.hard.push_back(m.entry);
  for (const auto& [id, value] : multiplier) c.farkas.push_back({entries[id].entry, value});
}

}  // namespace

// From an infeasible answer on the active entries: the deletion filter in each order, the smallest
// subsystem kept and certified into `out` (or, when the soft entries cannot help, the hard ones'
// own conflict).
void find_subsystem(const model::Model& model, Prober& prober, const Entries& entries, const Units& units,
                    const Answer& first, bool by_group, Explanation& out) {
  std::vector<int> start_units = support(first.farkas, units);
  out.support_size = static_cast<long>(first.farkas.size());
  std::optional<Found> best;
  for (const Order& order : orders) {
    std::vector<int> candidates = in_order(start_units, units, entries, order.bounds_first);
    activate(prober, entries, units, candidates);
    prober.ask_afresh();
    Found found =
        deletion_filter(prober, units, candidates, first.farkas, std::string("deletion, ") + order.name);
    out.orders.push_back({order.name, found.units.size(), found.sub_solves, found.earlier_proofs});
    if (!best || found.units.size() < best->units.size()) best = std::move(found);
    // No order changes the answer when the hard entries alone conflict, nor when the first
    // support is irreducible already: then it is the only infeasible subset of itself.
    if (best->units.empty() || best->units.size() == start_units.size()) break;
  }
  if (!best->units.empty()) {
    out.outcome = Outcome::infeasible_subsystem;
    certify_subsystem(model, entries, units, *best, true, by_group, out);
    return;
  }
  // Every soft entry dropped and still infeasible: an irreducible set of hard entries.
  Units hard = hard_units(entries);
  std::vector<int> candidates = support(best->farkas, hard);
  for (int id = 0; id < entries.size(); ++id) prober.set_active(id, false);
  for (int unit : candidates) prober.set_active(hard.entries[static_cast<std::size_t>(unit)].front(), true);
  Found found = deletion_filter(prober, hard, candidates, best->farkas, "deletion, hard entries");
  out.outcome = Outcome::inconsistent;
  certify_subsystem(model, entries, hard, found, false, false, out);
}

// --all: after each conflict, one of its units is set aside for good (the first in model order:
// a heuristic, and so is the cover it builds) and the rest searched again, until it is feasible.
void find_further(const model::Model& model, Prober& prober, const Entries& entries, const Units& units,
                  const Options& options, Explanation& out) {
  std::vector<bool> aside(units.entries.size(), false);
  const Explanation* last = &out;
  while (last->outcome == Outcome::infeasible_subsystem) {
    int unit = units.of[static_cast<std::size_t>(entries.id_of(last->members.front()))];
    aside[static_cast<std::size_t>(unit)] = true;
    for (int id : units.entries[static_cast<std::size_t>(unit)]) out.set_aside.push_back(entries[id]);
    std::vector<int> others;
    for (int u = 0; u < static_cast<int>(units.entries.size()); ++u)
      if (!aside[static_cast<std::size_t>(u)]) others.push_back(u);
    activate(prober, entries, units, others);
    Answer next = prober.probe("all: the next conflict");
    if (!next.infeasible) return;
    Explanation more;
    find_subsystem(model, prober, entries, units, next, options.by_group, more);
    more.verdict = check::verify(model, more.certificate);
    out.further.push_back(std::move(more));
    last = &out.further.back();
  }
}

Explanation explain(const model::Model& model, const Options& options) {
  auto start = std::chrono::steady_clock::now();
  Explanation out;
  Entries entries(model);
  Prober prober(model, entries, options, out);
  Units units = soft_units(entries, options);
  try {
    Answer first = prober.probe("first solve");
    if (!first.infeasible) {
      out.outcome = Outcome::feasible;
      out.certificate.model = certificate::identify(model);
      out.certificate.status = certificate::Status::feasible;
      out.certificate.x = named(model, first.x);
    } else {
      find_subsystem(model, prober, entries, units, first, options.by_group, out);
    }
  } catch (const run::Stopped& stopped) {
    Explanation stopped_out;
    stopped_out.sub_solves = out.sub_solves;
    stopped_out.float_seconds = out.float_seconds;
    stopped_out.exact_seconds = out.exact_seconds;
    stopped_out.stop_reason = stopped.reason;
    stopped_out.stopped_during = stopped.progress;
    out = std::move(stopped_out);
  }
  if (out.outcome != Outcome::stopped) out.verdict = check::verify(model, out.certificate);
  if (options.all && out.outcome == Outcome::infeasible_subsystem) {
    try {
      find_further(model, prober, entries, units, options, out);
    } catch (const run::Stopped& stopped) {
      out.stop_reason = stopped.reason;  // the conflicts found so far stand, each proven
      out.stopped_during = stopped.progress;
    }
  }
  out.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  return out;
}

}  // namespace plumb::explain
