#pragma once

#include "widgets/copyable_table_view.hpp"

namespace plumbline {

// The metric table: the metric's name and each model's estimate keep the width of their text;
// the models' readings share the rest of the width and wrap, so every model's reading stays on
// screen in a narrow window.
class MetricTableView : public CopyableTableView {
    Q_OBJECT
public:
    explicit MetricTableView(QWidget* parent = nullptr);
    void setModel(QAbstractItemModel* model) override;

protected:
    void resizeEvent(QResizeEvent* event) override;

private:
    void fitColumns();
};

} // namespace plumbline
