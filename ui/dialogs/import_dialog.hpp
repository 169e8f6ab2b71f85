#pragma once

#include "intake/column_roles.hpp"
#include "intake/delimited_table.hpp"
#include "intake/input_error.hpp"
#include "intake/intake.hpp"

#include <QDialog>
#include <QFutureWatcher>

#include <optional>
#include <string>
#include <vector>

class QCheckBox;
class QComboBox;
class QLabel;
class QLineEdit;
class QListWidget;
class QPushButton;
class QTableWidget;

namespace plumbline {

class IntakeAuditModel;

// Opens a cohort: previews the first rows as parsed, lets the user map the columns (pre-filled
// with guesses from names and content), and shows the intake audit — rows used, exclusions by
// reason, join counts — before anything is computed. A file that cannot be used gets the same
// message as the command line. Return in the path box reads the typed file; Return elsewhere
// (or Run) checks the data if needed and runs once the mapping is complete.
class ImportDialog : public QDialog {
    Q_OBJECT
public:
    explicit ImportDialog(QWidget* parent = nullptr);

    // Reads a file for the preview and the guesses; false (with the message shown) when unusable.
    bool loadFile(const QString& path);
    // A query's result as the cohort (File → Open from database): previewed, mapped and checked
    // like a file. The database is named without a password (see core/intake/query_table.hpp).
    bool loadDatabase(const QString& database, const QString& query);
    // The workbook's sheets (empty unless a workbook is open) and the one chosen.
    QStringList sheetNames() const;
    bool chooseSheet(const QString& sheet);
    // The value labels of the source's columns as shown under the preview (empty when none).
    QString valueLabelsText() const;
    bool loadOutcomesFile(const QString& path);

    IntakeSettings intakeSettings() const;
    // Sets the column choices (outcome, scores, id, groups, period, scale, event) as given.
    void setMapping(const IntakeSettings& settings);
    // Runs the intake now on this thread (tests, small files); the button runs it in the background.
    bool checkNow();
    QString problemText() const;
    const std::optional<IntakeResult>& checkedIntake() const { return m_checked; }
    // The columns offered as scores (numbers only, never the outcome or the id).
    QStringList scoreChoices() const;
    // The columns offered as subgroups (categories, never a chosen outcome, score or id).
    QStringList groupChoices() const;
    QPushButton* runButton() const { return m_run; }

protected:
    bool eventFilter(QObject* watched, QEvent* event) override;

private:
    void buildLayout();
    void fillColumnChoices(const std::vector<std::string>& header, const struct ColumnRoles& roles);
    void refreshScoreChoices(const std::vector<std::string>& wanted);
    void refreshGroupChoices(const std::vector<std::string>& wanted);
    // The site column's choices: every column but the outcome, the id and the scores.
    void refreshSiteChoices(const std::optional<std::string>& wanted);
    void showPreview(const TablePreview& preview);
    void showProblem(const QString& text);
    // The file read and split into fields; on failure the problem is shown and nullopt returned.
    std::optional<DelimitedTable> openTable(const QString& path);
    // A workbook's sheet, a statistical file or a query's result, read for the preview and guesses.
    bool loadTypedSource();
    void showSourceKind(bool delimited);
    void showColumns(const TablePreview& preview, const TableProfile& profile);
    void showIntake(const std::expected<IntakeResult, InputError>& result);
    void startCheck();
    void run();
    void stale();
    bool mappingComplete() const;
    std::optional<char> delimiterChoice() const;

    QLineEdit* m_file;
    QCheckBox* m_twoFiles;
    QLineEdit* m_outcomesFile;
    QComboBox* m_outcomesId;
    QComboBox* m_delimiter;
    QCheckBox* m_decimalComma;
    QLabel* m_fileLabel;
    QPushButton* m_browse;
    QLabel* m_sheetLabel;
    QComboBox* m_sheet;
    QLabel* m_valueLabels;
    std::optional<std::string> m_database;
    std::optional<std::string> m_query;
    QTableWidget* m_preview;
    QComboBox* m_outcome;
    QLineEdit* m_event;
    QListWidget* m_scores;
    QComboBox* m_scale;
    QComboBox* m_id;
    QListWidget* m_groups;
    QComboBox* m_period;
    QComboBox* m_cluster;
    QLabel* m_problem;
    QLabel* m_auditSummary;
    IntakeAuditModel* m_audit;
    QPushButton* m_check;
    QPushButton* m_run;
    QFutureWatcher<std::expected<IntakeResult, InputError>> m_watcher;
    std::optional<IntakeResult> m_checked;
    QString m_loadedPath;
    QString m_loadedOutcomesPath;
    std::vector<std::string> m_numericColumns;
    std::vector<std::string> m_categoryColumns;
    std::vector<std::string> m_header;
    bool m_runAfterCheck = false;
};

} // namespace plumbline
