// NIST StRD one-way ANOVA: all 11 datasets against their certified values.
// Source: NIST Statistical Reference Datasets, Analysis of Variance (SiRstv, SmLs01-09, AtmWtAg);
// public-domain files copied from Debian's python3-scipy (scipy/stats/tests/data/nist_anova).
// Bar (quality.md): log relative error (LRE) >= 13 for F, the between and within sums of squares,
// R^2 and the residual SD. The data go through the real reader, so the exact decimal centring
// is what is tested: a plain double parser caps SmLs07-09 near LRE 4-5.
#include <doctest/doctest.h>

#include <cmath>
#include <fstream>
#include <sstream>
#include <string>

#include "contrasta/anova.hpp"
#include "contrasta/prepared.hpp"
#include "contrasta/read.hpp"

namespace {

struct certified {
  double ss_between = 0, ss_within = 0, f = 0, r_squared = 0, residual_sd = 0;
  std::string csv;  // the data rewritten as a two-column CSV, numbers exactly as in the file
};

certified load(const std::string& name) {
  std::ifstream in(std::string(CONTRASTA_TEST_DATA) + "/" + name + ".dat");
  REQUIRE(in.good());
  certified c;
  std::string line;
  bool data = false;
  c.csv = "treatment,response\n";
  while (std::getline(in, line)) {
    std::istringstream s(line);
    std::string a, b;
    if (data) {
      std::string treatment, response;
      if (s >> treatment >> response) c.csv += treatment + "," + response + "\n";
      continue;
    }
    if (line.rfind("Between ", 0) == 0) {
      std::string w1, w2, df, ss, ms, f;
      s >> w1 >> w2 >> df >> ss >> ms >> f;
      c.ss_between = std::stod(ss);
      c.f = std::stod(f);
    } else if (line.rfind("Within ", 0) == 0) {
      std::string w1, w2, df, ss;
      s >> w1 >> w2 >> df >> ss;
      c.ss_within = std::stod(ss);
    } else if (line.find("Certified R-Squared") != std::string::npos) {
      c.r_squared = std::stod(line.substr(line.find("Squared") + 7));
    } else if (line.find("Standard Deviation") != std::string::npos) {
      c.residual_sd = std::stod(line.substr(line.find("Deviation") + 9));
    } else if (line.rfind("Data:  ", 0) == 0 && line.find("Factor") == std::string::npos) {
      data = true;
    }
  }
  return c;
}

double lre(double got, double want) {
  if (got == want) return 15.9;  // exact to the last digit of double
  return -std::log10(std::abs(got - want) / std::abs(want));
}

}  // namespace

TEST_CASE("NIST StRD one-way ANOVA: LRE >= 13 on every certified value") {
  const char* names[] = {"SiRstv", "SmLs01", "SmLs02", "SmLs03", "SmLs04", "SmLs05",
                         "SmLs06", "SmLs07", "SmLs08", "SmLs09", "AtmWtAg"};
  double worst = 99;
  for (const char* name : names) {
    CAPTURE(std::string(name));
    certified c = load(name);
    std::istringstream in(c.csv);
    contrasta::read_request request;
    auto datasets = contrasta::read_datasets(in, name, request);
    REQUIRE(datasets.size() == 1);
    auto p = contrasta::prepare(std::move(datasets.front()));
    const auto& a = p.anova;
    double values[] = {lre(a.f, c.f), lre(a.ss_between, c.ss_between), lre(a.ss_within, c.ss_within),
                       lre(a.r_squared, c.r_squared), lre(a.residual_sd, c.residual_sd)};
    for (double v : values) {
      CHECK(v >= 13.0);
      worst = std::min(worst, v);
    }
    MESSAGE(std::string(name) << ": LRE F " << values[0] << ", SSB " << values[1] << ", SSW " << values[2] << ", R2 " << values[3]
                 << ", residual SD " << values[4]);
  }
  MESSAGE("smallest LRE over all NIST ANOVA datasets: " << worst);
}
