// `contrasta layout`: a seeded randomisation plan for a completely randomised design.
#include <algorithm>
#include <fstream>
#include <memory>
#include <optional>
#include <random>
#include <set>

#include "cli/commands.hpp"
#include "cli/common.hpp"
#include "cli/format.hpp"
#include "cli/json.hpp"
#include "cli/run.hpp"
#include "contrasta/error.hpp"
#include "contrasta/layout.hpp"
#include "contrasta/version.hpp"

namespace contrasta::cli {
namespace {

struct layout_settings {
  std::vector<std::string> treatments;
  std::string replicates;
  std::string units;
  std::optional<std::uint64_t> seed;
  output_options output;
};

std::string trimmed(std::string s) {
  const std::size_t first = s.find_first_not_of(" \t\r"), last = s.find_last_not_of(" \t\r");
  return first == std::string::npos ? "" : s.substr(first, last - first + 1);
}

std::size_t replicate_count(const std::string& text) {
  std::size_t used = 0;
  unsigned long long v = 0;
  try {
    v = std::stoull(text, &used);
  } catch (const std::exception&) {
    used = 0;
  }
  if (used == 0 || used != text.size() || text[0] == '-' || v == 0 || v > 4'000'000'000ULL)
    throw usage_error("--replicates: '" + text + "' is not a positive whole number of units");
  return static_cast<std::size_t>(v);
}

// One label per line; blank lines and lines starting with '#' are skipped.
std::vector<std::string> read_unit_labels(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw input_error("cannot read the unit file '" + path + "': check the name and permissions");
  std::vector<std::string> labels;
  std::set<std::string> seen;
  std::string line;
  std::size_t number = 0;
  while (std::getline(in, line)) {
    ++number;
    if (number == 1 && line.rfind("\xEF\xBB\xBF", 0) == 0) line.erase(0, 3);  // UTF-8 byte order mark
    line = trimmed(line);
    if (line.empty() || line[0] == '#') continue;
    if (!seen.insert(line).second)
      throw input_error(path + ":" + std::to_string(number) + ": unit '" + line + "' is listed twice; give each unit once");
    labels.push_back(line);
  }
  if (labels.empty()) throw input_error("the unit file '" + path + "' lists no units; write one unit label per line");
  return labels;
}

layout_design make_design(const layout_settings& s) {
  layout_design design;
  const std::string text = trimmed(s.replicates);
  if (text.empty()) throw usage_error("give --replicates, for example --replicates 4 or --replicates \"a=4,b=6,c=4\"");
  if (text.find('=') == std::string::npos) {
    if (s.treatments.empty()) throw usage_error("give the treatments, for example --treatments a,b,c");
    design.treatments = s.treatments;
    design.replicates.assign(s.treatments.size(), replicate_count(text));
  } else {
    std::size_t start = 0;
    while (start <= text.size()) {
      std::size_t comma = text.find(',', start);
      if (comma == std::string::npos) comma = text.size();
      const std::string item = trimmed(text.substr(start, comma - start));
      const std::size_t eq = item.rfind('=');
      if (eq == std::string::npos) throw usage_error("--replicates: '" + item + "' is not TREATMENT=COUNT");
      design.treatments.push_back(trimmed(item.substr(0, eq)));
      design.replicates.push_back(replicate_count(trimmed(item.substr(eq + 1))));
      start = comma + 1;
    }
    if (!s.treatments.empty()) {
      // Both given: the same set; the order of --treatments wins.
      layout_design ordered;
      for (const std::string& t : s.treatments) {
        auto it = std::find(design.treatments.begin(), design.treatments.end(), t);
        if (it == design.treatments.end())
          throw usage_error("--replicates gives no count for treatment '" + t + "'");
        ordered.treatments.push_back(t);
        ordered.replicates.push_back(design.replicates[static_cast<std::size_t>(it - design.treatments.begin())]);
      }
      if (ordered.treatments.size() != design.treatments.size())
        throw usage_error("--replicates names a treatment that --treatments does not list");
      design.treatments = ordered.treatments;
      design.replicates = ordered.replicates;
    }
  }
  if (!s.units.empty()) design.unit_labels = read_unit_labels(s.units);
  design.seed = s.seed ? *s.seed : std::random_device{}();
  check_layout_design(design);
  return design;
}

std::string replicates_text(const layout_design& d) {
  std::string s;
  for (std::size_t i = 0; i < d.treatments.size(); ++i) s += (i ? "," : "") + d.treatments[i] + "=" + std::to_string(d.replicates[i]);
  return s;
}

std::string quoted(const std::string& s) { return "\"" + s + "\""; }

std::string reproduce_line(const layout_design& d, const std::string& units_path) {
  std::string s = "contrasta layout --replicates " + quoted(replicates_text(d)) + " --seed " + std::to_string(d.seed);
  if (!units_path.empty()) s += " --units " + quoted(units_path);
  return s;
}

const char* generator_words =
    "pcg32 (stream 'layout'), Fisher-Yates shuffle with Lemire bounded integers; the same seed gives this plan on any machine";

std::string csv_cell(const std::string& s) {
  if (s.find_first_of(",\"\n\r#") == std::string::npos) return s;
  std::string out = "\"";
  for (char ch : s) out += ch == '"' ? std::string("\"\"") : std::string(1, ch);
  return out + "\"";
}

void write_layout_csv(std::ostream& out, const layout_plan& plan, const std::string& units_path) {
  const layout_design& d = plan.design;
  out << "# contrasta " << version() << " layout: completely randomised design\n";
  out << "# seed: " << d.seed << '\n';
  out << "# treatments: " << replicates_text(d) << " (" << plan.units() << " units)\n";
  if (!units_path.empty()) out << "# unit labels: " << units_path << '\n';
  out << "# randomisation: " << generator_words << '\n';
  out << "# reproduce with: " << reproduce_line(d, units_path) << '\n';
  const bool labelled = !d.unit_labels.empty();
  out << (labelled ? "unit,treatment,label\n" : "unit,treatment\n");
  for (std::size_t u = 0; u < plan.units(); ++u) {
    out << (u + 1) << ',' << csv_cell(d.treatments[plan.treatment_of_unit[u]]);
    if (labelled) out << ',' << csv_cell(d.unit_labels[u]);
    out << '\n';
  }
}

void write_layout_json(std::ostream& out, const layout_plan& plan, const std::string& units_path) {
  const layout_design& d = plan.design;
  json_writer json(out);
  json.begin_object();
  json.key("tool").begin_object().field("name", "contrasta").field("version", version()).end_object();
  json.field("seed", d.seed);
  json.key("design").begin_object();
  json.field("kind", "completely randomised");
  json.key("treatments").begin_array();
  for (std::size_t i = 0; i < d.treatments.size(); ++i)
    json.begin_object().field("name", d.treatments[i]).field("replicates", static_cast<std::uint64_t>(d.replicates[i])).end_object();
  json.end_array();
  json.field("units", static_cast<std::uint64_t>(plan.units()));
  if (units_path.empty()) json.key("unit_labels").null();
  else json.field("unit_labels", units_path);
  json.field("randomisation", generator_words);
  json.field("reproduce", reproduce_line(d, units_path));
  json.end_object();
  json.key("plan").begin_array();
  for (std::size_t u = 0; u < plan.units(); ++u) {
    json.begin_object().field("unit", static_cast<std::uint64_t>(u + 1)).field("treatment", d.treatments[plan.treatment_of_unit[u]]);
    if (!d.unit_labels.empty()) json.field("label", d.unit_labels[u]);
    json.end_object();
  }
  json.end_array();
  json.end_object();
}

text_table layout_table(const layout_plan& plan) {
  text_table t;
  const bool labelled = !plan.design.unit_labels.empty();
  t.header = {"unit", "treatment"};
  t.right = {true, false, false};
  if (labelled) t.header.push_back("label");
  for (std::size_t u = 0; u < plan.units(); ++u) {
    std::vector<std::string> row = {std::to_string(u + 1), plan.design.treatments[plan.treatment_of_unit[u]]};
    if (labelled) row.push_back(plan.design.unit_labels[u]);
    t.rows.push_back(row);
  }
  return t;
}

void write_layout_table(std::ostream& out, const layout_plan& plan, const std::string& units_path) {
  const layout_design& d = plan.design;
  out << "contrasta " << version() << " | layout: completely randomised design\n";
  out << "  seed        " << d.seed << '\n';
  out << "  treatments  " << replicates_text(d) << " (" << plan.units() << " units, run order below)\n";
  out << "  reproduce   " << reproduce_line(d, units_path) << "\n\n";
  layout_table(plan).print(out);
  out << "\n  randomisation: " << generator_words << ".\n";
  out << "  Keep this plan with the trial records; apply treatments to units exactly as listed.\n";
}

void write_layout_markdown(std::ostream& out, const layout_plan& plan, const std::string& units_path) {
  const layout_design& d = plan.design;
  out << "# Randomisation plan\n\n";
  out << "- design: completely randomised; treatments " << markdown_escape(replicates_text(d)) << " (" << plan.units() << " units)\n";
  out << "- seed: " << d.seed << "\n";
  out << "- reproduce with: `" << reproduce_line(d, units_path) << "`\n";
  out << "- randomisation: " << generator_words << "\n\n";
  layout_table(plan).print_markdown(out);
}

}  // namespace

void add_layout_command(CLI::App& app) {
  auto s = std::make_shared<layout_settings>();
  auto* cmd = app.add_subcommand("layout", "a seeded randomisation plan for a completely randomised design");
  cmd->footer(
      "Examples:\n"
      "  contrasta layout --treatments a,b,c --replicates 4 --seed 5\n"
      "  contrasta layout --replicates \"peat=8,coir=8,bark=12\" --seed 2027 --format table\n"
      "  contrasta layout --treatments peat,coir --replicates 6 --units benches.txt --seed 11 -o plan.csv");
  cmd->add_option("--treatments", s->treatments, "the treatments (comma list)")->delimiter(',');
  cmd->add_option("--replicates", s->replicates,
                  "units per treatment: one number for all, or \"TREATMENT=COUNT,...\" for unequal replication")
      ->required();
  cmd->add_option("--units", s->units,
                  "file of unit labels, one per line in run order (blank lines and # comments skipped); "
                  "as many as the replicates add up to");
  cmd->add_option("--seed", s->seed, "seed of the randomisation (default: drawn and recorded in the output)");
  add_output_options(cmd, s->output, {"csv", "table", "json", "markdown"});
  s->output.format = "csv";
  set_action(cmd, [s] {
    const layout_plan plan = randomise_layout(make_design(*s));
    write_output(s->output, [&](std::ostream& out) {
      if (s->output.format == "json") write_layout_json(out, plan, s->units);
      else if (s->output.format == "table") write_layout_table(out, plan, s->units);
      else if (s->output.format == "markdown") write_layout_markdown(out, plan, s->units);
      else write_layout_csv(out, plan, s->units);
    });
  });
}

}  // namespace contrasta::cli
