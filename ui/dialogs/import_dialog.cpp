#include "dialogs/import_dialog.hpp"

#include "intake/column_roles.hpp"
#include "widgets/copyable_table_view.hpp"
#include "intake/delimited_table.hpp"
#include "intake/query_table.hpp"
#include "intake/source_kind.hpp"
#include "intake/typed_source.hpp"
#include "intake/xlsx_table.hpp"
#include "models/intake_audit_model.hpp"
#include "widgets/save_location.hpp"

#include <QCheckBox>
#include <QComboBox>
#include <QDialogButtonBox>
#include <QFormLayout>
#include <QGroupBox>
#include <QGuiApplication>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QKeyEvent>
#include <QLabel>
#include <QLineEdit>
#include <QListWidget>
#include <QLocale>
#include <QPushButton>
#include <QScreen>
#include <QScrollArea>
#include <QSplitter>
#include <QTableWidget>
#include <QVBoxLayout>
#include <QtConcurrent/QtConcurrentRun>

namespace plumbline {

namespace {

const QString none = QObject::tr("(none)");
const QString delimitedFiles = QObject::tr("Delimited text (*.csv *.tsv *.txt);;All files (*)");
const QString cohortFiles = QObject::tr("Cohort files (*.csv *.tsv *.txt *.xlsx *.sas7bdat *.xpt *.dta *.sav *.zsav);;"
                                        "Delimited text (*.csv *.tsv *.txt);;Workbooks (*.xlsx);;"
                                        "SAS, Stata and SPSS files (*.sas7bdat *.xpt *.dta *.sav *.zsav);;All files (*)");

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

// A push button that Return never presses unless it is the dialog's default.
QPushButton* plainButton(const QString& text)
{
    auto* button = new QPushButton(text);
    button->setAutoDefault(false);
    return button;
}

QComboBox* columnBox()
{
    auto* box = new QComboBox;
    box->setSizeAdjustPolicy(QComboBox::AdjustToContents);
    box->setMinimumContentsLength(14);
    return box;
}

} // namespace

ImportDialog::ImportDialog(QWidget* parent)
    : QDialog(parent)
    , m_file(new QLineEdit)
    , m_twoFiles(new QCheckBox(tr("Outcomes are in a &second file, joined on an id")))
    , m_outcomesFile(new QLineEdit)
    , m_outcomesId(columnBox())
    , m_delimiter(new QComboBox)
    , m_decimalComma(new QCheckBox(tr("Decimal &comma (0,25)")))
    , m_fileLabel(new QLabel(tr("Cohort &file:")))
    , m_browse(plainButton(tr("&Browse…")))
    , m_sheetLabel(new QLabel(tr("S&heet:")))
    , m_sheet(new QComboBox)
    , m_valueLabels(new QLabel)
    , m_preview(new QTableWidget)
    , m_outcome(columnBox())
    , m_event(new QLineEdit)
    , m_scores(new QListWidget)
    , m_scale(new QComboBox)
    , m_id(columnBox())
    , m_groups(new QListWidget)
    , m_period(columnBox())
    , m_cluster(columnBox())
    , m_problem(new QLabel)
    , m_auditSummary(new QLabel)
    , m_audit(new IntakeAuditModel(this))
    , m_check(plainButton(tr("C&heck the data")))
    , m_run(new QPushButton(tr("&Run validation")))
{
    setWindowTitle(tr("Open a cohort"));
    m_file->setObjectName(QStringLiteral("cohortPath"));
    m_file->setPlaceholderText(tr("Type or paste a path and press Return, or Browse…"));
    m_file->installEventFilter(this);
    m_outcomesFile->setObjectName(QStringLiteral("outcomesPath"));
    m_twoFiles->setObjectName(QStringLiteral("twoFiles"));
    m_cluster->setObjectName(QStringLiteral("siteColumn"));
    m_scores->setObjectName(QStringLiteral("scoreColumns"));
    m_outcomesFile->setPlaceholderText(tr("Type or paste a path and press Return, or Browse…"));
    // A typed outcomes path is read on Return or when the box is left, like the cohort's.
    connect(m_outcomesFile, &QLineEdit::editingFinished, this, [this] {
        const QString typed = m_outcomesFile->text().trimmed();
        if (!typed.isEmpty() && typed != m_loadedOutcomesPath)
            loadOutcomesFile(typed);
    });
    m_delimiter->addItem(tr("Sniff"), QString());
    m_delimiter->addItem(tr("Comma"), QStringLiteral(","));
    m_delimiter->addItem(tr("Semicolon"), QStringLiteral(";"));
    m_delimiter->addItem(tr("Tab"), QStringLiteral("\t"));
    m_delimiter->addItem(tr("Pipe"), QStringLiteral("|"));
    for (const char* scale : {"probability", "percent", "logit", "points"})
        m_scale->addItem(QString::fromLatin1(scale));
    m_event->setPlaceholderText(tr("only when not 0/1, yes/no, y/n or true/false"));
    m_problem->setWordWrap(true);
    m_problem->setTextInteractionFlags(Qt::TextSelectableByMouse);
    m_problem->setStyleSheet(QStringLiteral("color: #b00020"));
    m_auditSummary->setWordWrap(true);
    m_auditSummary->setTextInteractionFlags(Qt::TextSelectableByMouse);
    m_auditSummary->setAlignment(Qt::AlignTop | Qt::AlignLeft);
    m_run->setDefault(true);
    m_run->setEnabled(false);
    m_run->setToolTip(tr("Checks the data if that was not done yet, then runs the validation (Return)"));
    buildLayout();
    connect(m_check, &QPushButton::clicked, this, [this] { startCheck(); });
    connect(m_run, &QPushButton::clicked, this, &ImportDialog::run);
    connect(&m_watcher, &QFutureWatcherBase::finished, this, [this] {
        m_check->setEnabled(true);
        showIntake(m_watcher.result());
        if (m_runAfterCheck && m_checked)
            accept();
        m_runAfterCheck = false;
    });
    // Any change of the mapping makes the last check stale.
    for (QComboBox* box : {m_scale, m_period, m_cluster, m_outcomesId, m_delimiter})
        connect(box, &QComboBox::currentIndexChanged, this, &ImportDialog::stale);
    // The outcome and the id are never offered as scores.
    auto names = [](const QStringList& list) {
        std::vector<std::string> out;
        for (const QString& name : list)
            out.push_back(name.toStdString());
        return out;
    };
    for (QComboBox* box : {m_outcome, m_id})
        connect(box, &QComboBox::currentIndexChanged, this, [this, names] {
            refreshScoreChoices(names(checkedItems(m_scores)));
            refreshGroupChoices(names(checkedItems(m_groups)));
            refreshSiteChoices(chosen(m_cluster));
            stale();
        });
    connect(m_scores, &QListWidget::itemChanged, this, [this, names] {
        refreshGroupChoices(names(checkedItems(m_groups)));
        refreshSiteChoices(chosen(m_cluster));
        stale();
    });
    connect(m_groups, &QListWidget::itemChanged, this, &ImportDialog::stale);
    connect(m_event, &QLineEdit::textChanged, this, &ImportDialog::stale);
    connect(m_decimalComma, &QCheckBox::toggled, this, &ImportDialog::stale);
    connect(m_twoFiles, &QCheckBox::toggled, this, [this](bool on) {
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
    m_sheet->setObjectName(QStringLiteral("sheet"));
    m_sheet->setAccessibleName(tr("Sheet"));
    m_sheetLabel->setBuddy(m_sheet);
    connect(m_sheet, &QComboBox::currentIndexChanged, this, [this] {
        if (!m_loadedPath.isEmpty() && isSpreadsheetPath(m_loadedPath.toStdString()))
            loadTypedSource();
    });
    m_valueLabels->setWordWrap(true);
    m_valueLabels->setTextInteractionFlags(Qt::TextSelectableByMouse);
    showSourceKind(true);
}

void ImportDialog::buildLayout()
{
    QPushButton* browse = m_browse;
    auto* browseOutcomes = plainButton(tr("Bro&wse…"));
    connect(browse, &QPushButton::clicked, this, [this] {
        const QString path = askOpenLocation(this, tr("Cohort file"), cohortFiles);
        if (!path.isEmpty())
            loadFile(path);
    });
    connect(browseOutcomes, &QPushButton::clicked, this, [this] {
        const QString path = askOpenLocation(this, tr("Outcomes file"), delimitedFiles);
        if (!path.isEmpty())
            loadOutcomesFile(path);
    });
    QLabel* fileLabel = m_fileLabel;
    fileLabel->setBuddy(m_file);
    auto* fileRow = new QHBoxLayout;
    fileRow->addWidget(fileLabel);
    fileRow->addWidget(m_file, 1);
    fileRow->addWidget(browse);
    fileRow->addWidget(m_sheetLabel);
    fileRow->addWidget(m_sheet);
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
    for (QListWidget* list : {m_scores, m_groups}) {
        list->setMinimumHeight(52);
        list->setSizePolicy(QSizePolicy::Preferred, QSizePolicy::Preferred);
    }
    auto* mapping = new QFormLayout;
    mapping->addRow(tr("&Outcome column:"), m_outcome);
    mapping->addRow(tr("&Event value:"), m_event);
    mapping->addRow(tr("&Score columns (one per model):"), m_scores);
    mapping->addRow(tr("Score s&cale:"), m_scale);
    mapping->addRow(tr("&Id column:"), m_id);
    mapping->addRow(tr("Sub&group columns:"), m_groups);
    mapping->addRow(tr("&Period (date) column:"), m_period);
    mapping->addRow(tr("Si&te column (pool across sites):"), m_cluster);
    auto* mappingBox = new QGroupBox(tr("What the columns are"));
    mappingBox->setLayout(mapping);

    auto* auditTable = new CopyableTableView;
    auditTable->setModel(m_audit);
    auditTable->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    auditTable->setMinimumHeight(60);
    auto* auditLayout = new QVBoxLayout;
    auditLayout->addWidget(m_check, 0, Qt::AlignLeft);
    // The summary and its warnings scroll, so a long audit never squeezes the preview.
    auto* summaryArea = new QScrollArea;
    summaryArea->setWidget(m_auditSummary);
    summaryArea->setWidgetResizable(true);
    summaryArea->setFrameShape(QFrame::NoFrame);
    summaryArea->setMinimumHeight(36);
    summaryArea->setMaximumHeight(100);
    auditLayout->addWidget(summaryArea);
    auditLayout->addWidget(auditTable, 1);
    auditLayout->addWidget(m_problem);
    auto* auditBox = new QGroupBox(tr("Every row accounted for"));
    auditBox->setLayout(auditLayout);

    auto* lower = new QSplitter(Qt::Horizontal);
    lower->addWidget(mappingBox);
    lower->addWidget(auditBox);
    lower->setChildrenCollapsible(false);
    m_preview->setEditTriggers(QAbstractItemView::NoEditTriggers);
    m_preview->setAccessibleName(tr("First rows as read"));
    m_preview->setMinimumHeight(70);
    auto* previewBox = new QGroupBox(tr("First rows, as Plumbline reads them"));
    auto* previewLayout = new QVBoxLayout(previewBox);
    previewLayout->addWidget(m_preview);
    previewLayout->addWidget(m_valueLabels);
    // The preview keeps its share of the height whatever the audit shows; the user can drag.
    auto* split = new QSplitter(Qt::Vertical);
    split->addWidget(previewBox);
    split->addWidget(lower);
    split->setStretchFactor(0, 2);
    split->setStretchFactor(1, 3);
    split->setSizes({260, 390});
    split->setChildrenCollapsible(false);

    auto* buttons = new QDialogButtonBox;
    buttons->addButton(m_run, QDialogButtonBox::AcceptRole);
    QPushButton* cancel = buttons->addButton(QDialogButtonBox::Cancel);
    cancel->setAutoDefault(false);
    connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);

    auto* layout = new QVBoxLayout(this);
    layout->addLayout(fileRow);
    layout->addLayout(outcomesRow);
    layout->addWidget(split, 1);
    layout->addWidget(buttons);
    // Fits the screen it opens on (a 1280×720 laptop included).
    const QRect screen = QGuiApplication::primaryScreen() ? QGuiApplication::primaryScreen()->availableGeometry() : QRect(0, 0, 1280, 720);
    resize(std::min(1100, screen.width() - 40), std::min(760, screen.height() - 60));
}

bool ImportDialog::eventFilter(QObject* watched, QEvent* event)
{
    // Return in the path box reads the typed file; once it is read, Return runs (the default).
    if (watched == m_file && event->type() == QEvent::KeyPress) {
        const int key = static_cast<QKeyEvent*>(event)->key();
        // A database's address is not a path: it is shown, not read, here.
        if ((key == Qt::Key_Return || key == Qt::Key_Enter) && !m_database && m_file->text().trimmed() != m_loadedPath) {
            loadFile(m_file->text().trimmed());
            return true;
        }
    }
    return QDialog::eventFilter(watched, event);
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
    m_run->setEnabled(mappingComplete());
}

QString ImportDialog::problemText() const
{
    return m_problem->text();
}

bool ImportDialog::mappingComplete() const
{
    return !m_loadedPath.isEmpty() && chosen(m_outcome).has_value() && !checkedItems(m_scores).isEmpty();
}

void ImportDialog::stale()
{
    m_checked.reset();
    m_run->setEnabled(mappingComplete());
}

void ImportDialog::run()
{
    if (m_checked) {
        accept();
        return;
    }
    if (!mappingComplete() || m_watcher.isRunning())
        return;
    m_runAfterCheck = true;
    startCheck();
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
    m_file->setReadOnly(false);
    m_fileLabel->setText(tr("Cohort &file:"));
    m_browse->setVisible(true);
    m_file->setToolTip(QString());
    m_file->setText(path);
    m_database.reset();
    m_query.reset();
    m_loadedPath.clear();
    m_problem->clear();
    m_auditSummary->clear();
    m_audit->setAudit({});
    m_valueLabels->clear();
    if (isTypedSourcePath(path.toStdString())) {
        showSourceKind(false);
        const QSignalBlocker quiet(m_sheet);
        m_sheet->clear();
        if (isSpreadsheetPath(path.toStdString())) {
            const auto sheets = xlsxSheetNames(path.toStdString());
            if (!sheets) {
                showProblem(QString::fromStdString(sheets.error().message()));
                return false;
            }
            for (const auto& sheet : *sheets)
                m_sheet->addItem(QString::fromStdString(sheet));
        }
        m_sheet->setVisible(m_sheet->count() > 0);
        m_sheetLabel->setVisible(m_sheet->count() > 0);
        m_loadedPath = path;
        if (!loadTypedSource()) {
            m_loadedPath.clear();
            return false;
        }
        rememberFolderOf(path, FolderUse::Reading);
        return true;
    }
    showSourceKind(true);
    const auto table = openTable(path);
    if (!table)
        return false;
    const auto profile = profileColumns(*table, 5000);
    if (!profile) {
        showProblem(QString::fromStdString(profile.error().message()));
        return false;
    }
    m_loadedPath = path;
    rememberFolderOf(path, FolderUse::Reading);
    showColumns(previewTable(*table, 20), *profile);
    return true;
}

bool ImportDialog::loadOutcomesFile(const QString& path)
{
    m_twoFiles->setChecked(true);
    m_outcomesFile->setText(path);
    m_loadedOutcomesPath = path;
    m_problem->clear();
    const auto table = openTable(path);
    if (!table)
        return false;
    rememberFolderOf(path, FolderUse::Reading);
    const QSignalBlocker blockOutcome(m_outcome);
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
    stale();
    return true;
}

bool ImportDialog::loadDatabase(const QString& database, const QString& query)
{
    m_database = database.trimmed().toStdString();
    m_query = query.trimmed().toStdString();
    m_file->setText(QString::fromStdString(databaseDisplayName(*m_database)));
    m_file->setReadOnly(true);
    m_fileLabel->setText(tr("&Database:"));
    m_browse->setVisible(false);
    m_file->setToolTip(tr("The cohort is this query's result:\n%1").arg(query.trimmed()));
    m_loadedPath = m_file->text();
    m_problem->clear();
    m_auditSummary->clear();
    m_audit->setAudit({});
    m_valueLabels->clear();
    showSourceKind(false);
    m_sheet->setVisible(false);
    m_sheetLabel->setVisible(false);
    if (!loadTypedSource()) {
        m_loadedPath.clear();
        return false;
    }
    return true;
}

// Delimiter, decimal comma and a second file belong to delimited text only.
void ImportDialog::showSourceKind(bool delimited)
{
    m_delimiter->setEnabled(delimited);
    m_decimalComma->setEnabled(delimited);
    m_twoFiles->setEnabled(delimited);
    if (!delimited)
        m_twoFiles->setChecked(false);
    if (delimited) {
        m_sheet->setVisible(false);
        m_sheetLabel->setVisible(false);
    }
}

bool ImportDialog::loadTypedSource()
{
    const IntakeSettings settings = intakeSettings();
    m_problem->clear();
    m_checked.reset();
    auto table = openTypedSource(settings);
    if (!table) {
        showProblem(QString::fromStdString(table.error().message()));
        return false;
    }
    const auto profile = profileColumns(**table, 5000);
    if (!profile) {
        showProblem(QString::fromStdString(profile.error().message()));
        return false;
    }
    const auto preview = previewTable(**table, 20);
    if (!preview) {
        showProblem(QString::fromStdString(preview.error().message()));
        return false;
    }
    QStringList labels;
    for (const auto& column : (*table)->columns()) {
        if (column.labels.empty())
            continue;
        QStringList pairs;
        for (const auto& label : column.labels)
            pairs << QString::number(label.value, 'g', 15) + QStringLiteral(" = ") + QString::fromStdString(label.label);
        labels << QStringLiteral("%1: %2").arg(QString::fromStdString(column.name), pairs.join(QStringLiteral(", ")));
    }
    m_valueLabels->setText(labels.isEmpty() ? QString()
                                            : tr("Value labels (the preview shows the labels; a label can be typed as the event value) — %1")
                                                  .arg(labels.join(QStringLiteral("; "))));
    showColumns(*preview, *profile);
    return true;
}

QStringList ImportDialog::sheetNames() const
{
    QStringList out;
    for (int i = 0; i < m_sheet->count(); ++i)
        out << m_sheet->itemText(i);
    return out;
}

bool ImportDialog::chooseSheet(const QString& sheet)
{
    const int index = m_sheet->findText(sheet);
    if (index < 0)
        return false;
    m_sheet->setCurrentIndex(index);
    return m_problem->text().isEmpty();
}

QString ImportDialog::valueLabelsText() const
{
    return m_valueLabels->text();
}

void ImportDialog::showColumns(const TablePreview& preview, const TableProfile& profile)
{
    m_numericColumns.clear();
    m_categoryColumns.clear();
    for (const auto& column : profile.columns) {
        if (couldHoldScores(column))
            m_numericColumns.push_back(column.name);
        if (couldBeSubgroup(column))
            m_categoryColumns.push_back(column.name);
    }
    showPreview(preview);
    fillColumnChoices(preview.header, guessColumnRoles(profile));
    stale();
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
        lines << (m_database ? tr("result row %1") : isTypedSourcePath(m_loadedPath.toStdString()) ? tr("row %1") : tr("line %1"))
                     .arg(preview.lines[r]);
        for (std::size_t c = 0; c < preview.rows[r].size() && c < preview.header.size(); ++c)
            m_preview->setItem(int(r), int(c), new QTableWidgetItem(QString::fromStdString(preview.rows[r][c])));
    }
    m_preview->setVerticalHeaderLabels(lines);
    m_preview->resizeColumnsToContents();
}

void ImportDialog::fillColumnChoices(const std::vector<std::string>& header, const ColumnRoles& roles)
{
    {
        const QSignalBlocker blockOutcome(m_outcome);
        const QSignalBlocker blockId(m_id);
        m_outcome->clear();
        m_id->clear();
        m_period->clear();
        m_outcome->addItem(none);
        m_id->addItem(none);
        m_period->addItem(none);
        for (const auto& name : header) {
            const QString column = QString::fromStdString(name);
            m_outcome->addItem(column);
            m_id->addItem(column);
            m_period->addItem(column);
        }
        if (roles.outcome)
            m_outcome->setCurrentText(QString::fromStdString(*roles.outcome));
        if (roles.id)
            m_id->setCurrentText(QString::fromStdString(*roles.id));
    }
    if (roles.period)
        m_period->setCurrentText(QString::fromStdString(*roles.period));
    m_scale->setCurrentText(QString::fromLatin1(scaleName(roles.scale).data()));
    m_header = header;
    refreshScoreChoices(roles.scores);
    refreshGroupChoices(roles.groups);
    refreshSiteChoices(roles.site);
}

void ImportDialog::refreshSiteChoices(const std::optional<std::string>& wanted)
{
    const QSignalBlocker block(m_cluster);
    m_cluster->clear();
    m_cluster->addItem(none);
    const auto outcome = chosen(m_outcome), id = chosen(m_id);
    const QStringList scores = checkedItems(m_scores);
    bool kept = false;
    for (const auto& name : m_header) {
        if (name == outcome || name == id || scores.contains(QString::fromStdString(name)))
            continue;
        m_cluster->addItem(QString::fromStdString(name));
        kept = kept || name == wanted;
    }
    // A choice now taken as the outcome, the id or a score falls back to none.
    m_cluster->setCurrentText(kept ? QString::fromStdString(*wanted) : none);
}

void ImportDialog::refreshScoreChoices(const std::vector<std::string>& wanted)
{
    const QSignalBlocker block(m_scores);
    m_scores->clear();
    const auto outcome = chosen(m_outcome), id = chosen(m_id);
    for (const auto& name : m_numericColumns) {
        if (name == outcome || name == id)
            continue;
        auto* item = new QListWidgetItem(QString::fromStdString(name), m_scores);
        item->setCheckState(std::find(wanted.begin(), wanted.end(), name) != wanted.end() ? Qt::Checked : Qt::Unchecked);
    }
}

void ImportDialog::refreshGroupChoices(const std::vector<std::string>& wanted)
{
    const QSignalBlocker block(m_groups);
    m_groups->clear();
    const auto outcome = chosen(m_outcome), id = chosen(m_id);
    const QStringList scores = checkedItems(m_scores);
    std::vector<std::string> offered = m_categoryColumns;
    for (const auto& name : wanted) // a saved choice stays offered even when it looks continuous
        if (std::find(offered.begin(), offered.end(), name) == offered.end())
            offered.push_back(name);
    for (const auto& name : offered) {
        if (name == outcome || name == id || scores.contains(QString::fromStdString(name)))
            continue;
        auto* item = new QListWidgetItem(QString::fromStdString(name), m_groups);
        item->setCheckState(std::find(wanted.begin(), wanted.end(), name) != wanted.end() ? Qt::Checked : Qt::Unchecked);
    }
}

QStringList ImportDialog::groupChoices() const
{
    QStringList out;
    for (int i = 0; i < m_groups->count(); ++i)
        out << m_groups->item(i)->text();
    return out;
}

QStringList ImportDialog::scoreChoices() const
{
    QStringList out;
    for (int i = 0; i < m_scores->count(); ++i)
        out << m_scores->item(i)->text();
    return out;
}

IntakeSettings ImportDialog::intakeSettings() const
{
    IntakeSettings s;
    if (m_database) {
        s.database = m_database;
        s.query = m_query;
    } else {
        s.cohortFile = m_file->text().toStdString();
        if (isSpreadsheetPath(s.cohortFile) && m_sheet->currentIndex() >= 0)
            s.sheet = m_sheet->currentText().toStdString();
    }
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
    s.clusterColumn = chosen(m_cluster);
    if (!m_event->text().trimmed().isEmpty())
        s.eventValue = m_event->text().trimmed().toStdString();
    s.scale = *scaleFromName(m_scale->currentText().toStdString());
    s.scaleGiven = m_scale->currentIndex() != 0;
    if (!s.database && !isTypedSourcePath(s.cohortFile)) {
        s.delimiter = delimiterChoice();
        s.decimalComma = m_decimalComma->isChecked();
    }
    return s;
}

void ImportDialog::setMapping(const IntakeSettings& settings)
{
    m_outcome->setCurrentText(settings.outcomeColumn.empty() ? none : QString::fromStdString(settings.outcomeColumn));
    m_id->setCurrentText(settings.idColumn ? QString::fromStdString(*settings.idColumn) : none);
    refreshScoreChoices(settings.scoreColumns);
    refreshGroupChoices(settings.groupColumns);
    m_period->setCurrentText(settings.periodColumn ? QString::fromStdString(*settings.periodColumn) : none);
    refreshSiteChoices(settings.clusterColumn);
    m_scale->setCurrentText(QString::fromLatin1(scaleName(settings.scale).data()));
    m_event->setText(settings.eventValue ? QString::fromStdString(*settings.eventValue) : QString());
    stale();
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
