#include "import_dialog.hpp"

#include "column_roles.hpp"
#include "copyable_table_view.hpp"
#include "delimited_table.hpp"
#include "intake_audit_model.hpp"

#include <QCheckBox>
#include <QComboBox>
#include <QDialogButtonBox>
#include <QFileDialog>
#include <QFormLayout>
#include <QGroupBox>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QLineEdit>
#include <QListWidget>
#include <QLocale>
#include <QPushButton>
#include <QSplitter>
#include <QTableWidget>
#include <QVBoxLayout>
#include <QtConcurrent/QtConcurrentRun>

namespace plumbline {

namespace {

const QString none = QObject::tr("(none)");

QStringList checkedItems(const QListWidget* list)
{
    QStringList out;
    for (int i = 0; i < list->count(); ++i)
        if (list->item(i)->checkState() == Qt::Checked)
            out << list->item(i)->text();
    return out;
}

std::optional<std::string> chosen(const QComboBox* box)
{
    if (box->currentIndex() <= 0 || box->currentText() == none)
        return std::nullopt;
    return box->currentText().toStdString();
}

} // namespace

ImportDialog::ImportDialog(QWidget* parent)
    : QDialog(parent)
    , m_file(new QLineEdit)
    , m_twoFiles(new QCheckBox(tr("Outcomes are in a &second file, joined on an id")))
    , m_outcomesFile(new QLineEdit)
    , m_outcomesId(new QComboBox)
    , m_delimiter(new QComboBox)
    , m_decimalComma(new QCheckBox(tr("Decimal &comma (0,25)")))
    , m_preview(new QTableWidget)
    , m_outcome(new QComboBox)
    , m_event(new QLineEdit)
    , m_scores(new QListWidget)
    , m_scale(new QComboBox)
    , m_id(new QComboBox)
    , m_groups(new QListWidget)
    , m_period(new QComboBox)
    , m_problem(new QLabel)
    , m_auditSummary(new QLabel)
    , m_audit(new IntakeAuditModel(this))
    , m_check(new QPushButton(tr("C&heck the data")))
    , m_run(new QPushButton(tr("&Run validation")))
{
    setWindowTitle(tr("Open a cohort"));
    m_delimiter->addItem(tr("Sniff"), QString());
    m_delimiter->addItem(tr("Comma"), QStringLiteral(","));
    m_delimiter->addItem(tr("Semicolon"), QStringLiteral(";"));
    m_delimiter->addItem(tr("Tab"), QStringLiteral("\t"));
    m_delimiter->addItem(tr("Pipe"), QStringLiteral("|"));
    for (const char* scale : {"probability", "percent", "logit", "points"})
        m_scale->addItem(QString::fromLatin1(scale));
    m_event->setPlaceholderText(tr("needed only when the values are not 0/1, yes/no, y/n or true/false"));
    m_problem->setWordWrap(true);
    m_problem->setTextInteractionFlags(Qt::TextSelectableByMouse);
    m_problem->setStyleSheet(QStringLiteral("color: #b00020"));
    m_auditSummary->setWordWrap(true);
    m_run->setDefault(true);
    m_run->setEnabled(false);
    buildLayout();
    connect(m_check, &QPushButton::clicked, this, [this] { startCheck(); });
    connect(m_run, &QPushButton::clicked, this, [this] {
        if (m_checked)
            accept();
    });
    connect(&m_watcher, &QFutureWatcherBase::finished, this, [this] {
        m_check->setEnabled(true);
        showIntake(m_watcher.result());
    });
    // Any change of the mapping makes the last check stale.
    auto stale = [this] {
        m_checked.reset();
        m_run->setEnabled(false);
    };
    for (QComboBox* box : {m_outcome, m_scale, m_id, m_period, m_outcomesId, m_delimiter})
        connect(box, &QComboBox::currentIndexChanged, this, stale);
    connect(m_scores, &QListWidget::itemChanged, this, stale);
    connect(m_groups, &QListWidget::itemChanged, this, stale);
    connect(m_event, &QLineEdit::textChanged, this, stale);
    connect(m_decimalComma, &QCheckBox::toggled, this, stale);
    connect(m_twoFiles, &QCheckBox::toggled, this, [this, stale](bool on) {
        m_outcomesFile->setEnabled(on);
        m_outcomesId->setEnabled(on);
        stale();
    });
    connect(m_delimiter, &QComboBox::currentIndexChanged, this, [this] {
        if (!m_file->text().isEmpty())
            loadFile(m_file->text());
    });
    m_outcomesFile->setEnabled(false);
    m_outcomesId->setEnabled(false);
}

void ImportDialog::buildLayout()
{
    auto* browse = new QPushButton(tr("&Browse…"));
    auto* browseOutcomes = new QPushButton(tr("Bro&wse…"));
    connect(browse, &QPushButton::clicked, this, [this] {
        const QString path = QFileDialog::getOpenFileName(this, tr("Cohort file"), QString(),
                                                          tr("Delimited text (*.csv *.tsv *.txt);;All files (*)"));
        if (!path.isEmpty())
            loadFile(path);
    });
    connect(browseOutcomes, &QPushButton::clicked, this, [this] {
        const QString path = QFileDialog::getOpenFileName(this, tr("Outcomes file"), QString(),
                                                          tr("Delimited text (*.csv *.tsv *.txt);;All files (*)"));
        if (!path.isEmpty())
            loadOutcomesFile(path);
    });
    auto* fileRow = new QHBoxLayout;
    fileRow->addWidget(new QLabel(tr("Cohort file:")));
    fileRow->addWidget(m_file, 1);
    fileRow->addWidget(browse);
    fileRow->addWidget(new QLabel(tr("Delimiter:")));
    fileRow->addWidget(m_delimiter);
    fileRow->addWidget(m_decimalComma);
    auto* outcomesRow = new QHBoxLayout;
    outcomesRow->addWidget(m_twoFiles);
    outcomesRow->addWidget(m_outcomesFile, 1);
    outcomesRow->addWidget(browseOutcomes);
    outcomesRow->addWidget(new QLabel(tr("its id column:")));
    outcomesRow->addWidget(m_outcomesId);

    m_scores->setAccessibleName(tr("Score columns"));
    m_groups->setAccessibleName(tr("Subgroup columns"));
    auto* mapping = new QFormLayout;
    mapping->addRow(tr("&Outcome column:"), m_outcome);
    mapping->addRow(tr("&Event value:"), m_event);
    mapping->addRow(tr("&Score columns (one per model):"), m_scores);
    mapping->addRow(tr("Score s&cale:"), m_scale);
    mapping->addRow(tr("&Id column:"), m_id);
    mapping->addRow(tr("Sub&group columns:"), m_groups);
    mapping->addRow(tr("&Period (date) column:"), m_period);
    auto* mappingBox = new QGroupBox(tr("What the columns are"));
    mappingBox->setLayout(mapping);

    auto* auditTable = new CopyableTableView;
    auditTable->setModel(m_audit);
    auditTable->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    auto* auditLayout = new QVBoxLayout;
    auditLayout->addWidget(m_check);
    auditLayout->addWidget(m_auditSummary);
    auditLayout->addWidget(auditTable, 1);
    auditLayout->addWidget(m_problem);
    auto* auditBox = new QGroupBox(tr("Every row accounted for"));
    auditBox->setLayout(auditLayout);

    auto* lower = new QHBoxLayout;
    lower->addWidget(mappingBox, 1);
    lower->addWidget(auditBox, 1);
    auto* buttons = new QDialogButtonBox;
    buttons->addButton(m_run, QDialogButtonBox::AcceptRole);
    buttons->addButton(QDialogButtonBox::Cancel);
    connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);

