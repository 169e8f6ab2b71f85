#pragma once

#include <cstddef>
#include <span>
#include <vector>

namespace plumbline {

// Small-cell suppression that holds across a whole report. Counts are cells; every total a
// reader can form from what is printed (a column that adds up to the cohort, events plus
// non-events, a reclassification row against the threshold table) is a sum relation. A count
// above zero and below the minimum is suppressed (primary); further printed cells are then
// suppressed (complementary, the smallest first) until no suppressed or unprinted small count
// can be solved for from the printed ones by any combination of the relations (checked with
// linear algebra, not only one relation at a time).
class SmallCellProtection {
public:
    using Cell = std::size_t;

    // A count the report prints; it may be suppressed.
    Cell printed(std::size_t value);
    // A count the report does not print but a reader could form (a group's non-events): never
    // shown, and protected like a printed one when it is small.
    Cell unprinted(std::size_t value);
    // A count printed and never suppressed (the cohort's patients and events, data-quality
    // exclusions): the rule's stated exceptions.
    Cell published(std::size_t value);

    // The parts add up to the total.
    void sumOf(std::span<const Cell> parts, Cell total);

    // Applies the rule: primary suppression below `minimumCell`, then complementary suppression.
    void protect(std::size_t minimumCell);

    bool suppressed(Cell cell) const { return m_cells[cell].suppressed; }
    bool primary(Cell cell) const { return m_cells[cell].primary; }
    std::size_t value(Cell cell) const { return m_cells[cell].value; }
    // Small counts that no printed cell could protect (every other part of a relation is a
    // published total): they equal what the report publishes anyway.
    std::size_t unprotectable() const { return m_unprotectable; }
    std::size_t cellCount() const { return m_cells.size(); }

private:
    enum class Kind { Printed, Unprinted, Published };
    struct CellState {
        std::size_t value = 0;
        Kind kind = Kind::Printed;
        bool primary = false;    // small: must not be shown or derivable
        bool suppressed = false; // printed but withheld
        bool givenUp = false;    // could not be protected
    };
    struct Relation {
        std::vector<Cell> parts;
        Cell total;
    };

    Cell add(std::size_t value, Kind kind);
    bool hidden(Cell cell) const;
    bool mustStayHidden(Cell cell) const;
    std::vector<Cell> derivableHidden() const;
    bool complementFor(Cell cell);

    std::vector<CellState> m_cells;
    std::vector<Relation> m_relations;
    std::size_t m_unprotectable = 0;
};

} // namespace plumbline
