#include "stats/logistic.h"

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <limits>

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
constexpr double kDevianceTolerance = 1e-14;
// |x' beta| above this is a fitted probability within 1e-13 of 0 or 1.
constexpr double kSeparatedEta = 30.0;

// s log(s / f) with 0 log 0 = 0.
double XLogXOverY(double s, double f) { return s > 0 ? s * std::log(s / f) : 0.0; }

double Deviance(const VectorXd& s, const VectorXd& m, const VectorXd& mu) {
  double d = 0;
  for (Eigen::Index i = 0; i < s.size(); ++i)
    d += XLogXOverY(s[i], m[i] * mu[i]) + XLogXOverY(m[i] - s[i], m[i] * (1 - mu[i]));
  return 2 * d;
}

// log(1 + exp(-|eta|)) form keeps mu off exactly 0 and 1 for moderate eta.
double Expit(double eta) { return eta >= 0 ? 1 / (1 + std::exp(-eta)) : std::exp(eta) / (1 + std::exp(eta)); }

struct Core {
  FitStatus status = FitStatus::kOk;
  std::string message;
  VectorXd beta;
  MatrixXd covariance;
  VectorXd mu;
  double deviance = 0;
  int iterations = 0;
};

std::string Num(double v) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.3g", v);
  return buf;
}

// Newton / IRLS on X with a fixed offset. `names` names the columns of X for
// the separation message.
Core Newton(const MatrixXd& x, const VectorXd& s, const VectorXd& m, const VectorXd& offset,
            const std::vector<std::string>& names) {
  Core c;
  const Eigen::Index p = x.cols();
  c.beta = VectorXd::Zero(p);
  auto mu_of = [&](const VectorXd& beta, VectorXd& eta) {
    eta = x * beta + offset;
    VectorXd mu(eta.size());
    for (Eigen::Index i = 0; i < eta.size(); ++i) mu[i] = Expit(eta[i]);
    return mu;
  };
  VectorXd eta;
  c.mu = mu_of(c.beta, eta);
  c.deviance = Deviance(s, m, c.mu);
  bool converged = false;
  VectorXd last_step = VectorXd::Zero(p);
  for (c.iterations = 1; c.iterations <= kMaxIterations; ++c.iterations) {
    VectorXd w = (m.array() * c.mu.array() * (1 - c.mu.array())).matrix();
    MatrixXd info = x.transpose() * w.asDiagonal() * x;
    VectorXd score = x.transpose() * (s - m.cwiseProduct(c.mu));
    Eigen::LDLT<MatrixXd> ldlt(info);
    if (p > 0 && (ldlt.info() != Eigen::Success || ldlt.vectorD().minCoeff() <= 1e-12 * ldlt.vectorD().maxCoeff())) {
      // A singular information matrix at finite beta: either the columns are
      // linearly dependent (at the start, beta = 0) or the fit has already
      // run off towards separation.
      if (c.iterations == 1) {
        c.status = FitStatus::kSingular;
        c.message = "the covariates are linearly dependent (a column repeats or is a combination of others)";
        return c;
      }
      break;
    }
    VectorXd step = p > 0 ? VectorXd(ldlt.solve(score)) : VectorXd();
    double dev_new = 0;
    VectorXd beta_new, mu_new;
    for (int half = 0; half < 40; ++half) {
      beta_new = c.beta + step;
      mu_new = mu_of(beta_new, eta);
      dev_new = Deviance(s, m, mu_new);
      if (dev_new <= c.deviance * (1 + 1e-15) + 1e-300) break;
      step /= 2;
    }
    last_step = beta_new - c.beta;
    const double change = std::abs(c.deviance - dev_new) / (std::abs(dev_new) + 0.1);
    const double step_size = p > 0 ? last_step.cwiseAbs().maxCoeff() : 0.0;
    const double scale = 1 + (p > 0 ? beta_new.cwiseAbs().maxCoeff() : 0.0);
    c.beta = beta_new;
    c.mu = mu_new;
    c.deviance = dev_new;
    if (eta.size() > 0 && eta.cwiseAbs().maxCoeff() > 2 * kSeparatedEta) break;  // well on the way to infinity
    // A small deviance change alone leaves beta good to about the square
    // root of it; Newton converges quadratically, so one more small step
    // brings it to full precision.
    if (change < kDevianceTolerance && step_size < 1e-9 * scale) {
      converged = true;
      break;
    }
  }
  mu_of(c.beta, eta);
  if (!converged || (eta.size() > 0 && eta.cwiseAbs().maxCoeff() > kSeparatedEta)) {
    // Name the covariate whose step moves the linear predictor most: the
    // step times the column's spread (an intercept's spread is 0, so it is
    // named only when nothing else moves).
    Eigen::Index worst = 0;
    if (p > 0) {
      VectorXd moved(p);
      for (Eigen::Index j = 0; j < p; ++j) {
        const VectorXd centred = x.col(j).array() - x.col(j).mean();
        moved[j] = std::abs(last_step[j]) * (centred.norm() + 1e-12);
      }
      moved.maxCoeff(&worst);
    }
    c.status = FitStatus::kSeparation;
    c.message = "the outcome is perfectly predicted by the covariates (separation), so the maximum-likelihood "
                "estimate does not exist";
    if (p > 0) c.message += "; '" + names[static_cast<size_t>(worst)] + "' runs off towards infinity (" +
                            Num(c.beta[worst]) + " after " + std::to_string(c.iterations) + " iterations)";
    return c;
  }
  VectorXd w = (m.array() * c.mu.array() * (1 - c.mu.array())).matrix();
  MatrixXd info = x.transpose() * w.asDiagonal() * x;
  Eigen::LDLT<MatrixXd> ldlt(info);
  c.covariance = ldlt.solve(MatrixXd::Identity(p, p));
  return c;
}

