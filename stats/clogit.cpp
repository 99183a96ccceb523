#include "stats/clogit.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstdint>
#include <limits>
#include <map>

#include <Eigen/Dense>
#include <boost/math/distributions/chi_squared.hpp>
#include <boost/math/distributions/normal.hpp>
#include <boost/math/tools/roots.hpp>

#include "stats/model_rows.h"

namespace twinprobe::stats {
namespace {

using Eigen::MatrixXd;
using Eigen::VectorXd;

constexpr int kMaxIterations = 100;
constexpr double kSeparatedSpan = 30.0;

// One informative set: its covariate rows and which are positive.
struct Set {
  MatrixXd x;  // n x p
  VectorXd offset;  // fixed part of each row's linear predictor (0 unless a coefficient is held fixed)
  std::vector<int> positive;
  int d = 0;
};

struct Value {
  double loglik = 0;
  VectorXd gradient;
  MatrixXd hessian;  // of the log likelihood (negative definite at the top)
};

// log L, its gradient and Hessian for one set by the Gail-Lubin-Rubinstein
// recursion over B(k, m), k = 0..d, updated in place for m = 1..n.
void AddSet(const Set& s, const VectorXd& beta, bool derivatives, Value& v) {
  const Eigen::Index n = s.x.rows(), p = s.x.cols();
  const VectorXd eta = s.x * beta + s.offset;
  // Shift by the largest eta so every weight is at most 1 (B stays below
  // C(n, d)); the shift cancels between numerator and denominator.
  const double shift = eta.maxCoeff();
  std::vector<double> b(static_cast<size_t>(s.d) + 1, 0.0);
  std::vector<VectorXd> db;
  std::vector<MatrixXd> d2b;
  b[0] = 1;
  if (derivatives) {
    db.assign(b.size(), VectorXd::Zero(p));
    d2b.assign(b.size(), MatrixXd::Zero(p, p));
  }
  for (Eigen::Index m = 0; m < n; ++m) {
    const double r = std::exp(eta[m] - shift);
    const VectorXd xm = s.x.row(m).transpose();
    const int top = static_cast<int>(std::min<Eigen::Index>(m + 1, s.d));
    for (int k = top; k >= 1; --k) {
      const auto ku = static_cast<size_t>(k);
      if (derivatives) {
        d2b[ku] += r * (d2b[ku - 1] + xm * db[ku - 1].transpose() + db[ku - 1] * xm.transpose() +
                        xm * xm.transpose() * b[ku - 1]);
        db[ku] += r * (db[ku - 1] + xm * b[ku - 1]);
      }
      b[ku] += r * b[ku - 1];
    }
  }
  const auto du = static_cast<size_t>(s.d);
  double numerator = 0;
  VectorXd xsum = VectorXd::Zero(p);
  for (Eigen::Index i = 0; i < n; ++i)
    if (s.positive[static_cast<size_t>(i)]) numerator += eta[i] - shift, xsum += s.x.row(i).transpose();
  v.loglik += numerator - std::log(b[du]);
  if (derivatives) {
    const VectorXd mean = db[du] / b[du];
    v.gradient += xsum - mean;
    v.hessian -= d2b[du] / b[du] - mean * mean.transpose();
  }
}

Value Evaluate(const std::vector<Set>& sets, const VectorXd& beta, bool derivatives) {
  Value v;
  const Eigen::Index p = beta.size();
  v.gradient = VectorXd::Zero(p);
  v.hessian = MatrixXd::Zero(p, p);
  for (const Set& s : sets) AddSet(s, beta, derivatives, v);
  return v;
}

std::string Num(double v) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.3g", v);
  return buf;
}

bool Build(const MatchedSetsData& d, std::vector<Set>& sets, std::string& why) {
  const size_t n = d.outcome.size();
  if (d.set.size() != n || d.x.size() != n) {
    why = "set, x and outcome must have one entry per row";
    return false;
  }
  std::map<long, std::vector<size_t>> rows;
  for (size_t i = 0; i < n; ++i) {
    if (!CheckCovariateRow(d.x[i], d.names.size(), i, why)) return false;
    if (d.outcome[i] != 0 && d.outcome[i] != 1) {
      why = "row " + std::to_string(i + 1) + " has outcome " + std::to_string(d.outcome[i]) + ", expected 0 or 1";
      return false;
    }
    rows[d.set[i]].push_back(i);
  }
  const auto p = static_cast<Eigen::Index>(d.names.size());
  for (const auto& [id, members] : rows) {
    Set s;
    for (size_t i : members) s.d += d.outcome[i];
    if (s.d == 0 || s.d == static_cast<int>(members.size())) continue;  // no information
    s.x.resize(static_cast<Eigen::Index>(members.size()), p);
    s.offset = VectorXd::Zero(static_cast<Eigen::Index>(members.size()));
    for (size_t r = 0; r < members.size(); ++r) {
      for (Eigen::Index j = 0; j < p; ++j)
        s.x(static_cast<Eigen::Index>(r), j) = d.x[members[r]][static_cast<size_t>(j)];
      s.positive.push_back(d.outcome[members[r]]);
    }
    sets.push_back(std::move(s));
  }
  if (sets.empty()) {
    why = "no set has both a positive and a negative outcome, so there is nothing to compare within sets";
    return false;
  }
  return true;
}

// A column constant within every informative set cancels from the
// conditional likelihood; name it.
std::string SingularMessage(const MatchedSetsData& d, const std::vector<Set>& sets) {
  for (Eigen::Index j = 0; j < static_cast<Eigen::Index>(d.names.size()); ++j) {
    bool varies = false;
    for (const Set& s : sets)
      if (s.x.col(j).maxCoeff() != s.x.col(j).minCoeff()) varies = true;
    if (!varies)
      return "'" + d.names[static_cast<size_t>(j)] +
             "' does not vary within any informative set, so conditioning on the set removes it (a factor that "
             "varies between vacancies enters only through its interaction with a within factor)";
  }
  return "the covariates are linearly dependent within sets (a column repeats or is a combination of others)";
}

}  // namespace

