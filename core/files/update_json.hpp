#pragma once

#include "analyses/model_updating.hpp"

#include <nlohmann/json.hpp>

namespace plumbline {

// An `updates` entry of the result file: method asked, choice made, formula, closed-test
// p-values, apparent and optimism-corrected performance, cautions.
nlohmann::ordered_json updateJson(const ModelUpdate& update);

} // namespace plumbline