bool Validate(const LogisticData& d, std::string& why) {
  const size_t n = d.successes.size();
  if (d.trials.size() != n || d.x.size() != n) {
    why = "x, successes and trials must have one entry per row";
    return false;
  }
  if (n == 0) {
    why = "no rows to fit";
    return false;
  }
  for (size_t i = 0; i < n; ++i) {
    if (!CheckCovariateRow(d.x[i], d.names.size(), i, why)) return false;
    if (!(d.trials[i] > 0) || !(d.successes[i] >= 0 && d.successes[i] <= d.trials[i])) {
      why = "row " + std::to_string(i + 1) + " needs trials > 0 and 0 <= successes <= trials";
      return false;
    }
  }
  return true;
}

void Unpack(const LogisticData& d, MatrixXd& x, VectorXd& s, VectorXd& m) {
  const auto n = static_cast<Eigen::Index>(d.successes.size());
  const auto p = static_cast<Eigen::Index>(d.names.size());
  x.resize(n, p);
  s.resize(n);
  m.resize(n);
  for (Eigen::Index i = 0; i < n; ++i) {
    for (Eigen::Index j = 0; j < p; ++j) x(i, j) = d.x[static_cast<size_t>(i)][static_cast<size_t>(j)];
    s[i] = d.successes[static_cast<size_t>(i)];
    m[i] = d.trials[static_cast<size_t>(i)];
  }
}

LogisticFit Finish(const Core& c, const VectorXd& s, const VectorXd& m, int rows, int cols, bool intercept) {
  LogisticFit f;
  f.status = c.status;
  f.message = c.message;
  f.iterations = c.iterations;
  f.deviance = c.deviance;
  f.df_residual = rows - cols;
  f.df_null = rows - (intercept ? 1 : 0);
  const double pooled = s.sum() / m.sum();
  VectorXd mu0 = VectorXd::Constant(s.size(), intercept ? pooled : 0.5);
  f.null_deviance = Deviance(s, m, mu0);
  if (c.status != FitStatus::kOk) return f;
  double ll = 0;
  for (Eigen::Index i = 0; i < s.size(); ++i) {
    ll += std::lgamma(m[i] + 1) - std::lgamma(s[i] + 1) - std::lgamma(m[i] - s[i] + 1);
    if (s[i] > 0) ll += s[i] * std::log(c.mu[i]);
    if (m[i] - s[i] > 0) ll += (m[i] - s[i]) * std::log1p(-c.mu[i]);
  }
  f.log_likelihood = ll;
  boost::math::normal normal;
  for (Eigen::Index j = 0; j < c.beta.size(); ++j) {
    f.coefficients.push_back(c.beta[j]);
    const double se = std::sqrt(c.covariance(j, j));
    f.standard_errors.push_back(se);
    f.z.push_back(c.beta[j] / se);
    f.p_wald.push_back(2 * boost::math::cdf(boost::math::complement(normal, std::abs(c.beta[j] / se))));
    std::vector<double> row;
    for (Eigen::Index k = 0; k < c.beta.size(); ++k) row.push_back(c.covariance(j, k));
    f.covariance.push_back(row);
  }
  return f;
}