double ClogitLogLikelihood(const MatchedSetsData& data, const std::vector<double>& beta) {
  std::vector<Set> sets;
  std::string why;
  if (!Build(data, sets, why)) return 0;
  return Evaluate(sets, Eigen::Map<const VectorXd>(beta.data(), static_cast<Eigen::Index>(beta.size())), false)
      .loglik;
}

namespace {

ClogitFit Fit(const MatchedSetsData& data, std::vector<Set> sets);

}  // namespace

ClogitFit FitClogit(const MatchedSetsData& data) {
  ClogitFit f;
  std::vector<Set> sets;
  if (!Build(data, sets, f.message)) return f;
  return Fit(data, std::move(sets));
}

ClogitFit FitClogitFixed(const MatchedSetsData& data, int fixed, double value) {
  ClogitFit f;
  std::vector<Set> sets;
  if (!Build(data, sets, f.message)) return f;
  if (fixed < 0 || fixed >= static_cast<int>(data.names.size())) {
    f.message = "no coefficient " + std::to_string(fixed);
    return f;
  }
  MatchedSetsData rest = data;
  rest.names.erase(rest.names.begin() + fixed);
  for (Set& s : sets) {
    s.offset = s.x.col(fixed) * value;
    MatrixXd kept(s.x.rows(), s.x.cols() - 1);
    for (Eigen::Index j = 0, k = 0; j < s.x.cols(); ++j)
      if (j != fixed) kept.col(k++) = s.x.col(j);
    s.x = std::move(kept);
  }
  return Fit(rest, std::move(sets));
}

