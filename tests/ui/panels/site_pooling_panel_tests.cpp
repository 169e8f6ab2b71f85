// The Sites tab: reached with its key, it shows for each model the forest charts and the table
// of the core's pooled numbers (the core's own tests check those against statsmodels and scipy).
#include "support/fresh_settings_main.hpp"
#include "support/window_test_support.hpp"

#include "charts/site_forest_view.hpp"
#include "intake/acceptable_criteria.hpp"
#include "panels/settings_panel.hpp"
#include "panels/site_pooling_panel.hpp"
#include "reporting/value_text.hpp"

#include <QComboBox>
#include <QLabel>
#include <QLineEdit>
#include <QTabWidget>
#include <QTableWidget>
#include <QTest>

using namespace plumbline;
using namespace plumbline::testing;

class SitePoolingPanelTests : public QObject {
    Q_OBJECT
private slots:
    void theSitesTabShowsTheCoresPooledNumbersForEachModel()
    {
        MainWindow window;
        window.resize(1280, 720);
        window.show();
        AnalysisRequest request = sampleRequest(0, 7);
        request.intake.clusterColumn = "hospital";
        request.panel.simulationSeed = 7;
        QVERIFY(runAndWait(window, request));
        // Alt+I, the tab's key, as a person switches to it.
        QTest::keyClick(&window, Qt::Key_I, Qt::AltModifier);
        SitePoolingPanel* panel = window.sitePoolingPanel();
        QCOMPARE(window.tabs()->currentWidget(), static_cast<QWidget*>(panel));
        const auto& sites = window.snapshot()->validation.sites;
        QVERIFY(sites.has_value());
        QCOMPARE(panel->modelPicker()->count(), 2);
        for (int m = 0; m < 2; ++m) {
            panel->modelPicker()->setCurrentIndex(m);
            const ModelSitePooling& model = sites->models[std::size_t(m)];
            QCOMPARE(panel->table()->rowCount(), int(model.measures.size()));
            for (int row = 0; row < panel->table()->rowCount(); ++row) {
                const PooledMeasure& measure = model.measures[std::size_t(row)];
                QCOMPARE(panel->table()->item(row, 2)->text().toStdString(), fixedText(*measure.pooled, 3));
                QCOMPARE(panel->table()->item(row, 1)->text().toInt(), int(measure.sites.size()));
            }
            // The C forest: every site in name order, then the pooled row and a new site's row.
            const QStringList labels = panel->cChart()->rowLabels();
            QCOMPARE(labels.size(), int(model.measures[0].sites.size()) + 2);
            QCOMPARE(labels.front().toStdString(), model.measures[0].sites.front().site);
            QVERIFY(labels.back().startsWith(QStringLiteral("New site")));
            QVERIFY(panel->noteText().contains(QStringLiteral("joint simulation from the predictive distribution")));
            QVERIFY(panel->noteText().contains(QStringLiteral("seed 7")));
        }
    }

    void theSettingsTabTakesTheAcceptabilityCriteriaAndRefusesBadOnes()
    {
        SettingsPanel panel;
        panel.show();
        auto* field = panel.findChild<QLineEdit*>(QStringLiteral("acceptable"));
        QVERIFY(field);
        QCOMPARE(panel.request()->panel.acceptable, AcceptableCriteria{}); // the defaults, as on the command line
        field->setFocus();
        field->selectAll();
        QTest::keyClicks(field, QStringLiteral("c=0.75, oe=0.9:1.1"));
        // The same core parser as --acceptable reads what was typed.
        QCOMPARE(panel.request()->panel.acceptable, parseAcceptableCriteria("c=0.75,oe=0.9:1.1", "x").value());
        field->selectAll();
        QTest::keyClicks(field, QStringLiteral("c=1.5"));
        QVERIFY(!panel.request());
        bool said = false;
        for (QLabel* label : panel.findChildren<QLabel*>())
            said = said || label->text().contains(QStringLiteral("Acceptable in a new site takes c as a C statistic strictly between 0 and 1"));
        QVERIFY(said);
        // A saved analysis's criteria show in the field.
        AnalysisRequest saved;
        saved.panel.acceptable = parseAcceptableCriteria("slope=0.9:1.1", "x").value();
        panel.setRequest(saved);
        QCOMPARE(panel.request()->panel.acceptable, saved.panel.acceptable);
    }

    void withoutASiteColumnTheTabSaysHowToChooseOne()
    {
        MainWindow window;
        QVERIFY(runAndWait(window, sampleRequest(0)));
        QVERIFY(window.sitePoolingPanel()->noteText().contains(QStringLiteral("--cluster")));
        QCOMPARE(window.sitePoolingPanel()->modelPicker()->count(), 0);
    }
};

PLUMBLINE_FRESH_SETTINGS_MAIN(SitePoolingPanelTests)
#include "site_pooling_panel_tests.moc"