    m_preview->setEditTriggers(QAbstractItemView::NoEditTriggers);
    m_preview->setAccessibleName(tr("First rows as read"));
    auto* layout = new QVBoxLayout(this);
    layout->addLayout(fileRow);
    layout->addLayout(outcomesRow);
    layout->addWidget(new QLabel(tr("First rows, as Plumbline reads them:")));
    layout->addWidget(m_preview, 1);
    layout->addLayout(lower, 2);
    layout->addWidget(buttons);
    resize(1100, 760);
}

std::optional<char> ImportDialog::delimiterChoice() const
{
    const QString d = m_delimiter->currentData().toString();
    return d.isEmpty() ? std::nullopt : std::optional<char>(d.at(0).toLatin1());
}

void ImportDialog::showProblem(const QString& text)
{
    m_problem->setText(text);
    m_checked.reset();
    m_run->setEnabled(false);
}

QString ImportDialog::problemText() const
{
    return m_problem->text();
}

std::optional<DelimitedTable> ImportDialog::openTable(const QString& path)
{
    auto file = TextFile::load(path.toStdString());
    auto table = file ? DelimitedTable::open(std::move(*file), delimiterChoice())
                      : std::expected<DelimitedTable, InputError>(std::unexpected(file.error()));
    if (!table) {
        showProblem(QString::fromStdString(table.error().message()));
        return std::nullopt;
    }
    return std::move(*table);
}