namespace {

ClogitFit Fit(const MatchedSetsData& data, std::vector<Set> sets) {
  ClogitFit f;
  f.sets = static_cast<int>(sets.size());
  const auto p = static_cast<Eigen::Index>(data.names.size());
  f.df = static_cast<int>(p);
  VectorXd beta = VectorXd::Zero(p);
  Value v = Evaluate(sets, beta, true);
  f.log_likelihood_null = v.loglik;
  if (p == 0) {  // the empty model: the reference point of a likelihood-ratio test
    f.status = FitStatus::kOk;
    f.log_likelihood = v.loglik;
    return f;
  }
  bool converged = false;
  VectorXd last_step = VectorXd::Zero(p);
  for (f.iterations = 1; f.iterations <= kMaxIterations; ++f.iterations) {
    Eigen::LDLT<MatrixXd> ldlt(-v.hessian);
    if (ldlt.info() != Eigen::Success || ldlt.vectorD().minCoeff() <= 1e-12 * ldlt.vectorD().cwiseAbs().maxCoeff()) {
      if (f.iterations == 1) {
        f.status = FitStatus::kSingular;
        f.message = SingularMessage(data, sets);
        return f;
      }
      break;
    }
    VectorXd step = ldlt.solve(v.gradient);
    Value next;
    for (int half = 0; half < 40; ++half) {
      next = Evaluate(sets, beta + step, true);
      if (next.loglik >= v.loglik - 1e-15 * std::abs(v.loglik)) break;
      step /= 2;
    }
    beta += step;
    last_step = step;
    const double change = std::abs(next.loglik - v.loglik) / (std::abs(next.loglik) + 0.1);
    v = next;
    double span = 0;
    for (const Set& s : sets) {
      const VectorXd eta = s.x * beta + s.offset;
      span = std::max(span, eta.maxCoeff() - eta.minCoeff());
    }
    if (span > 2 * kSeparatedSpan) break;
    // As in stats/logistic.cpp: a small change and a small step, so beta is
    // at full precision.
    if (change < 1e-14 && step.cwiseAbs().maxCoeff() < 1e-9 * (1 + beta.cwiseAbs().maxCoeff())) {
      converged = span <= kSeparatedSpan;
      break;
    }
  }
  if (!converged) {
    Eigen::Index worst = 0;
    last_step.cwiseAbs().maxCoeff(&worst);
    f.status = FitStatus::kSeparation;
    f.message = "within every informative set the outcome is ordered by the covariates (separation), so the "
                "conditional maximum-likelihood estimate does not exist; '" +
                data.names[static_cast<size_t>(worst)] + "' runs off towards infinity (" + Num(beta[worst]) +
                " after " + std::to_string(f.iterations) + " iterations)";
    return f;
  }
  f.status = FitStatus::kOk;
  f.log_likelihood = v.loglik;
  const MatrixXd cov = Eigen::LDLT<MatrixXd>(-v.hessian).solve(MatrixXd::Identity(p, p));
  boost::math::normal normal;
  for (Eigen::Index j = 0; j < p; ++j) {
    const double se = std::sqrt(cov(j, j));
    f.coefficients.push_back(beta[j]);
    f.standard_errors.push_back(se);
    f.z.push_back(beta[j] / se);
    f.p_wald.push_back(2 * boost::math::cdf(boost::math::complement(normal, std::abs(beta[j] / se))));
    std::vector<double> row;
    for (Eigen::Index k = 0; k < p; ++k) row.push_back(cov(j, k));
    f.covariance.push_back(row);
  }
  boost::math::chi_squared chi(static_cast<double>(p));
  f.lr_statistic = 2 * (f.log_likelihood - f.log_likelihood_null);
  f.lr_p = boost::math::cdf(boost::math::complement(chi, std::max(0.0, f.lr_statistic)));
  f.wald_statistic = beta.dot(Eigen::LDLT<MatrixXd>(cov).solve(beta));
  f.wald_p = boost::math::cdf(boost::math::complement(chi, std::max(0.0, f.wald_statistic)));
  return f;
}

}  // namespace

Interval ClogitProfileInterval(const MatchedSetsData& data, const ClogitFit& fit, int j, double conf) {
  const auto k = static_cast<size_t>(j);
  const double beta = fit.coefficients[k], se = fit.standard_errors[k];
  const double cutoff = std::sqrt(boost::math::quantile(boost::math::chi_squared(1.0), conf));
  // Signed root of twice the drop in log likelihood, increasing in b; a
  // fixed-value fit that separates counts as beyond the cut-off.
  auto root = [&](double b) {
    ClogitFit g = FitClogitFixed(data, j, b);
    const double drop = g.ok() ? std::max(0.0, 2 * (fit.log_likelihood - g.log_likelihood))
                               : std::numeric_limits<double>::infinity();
    return (b < beta ? -1.0 : 1.0) * std::sqrt(drop);
  };
  auto solve = [&](int side) {
    double inner = beta, outer = beta;
    for (double t = 1;; t *= 1.5) {
      if (t > 40) return side * std::numeric_limits<double>::infinity();
      outer = beta + side * t * se;
      if (side * root(outer) >= cutoff) break;
      inner = outer;
    }
    auto f = [&](double b) { return root(b) - side * cutoff; };
    std::uintmax_t iters = 200;
    auto tol = [](double a, double b) { return std::abs(a - b) <= 1e-11 * std::max(1.0, std::abs(a)); };
    const double lo = std::min(inner, outer), hi = std::max(inner, outer);
    auto r = boost::math::tools::toms748_solve(f, lo, hi, f(lo), f(hi), tol, iters);
    return (r.first + r.second) / 2;
  };
  return {solve(-1), solve(+1)};
}

LikelihoodRatio CompareNested(const ClogitFit& full, const ClogitFit& reduced) {
  LikelihoodRatio lr;
  lr.df = full.df - reduced.df;
  lr.statistic = 2 * (full.log_likelihood - reduced.log_likelihood);
  if (lr.df > 0)
    lr.p = boost::math::cdf(
        boost::math::complement(boost::math::chi_squared(lr.df), std::max(0.0, lr.statistic)));
  return lr;
}

Interval ClogitWaldInterval(const ClogitFit& fit, int j, double conf) {
  const double z = boost::math::quantile(boost::math::normal(), 1 - (1 - conf) / 2);
  const auto k = static_cast<size_t>(j);
  return {fit.coefficients[k] - z * fit.standard_errors[k], fit.coefficients[k] + z * fit.standard_errors[k]};
}

}  // namespace twinprobe::stats
