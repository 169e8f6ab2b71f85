#pragma once

#include <QByteArray>
#include <QString>

#include <vector>

namespace plumbline {

// One entry of a PDF's bookmarks (its outline): a title and the page it opens, 1-based.
struct PdfBookmark {
    QString title;
    int page = 1;
};

// The PDF with an outline of `bookmarks` added as an incremental update (new outline objects, the
// catalog again with /Outlines, a new cross-reference section pointing back to the old one).
// QPdfWriter has no outline of its own. A PDF this cannot read (not a classic cross-reference
// table, say) comes back unchanged: the bookmarks are a convenience, never worth a broken file.
QByteArray withPdfOutline(const QByteArray& pdf, const std::vector<PdfBookmark>& bookmarks);

} // namespace plumbline