bool ImportDialog::loadFile(const QString& path)
{
    m_file->setText(path);
    m_problem->clear();
    const auto table = openTable(path);
    if (!table)
        return false;
    const auto profile = profileColumns(*table, 5000);
    if (!profile) {
        showProblem(QString::fromStdString(profile.error().message()));
        return false;
    }
    showPreview(previewTable(*table, 20));
    fillColumnChoices(table->header(), guessColumnRoles(*profile));
    return true;
}

bool ImportDialog::loadOutcomesFile(const QString& path)
{
    m_twoFiles->setChecked(true);
    m_outcomesFile->setText(path);
    const auto table = openTable(path);
    if (!table)
        return false;
    m_outcomesId->clear();
    m_outcome->clear();
    m_outcome->addItem(none);
    for (const auto& name : table->header()) {
        m_outcomesId->addItem(QString::fromStdString(name));
        m_outcome->addItem(QString::fromStdString(name));
    }
    if (const auto profile = profileColumns(*table, 5000)) {
        const ColumnRoles roles = guessColumnRoles(*profile);
        if (roles.outcome)
            m_outcome->setCurrentText(QString::fromStdString(*roles.outcome));
        if (roles.id)
            m_outcomesId->setCurrentText(QString::fromStdString(*roles.id));
    }
    return true;
}

void ImportDialog::showPreview(const TablePreview& preview)
{
    m_preview->clear();
    m_preview->setColumnCount(int(preview.header.size()));
    m_preview->setRowCount(int(preview.rows.size()));
    QStringList header;
    for (const auto& name : preview.header)
        header << QString::fromStdString(name);
    m_preview->setHorizontalHeaderLabels(header);
    QStringList lines;
    for (std::size_t r = 0; r < preview.rows.size(); ++r) {
        lines << tr("line %1").arg(preview.lines[r]);
        for (std::size_t c = 0; c < preview.rows[r].size() && c < preview.header.size(); ++c)
            m_preview->setItem(int(r), int(c), new QTableWidgetItem(QString::fromStdString(preview.rows[r][c])));
    }
    m_preview->setVerticalHeaderLabels(lines);
    m_preview->resizeColumnsToContents();
}

void ImportDialog::fillColumnChoices(const std::vector<std::string>& header, const ColumnRoles& roles)
{
    const QSignalBlocker blockOutcome(m_outcome);
    m_outcome->clear();
    m_id->clear();
    m_period->clear();
    m_scores->clear();
    m_groups->clear();
    m_outcome->addItem(none);
    m_id->addItem(none);
    m_period->addItem(none);
    auto has = [](const std::vector<std::string>& list, const std::string& name) {
        return std::find(list.begin(), list.end(), name) != list.end();
    };
    for (const auto& name : header) {
        const QString column = QString::fromStdString(name);
        m_outcome->addItem(column);
        m_id->addItem(column);
        m_period->addItem(column);
        auto* score = new QListWidgetItem(column, m_scores);
        score->setCheckState(has(roles.scores, name) ? Qt::Checked : Qt::Unchecked);
        auto* group = new QListWidgetItem(column, m_groups);
        group->setCheckState(has(roles.groups, name) ? Qt::Checked : Qt::Unchecked);
    }
    if (roles.outcome)
        m_outcome->setCurrentText(QString::fromStdString(*roles.outcome));
    if (roles.id)
        m_id->setCurrentText(QString::fromStdString(*roles.id));
    if (roles.period)
        m_period->setCurrentText(QString::fromStdString(*roles.period));
    m_scale->setCurrentText(QString::fromLatin1(scaleName(roles.scale).data()));
}

