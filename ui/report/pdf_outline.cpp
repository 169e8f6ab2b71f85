#include "report/pdf_outline.hpp"

#include <QRegularExpression>

namespace plumbline {

namespace {

// A PDF text string in UTF-16BE with its byte-order mark, written in hex: any title is safe.
QByteArray pdfText(const QString& text)
{
    QByteArray hex("<FEFF");
    for (QChar c : text)
        hex += QByteArray::number(c.unicode(), 16).rightJustified(4, '0').toUpper();
    return hex + '>';
}

} // namespace

QByteArray withPdfOutline(const QByteArray& pdf, const std::vector<PdfBookmark>& bookmarks)
{
    if (bookmarks.empty())
        return pdf;
    const qsizetype trailerAt = pdf.lastIndexOf("trailer");
    const qsizetype startxrefAt = pdf.lastIndexOf("startxref");
    if (trailerAt < 0 || startxrefAt < trailerAt)
        return pdf;
    const QString trailer = QString::fromLatin1(pdf.mid(trailerAt, startxrefAt - trailerAt));
    const auto size = QRegularExpression(QStringLiteral("/Size\\s+(\\d+)")).match(trailer);
    const auto root = QRegularExpression(QStringLiteral("/Root\\s+(\\d+)\\s+0\\s+R")).match(trailer);
    const auto info = QRegularExpression(QStringLiteral("/Info\\s+(\\d+)\\s+0\\s+R")).match(trailer);
    const auto previous = QRegularExpression(QStringLiteral("startxref\\s+(\\d+)")).match(QString::fromLatin1(pdf.mid(startxrefAt, 40)));
    if (!size.hasMatch() || !root.hasMatch() || !previous.hasMatch())
        return pdf;
    // The catalog's dictionary and the page tree it names (QPdfWriter writes one flat /Kids list).
    const QString text = QString::fromLatin1(pdf);
    const auto catalog = QRegularExpression(QStringLiteral("\\n%1 0 obj\\s*<<(.*?)>>\\s*endobj").arg(root.captured(1)),
                                            QRegularExpression::DotMatchesEverythingOption).match(text);
    if (!catalog.hasMatch() || catalog.captured(1).contains(QStringLiteral("/Outlines")))
        return pdf;
    const auto pagesRef = QRegularExpression(QStringLiteral("/Pages\\s+(\\d+)\\s+0\\s+R")).match(catalog.captured(1));
    if (!pagesRef.hasMatch())
        return pdf;
    const auto pages = QRegularExpression(QStringLiteral("\\n%1 0 obj\\s*<<.*?/Kids\\s*\\[(.*?)\\]").arg(pagesRef.captured(1)),
                                          QRegularExpression::DotMatchesEverythingOption).match(text);
    if (!pages.hasMatch())
        return pdf;
    QStringList kids;
    auto refs = QRegularExpression(QStringLiteral("(\\d+)\\s+0\\s+R")).globalMatch(pages.captured(1));
    while (refs.hasNext())
        kids << refs.next().captured(1);
    if (kids.isEmpty())
        return pdf;

    const int first = size.captured(1).toInt(); // the outline's root; its entries follow
    const int count = int(bookmarks.size());
    QByteArray out = pdf;
    if (!out.endsWith('\n'))
        out += '\n';
    std::vector<qsizetype> offsets;
    auto object = [&](int id, const QByteArray& body) {
        offsets.push_back(out.size());
        out += QByteArray::number(id) + " 0 obj\n<<\n" + body + ">>\nendobj\n";
    };
    object(first, "/Type /Outlines\n/First " + QByteArray::number(first + 1) + " 0 R\n/Last " + QByteArray::number(first + count)
                      + " 0 R\n/Count " + QByteArray::number(count) + "\n");
    for (int k = 0; k < count; ++k) {
        const int page = std::clamp(bookmarks[std::size_t(k)].page, 1, int(kids.size()));
        QByteArray body = "/Title " + pdfText(bookmarks[std::size_t(k)].title) + "\n/Parent " + QByteArray::number(first) + " 0 R\n";
        if (k > 0)
            body += "/Prev " + QByteArray::number(first + k) + " 0 R\n";
        if (k + 1 < count)
            body += "/Next " + QByteArray::number(first + k + 2) + " 0 R\n";
        body += "/Dest [" + kids[page - 1].toLatin1() + " 0 R /Fit]\n";
        object(first + 1 + k, body);
    }
    const qsizetype catalogAt = out.size();
    out += root.captured(1).toLatin1() + " 0 obj\n<<" + catalog.captured(1).toLatin1() + "/Outlines " + QByteArray::number(first)
        + " 0 R\n/PageMode /UseOutlines\n>>\nendobj\n";
    const qsizetype xrefAt = out.size();
    auto entry = [](qsizetype offset) { return QByteArray::number(offset).rightJustified(10, '0') + " 00000 n \n"; };
    out += "xref\n" + root.captured(1).toLatin1() + " 1\n" + entry(catalogAt);
    out += QByteArray::number(first) + " " + QByteArray::number(count + 1) + "\n";
    for (qsizetype offset : offsets)
        out += entry(offset);
    out += "trailer\n<<\n/Size " + QByteArray::number(first + count + 1) + "\n/Root " + root.captured(1).toLatin1() + " 0 R\n";
    if (info.hasMatch())
        out += "/Info " + info.captured(1).toLatin1() + " 0 R\n";
    out += "/Prev " + previous.captured(1).toLatin1() + "\n>>\nstartxref\n" + QByteArray::number(xrefAt) + "\n%%EOF\n";
    return out;
}

} // namespace plumbline
