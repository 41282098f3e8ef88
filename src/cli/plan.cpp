// `contrasta plan`: power, sample size, detectable contrast and allocation for planned contrasts.
// Options become a planning_request; plan_trial computes; the writers below only format.
#include <algorithm>
#include <cmath>
#include <memory>
#include <optional>
#include <random>

#include "cli/commands.hpp"
#include "cli/common.hpp"
#include "cli/format.hpp"
#include "cli/json.hpp"
#include "cli/run.hpp"
#include "contrasta/error.hpp"
#include "contrasta/plan.hpp"
#include "contrasta/prepared.hpp"
#include "contrasta/version.hpp"

namespace contrasta::cli {
namespace {

struct plan_settings {
  std::string means, sds, ns;
  std::optional<double> sd;
  std::optional<std::size_t> n;
  std::optional<double> power;
  std::optional<std::size_t> total;
  bool allocate = false;
  std::string method = "welch";
  double alpha = 0.05;
  std::string alternative = "two-sided";
  contrast_options contrasts;
  data_options data;  // --from-data and its reading options
  std::vector<std::string> level_list;
  bool simulate = false;
  std::uint64_t simulations = 10'000;
  std::optional<std::uint64_t> seed;
  output_options output;
};

// What the writers need besides the result: the request and where the assumptions came from.
struct plan_report {
  planning_request request;
  planning_result result;
  std::string source;  // "given" or the pilot file
  bool simulated = false;
};

using assignments = std::vector<std::pair<std::string, std::string>>;  // LEVEL=VALUE, in order

// "a=10,b=12,c=11" in the order written. Level names may contain '=' only before the last one.
assignments parse_assignments(const std::string& text, const std::string& option) {
  assignments out;
  std::size_t start = 0;
  while (start <= text.size()) {
    std::size_t comma = text.find(',', start);
    if (comma == std::string::npos) comma = text.size();
    std::string item = text.substr(start, comma - start);
    const std::size_t first = item.find_first_not_of(' '), last = item.find_last_not_of(' ');
    item = first == std::string::npos ? "" : item.substr(first, last - first + 1);
    const std::size_t eq = item.rfind('=');
    if (eq == std::string::npos || eq == 0 || eq + 1 == item.size())
      throw usage_error(option + " takes LEVEL=VALUE pairs separated by commas, for example " + option +
                        " \"peat=48,coir=50\"; '" + item + "' is not one");
    std::string level = item.substr(0, eq), value = item.substr(eq + 1);
    while (!level.empty() && level.back() == ' ') level.pop_back();
    // [brackets] as in contrast expressions are allowed around level names.
    if (level.size() >= 2 && level.front() == '[' && level.back() == ']') level = level.substr(1, level.size() - 2);
    while (!value.empty() && value.front() == ' ') value.erase(0, 1);
    for (const auto& [seen, v] : out)
      if (seen == level) throw usage_error(option + " names level '" + level + "' twice");
    out.emplace_back(level, value);
    start = comma + 1;
  }
  return out;
}

double number_of(const std::string& text, const std::string& option) {
  std::size_t used = 0;
  double v = 0;
  try {
    v = std::stod(text, &used);
  } catch (const std::exception&) {
    used = 0;
  }
  if (used != text.size() || !std::isfinite(v)) throw usage_error(option + ": '" + text + "' is not a number");
  return v;
}

// Values of a LEVEL=VALUE option in level order; every level must be named exactly once.
std::vector<std::string> values_in_order(const assignments& pairs,
                                         const std::vector<std::string>& levels, const std::string& option) {
  std::vector<std::string> out;
  for (const std::string& level : levels) {
    auto it = std::find_if(pairs.begin(), pairs.end(), [&](const auto& p) { return p.first == level; });
    if (it == pairs.end()) throw usage_error(option + " gives no value for level '" + level + "'; name every level");
    out.push_back(it->second);
  }
  for (const auto& [level, value] : pairs)
    if (std::find(levels.begin(), levels.end(), level) == levels.end())
      throw usage_error(option + " names level '" + level + "', which is not among the levels of the plan");
  return out;
}

plan_report make_report(const plan_settings& s) {
  plan_report report;
  planning_request& r = report.request;
  r.test.test = parse_planned_test(s.method);
  r.test.alpha = s.alpha;
  r.test.side = parse_alternative(s.alternative);
  report.source = "given";

  // The pilot dataset, when asked: it fixes the levels and supplies SDs (and means on request).
  std::optional<prepared_data> pilot;
  if (!s.data.path.empty()) {
    auto datasets = load_datasets(s.data);
    if (datasets.size() != 1) throw usage_error("--from-data plans for one response; name it with --response");
    pilot = prepare(std::move(datasets.front()));
    report.source = pilot->data.source + " (response '" + pilot->data.response + "')";
  }

  const assignments means = s.means.empty() || s.means == "pilot" ? assignments{} : parse_assignments(s.means, "--means");
  const assignments sds = s.sds.empty() ? assignments{} : parse_assignments(s.sds, "--sds");
  const assignments ns = s.ns.empty() ? assignments{} : parse_assignments(s.ns, "--ns");

  if (pilot) r.levels = pilot->data.levels;
  else if (!s.level_list.empty()) r.levels = s.level_list;
  else
    for (const auto* source : {&means, &sds, &ns})
      if (r.levels.empty())
        for (const auto& [level, v] : *source) r.levels.push_back(level);
  if (r.levels.empty())
    throw usage_error("name the levels: give --means \"a=10,b=12\" (or --sds, --ns, --levels, or --from-data FILE)");
  const std::size_t k = r.levels.size();
  if (k < 2) {
    std::string listed;
    for (const auto& level : r.levels) listed += (listed.empty() ? "'" : ", '") + level + "'";
    throw usage_error("planning needs at least two levels, but only " + listed +
                      " was named; write LEVEL=VALUE pairs separated by commas");
  }

  if (s.means == "pilot") {
    if (!pilot) throw usage_error("--means pilot takes the means from --from-data FILE; give the file");
    for (const auto& g : pilot->groups) r.means.push_back(g.mean);
  } else if (!means.empty()) {
    for (const auto& v : values_in_order(means, r.levels, "--means")) r.means.push_back(number_of(v, "--means"));
  }

  if (!sds.empty()) {
    if (s.sd) throw usage_error("give either --sd (one SD for every level) or --sds (per level), not both");
    for (const auto& v : values_in_order(sds, r.levels, "--sds")) r.sds.push_back(number_of(v, "--sds"));
  } else if (s.sd) {
    r.sds.assign(k, *s.sd);
  } else if (pilot) {
    // The pooled test assumes one SD: take the pilot's pooled residual SD for every level; the
    // Welch test uses each level's own SD.
    for (const auto& g : pilot->groups)
      r.sds.push_back(r.test.test == planned_test::pooled ? std::sqrt(pilot->anova.ms_within) : g.sd);
    for (std::size_t i = 0; i < k; ++i)
      if (!(r.sds[i] > 0) || !std::isfinite(r.sds[i]))
        throw analysis_error("the pilot data give no usable SD for level '" + r.levels[i] +
                             "' (fewer than 2 observations or a constant response); give --sd or --sds");
  } else {
    throw usage_error("give the anticipated SD: --sd 2 for every level or --sds \"a=2,b=3\" per level");
  }
  for (double sd : r.sds)
    if (!(sd > 0)) throw usage_error("anticipated SDs must be positive");

  std::vector<double> ns_values;
  if (!ns.empty()) {
    if (s.n) throw usage_error("give either --n (units per level) or --ns (per level), not both");
    for (const auto& v : values_in_order(ns, r.levels, "--ns")) ns_values.push_back(number_of(v, "--ns"));
  }

  std::vector<std::size_t> pilot_n;
  if (pilot) pilot_n = group_sizes(*pilot);
  r.contrasts = build_contrasts(s.contrasts, r.levels, pilot_n.empty() ? std::vector<std::size_t>(k, 1) : pilot_n);
  bool all_pairs_default = false;
  if (r.contrasts.empty()) {
    r.contrasts = build_contrasts({{}, {}, "", {"all-pairs"}, false}, r.levels, std::vector<std::size_t>(k, 1));
    all_pairs_default = true;
  }

  if (s.power) r.target_power = *s.power;
  if (s.total || s.allocate) {
    if (!ns_values.empty() || s.n) throw usage_error("--allocate chooses the n per level itself; drop --n / --ns");
    if (s.total) {
      r.goal = planning_goal::allocation;
      r.total = *s.total;
    } else if (s.power) {
      r.goal = planning_goal::allocated_total;
    } else {
      throw usage_error("--allocate needs --total N (share N units) or --power P (the smallest total reaching P)");
    }
  } else if (s.power && !s.n) {
    r.goal = planning_goal::sample_size;
    r.ratios = ns_values.empty() ? std::vector<double>(k, 1.0) : ns_values;
  } else {
    r.goal = planning_goal::power;
    if (s.n) {
      r.n.assign(k, *s.n);
    } else if (!ns_values.empty()) {
      for (double v : ns_values) {
        if (v < 0 || v != std::floor(v) || v > 1e12) throw usage_error("--ns: units per level must be whole numbers");
        r.n.push_back(static_cast<std::size_t>(v));
      }
    } else {
      throw usage_error("say what to plan: --n or --ns for the power of a design, --power P for the n that reaches P, "
                        "--allocate with --total or --power for the best allocation");
    }
    if (r.means.empty() && !s.power)
      report.result.notes.push_back("no --means given: only the detectable contrast (at power 0.8) is reported");
  }
  if (s.simulate) {
    r.simulations = s.simulations;
    r.seed = s.seed ? *s.seed : std::random_device{}();
    report.simulated = true;
  }
  if (all_pairs_default) report.result.notes.push_back("no contrast given: planned for all pairs of levels");
  auto notes = std::move(report.result.notes);
  report.result = plan_trial(r);
  report.result.notes.insert(report.result.notes.begin(), notes.begin(), notes.end());
  if (s.means == "pilot")
    report.result.notes.push_back("the means are the pilot's own: power computed from observed effects is optimistic "
                                  "for a new trial; prefer the smallest effect that matters");
  return report;
}

// ---- writers ----------------------------------------------------------------------------------

std::string test_words(const power_request& t) {
  std::string s = t.test == planned_test::welch ? "Welch t (Satterthwaite df)" : "pooled-variance t (df N - k)";
  s += ", alpha " + general(t.alpha, 3) + ", ";
  s += t.side == alternative::two_sided ? "two-sided" : t.side == alternative::greater ? "one-sided (contrast > 0)" : "one-sided (contrast < 0)";
  return s;
}

std::string goal_words(planning_goal g, double target) {
  switch (g) {
    case planning_goal::power: return "power of each contrast at the given units per level";
    case planning_goal::sample_size: return "smallest units per level reaching power " + general(target, 3);
    case planning_goal::allocation: return "allocation of the fixed total that makes each contrast most precise";
    case planning_goal::allocated_total: return "smallest total reaching power " + general(target, 3) + ", allocated to make each contrast most precise";
  }
  return "";
}

std::size_t total_of(const std::vector<std::size_t>& n) {
  std::size_t t = 0;
  for (std::size_t x : n) t += x;
  return t;
}

std::string design_text(const std::vector<std::string>& levels, const std::vector<std::size_t>& n) {
  std::string s;
  for (std::size_t i = 0; i < levels.size(); ++i) s += (i ? ", " : "") + levels[i] + "=" + std::to_string(n[i]);
  return s;
}

std::string values_text(const std::vector<std::string>& levels, const std::vector<double>& v) {
  std::string s;
  for (std::size_t i = 0; i < levels.size(); ++i) s += (i ? ", " : "") + levels[i] + "=" + general(v[i], 4);
  return s;
}

void write_plan_json(std::ostream& out, const plan_report& report) {
  const planning_request& r = report.request;
  const planning_result& res = report.result;
  json_writer json(out);
  json.begin_object();
  json.key("tool").begin_object().field("name", "contrasta").field("version", version()).end_object();
  if (report.simulated) json.field("seed", r.seed);
  else json.key("seed").null();
  json.field("goal", to_string(r.goal)).field("method", to_string(r.test.test)).field("alpha", r.test.alpha);
  json.field("alternative", to_string(r.test.side)).field("target_power", r.target_power);
  json.key("assumptions").begin_object();
  json.field("source", report.source);
  json.key("levels").strings(r.levels);
  json.key("means");
  if (r.means.empty()) json.null();
  else {
    json.begin_object();
    for (std::size_t i = 0; i < r.levels.size(); ++i) json.field(r.levels[i], r.means[i]);
    json.end_object();
  }
  json.key("sds").begin_object();
  for (std::size_t i = 0; i < r.levels.size(); ++i) json.field(r.levels[i], r.sds[i]);
  json.end_object();
  json.end_object();
  json.key("plans").begin_array();
  for (const contrast_plan& p : res.plans) {
    json.begin_object();
    json.field("contrast", p.spec.name).field("expression", p.spec.expression);
    json.key("coefficients").begin_object();
    for (std::size_t i = 0; i < r.levels.size(); ++i) json.field(r.levels[i], p.spec.coefficients[i]);
    json.end_object();
    json.field("method", to_string(r.test.test)).field("alpha", r.test.alpha).field("alternative", to_string(r.test.side));
    json.key("n").begin_object();
    for (std::size_t i = 0; i < r.levels.size(); ++i) json.field(r.levels[i], static_cast<std::uint64_t>(p.n[i]));
    json.end_object();
    json.field("total", static_cast<std::uint64_t>(total_of(p.n)));
    if (p.power) {
      json.field("contrast_value", p.power->contrast_value).field("se", p.power->se).field("df", p.power->df);
      json.field("ncp", p.power->ncp).field("critical_t", p.power->critical).field("power", p.power->power);
    } else {
      json.key("contrast_value").null().field("se", p.se).field("df", p.df).key("ncp").null();
      json.key("critical_t").null().key("power").null();
    }
    json.field("target_power", r.target_power).field("detectable", p.detectable);
    if (r.goal == planning_goal::sample_size || r.goal == planning_goal::allocated_total) {
      json.field("power_one_less", p.power_one_less).field("reached", p.reached);
    }
    if (p.simulated) {
      json.key("simulation").begin_object();
      json.field("simulations", p.simulated->simulations).field("rejections", p.simulated->rejections);
      json.field("power", p.simulated->power).field("low", p.simulated->low).field("high", p.simulated->high);
      json.field("interval", "99% Clopper-Pearson").field("seed", p.simulated->seed);
      json.end_object();
    }
    json.end_object();
  }
  json.end_array();
  json.key("design");
  if (res.common_n.empty()) {
    json.null();
  } else {
    json.begin_object();
    json.key("n").begin_object();
    for (std::size_t i = 0; i < r.levels.size(); ++i) json.field(r.levels[i], static_cast<std::uint64_t>(res.common_n[i]));
    json.end_object();
    json.field("total", static_cast<std::uint64_t>(total_of(res.common_n)));
    if (res.limiting_contrast.empty()) json.key("limiting_contrast").null();
    else json.field("limiting_contrast", res.limiting_contrast);
    json.key("powers").begin_array();
    for (std::size_t j = 0; j < res.power_at_common.size(); ++j)
      json.begin_object().field("contrast", res.plans[j].spec.name).field("power", res.power_at_common[j]).end_object();
    json.end_array();
    json.end_object();
  }
  json.key("notes").strings(res.notes);
  json.end_object();
}

std::string csv_cell(const std::string& s) {
  if (s.find_first_of(",\"\n\r") == std::string::npos) return s;
  std::string out = "\"";
  for (char ch : s) out += ch == '"' ? std::string("\"\"") : std::string(1, ch);
  return out + "\"";
}
std::string csv_number(double v) { return std::isfinite(v) ? number_text(v) : (std::isnan(v) ? "" : (v > 0 ? "inf" : "-inf")); }

void write_plan_csv(std::ostream& out, const plan_report& report) {
  const planning_request& r = report.request;
  out << "contrast,method,alpha,alternative,goal";
  for (const std::string& level : r.levels) out << ',' << csv_cell("n_" + level);
  out << ",total,contrast_value,se,df,ncp,power,target_power,detectable,power_one_less,simulated_power,simulated_low,"
         "simulated_high\n";
  const bool searched = r.goal == planning_goal::sample_size || r.goal == planning_goal::allocated_total;
  for (const contrast_plan& p : report.result.plans) {
    out << csv_cell(p.spec.name) << ',' << to_string(r.test.test) << ',' << csv_number(r.test.alpha) << ','
        << to_string(r.test.side) << ',' << to_string(r.goal);
    for (std::size_t x : p.n) out << ',' << x;
    out << ',' << total_of(p.n);
    if (p.power)
      out << ',' << csv_number(p.power->contrast_value) << ',' << csv_number(p.power->se) << ',' << csv_number(p.power->df)
          << ',' << csv_number(p.power->ncp) << ',' << csv_number(p.power->power);
    else
      out << ",," << csv_number(p.se) << ',' << csv_number(p.df) << ",,";
    out << ',' << csv_number(r.target_power) << ',' << csv_number(p.detectable) << ','
        << (searched ? csv_number(p.power_one_less) : "");
    if (p.simulated)
      out << ',' << csv_number(p.simulated->power) << ',' << csv_number(p.simulated->low) << ',' << csv_number(p.simulated->high);
    else
      out << ",,,";
    out << '\n';
  }
}

text_table plan_table(const plan_report& report) {
  const planning_request& r = report.request;
  const bool searched = r.goal == planning_goal::sample_size || r.goal == planning_goal::allocated_total;
  text_table t;
  t.header = {"contrast", "n per level", "N", "df", "ncp", "power"};
  if (searched) t.header.push_back("power with one step less");
  t.header.push_back("detectable at power " + general(r.target_power, 3));
  if (report.simulated) t.header.push_back("simulated power [99%]");
  t.right.assign(t.header.size(), true);
  t.right[0] = t.right[1] = false;
  double scale = HUGE_VAL;
  for (double sd : r.sds) scale = std::min(scale, sd);
  const int d = decimals_for(scale / 10);
  for (const contrast_plan& p : report.result.plans) {
    std::vector<std::string> row = {p.spec.name, design_text(r.levels, p.n), std::to_string(total_of(p.n))};
    row.push_back(general(p.df, 4));
    if (p.power) {
      row.push_back(fixed(p.power->ncp, 3));
      row.push_back(fixed(p.power->power, 4) + (p.reached ? "" : " (limit)"));
    } else {
      row.insert(row.end(), {"-", "-"});
    }
    if (searched) row.push_back(fixed(p.power_one_less, 4));
    row.push_back(fixed(p.detectable, d));
    if (p.simulated)
      row.push_back(fixed(p.simulated->power, 3) + " [" + fixed(p.simulated->low, 3) + ", " + fixed(p.simulated->high, 3) + "]");
    t.rows.push_back(row);
  }
  return t;
}

void write_design_lines(std::ostream& out, const plan_report& report, const std::string& bullet) {
  const planning_request& r = report.request;
  const planning_result& res = report.result;
  if (res.common_n.empty()) return;
  out << bullet << (r.goal == planning_goal::power ? "design: " : "design serving every contrast: ")
      << design_text(r.levels, res.common_n) << " (N = " << total_of(res.common_n) << ")";
  if (!res.limiting_contrast.empty() && res.plans.size() > 1) out << "; set by '" << res.limiting_contrast << "'";
  out << '\n';
  if (res.plans.size() > 1 && !res.power_at_common.empty()) {
    out << bullet << "power of each contrast in that design:";
    for (std::size_t j = 0; j < res.power_at_common.size(); ++j)
      out << (j ? ", " : " ") << res.plans[j].spec.name << " " << fixed(res.power_at_common[j], 3);
    out << '\n';
  }
}

const char* plan_caution =
    "Read with care: power is only as good as the anticipated means and SDs; plan for the smallest effect\n"
    "that matters, not the one a pilot happened to show. Several contrasts tested at alpha each raise the\n"
    "chance of a false alarm; lower --alpha (e.g. alpha / number of contrasts) if they will be adjusted.\n"
    "Decisions under regulation or licence follow local rules and a qualified statistician.\n";

void write_plan_table(std::ostream& out, const plan_report& report) {
  const planning_request& r = report.request;
  out << "contrasta " << version() << " | plan\n";
  out << "  goal     " << goal_words(r.goal, r.target_power) << '\n';
  out << "  test     " << test_words(r.test) << '\n';
  out << "  means    " << (r.means.empty() ? std::string("not given") : values_text(r.levels, r.means)) << '\n';
  out << "  SDs      " << values_text(r.levels, r.sds) << "   (source: " << report.source << ")\n";
  if (report.simulated) out << "  seed     " << r.seed << "   (" << r.simulations << " simulated trials per contrast)\n";
  out << "\nPLANS\n";
  plan_table(report).print(out);
  out << '\n';
  write_design_lines(out, report, "  ");
  out << "  detectable: the smallest true contrast (in data units) found with the target power at that n.\n";
  for (const std::string& note : report.result.notes) out << "  note: " << note << '\n';
  out << '\n' << plan_caution;
}

void write_plan_markdown(std::ostream& out, const plan_report& report) {
  const planning_request& r = report.request;
  out << "# Trial plan\n\n";
  out << "- goal: " << goal_words(r.goal, r.target_power) << "\n";
  out << "- test: " << test_words(r.test) << "\n";
  out << "- anticipated means: " << (r.means.empty() ? std::string("not given") : markdown_escape(values_text(r.levels, r.means))) << "\n";
  out << "- anticipated SDs: " << markdown_escape(values_text(r.levels, r.sds)) << " (source: " << markdown_escape(report.source) << ")\n";
  if (report.simulated) out << "- seed: " << r.seed << " (" << r.simulations << " simulated trials per contrast)\n";
  out << "\n## Plans\n\n";
  plan_table(report).print_markdown(out);
  out << '\n';
  write_design_lines(out, report, "- ");
  for (const std::string& note : report.result.notes) out << "- note: " << markdown_escape(note) << '\n';
  out << '\n';
  std::string caution = plan_caution;
  for (std::size_t start = 0; start < caution.size();) {
    const std::size_t end = caution.find('\n', start);
    out << "> " << caution.substr(start, end - start) << '\n';
    start = end == std::string::npos ? caution.size() : end + 1;
  }
}

}  // namespace

void add_plan_command(CLI::App& app) {
  auto s = std::make_shared<plan_settings>();
  auto* cmd = app.add_subcommand("plan", "power, sample size and allocation for planned contrasts");
  cmd->footer(
      "Examples:\n"
      "  contrasta plan --means \"a=10,b=12,c=11\" --sd 2 --n 8 -c \"b - a\"\n"
      "  contrasta plan --means \"peat=47,coir=49,bark compost=40\" --sds \"peat=2.5,coir=3,bark compost=6\" --power 0.8 --family all-pairs\n"
      "  contrasta plan --from-data pilot.csv --group substrate --response fresh_mass_g --means pilot --power 0.9 --ns \"peat=2,coir=1,bark=1\"\n"
      "  contrasta plan --means \"a=10,b=12\" --sds \"a=1,b=3\" --allocate --total 40 -c \"b - a\"\n"
      "  contrasta plan --means \"a=10,b=12,c=11\" --sd 2 --n 8 -c \"b - a\" --simulate --seed 1");
  cmd->add_option("--means", s->means,
                  "anticipated mean per level, \"LEVEL=VALUE,...\"; or 'pilot' to take them from --from-data");
  cmd->add_option("--sd", s->sd, "one anticipated SD for every level");
  cmd->add_option("--sds", s->sds, "anticipated SD per level, \"LEVEL=VALUE,...\"");
  cmd->add_option("--n", s->n, "units per level (the same for every level)");
  cmd->add_option("--ns", s->ns,
                  "units per level, \"LEVEL=N,...\"; with --power (and no --n) they are allocation ratios to scale");
  cmd->add_option("--power", s->power,
                  "target power: without --n, solve for the smallest n; with --n, the power the detectable contrast uses (default 0.8)")
      ->check(CLI::Range(0.0, 1.0));
  cmd->add_flag("--allocate", s->allocate,
                "choose n per level to make each contrast most precise (n proportional to |c_i| SD_i); with --total or --power");
  cmd->add_option("--total", s->total, "total units to allocate (implies --allocate)");
  cmd->add_option("--method", s->method, "test the trial will use: welch (default) or pooled")
      ->check(CLI::IsMember({"pooled", "welch"}));
  cmd->add_option("--alpha", s->alpha, "significance level of the planned test (default 0.05)")->check(CLI::Range(1e-12, 0.5));
  cmd->add_option("--alternative", s->alternative, "two-sided, greater (contrast > 0) or less")
      ->check(CLI::IsMember({"two-sided", "greater", "less"}));
  cmd->add_option("--levels", s->level_list, "the levels of the plan, in order (comma list); with --from-data, the levels to keep")
      ->delimiter(',');
  add_contrast_options(cmd, s->contrasts);
  cmd->add_option("--from-data", s->data.path, "pilot dataset: anticipated SDs (and, with --means pilot, means) from it");
  cmd->add_option("--group", s->data.group, "with --from-data: the column holding the level of each row");
  cmd->add_option("--response", s->data.responses, "with --from-data: the response column");
  cmd->add_option("--delimiter", s->data.delimiter, "with --from-data: field separator , ; tab (default: detected)");
  cmd->add_flag("--decimal-comma", s->data.decimal_comma, "with --from-data: numbers are written with a decimal comma");
  cmd->add_flag("--simulate", s->simulate,
                "check each analytic power by simulating normal trials and running contrasta's own test on them");
  cmd->add_option("--simulations", s->simulations, "simulated trials per contrast with --simulate (default 10000)")
      ->check(CLI::Range(std::uint64_t{100}, std::uint64_t{100'000'000}));
  cmd->add_option("--seed", s->seed, "seed of the simulation (default: drawn and printed)");
  add_output_options(cmd, s->output, {"table", "json", "csv", "markdown"});
  set_action(cmd, [s] {
    plan_settings settings = *s;
    if (!settings.level_list.empty() && !settings.data.path.empty()) {
      settings.data.levels = settings.level_list;
      settings.level_list.clear();
    }
    const plan_report report = make_report(settings);
    write_output(settings.output, [&](std::ostream& out) {
      if (settings.output.format == "json") write_plan_json(out, report);
      else if (settings.output.format == "csv") write_plan_csv(out, report);
      else if (settings.output.format == "markdown") write_plan_markdown(out, report);
      else write_plan_table(out, report);
    });
  });
}

}  // namespace contrasta::cli
