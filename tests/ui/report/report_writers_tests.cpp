#include "run/analysis_snapshot.hpp"
#include "report/pdf_outline.hpp"
#include "report/report_writers.hpp"
#include "files/result_json.hpp"
#include "reporting/value_text.hpp"
#include "report/report_charts.hpp"

#include <QDir>
#include <QFile>
#include <QProcess>
#include <QRegularExpression>
#include <QTemporaryDir>
#include <QTest>
#include <QXmlStreamReader>

#include <algorithm>
#include <cmath>
#include <regex>

using namespace plumbline;

namespace {

// A cohort whose column names try to break the outputs: markup and a spreadsheet formula.
const std::string hostileScore = "<script>alert(1)</script>";
const std::string formulaScore = "=HYPERLINK(\"http://example.invalid\")";

SnapshotPointer snapshotOf(std::size_t rows, std::size_t groups)
{
    std::string csv = "y," + std::string("\"") + hostileScore + "\",\"=HYPERLINK(\"\"http://example.invalid\"\")\"\n";
    for (std::size_t i = 0; i < rows; ++i) {
        const double p = 0.05 + 0.9 * double((i * 37) % 101) / 100.0;
        const int y = double((i * 53) % 97) / 97.0 < p ? 1 : 0;
        csv += std::to_string(y) + "," + std::to_string(p) + "," + std::to_string(std::min(0.99, p * 0.8 + 0.05)) + "\n";
    }
    IntakeSettings intake;
    intake.cohortFile = "hostile.csv";
    intake.outcomeColumn = "y";
    intake.scoreColumns = {hostileScore, formulaScore};
    auto result = runIntake(intake, *TextFile::fromBytes("hostile.csv", csv), std::nullopt);
    auto snapshot = std::make_shared<AnalysisSnapshot>();
    snapshot->request.intake = intake;
    snapshot->request.panel.riskGroups = groups;
    snapshot->validation = runValidation(result->cohort, snapshot->request.panel);
    snapshot->audit = result->audit;
    snapshot->inputs = result->inputs;
    snapshot->cohort = std::make_shared<const Cohort>(std::move(result->cohort));
    return snapshot;
}

// "MM-DD" of day `d` (0-based) of a leap year or not.
std::string monthDay(int d, bool leap)
{
    const int lengths[] = {31, leap ? 29 : 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31};
    int month = 0;
    while (d >= lengths[month]) {
        d -= lengths[month];
        ++month;
    }
    char text[8];
    std::snprintf(text, sizeof text, "%02d-%02d", month + 1, d + 1);
    return text;
}

QByteArray slurp(const QString& path)
{
    QFile file(path);
    file.open(QIODevice::ReadOnly);
    return file.readAll();
}

QString pythonOutput(const QString& script, const QStringList& arguments)
{
    QProcess python;
    python.start(QStringLiteral("/usr/bin/python3"), QStringList{QStringLiteral("-c"), script} + arguments);
    python.waitForFinished(30000);
    return QString::fromUtf8(python.readAllStandardOutput()).trimmed();
}

// The PDF's text (pdftotext with `options`), whitespace collapsed (a long title may wrap) and
// typographic ligatures (the font draws "ff" as one glyph, which pdftotext reports as U+FB00)
// spelled out; empty when the PDF could not be written or read.
QString pdfText(const SnapshotPointer& snapshot, const ReportDocument& document, const QStringList& options)
{
    ReportCharts charts(snapshot);
    QTemporaryDir dir;
    const QString path = dir.filePath(QStringLiteral("r.pdf"));
    if (!writeReport(document, charts, path.toStdString()).has_value())
        return {};
    QProcess text;
    text.start(QStringLiteral("pdftotext"), options + QStringList{path, QStringLiteral("-")});
    if (!text.waitForFinished(30000))
        return {};
    QString content = QString::fromUtf8(text.readAllStandardOutput()).simplified();
    content.replace(QChar(0xFB00), QStringLiteral("ff")).replace(QChar(0xFB01), QStringLiteral("fi")).replace(QChar(0xFB02), QStringLiteral("fl"));
    return content;
}

} // namespace