bool HasIntercept(const MatrixXd& x) {
  for (Eigen::Index j = 0; j < x.cols(); ++j)
    if ((x.col(j).array() == 1.0).all()) return true;
  return false;
}

}  // namespace

int CoefficientIndex(const LogisticData& data, const std::string& name) {
  auto it = std::find(data.names.begin(), data.names.end(), name);
  return it == data.names.end() ? -1 : static_cast<int>(it - data.names.begin());
}

LogisticFit FitLogistic(const LogisticData& data) {
  LogisticFit bad;
  if (!Validate(data, bad.message)) return bad;
  MatrixXd x;
  VectorXd s, m;
  Unpack(data, x, s, m);
  Core c = Newton(x, s, m, VectorXd::Zero(s.size()), data.names);
  return Finish(c, s, m, static_cast<int>(x.rows()), static_cast<int>(x.cols()), HasIntercept(x));
}

LogisticFit FitLogisticFixed(const LogisticData& data, int fixed, double value) {
  LogisticFit bad;
  if (!Validate(data, bad.message)) return bad;
  if (fixed < 0 || fixed >= static_cast<int>(data.names.size())) {
    bad.message = "no coefficient " + std::to_string(fixed);
    return bad;
  }
  MatrixXd x;
  VectorXd s, m;
  Unpack(data, x, s, m);
  const VectorXd offset = x.col(fixed) * value;
  MatrixXd rest(x.rows(), x.cols() - 1);
  std::vector<std::string> names;
  for (Eigen::Index j = 0, k = 0; j < x.cols(); ++j)
    if (j != fixed) rest.col(k++) = x.col(j), names.push_back(data.names[static_cast<size_t>(j)]);
  Core c = Newton(rest, s, m, offset, names);
  return Finish(c, s, m, static_cast<int>(x.rows()), static_cast<int>(rest.cols()), HasIntercept(rest));
}

LikelihoodRatio CompareNested(const LogisticFit& full, const LogisticFit& reduced) {
  LikelihoodRatio lr;
  lr.df = reduced.df_residual - full.df_residual;
  lr.statistic = reduced.deviance - full.deviance;
  if (lr.df > 0)
    lr.p = boost::math::cdf(boost::math::complement(boost::math::chi_squared(lr.df), std::max(0.0, lr.statistic)));
  return lr;
}

Interval WaldInterval(const LogisticFit& fit, int j, double conf) {
  const double z = boost::math::quantile(boost::math::normal(), 1 - (1 - conf) / 2);
  const auto k = static_cast<size_t>(j);
  return {fit.coefficients[k] - z * fit.standard_errors[k], fit.coefficients[k] + z * fit.standard_errors[k]};
}

Interval ProfileInterval(const LogisticData& data, const LogisticFit& fit, int j, double conf) {
  const auto k = static_cast<size_t>(j);
  const double beta = fit.coefficients[k], se = fit.standard_errors[k];
  const double cutoff = std::sqrt(boost::math::quantile(boost::math::chi_squared(1.0), conf));
  // Signed root of the profile deviance, increasing in b. A fixed-value fit
  // that cannot be evaluated (it separates) counts as beyond the cut-off.
  auto root = [&](double b) {
    LogisticFit g = FitLogisticFixed(data, j, b);
    const double excess = g.ok() ? std::max(0.0, g.deviance - fit.deviance) : std::numeric_limits<double>::infinity();
    return (b < beta ? -1.0 : 1.0) * std::sqrt(excess);
  };
  auto solve = [&](int side) {
    // Walk out in steps of one SE until the signed root passes the cut-off.
    double inner = beta, outer = beta;
    for (double t = 1; t <= 40; t *= 1.5) {
      outer = beta + side * t * se;
      const double r = side * root(outer);
      if (r >= cutoff) break;
      inner = outer;
      if (t * 1.5 > 40) return side * std::numeric_limits<double>::infinity();
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

}  // namespace twinprobe::stats