IntakeSettings ImportDialog::intakeSettings() const
{
    IntakeSettings s;
    s.cohortFile = m_file->text().toStdString();
    if (m_twoFiles->isChecked() && !m_outcomesFile->text().isEmpty()) {
        s.outcomesFile = m_outcomesFile->text().toStdString();
        if (m_outcomesId->currentIndex() >= 0)
            s.outcomesIdColumn = m_outcomesId->currentText().toStdString();
    }
    s.outcomeColumn = chosen(m_outcome).value_or(std::string());
    for (const QString& score : checkedItems(m_scores))
        s.scoreColumns.push_back(score.toStdString());
    for (const QString& group : checkedItems(m_groups))
        s.groupColumns.push_back(group.toStdString());
    s.idColumn = chosen(m_id);
    s.periodColumn = chosen(m_period);
    if (!m_event->text().trimmed().isEmpty())
        s.eventValue = m_event->text().trimmed().toStdString();
    s.scale = *scaleFromName(m_scale->currentText().toStdString());
    s.scaleGiven = m_scale->currentIndex() != 0;
    s.delimiter = delimiterChoice();
    s.decimalComma = m_decimalComma->isChecked();
    return s;
}

void ImportDialog::setMapping(const IntakeSettings& settings)
{
    auto check = [](QListWidget* list, const std::vector<std::string>& names) {
        for (int i = 0; i < list->count(); ++i) {
            const bool wanted = std::find(names.begin(), names.end(), list->item(i)->text().toStdString()) != names.end();
            list->item(i)->setCheckState(wanted ? Qt::Checked : Qt::Unchecked);
        }
    };
    m_outcome->setCurrentText(QString::fromStdString(settings.outcomeColumn));
    check(m_scores, settings.scoreColumns);
    check(m_groups, settings.groupColumns);
    m_id->setCurrentText(settings.idColumn ? QString::fromStdString(*settings.idColumn) : none);
    m_period->setCurrentText(settings.periodColumn ? QString::fromStdString(*settings.periodColumn) : none);
    m_scale->setCurrentText(QString::fromLatin1(scaleName(settings.scale).data()));
    m_event->setText(settings.eventValue ? QString::fromStdString(*settings.eventValue) : QString());
}

bool ImportDialog::checkNow()
{
    const auto result = runIntake(intakeSettings());
    showIntake(result);
    return result.has_value();
}

void ImportDialog::startCheck()
{
    m_check->setEnabled(false);
    m_auditSummary->setText(tr("Reading…"));
    const IntakeSettings settings = intakeSettings();
    m_watcher.setFuture(QtConcurrent::run([settings] { return runIntake(settings); }));
}

void ImportDialog::showIntake(const std::expected<IntakeResult, InputError>& result)
{
    if (!result) {
        m_auditSummary->clear();
        m_audit->setAudit({});
        showProblem(QString::fromStdString(result.error().message()));
        return;
    }
    m_problem->clear();
    const IntakeAudit& a = result->audit;
    const QLocale locale;
    QString text = tr("Rows read %1, used %2 (%3 events, %4 without), excluded %5.")
                       .arg(locale.toString(qulonglong(a.rowsRead)), locale.toString(qulonglong(a.rowsUsed)),
                            locale.toString(qulonglong(a.events)), locale.toString(qulonglong(a.nonEvents)),
                            locale.toString(qulonglong(a.rowsExcluded())));
    if (a.join)
        text += tr(" Join: %1 matched, %2 score rows without outcome, %3 outcome rows without score.")
                    .arg(locale.toString(qulonglong(a.join->matched)), locale.toString(qulonglong(a.join->scoresWithoutOutcome)),
                         locale.toString(qulonglong(a.join->outcomesWithoutScore)));
    for (const auto& warning : a.warnings)
        text += QStringLiteral("\n") + QString::fromStdString(warning);
    m_auditSummary->setText(text);
    m_audit->setAudit(a);
    m_checked = *result;
    m_run->setEnabled(true);
}

} // namespace plumbline