class ReportWritersTests : public QObject {
    Q_OBJECT
private slots:
    void theSitesPartShowsThePooledNumbersAndWithholdsSmallSites()
    {
        // The sample cohort by hospital: the report's tables carry the core's pooled values, and
        // a small-cell rule above every hospital's size leaves no site estimate of its own.
        IntakeSettings intake;
        intake.cohortFile = PLUMBLINE_SAMPLE_DATA "/readmissions.csv";
        intake.outcomeColumn = "readmitted_30d";
        intake.scoreColumns = {"supplier_score", "local_score"};
        intake.clusterColumn = "hospital";
        auto result = runIntake(intake);
        QVERIFY(result.has_value());
        auto snapshot = std::make_shared<AnalysisSnapshot>();
        snapshot->request.intake = intake;
        snapshot->validation = runValidation(result->cohort, snapshot->request.panel);
        snapshot->audit = result->audit;
        snapshot->inputs = result->inputs;
        snapshot->cohort = std::make_shared<const Cohort>(std::move(result->cohort));
        auto tableOf = [](const ReportDocument& d, const std::string& id) -> const ReportTable* {
            for (const ReportTable* t : d.tables())
                if (t->id == id)
                    return t;
            return nullptr;
        };
        const ReportDocument document = buildReport(*snapshot, {}, 11, "2026-01-01T00:00:00Z");
        const ReportTable* pooled = tableOf(document, "site_pooling");
        const ReportTable* sites = tableOf(document, "site_estimates");
        QVERIFY(pooled && sites);
        const SitePooling& s = *snapshot->validation.sites;
        const PooledMeasure& c = s.models[0].measures[0];
        QCOMPARE(pooled->rows[0][3].text, fixedText(*c.pooled, 3));
        QCOMPARE(int(sites->rows.size()), 2 * 3 * int(s.sites)); // 2 models, 3 measures, every hospital above the rule
        const ReportDocument strict = buildReport(*snapshot, {}, 100000, "2026-01-01T00:00:00Z");
        QVERIFY(tableOf(strict, "site_estimates")->rows.empty());
        QVERIFY(tableOf(strict, "site_estimates")->note.find("estimate withheld in reports") != std::string::npos);
        QCOMPARE(tableOf(strict, "site_pooling")->rows[0][3].text, fixedText(*c.pooled, 3));
        // The forest chart is drawn by the window's own view.
        ReportCharts charts(snapshotForReport(*snapshot, 11));
        QVERIFY(charts.svg({ReportChart::SiteC, 1}).contains("<svg"));
        QVERIFY(charts.caption({ReportChart::SiteOe, 1}).contains(QStringLiteral("local_score")));
    }

    void outlineUpdateKeepsEveryOffsetRightAndLeavesUnreadableFilesAlone()
    {
        // A minimal classic PDF (PDF 1.7 reference, 7.5): catalog 1, pages 2, one page 3.
        QByteArray pdf = "%PDF-1.4\n";
        std::vector<qsizetype> at;
        for (const QByteArray& body : {QByteArray("<< /Type /Catalog /Pages 2 0 R >>"), QByteArray("<< /Type /Pages /Kids [3 0 R] /Count 1 >>"),
                                       QByteArray("<< /Type /Page /Parent 2 0 R /MediaBox [0 0 10 10] >>")}) {
            at.push_back(pdf.size());
            pdf += QByteArray::number(qsizetype(at.size())) + " 0 obj\n" + body + "\nendobj\n";
        }
        const qsizetype xref = pdf.size();
        pdf += "xref\n0 4\n0000000000 65535 f \n";
        for (qsizetype offset : at)
            pdf += QByteArray::number(offset).rightJustified(10, '0') + " 00000 n \n";
        pdf += "trailer\n<< /Size 4 /Root 1 0 R >>\nstartxref\n" + QByteArray::number(xref) + "\n%%EOF\n";
        const QByteArray marked = withPdfOutline(pdf, {{QStringLiteral("1. Summary \u00e9"), 1}});
        QVERIFY(marked.startsWith(pdf));
        QVERIFY(marked.contains("/Outlines 4 0 R"));
        // UTF-16BE with its mark: "1. Summary é" keeps its accent.
        QVERIFY(marked.contains("/Title <FEFF0031002E002000530075006D006D006100720079002000E9>"));
        QVERIFY(marked.contains("/Prev " + QByteArray::number(xref)));
        // Every offset of the new cross-reference section points at its object.
        const qsizetype newXref = marked.mid(marked.lastIndexOf("startxref") + 10).trimmed().split('\n').first().toLongLong();
        QVERIFY(marked.mid(newXref, 4) == "xref");
        const QList<QByteArray> lines = marked.mid(newXref).split('\n');
        int id = 0;
        for (const QByteArray& line : lines.mid(1)) {
            if (line.startsWith("trailer"))
                break;
            const QList<QByteArray> parts = line.trimmed().split(' ');
            if (parts.size() == 2) {
                id = parts[0].toInt();
                continue;
            }
            QVERIFY2(marked.mid(parts[0].toLongLong()).startsWith(QByteArray::number(id) + " 0 obj"), line.constData());
            ++id;
        }
        QCOMPARE(id, 6); // the catalog again (1), then objects 4 and 5
        // What it cannot read comes back as it was.
        for (const QByteArray& odd : {QByteArray(), QByteArray("not a pdf"), pdf.left(pdf.size() / 2), QByteArray("trailer startxref")})
            QCOMPARE(withPdfOutline(odd, {{QStringLiteral("x"), 1}}), odd);
    }

