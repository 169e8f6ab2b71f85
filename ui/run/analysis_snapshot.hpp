#pragma once

#include "run/analysis_request.hpp"
#include "intake/intake.hpp"
#include "analyses/model_updating.hpp"
#include "analyses/validation.hpp"
#include "analyses/capacity_lookup.hpp"

#include <QMetaType>

#include <memory>

namespace plumbline {

// The immutable result the window shows: the request that produced it, the intake audit and
// fingerprints, and the validation. Shared between views; never changed after a run.
struct AnalysisSnapshot {
    AnalysisRequest request;
    std::shared_ptr<const Cohort> cohort; // the rows analysed, for views that run a core step on demand (updating)
    IntakeAudit audit;
    std::vector<InputFingerprint> inputs;
    ValidationResult validation;
    std::vector<ModelUpdate> updates; // models updated on these data and added to the validation
    CapacityLookup capacity;          // flagged patients per model along the slider's grid, and the date span
};

using SnapshotPointer = std::shared_ptr<const AnalysisSnapshot>;

} // namespace plumbline

Q_DECLARE_METATYPE(plumbline::SnapshotPointer)
