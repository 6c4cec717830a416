// SPDX-License-Identifier: MIT
#include "core/modelfitter.h"

#include "core/alsmodel.h"
#include "core/biasmodel.h"
#include "core/globalmeanmodel.h"
#include "core/itemknnmodel.h"
#include "core/popularmodel.h"
#include "core/runassembly.h"
#include "core/trainmatrix.h"

#include <chrono>
#include <cmath>

namespace slatewise::core {

namespace {

Error usage(std::string value, std::string message, std::string expected)
{
    Error e;
    e.kind = ErrorKind::Usage;
    e.value = std::move(value);
    e.message = std::move(message);
    e.expected = std::move(expected);
    return e;
}

template <typename Model>
Result<FitResult> finish(Result<Model> model, const Dataset& data, const TrainMatrix& train,
                         const ModelSettings& settings, const Progress& progress, bool keepParameters)
{
    if (!model)
        return model.errors();
    auto run = model->toRun(data, train, settings, progress);
    if (!run)
        return run.errors();
    FitResult result;
    result.run = std::move(run.value());
    if (keepParameters)
        result.parametersJson = model->parametersJson();
    return result;
}

} // namespace

std::vector<Error> validate(const ModelSettings& s)
{
    std::vector<Error> errors;
    if (s.listLength < 1)
        errors.push_back(usage(std::to_string(s.listLength), "--list-length must be at least 1", "a whole number ≥ 1"));
    if (s.kind == ModelKind::Als) {
        if (s.rank < 1 || s.rank > 1024)
            errors.push_back(usage(std::to_string(s.rank), "--rank is out of range", "a whole number from 1 to 1024"));
        if (!(s.lambda >= 0.0) || !std::isfinite(s.lambda))
            errors.push_back(usage(std::to_string(s.lambda), "--lambda must not be negative", "a number ≥ 0"));
        if (s.iterations < 1 || s.iterations > 1000)
            errors.push_back(
                usage(std::to_string(s.iterations), "--iterations is out of range", "a whole number from 1 to 1000"));
    }
    if (s.kind == ModelKind::Bias || s.kind == ModelKind::ItemKnn) {
        if (!(s.biasUserLambda >= 0.0) || !(s.biasItemLambda >= 0.0))
            errors.push_back(usage(std::to_string(s.biasUserLambda), "bias λ must not be negative", "a number ≥ 0"));
        if (s.biasIterations < 1)
            errors.push_back(
                usage(std::to_string(s.biasIterations), "--iterations must be at least 1", "a whole number ≥ 1"));
    }
    if (s.kind == ModelKind::ItemKnn) {
        if (s.neighbours < 1)
            errors.push_back(
                usage(std::to_string(s.neighbours), "--neighbours must be at least 1", "a whole number ≥ 1"));
        if (!(s.shrinkage >= 0.0))
            errors.push_back(usage(std::to_string(s.shrinkage), "shrinkage must not be negative", "a number ≥ 0"));
    }
    return errors;
}

Result<FitResult> fitModel(const Dataset& data, const ModelSettings& settings, const Progress& progress,
                           const IterationCallback& onIteration, bool keepParameters)
{
    if (auto errors = validate(settings); !errors.empty())
        return errors;
    const auto start = std::chrono::steady_clock::now();
    std::vector<FitIteration> log;
    const IterationCallback record = [&](const FitIteration& f) {
        log.push_back(f);
        if (onIteration)
            onIteration(f);
    };
    progress(0.0, "preparing the train matrix");
    const TrainMatrix train = TrainMatrix::build(data);
    if (progress.cancelled())
        return RunAssembly::cancelled("fitting");

    Result<FitResult> result = Error{};
    switch (settings.kind) {
    case ModelKind::Popular:
        result = finish(PopularModel::fit(train, progress), data, train, settings, progress, keepParameters);
        break;
    case ModelKind::Mean:
        result = finish(Result<GlobalMeanModel>(GlobalMeanModel::fit(train)), data, train, settings, progress,
                        keepParameters);
        break;
    case ModelKind::Bias:
        result = finish(BiasModel::fit(data, train, settings, progress, record), data, train, settings, progress,
                        keepParameters);
        break;
    case ModelKind::ItemKnn:
        result = finish(ItemKnnModel::fit(data, train, settings, progress, record), data, train, settings, progress,
                        keepParameters);
        break;
    case ModelKind::Als:
        result = finish(AlsModel::fit(data, train, settings, progress, record), data, train, settings, progress,
                        keepParameters);
        break;
    }
    if (!result)
        return result;
    FitResult& r = result.value();
    r.log = std::move(log);
    r.run.info.kind = RunKind::Fitted;
    r.run.info.method = std::string(toString(settings.kind));
    r.run.info.settingsJson = settings.toJson();
    r.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    progress(1.0, "fitted");
    return result;
}

} // namespace slatewise::core