    void htmlIsWellFormedSelfContainedAndEscaped()
    {
        const SnapshotPointer snapshot = snapshotOf(600, 10);
        ReportFields fields;
        fields.notes = "Group label <script>x</script> & friends";
        const ReportDocument document = buildReport(*snapshot, fields, 11, "2026-01-01T00:00:00Z");
        ReportCharts charts(snapshot);
        QTemporaryDir dir;
        const QString path = dir.filePath(QStringLiteral("r.html"));
        QVERIFY(writeReport(document, charts, path.toStdString()).has_value());
        const QByteArray html = slurp(path);
        QVERIFY(!html.contains("<script"));
        QVERIFY(html.contains("&lt;script&gt;alert(1)&lt;/script&gt;"));
        QVERIFY(html.contains("<svg"));
        QVERIFY(!QString::fromUtf8(html).contains(QRegularExpression(QStringLiteral("(src|href)\\s*=\\s*\"(https?:|//|file:)"))));
        // It parses as XML (every element closed, every text escaped).
        QXmlStreamReader xml(html.mid(html.indexOf("<html")));
        while (!xml.atEnd())
            xml.readNext();
        QVERIFY2(!xml.hasError(), qPrintable(xml.errorString()));
    }

    void csvAndXlsxNeutraliseFormulasAndSuppressSmallCells()
    {
        const SnapshotPointer snapshot = snapshotOf(100, 10); // ten patients a group: below 11
        const ReportDocument document = buildReport(*snapshot, {}, 11, "2026-01-01T00:00:00Z");
        QTemporaryDir dir;
        QVERIFY(writeCsvTables(document, dir.filePath(QStringLiteral("csv")).toStdString()).has_value());
        const QString discrimination = QString::fromUtf8(slurp(dir.filePath(QStringLiteral("csv/discrimination.csv"))));
        QVERIFY(discrimination.contains(QStringLiteral("\"'=HYPERLINK(\"\"http://example.invalid\"\")\"")));
        for (const QString& line : discrimination.split(QLatin1Char('\n')))
            QVERIFY(!line.startsWith(QLatin1Char('=')) && !line.contains(QStringLiteral(",=")));
        const QString groups = QString::fromUtf8(slurp(dir.filePath(QStringLiteral("csv/risk_groups.csv"))));
        QVERIFY(groups.contains(QStringLiteral("suppressed")));
        QVERIFY(!groups.contains(QStringLiteral("<11"))); // one marker: the small cell is not told from its complement
        // The rate and interval beside a small count would give it back: withheld.
        QVERIFY(groups.contains(QStringLiteral("withheld")));
        const QString workbook = dir.filePath(QStringLiteral("r.xlsx"));
        QVERIFY(writeXlsxReport(document, workbook.toStdString()).has_value());
        const QString check = QStringLiteral(
            "import sys, zipfile\n"
            "z = zipfile.ZipFile(sys.argv[1])\n"
            "strings = z.read('xl/sharedStrings.xml').decode()\n"
            "sheets = [n for n in z.namelist() if n.startswith('xl/worksheets/sheet')]\n"
            "formulas = sum(z.read(n).decode().count('<f>') for n in sheets)\n"
            "print(len(sheets), formulas, \"'=HYPERLINK\" in strings, '>=HYPERLINK' in strings)\n");
        // One sheet per table plus the report's words.
        QCOMPARE(pythonOutput(check, {workbook}), QStringLiteral("%1 0 True False").arg(document.tables().size() + 1));
        // openpyxl (Debian python3-openpyxl 3.0) reads estimates and interval ends as numbers, and
        // no text cell hides a number behind an apostrophe.
        const QString numbers = QStringLiteral(
            "import sys, re, openpyxl\n"
            "wb = openpyxl.load_workbook(sys.argv[1])\n"
            "ws = wb['calibration']\n"
            "head = [c.value for c in ws[3]]\n"
            "cols = [head.index(h) for h in ('Estimate', 'Interval lower', 'Interval upper')]\n"
            "rows = [r for r in ws.iter_rows(min_row=4, values_only=True) if r[0]]\n"
            "numeric = all(isinstance(r[c], (int, float)) for r in rows for c in cols if r[c] is not None)\n"
            "hidden = sum(1 for s in wb for r in s.iter_rows(values_only=True) for v in r\n"
            "             if isinstance(v, str) and re.match(r\"'[-0-9]\", v))\n"
            "print(len(rows) > 0, numeric, hidden)\n");
        QCOMPARE(pythonOutput(numbers, {workbook}), QStringLiteral("True True 0"));
    }

