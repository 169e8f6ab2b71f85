#pragma once

#include "analysis_request.hpp"
#include "intake.hpp"
#include "validation.hpp"

#include <QMetaType>

#include <memory>

namespace plumbline {

// The immutable result the window shows: the request that produced it, the intake audit and
// fingerprints, and the validation. Shared between views; never changed after a run.
struct AnalysisSnapshot {
    AnalysisRequest request;
    IntakeAudit audit;
    std::vector<InputFingerprint> inputs;
    ValidationResult validation;
};

using SnapshotPointer = std::shared_ptr<const AnalysisSnapshot>;

} // namespace plumbline

Q_DECLARE_METATYPE(plumbline::SnapshotPointer)
