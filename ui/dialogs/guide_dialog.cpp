#include "dialogs/guide_dialog.hpp"

#include "reporting/cautions.hpp"

#include <QDialogButtonBox>
#include <QTextBrowser>
#include <QVBoxLayout>

namespace plumbline {

GuideDialog::GuideDialog(QWidget* parent)
    : QDialog(parent)
{
    setWindowTitle(tr("Guide to the window"));
    auto* text = new QTextBrowser;
    text->setHtml(guideHtml());
    text->setOpenExternalLinks(false);
    auto* buttons = new QDialogButtonBox(QDialogButtonBox::Close);
    connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
    auto* layout = new QVBoxLayout(this);
    layout->addWidget(text);
    layout->addWidget(buttons);
    resize(640, 560);
}

QString GuideDialog::guideHtml()
{
    return tr(
        "<h3>Validating a model in four steps</h3>"
        "<ol><li><b>Open</b> the scored cohort (<b>File → Open cohort</b>, Ctrl+O, or drop a file on the window). Type "
        "a path and press Return, or Browse. Check the guessed columns: the outcome, one score column per model, and "
        "optionally an id, subgroup columns and a date column.</li>"
        "<li><b>Check the data</b> to see every row accounted for, then <b>Run validation</b> (Return). The run goes on "
        "in the background; Esc cancels it.</li>"
        "<li><b>Read</b> the results: set the <b>decision threshold</b> the care team would act on (drag the slider, or "
        "type a value and press Return); every chart and table follows it.</li>"
        "<li><b>Export</b> a report (Ctrl+E) and <b>save the analysis</b> (Ctrl+S) so that someone else can re-run it "
        "exactly.</li></ol>"
        "<h3>The tabs</h3><ul>"
        "<li><b>Overview</b>: ROC curves (C and its interval in the legend) and the calibration plot (risk groups with "
        "intervals, the smoothed curve, the ideal line); beneath them each model at the threshold and the distribution "
        "of predicted risk of the model you choose. Hover a point for its numbers; click a risk group to open it in "
        "<b>Risk groups</b>.</li>"
        "<li><b>Metrics</b>: every measure with its interval and a plain reading; hover a name for its definition and "
        "source.</li>"
        "<li><b>Risk groups</b>: the calibration table beside its plot; select a row to ring its point. Ctrl+C copies "
        "rows for a spreadsheet.</li>"
        "<li><b>Comparison</b> and <b>Updating</b>: two models on the same patients; a model recalibrated for the "
        "local population, with optimism-corrected performance.</li>"
        "<li><b>Net benefit</b>, <b>Subgroups</b>, <b>Over time</b>: decision curves; performance per level with the "
        "funnel of sites; performance per month or quarter against the first year.</li>"
        "<li><b>Cohort</b>: the files, their fingerprints, every exclusion and every warning. <b>Settings</b>: the "
        "analysis options and the report's text; Re-run (F5) applies them.</li></ul>"
        "<p>The check boxes beside the file name show or hide a model in the charts. Right-click a chart to copy it or "
        "save it as PNG or SVG; <b>Edit → Copy chart</b> copies the chart you clicked last. <b>View → Reset layout</b> "
        "puts every divider back.</p>"
        "<h3>Shortcuts</h3><table>"
        "<tr><td>Ctrl+O</td><td>Open a cohort</td></tr>"
        "<tr><td>Ctrl+S</td><td>Save the analysis</td></tr>"
        "<tr><td>Ctrl+E</td><td>Export the report</td></tr>"
        "<tr><td>F5</td><td>Re-run with the Settings tab's options</td></tr>"
        "<tr><td>Esc</td><td>Cancel a run</td></tr>"
        "<tr><td>Ctrl+C</td><td>Copy the selected table rows</td></tr>"
        "<tr><td>Ctrl+Shift+C</td><td>Copy the chart</td></tr>"
        "<tr><td>Ctrl+1 … Ctrl+9</td><td>Go to the first nine tabs (Settings: Alt+S)</td></tr>"
        "<tr><td>F1</td><td>This guide</td></tr></table>")
        + cautionsHtml();
}

QString GuideDialog::cautionsHtml()
{
    QString html = tr("<h3>Cautions</h3><p>");
    for (const auto caution : standardCautions)
        html += QString::fromUtf8(caution.data(), qsizetype(caution.size())).toHtmlEscaped() + QLatin1Char(' ');
    return html + QStringLiteral("</p>");
}

} // namespace plumbline