    void pdfHoldsEverySectionAndTheKeyNumbers()
    {
        const SnapshotPointer snapshot = snapshotOf(600, 10);
        const ReportDocument document = buildReport(*snapshot, {}, 11, "2026-01-01T00:00:00Z");
        const QString content = pdfText(snapshot, document, {QStringLiteral("-layout")});
        QVERIFY(!content.isEmpty());
        for (const auto& section : document.sections)
            QVERIFY2(content.contains(QString::fromStdString(section.title).simplified()), section.title.c_str());
        for (const auto& model : snapshot->validation.models) {
            const double c = *model.metrics[CStatistic].estimate.value;
            QVERIFY(content.contains(QString::number(c, 'f', 3)));
            QVERIFY(content.contains(QString::number(*model.metrics[CalibrationSlope].estimate.value, 'f', 3)));
        }
        // Document control: page N of M, a contents list and the document id on every page after the first.
        const int pages = int(content.count(QRegularExpression(QStringLiteral("page \\d+ of \\d+"))));
        QVERIFY(pages > 3);
        QVERIFY(content.contains(QStringLiteral("page 1 of %1").arg(pages)));
        QVERIFY(content.contains(QStringLiteral("Contents")));
        QVERIFY(!document.documentId.empty());
        QCOMPARE(int(content.count(QString::fromStdString(document.documentId))), pages + 1); // header of pages 2..M, title block, settings
        QVERIFY(content.contains(QStringLiteral("Reviewed by")));
    }

