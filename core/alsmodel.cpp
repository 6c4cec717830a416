// SPDX-License-Identifier: MIT
#include "core/alsmodel.h"

#include "core/runassembly.h"
#include "core/seededrandom.h"
#include "core/topnlist.h"

#include <Eigen/Cholesky>
#include <algorithm>
#include <chrono>
#include <cmath>
#include <functional>
#include <limits>
#include <nlohmann/json.hpp>

namespace slatewise::core {

namespace {

/// Solves every row of one side given the other side's factors and biases.
bool solveSide(std::uint32_t count, const std::vector<std::uint32_t>& offsets, const std::vector<std::uint32_t>& others,
    const std::vector<float>& ratings, const AlsModel::Matrix& otherFactors, const Eigen::VectorXd& otherBias,
    double mu, double lambda, AlsModel::Matrix& ownFactors, Eigen::VectorXd& ownBias, const Progress& progress,
    std::string_view stage, double from, double to)
{
    const Eigen::Index rank = otherFactors.cols();
    const Eigen::Index k1 = rank + 1;
    struct Scratch {
        Eigen::Matrix<double, Eigen::Dynamic, Eigen::Dynamic, Eigen::RowMajor> x;
        Eigen::VectorXd t;
        Eigen::MatrixXd a;
        Eigen::VectorXd b;
    };
    std::vector<Scratch> scratch(workerCount());
    return RunAssembly::forEach(count, progress, stage, from, to, [&](std::size_t row, unsigned w) {
        const std::uint32_t begin = offsets[row], end = offsets[row + 1];
        const Eigen::Index n = end - begin;
        if (n == 0) {
            ownFactors.row(static_cast<Eigen::Index>(row)).setZero();
            ownBias[static_cast<Eigen::Index>(row)] = 0.0;
            return;
        }
        Scratch& s = scratch[w];
        if (s.x.rows() < n) {
            s.x.resize(std::max<Eigen::Index>(n, 2 * s.x.rows()), k1);
            s.t.resize(s.x.rows());
        }
        for (Eigen::Index k = 0; k < n; ++k) {
            const std::uint32_t other = others[begin + k];
            s.x.row(k).head(rank) = otherFactors.row(other);
            s.x(k, rank) = 1.0;
            s.t[k] = ratings[begin + k] - mu - otherBias[other];
        }
        const auto x = s.x.topRows(n);
        s.a.setZero(k1, k1);
        s.a.selfadjointView<Eigen::Lower>().rankUpdate(x.transpose());
        s.a.diagonal().array() += lambda * static_cast<double>(n);
        s.b.noalias() = x.transpose() * s.t.head(n);
        const Eigen::LLT<Eigen::MatrixXd, Eigen::Lower> llt(s.a);
        const Eigen::VectorXd solution = llt.solve(s.b);
        ownFactors.row(static_cast<Eigen::Index>(row)) = solution.head(rank).transpose();
        ownBias[static_cast<Eigen::Index>(row)] = solution[rank];
    });
}

/// Offers `top` every score of row[0..count) that can be among its N best, in item order,
/// so the result equals offering all of them. The N-th largest of the 64-score block maxima
/// is at most the N-th largest score (the N largest maxima are N distinct scores), so blocks
/// whose maximum is below it, nearly all of a 40,000-item row, are skipped after one
/// vectorized pass.
void offerBest(const float* row, std::uint32_t count, TopNList& top, std::vector<float>& scratch)
{
    constexpr std::uint32_t kWidth = 64;
    const std::size_t n = top.capacity();
    const std::uint32_t blocks = count / kWidth;
    if (n == 0)
        return;
    if (blocks <= n) {
        for (std::uint32_t i = 0; i < count; ++i)
            top.offer(i, row[i]);
        return;
    }
    scratch.resize(2 * static_cast<std::size_t>(blocks));
    float* maxima = scratch.data();
    float* order = maxima + blocks;
    for (std::uint32_t b = 0; b < blocks; ++b)
        maxima[b] = Eigen::Map<const Eigen::ArrayXf>(row + static_cast<std::size_t>(b) * kWidth, kWidth).maxCoeff();
    std::copy(maxima, maxima + blocks, order);
    std::nth_element(order, order + (n - 1), order + blocks, std::greater<float>());
    const float bound = order[n - 1];
    for (std::uint32_t b = 0; b < blocks; ++b) {
        if (maxima[b] < bound)
            continue;
        for (std::uint32_t i = b * kWidth; i < (b + 1) * kWidth; ++i)
            if (row[i] >= bound)
                top.offer(i, row[i]);
    }
    for (std::uint32_t i = blocks * kWidth; i < count; ++i)
        if (row[i] >= bound)
            top.offer(i, row[i]);
}

} // namespace

AlsModel AlsModel::initial(const TrainMatrix& train, const ModelSettings& settings)
{
    AlsModel m;
    m.globalMean = train.globalMean;
    m.rank = std::max(1, settings.rank);
    m.lambda = settings.lambda;
    m.userFactors.resize(train.users, m.rank);
    for (std::uint32_t u = 0; u < train.users; ++u) {
        SeededRandom rng(settings.seed, u);
        for (Eigen::Index f = 0; f < m.rank; ++f)
            m.userFactors(u, f) = settings.initScale * rng.normal();
    }
    m.userBias = Eigen::VectorXd::Zero(train.users);
    m.itemFactors = Matrix::Zero(train.items, m.rank);
    m.itemBias = Eigen::VectorXd::Zero(train.items);
    return m;
}

bool AlsModel::itemStep(const TrainMatrix& train, const Progress& progress, double from, double to)
{
    return solveSide(train.items, train.itemOffsets, train.itemUsers, train.itemRatings, userFactors, userBias,
        globalMean, lambda, itemFactors, itemBias, progress, "als: item step", from, to);
}

bool AlsModel::userStep(const TrainMatrix& train, const Progress& progress, double from, double to)
{
    return solveSide(train.users, train.userOffsets, train.userItems, train.userRatings, itemFactors, itemBias,
        globalMean, lambda, userFactors, userBias, progress, "als: user step", from, to);
}

double AlsModel::trainRmse(const Dataset& data, const TrainMatrix& train, bool clip) const
{
    std::vector<double> sums(workerCount(), 0.0);
    parallelFor(train.users, [&](std::size_t begin, std::size_t end, unsigned w) {
        double s = 0.0;
        for (std::size_t u = begin; u < end; ++u) {
            const auto items = train.itemsOf(static_cast<std::uint32_t>(u));
            const auto ratings = train.ratingsOf(static_cast<std::uint32_t>(u));
            for (std::size_t k = 0; k < items.size(); ++k) {
                const double e
                    = RunAssembly::clamp(data, clip, predict(static_cast<std::uint32_t>(u), items[k])) - ratings[k];
                s += e * e;
            }
        }
        sums[w] = s;
    });
    double total = 0.0;
    for (double s : sums)
        total += s;
    return train.nnz() ? std::sqrt(total / static_cast<double>(train.nnz())) : std::nan("");
}

Result<AlsModel> AlsModel::fit(const Dataset& data, const TrainMatrix& train, const ModelSettings& settings,
    const Progress& progress, const IterationCallback& onIteration)
{
    AlsModel m = initial(train, settings);
    const int iterations = std::max(1, settings.iterations);
    // The iterations take the first 80% of the progress bar, scoring and lists the rest.
    const double span = 0.8 / iterations;
    for (int it = 0; it < iterations; ++it) {
        const auto start = std::chrono::steady_clock::now();
        const double at = span * it;
        if (!m.itemStep(train, progress, at, at + span / 2) || !m.userStep(train, progress, at + span / 2, at + span))
            return RunAssembly::cancelled("fitting ALS");
        FitIteration f;
        f.iteration = it + 1;
        f.iterations = iterations;
        f.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
        f.trainRmse = m.trainRmse(data, train, settings.clipToScale);
        f.withheldRmse = RunAssembly::withheldRmse(
            data, settings.clipToScale, [&m](std::uint32_t u, std::uint32_t i) { return m.predict(u, i); });
        if (onIteration)
            onIteration(f);
    }
    return m;
}

Result<RunData> AlsModel::toRun(
    const Dataset& data, const TrainMatrix& train, const ModelSettings& settings, const Progress& progress) const
{
    auto scores = RunAssembly::scoreWithheld(data, settings.clipToScale, progress, 0.8, 0.82,
        [this](std::uint32_t u, std::uint32_t i) { return predict(u, i); });
    if (progress.cancelled())
        return RunAssembly::cancelled("fitting ALS");

    // Augmented float factors: [p_u, b_u, 1] · [q_i, 1, b_i] = p_u·q_i + b_u + b_i.
    using FloatRows = Eigen::Matrix<float, Eigen::Dynamic, Eigen::Dynamic, Eigen::RowMajor>;
    const Eigen::Index k2 = rank + 2;
    FloatRows users(train.users, k2);
    users.leftCols(rank) = userFactors.cast<float>();
    users.col(rank) = userBias.cast<float>();
    users.col(rank + 1).setOnes();
    Eigen::MatrixXf itemsT(k2, train.items); // column i = item i
    itemsT.topRows(rank) = itemFactors.transpose().cast<float>();
    itemsT.row(rank).setOnes();
    itemsT.row(rank + 1) = itemBias.transpose().cast<float>();

    // Users in blocks of 64: one float product gives each user's scores for the whole
    // catalog (10 MiB per worker, within the shared cache), then each row is reduced to its N best.
    constexpr std::uint32_t kBlock = 64;
    const std::uint32_t blocks = (train.users + kBlock - 1) / kBlock;
    const std::size_t n = static_cast<std::size_t>(std::max(0, settings.listLength));
    std::vector<FloatRows> buffers(workerCount());
    std::vector<std::vector<float>> scratch(workerCount());
    std::vector<std::vector<ListEntry>> lists(data.userCount());
    const float mu = static_cast<float>(globalMean);
    const bool ok
        = RunAssembly::forEach(blocks, progress, "als: top-N lists", 0.82, 1.0, [&](std::size_t b, unsigned w) {
              const std::uint32_t first = static_cast<std::uint32_t>(b) * kBlock;
              const std::uint32_t count = std::min(kBlock, train.users - first);
              FloatRows& s = buffers[w];
              s.resize(count, train.items);
              s.noalias() = users.middleRows(first, count) * itemsT;
              TopNList top(n);
              for (std::uint32_t r = 0; r < count; ++r) {
                  const std::uint32_t u = first + r;
                  float* row = s.row(r).data();
                  for (std::uint32_t i : train.itemsOf(u))
                      row[i] = -std::numeric_limits<float>::infinity();
                  offerBest(row, train.items, top, scratch[w]);
                  auto list = top.take();
                  // Drop seen items that only made it in because fewer unseen items exist than N.
                  std::erase_if(list, [](const ListEntry& e) { return std::isinf(e.score); });
                  for (auto& e : list)
                      e.score = static_cast<float>(RunAssembly::clamp(data, settings.clipToScale, e.score + mu));
                  lists[u] = std::move(list);
              }
          });
    if (!ok)
        return RunAssembly::cancelled("fitting ALS");
    return RunAssembly::finish(data, std::move(scores), std::move(lists));
}

std::string AlsModel::parametersJson() const
{
    nlohmann::ordered_json j;
    j["global_mean"] = globalMean;
    j["rank"] = rank;
    j["lambda"] = lambda;
    auto rows = [](const Matrix& m) {
        std::vector<std::vector<double>> out(static_cast<std::size_t>(m.rows()));
        for (Eigen::Index r = 0; r < m.rows(); ++r)
            out[static_cast<std::size_t>(r)].assign(m.row(r).data(), m.row(r).data() + m.cols());
        return out;
    };
    j["user_factors"] = rows(userFactors);
    j["user_bias"] = std::vector<double>(userBias.data(), userBias.data() + userBias.size());
    j["item_factors"] = rows(itemFactors);
    j["item_bias"] = std::vector<double>(itemBias.data(), itemBias.data() + itemBias.size());
    return j.dump();
}

} // namespace slatewise::core
