#include "reporting/small_cell_protection.hpp"

#include <Eigen/Dense>

#include <algorithm>
#include <limits>
#include <optional>

namespace plumbline {

SmallCellProtection::Cell SmallCellProtection::add(std::size_t value, Kind kind)
{
    m_cells.push_back({value, kind, false, false, false});
    return m_cells.size() - 1;
}

SmallCellProtection::Cell SmallCellProtection::printed(std::size_t value)
{
    return add(value, Kind::Printed);
}

SmallCellProtection::Cell SmallCellProtection::unprinted(std::size_t value)
{
    return add(value, Kind::Unprinted);
}

SmallCellProtection::Cell SmallCellProtection::published(std::size_t value)
{
    return add(value, Kind::Published);
}

void SmallCellProtection::sumOf(std::span<const Cell> parts, Cell total)
{
    m_relations.push_back({{parts.begin(), parts.end()}, total});
}

bool SmallCellProtection::hidden(Cell cell) const
{
    return m_cells[cell].kind == Kind::Unprinted || m_cells[cell].suppressed;
}

bool SmallCellProtection::mustStayHidden(Cell cell) const
{
    // A complementary cell is protected too: were it derivable, the primary cell it shields
    // would be as well.
    return !m_cells[cell].givenUp && (m_cells[cell].primary || m_cells[cell].suppressed);
}

// The hidden cells that the printed ones determine: x_j is determined exactly when no solution of
// the relations' homogeneous system (restricted to the hidden cells) moves it, i.e. when row j of
// a kernel basis is zero.
std::vector<SmallCellProtection::Cell> SmallCellProtection::derivableHidden() const
{
    std::vector<Cell> unknown;
    std::vector<long> column(m_cells.size(), -1);
    for (Cell c = 0; c < m_cells.size(); ++c)
        if (hidden(c)) {
            column[c] = long(unknown.size());
            unknown.push_back(c);
        }
    std::vector<const Relation*> touching;
    for (const auto& r : m_relations) {
        bool any = column[r.total] >= 0;
        for (Cell p : r.parts)
            any = any || column[p] >= 0;
        if (any)
            touching.push_back(&r);
    }
    if (unknown.empty())
        return {};
    if (touching.empty())
        return {};
    Eigen::MatrixXd a = Eigen::MatrixXd::Zero(Eigen::Index(touching.size()), Eigen::Index(unknown.size()));
    for (std::size_t i = 0; i < touching.size(); ++i) {
        for (Cell p : touching[i]->parts)
            if (column[p] >= 0)
                a(Eigen::Index(i), column[p]) += 1.0;
        if (column[touching[i]->total] >= 0)
            a(Eigen::Index(i), column[touching[i]->total]) -= 1.0;
    }
    const Eigen::FullPivLU<Eigen::MatrixXd> lu(a);
    const Eigen::MatrixXd kernel = lu.kernel();
    std::vector<Cell> out;
    for (std::size_t j = 0; j < unknown.size(); ++j)
        if (kernel.row(Eigen::Index(j)).cwiseAbs().maxCoeff() < 1e-9)
            out.push_back(unknown[j]);
    return out;
}

// Suppresses the smallest printed cell (above zero where there is one) of a relation that holds
// `cell`; where those relations have none left, of a relation one hidden cell further on (the
// cell may be determined through a chain). False when no relation reachable through hidden cells
// has a printed cell left that is not published.
bool SmallCellProtection::complementFor(Cell cell)
{
    std::vector<bool> reached(m_cells.size(), false);
    std::vector<Cell> frontier{cell};
    reached[cell] = true;
    while (!frontier.empty()) {
        std::optional<Cell> best;
        auto better = [&](Cell c) {
            if (!best)
                return true;
            const std::size_t v = m_cells[c].value, b = m_cells[*best].value;
            if ((v == 0) != (b == 0))
                return v != 0;
            return v < b;
        };
        std::vector<Cell> next, candidates;
        for (const auto& r : m_relations) {
            const bool holds = std::any_of(frontier.begin(), frontier.end(), [&](Cell f) {
                return r.total == f || std::find(r.parts.begin(), r.parts.end(), f) != r.parts.end();
            });
            if (!holds)
                continue;
            auto consider = [&](Cell c) {
                if (reached[c])
                    return;
                if (m_cells[c].kind == Kind::Printed && !m_cells[c].suppressed) {
                    reached[c] = true;
                    candidates.push_back(c);
                    if (better(c))
                        best = c;
                } else if (hidden(c)) {
                    reached[c] = true;
                    next.push_back(c);
                }
            };
            consider(r.total);
            for (Cell p : r.parts)
                consider(p);
        }
        if (best) {
            // Of this level's candidates, the one after which the fewest protected cells can
            // still be worked out (a one-step look-ahead keeps the pattern small); ties go to
            // the smallest count.
            auto smaller = [&](Cell a, Cell b) {
                const std::size_t va = m_cells[a].value, vb = m_cells[b].value;
                if ((va == 0) != (vb == 0))
                    return va != 0;
                return va < vb;
            };
            std::size_t fewest = std::numeric_limits<std::size_t>::max();
            Cell chosen = *best;
            for (Cell c : candidates) {
                m_cells[c].suppressed = true;
                const auto derivable = derivableHidden();
                const auto exposed = std::size_t(std::count_if(derivable.begin(), derivable.end(), [&](Cell d) { return mustStayHidden(d); }));
                m_cells[c].suppressed = false;
                if (exposed < fewest || (exposed == fewest && smaller(c, chosen))) {
                    fewest = exposed;
                    chosen = c;
                }
            }
            m_cells[chosen].suppressed = true;
            return true;
        }
        frontier = std::move(next);
    }
    return false;
}

void SmallCellProtection::protect(std::size_t minimumCell)
{
    for (auto& c : m_cells) {
        c.primary = c.kind != Kind::Published && c.value > 0 && c.value < minimumCell;
        c.suppressed = c.primary && c.kind == Kind::Printed;
        c.givenUp = false;
    }
    m_unprotectable = 0;
    // Each pass suppresses one more cell or gives one up, so the loop ends.
    for (;;) {
        const std::vector<Cell> derivable = derivableHidden();
        const auto exposed = std::find_if(derivable.begin(), derivable.end(), [&](Cell c) { return mustStayHidden(c); });
        if (exposed == derivable.end())
            return;
        if (!complementFor(*exposed)) {
            m_cells[*exposed].givenUp = true;
            ++m_unprotectable;
        }
    }
}

} // namespace plumbline