    void monitoringIsInTheReportByMonthWithTheCoresLimits()
    {
        // Two years of dated patients, 3 a day, the sites filled by hand (as --cluster would).
        std::string csv = "y,p,day\n";
        for (int d = 0; d < 730; ++d)
            for (int k = 0; k < 3; ++k) {
                const double p = 0.05 + 0.5 * double((d * 7 + k * 13) % 29) / 29.0;
                const int y = double((d * 31 + k * 17) % 97) / 97.0 < p ? 1 : 0;
                char line[64];
                std::snprintf(line, sizeof line, "%d,%.4f,%s\n", y, p, d < 366 ? ("2024-" + monthDay(d, true)).c_str()
                                                                               : ("2025-" + monthDay(d - 366, false)).c_str());
                csv += line;
            }
        IntakeSettings intake;
        intake.cohortFile = "dated.csv";
        intake.outcomeColumn = "y";
        intake.scoreColumns = {"p"};
        intake.periodColumn = "day";
        auto result = runIntake(intake, *TextFile::fromBytes("dated.csv", csv), std::nullopt);
        QVERIFY(result.has_value());
        CategoricalColumn sites{"hospital", {"North", "South"}, {}};
        for (std::size_t i = 0; i < result->cohort.rows(); ++i)
            sites.codes.push_back(i % 3 == 0 ? 0u : 1u);
        result->cohort.cluster = sites;
        auto snapshot = std::make_shared<AnalysisSnapshot>();
        snapshot->request.intake = intake;
        snapshot->request.panel.monitoring.simulatedRuns = 50;
        snapshot->validation = runValidation(result->cohort, snapshot->request.panel);
        snapshot->audit = result->audit;
        snapshot->inputs = result->inputs;
        snapshot->cohort = std::make_shared<const Cohort>(std::move(result->cohort));
        QVERIFY(snapshot->validation.monitoring);
        const ReportDocument document = buildReport(*snapshot, {}, 11, "2026-01-01T00:00:00Z");
        const ReportTable* summary = nullptr;
        const ReportTable* signalTable = nullptr;
        const ReportTable* caseMix = nullptr;
        for (const ReportTable* t : document.tables()) {
            summary = t->id == "monitoring" ? t : summary;
            signalTable = t->id == "monitoring_signals" ? t : signalTable;
            caseMix = t->id == "monitoring_case_mix" ? t : caseMix;
        }
        QVERIFY(summary && caseMix);
        const auto& scopes = snapshot->validation.monitoring->scopes;
        QCOMPARE(summary->rows.size(), scopes.size() * 2); // whole cohort, North, South; two charts each
        QCOMPARE(summary->rows[0][6].text, fixedText(scopes[0].charts[0].limit.limit, 2));
        QCOMPARE(summary->rows[2][1].text, std::string("North"));
        QCOMPARE(caseMix->rows.size(), std::size_t(3 * 24));
        // Signals by month only: no day of a patient reaches the report.
        if (signalTable)
            for (const auto& row : signalTable->rows)
                QVERIFY(std::regex_match(row[3].text, std::regex("\\d{4}-\\d{2}|and \\d+ more \\(all in the JSON\\)")));
        const QString content = pdfText(snapshot, document, {});
        QVERIFY(content.contains(QStringLiteral("CUSUM watching for worse outcomes")));
        QVERIFY(content.contains(QStringLiteral("Monitoring: expected minus observed and the CUSUMs")));
        // Many signals: at most 10 per chart and scope, the worse chart's first, the rest
        // counted; the whole-network scope names no site (the tipping patient's site misleads).
        auto& monitoring = *snapshot->validation.monitoring;
        for (auto& scope : monitoring.scopes)
            for (auto& chart : scope.charts)
                chart.signalList.clear();
        monitoring.scopes[0].charts[1].signalList.assign(25, CusumSignal{9, "2024-02-01", "North", CusumDirection::Better, 9});
        monitoring.scopes[0].charts[0].signalList.assign(3, CusumSignal{5, "2024-03-02", "South", CusumDirection::Worse, 5});
        const ReportDocument many = buildReport(*snapshot, {}, 11, "2026-01-01T00:00:00Z");
        const ReportTable* listed = nullptr;
        for (const ReportTable* t : many.tables())
            listed = t->id == "monitoring_signals" ? t : listed;
        QVERIFY(listed);
        QCOMPARE(listed->rows.size(), std::size_t(3 + 10 + 1));
        for (std::size_t r = 0; r < 3; ++r)
            QCOMPARE(listed->rows[r][2].text, std::string("worse"));
        QCOMPARE(listed->rows[3][2].text, std::string("better"));
        QCOMPARE(listed->rows[13][3].text, std::string("and 15 more (all in the JSON)"));
        for (std::size_t r = 0; r < 13; ++r)
            QCOMPARE(listed->rows[r][4].text, std::string("-"));
    }

    void pageOneIsADecisionSummaryWithTheKeyNumbersAndEveryWarning()
    {
        const SnapshotPointer snapshot = snapshotOf(300, 10); // few events: warnings to show
        const ReportDocument document = buildReport(*snapshot, {}, 11, "2026-01-01T00:00:00Z");
        const QString page = pdfText(snapshot, document, {QStringLiteral("-f"), QStringLiteral("1"), QStringLiteral("-l"), QStringLiteral("1")});
        QVERIFY2(page.contains(QStringLiteral("Decision summary")), qPrintable(page));
        const ValidationResult& v = snapshot->validation;
        const double rate = double(snapshot->cohort->events()) / double(snapshot->cohort->rows());
        QVERIFY(page.contains(QStringLiteral("event rate %1 %").arg(rate * 100.0, 0, 'f', 1)));
        for (const auto& model : v.models) {
            auto shows = [&](PanelMetric k, int digits) {
                const Estimate& e = model.metrics[k].estimate;
                for (double x : {*e.value, *e.lower, *e.upper})
                    QVERIFY2(page.contains(QString::fromStdString(fixedText(x, digits))), qPrintable(QString::fromStdString(model.name + " " + model.metrics[k].key)));
            };
            shows(CStatistic, 3);
            shows(OeRatio, 2);
            shows(CalibrationSlope, 2);
        }
        // Every warning, on page 1 (its first words: a long warning wraps).
        for (const auto* list : {&snapshot->audit.warnings, &v.warnings})
            for (const auto& warning : *list)
                QVERIFY2(page.contains(QString::fromStdString(warning).simplified().left(40)), warning.c_str());
        QVERIFY(!v.warnings.empty() || !snapshot->audit.warnings.empty());
    }

    void longNamesNeverBreakMidWordInThePdf()
    {
        // A long column (model) name in every table, the widest ones included.
        SnapshotPointer base = snapshotOf(300, 10);
        auto snapshot = std::make_shared<AnalysisSnapshot>(*base);
        const std::string longName = "readmission_score_version_2024_recalibrated";
        snapshot->validation.models.at(0).name = longName;
        const ReportDocument document = buildReport(*snapshot, {}, 11, "2026-01-01T00:00:00Z");
        const QString content = pdfText(snapshot, document, {});
        QVERIFY(!content.isEmpty());
        // Every occurrence is whole (a chart legend may elide it with "...", never break it): as
        // many as the word appears, no piece of it on its own.
        const QString name = QString::fromStdString(longName);
        QVERIFY(content.count(name) >= 5);
        const qsizetype elided = content.count(QRegularExpression(QStringLiteral("readmission_score_version\\S*\\.\\.\\.")));
        QCOMPARE(content.count(QStringLiteral("readmission_score_version")) - elided, content.count(name));
    }

    void theLimitsSectionSaysWhatTheseDataCannotShowWithThisRunsNumbers()
    {
        const SnapshotPointer snapshot = snapshotOf(300, 10);
        const ReportDocument document = buildReport(*snapshot, {}, 11, "2026-01-01T00:00:00Z");
        const ReportSection* limits = nullptr;
        for (const auto& section : document.sections)
            if (section.title.find("What these data cannot show") != std::string::npos)
                limits = &section;
        QVERIFY(limits);
        std::string text;
        for (const auto& p : limits->paragraphs)
            text += p + "\n";
        for (const char* topic : {"Outcomes recorded elsewhere", "Competing events", "Interventions triggered by the score",
                                  "Complete cases only", "No evidence of clinical impact"})
            QVERIFY2(text.find(topic) != std::string::npos, topic);
        const IntakeAudit& a = snapshot->audit;
        QVERIFY(text.find(std::to_string(a.rowsExcluded()) + " of " + std::to_string(a.rowsRead) + " rows were left out") != std::string::npos);
    }

    void theChecklistListsEveryValidationItemWithAStatus()
    {
        const SnapshotPointer snapshot = snapshotOf(300, 10);
        const ReportDocument document = buildReport(*snapshot, {}, 11, "2026-01-01T00:00:00Z");
        const ReportTable* checklist = nullptr;
        for (const ReportTable* table : document.tables())
            if (table->id == "checklist")
                checklist = table;
        QVERIFY(checklist);
        // TRIPOD 2015's validation items (from memory): 1-9, 10c-10e, 11, 12, 13a-13c, 16-22.
        QStringList items;
        for (const auto& row : checklist->rows) {
            items << QString::fromStdString(row.at(0).text);
            const std::string& status = row.at(2).text;
            QVERIFY2(status == "covered" || status == "partly covered" || status == "for the authors to supply", status.c_str());
        }
        for (const char* item : {"1", "2", "3a", "3b", "4a", "4b", "5a", "5b", "5c", "6a", "6b", "7a", "7b", "8", "9", "10c", "10d",
                                 "10e", "11", "12", "13a", "13b", "13c", "16", "17", "18", "19a", "19b", "20", "21", "22"})
            QVERIFY2(items.contains(QString::fromLatin1(item)), item);
        QVERIFY(checklist->note.find("from memory") != std::string::npos);
        // TRIPOD+AI's items (from memory): 1-27 with their parts, each with a status.
        const ReportTable* ai = nullptr;
        for (const ReportTable* table : document.tables())
            if (table->id == "checklist_ai")
                ai = table;
        QVERIFY(ai);
        QStringList aiItems;
        for (const auto& row : ai->rows) {
            aiItems << QString::fromStdString(row.at(0).text);
            const std::string& status = row.at(2).text;
            QVERIFY2(status == "covered" || status == "partly covered" || status == "for the authors to supply", status.c_str());
        }
        for (int n = 1; n <= 27; ++n)
            QVERIFY2(std::any_of(aiItems.begin(), aiItems.end(), [&](const QString& i) { return i == QString::number(n) || i.startsWith(QString::number(n) + QLatin1Char('a')); }),
                     qPrintable(QString::number(n)));
        QVERIFY(ai->note.find("from memory") != std::string::npos);
    }

    void aFailedWriteLeavesNoPartialFile()
    {
        const SnapshotPointer snapshot = snapshotOf(300, 10);
        const ReportDocument document = buildReport(*snapshot, {}, 11, "2026-01-01T00:00:00Z");
        ReportCharts charts(snapshot);
        QTemporaryDir dir;
        // The target is a folder: each writer gets its bytes down under a temporary name, then
        // the rename fails; nothing is left behind and the folder is untouched.
        const QString target = dir.filePath(QStringLiteral("report.pdf"));
        QVERIFY(QDir().mkpath(target));
        QVERIFY(!writeReport(document, charts, target.toStdString()).has_value());
        const QString workbook = dir.filePath(QStringLiteral("report.xlsx"));
        QVERIFY(QDir().mkpath(workbook));
        QVERIFY(!writeXlsxReport(document, workbook.toStdString()).has_value());
        QCOMPARE(QDir(dir.path()).entryList(QDir::NoDotAndDotDot | QDir::AllEntries).size(), 2);
        QVERIFY(QDir(target).isEmpty());
        QVERIFY(!writeReport(document, charts, dir.filePath(QStringLiteral("report.docx")).toStdString()).has_value());
    }

    void aValueThatRoundsToZeroHasNoSignAndIntervalNotesAreShown()
    {
        // A difference of -1.4e-16 is 0 in exact arithmetic: the report must not print "-0.000".
        SnapshotPointer base = snapshotOf(300, 10);
        auto snapshot = std::make_shared<AnalysisSnapshot>(*base);
        MetricEntry& citl = snapshot->validation.models.at(0).metrics[CalibrationIntercept];
        citl.estimate.value = -1.4e-16;
        citl.estimate.lower = -0.1;
        citl.estimate.upper = 0.1;
        citl.intervalNote = "analytic interval: a reason given by the interval rule";
        const ReportDocument document = buildReport(*snapshot, {}, 11, "2026-01-01T00:00:00Z");
        const std::regex negativeZero("-0\\.0+(?![0-9])");
        bool found = false, noted = false;
        for (const auto& section : document.sections)
            for (const auto& table : section.tables) {
                noted = noted || table.note.find("a reason given by the interval rule") != std::string::npos;
                for (const auto& row : table.rows)
                    for (const auto& cell : row) {
                        QVERIFY2(!std::regex_search(cell.text, negativeZero), cell.text.c_str());
                        found = found || cell.text == "0.000";
                    }
            }
        QVERIFY(found);
        QVERIFY(noted);
    }
};

QTEST_MAIN(ReportWritersTests)
#include "report_writers_tests.moc"
