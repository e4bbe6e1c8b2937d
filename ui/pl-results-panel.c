/* SPDX-License-Identifier: GPL-3.0-or-later */

#include "config.h"

#include "pl-results-panel.h"

#include <glib/gi18n.h>
#include <math.h>

#include "pl-findings-list.h"

/* --- one row of a table (private) --- */

/* A row stays in its table while the set of parts and ports stays the same;
 * only its cells change.  They are worked out when the row is shown (bound
 * to a widget) or asked for, for the panel's current snapshot, so an update
 * costs the rows on screen and not the whole table. */
#define PL_TYPE_RESULT_ROW (pl_result_row_get_type ())
G_DECLARE_FINAL_TYPE (PlResultRow, pl_result_row, PL, RESULT_ROW, GObject)

struct _PlResultRow
{
  GObject parent_instance;
  PlResultsTable table;
  char *part_id;       /* may be NULL (a finding about the whole line) */
  guint part_index;    /* in the compiled layout the rows were made from */
  guint port_index;    /* points table only */
  GStrv cells;         /* NULL until worked out */
  guint64 generation;  /* the panel's snapshot generation the cells are of */
  guint n_bound;       /* cell widgets showing this row */
  pls_severity severity;
};

enum
{
  ROW_SIGNAL_CHANGED,  /* the cells changed: bound widgets show them again */
  N_ROW_SIGNALS
};

static guint row_signals[N_ROW_SIGNALS];

G_DEFINE_FINAL_TYPE (PlResultRow, pl_result_row, G_TYPE_OBJECT)

static void
pl_result_row_finalize (GObject *object)
{
  PlResultRow *self = PL_RESULT_ROW (object);

  g_free (self->part_id);
  g_strfreev (self->cells);
  G_OBJECT_CLASS (pl_result_row_parent_class)->finalize (object);
}

static void
pl_result_row_class_init (PlResultRowClass *klass)
{
  G_OBJECT_CLASS (klass)->finalize = pl_result_row_finalize;
  row_signals[ROW_SIGNAL_CHANGED] = g_signal_new ("changed", G_TYPE_FROM_CLASS (klass),
                                                  G_SIGNAL_RUN_LAST, 0, NULL, NULL, NULL,
                                                  G_TYPE_NONE, 0);
}

static void
pl_result_row_init (PlResultRow *self)
{
}

/* Takes cells (may be NULL: worked out when needed). */
static PlResultRow *
pl_result_row_new (PlResultsTable table, const char *part_id, guint part_index,
                   guint port_index, GStrv cells)
{
  PlResultRow *row = g_object_new (PL_TYPE_RESULT_ROW, NULL);

  row->table = table;
  row->part_id = g_strdup (part_id);
  row->part_index = part_index;
  row->port_index = port_index;
  row->cells = cells;
  return row;
}

static gboolean
pl_result_row_same_cells (PlResultRow *row, char **cells)
{
  return row->cells != NULL && g_strv_equal ((const char *const *) row->cells,
                                             (const char *const *) cells);
}

/* --- the panel --- */

enum
{
  SIGNAL_PART_ACTIVATED,
  N_SIGNALS
};

static guint signals[N_SIGNALS];

/* The pages that are refreshed on their own: the three tables (numbered as
 * PlResultsTable) and the plots. */
#define PAGE_PLOT PL_N_RESULTS_TABLES
#define N_PAGES (PL_N_RESULTS_TABLES + 1)

struct _PlResultsPanel
{
  GtkWidget parent_instance;

  PlDocument *doc;
  PlUnitPrefs prefs;
  PlResults *fast;
  PlResults *full;
  gboolean stale;

  GtkWidget *box;
  GtkWidget *stale_bar;
  GtkWidget *stack;
  GListStore *stores[PL_N_RESULTS_TABLES];
  GtkWidget *views[PL_N_RESULTS_TABLES];
  GtkWidget *pages[PL_N_RESULTS_TABLES];
  GPtrArray *columns[PL_N_RESULTS_TABLES];  /* GtkColumnViewColumn, for unit titles */
  GtkWidget *plots[2];
  GtkWidget *plot_stack;
  GtkWidget *chooser;        /* GtkListBox of GtkCheckButtons */
  GHashTable *plotted;       /* "id/port" -> TRUE, when the user chose */
  gboolean user_chose;
  gboolean building_chooser;
  char *chooser_signature;

  /* Incremental refresh: every new snapshot bumps the generation and marks
   * the pages dirty; the visible page is brought up to date once a frame
   * (tick_id), hidden ones when they are shown or asked for. */
  guint64 generation;
  gboolean dirty[N_PAGES];
  char *row_signature[PL_N_RESULTS_TABLES];  /* parts and ports the rows are of */
  guint tick_id;
  guint n_rebuilds[PL_N_RESULTS_TABLES];
};

G_DEFINE_FINAL_TYPE (PlResultsPanel, pl_results_panel, GTK_TYPE_WIDGET)

/* --- formatting --- */

static char *
pl_results_panel_fmt (PlResultsPanel *self, gboolean ok, double si, PlQuantity q)
{
  if (!ok)
    return g_strdup ("–");
  return pl_unit_format_number (si, q, &self->prefs, PL_UNIT_DEFAULT_DIGITS,
                                PL_UNIT_DECIMAL_FROM_LOCALE);
}

static const char *
pl_results_panel_unit_symbol (PlResultsPanel *self, PlQuantity q)
{
  const PlUnit *u = pl_unit_get (pl_unit_prefs_get_unit (&self->prefs, q));

  return u != NULL ? u->symbol : "";
}

/* --- list item factories --- */

static char **pl_results_panel_row_cells (PlResultsPanel *self, PlResultRow *row);

/* The full text of a cell (it may be ellipsized).  Asked for when the
 * tooltip is about to show: setting a tooltip text on every change would
 * ask the display where the pointer is, a round trip per cell. */
static gboolean
cell_query_tooltip_cb (GtkWidget  *label,
                       int         x,
                       int         y,
                       gboolean    keyboard,
                       GtkTooltip *tooltip,
                       gpointer    data)
{
  const char *text = gtk_label_get_text (GTK_LABEL (label));

  if (text == NULL || text[0] == '\0')
    return FALSE;
  gtk_tooltip_set_text (tooltip, text);
  return TRUE;
}

static void
cell_setup_cb (GtkSignalListItemFactory *factory, GtkListItem *item, gpointer data)
{
  GtkWidget *label = gtk_label_new (NULL);
  gboolean numeric = GPOINTER_TO_INT (g_object_get_data (G_OBJECT (factory), "numeric"));

  gtk_label_set_xalign (GTK_LABEL (label), numeric ? 1.0 : 0.0);
  gtk_label_set_ellipsize (GTK_LABEL (label), PANGO_ELLIPSIZE_END);
  if (numeric)
    gtk_widget_add_css_class (label, "numeric");
  g_object_set_data (G_OBJECT (label), "column", data);
  gtk_widget_set_has_tooltip (label, TRUE);
  g_signal_connect (label, "query-tooltip", G_CALLBACK (cell_query_tooltip_cb), NULL);
  gtk_list_item_set_child (item, label);
}

static void
cell_show (PlResultRow *row, GtkWidget *label)
{
  guint col = GPOINTER_TO_UINT (g_object_get_data (G_OBJECT (label), "column"));
  const char *text = row->cells != NULL && col < g_strv_length (row->cells)
                     ? row->cells[col] : "";

  gtk_label_set_text (GTK_LABEL (label), text);
}

static void
cell_changed_cb (PlResultRow *row, GtkWidget *label)
{
  cell_show (row, label);
}

static void
cell_bind_cb (GtkSignalListItemFactory *factory, GtkListItem *item, gpointer data)
{
  PlResultsPanel *panel = g_object_get_data (G_OBJECT (factory), "panel");
  PlResultRow *row = gtk_list_item_get_item (item);
  GtkWidget *label = gtk_list_item_get_child (item);

  pl_results_panel_row_cells (panel, row);
  cell_show (row, label);
  g_signal_connect (row, "changed", G_CALLBACK (cell_changed_cb), label);
  row->n_bound++;
}

static void
cell_unbind_cb (GtkSignalListItemFactory *factory, GtkListItem *item, gpointer data)
{
  PlResultRow *row = gtk_list_item_get_item (item);
  GtkWidget *label = gtk_list_item_get_child (item);

  g_signal_handlers_disconnect_by_func (row, cell_changed_cb, label);
  row->n_bound--;
}

static void
finding_setup_cb (GtkSignalListItemFactory *factory, GtkListItem *item, gpointer data)
{
  GtkWidget *box = gtk_box_new (GTK_ORIENTATION_HORIZONTAL, 8);
  GtkWidget *icon = gtk_image_new ();
  GtkWidget *label = gtk_label_new (NULL);

  gtk_widget_set_valign (icon, GTK_ALIGN_START);
  gtk_label_set_xalign (GTK_LABEL (label), 0.0);
  gtk_label_set_wrap (GTK_LABEL (label), TRUE);
  gtk_widget_set_hexpand (label, TRUE);
  gtk_widget_set_margin_top (box, 4);
  gtk_widget_set_margin_bottom (box, 4);
  gtk_widget_set_margin_start (box, 6);
  gtk_widget_set_margin_end (box, 6);
  gtk_box_append (GTK_BOX (box), icon);
  gtk_box_append (GTK_BOX (box), label);
  gtk_list_item_set_child (item, box);
}

static void
finding_bind_cb (GtkSignalListItemFactory *factory, GtkListItem *item, gpointer data)
{
  PlResultRow *row = gtk_list_item_get_item (item);
  GtkWidget *box = gtk_list_item_get_child (item);
  GtkWidget *icon = gtk_widget_get_first_child (box);
  GtkWidget *label = gtk_widget_get_next_sibling (icon);
  static const char *const classes[] = { "pl-info", "pl-warning", "pl-error" };

  gtk_image_set_from_icon_name (GTK_IMAGE (icon), pl_finding_get_icon_name (row->severity));
  gtk_accessible_update_property (GTK_ACCESSIBLE (icon), GTK_ACCESSIBLE_PROPERTY_LABEL,
                                  row->cells[0], -1);
  gtk_widget_set_tooltip_text (icon, row->cells[0]);
  for (guint i = 0; i < G_N_ELEMENTS (classes); i++)
    gtk_widget_remove_css_class (icon, classes[i]);
  gtk_widget_add_css_class (icon, classes[CLAMP ((int) row->severity, 0, 2)]);
  gtk_label_set_text (GTK_LABEL (label), row->cells[1]);
  gtk_widget_set_tooltip_text (box, row->part_id != NULL
                               ? _("Activate to select the part on the drawing") : NULL);
}

static void pl_results_panel_flush_page (PlResultsPanel *self, guint page);

static void
pl_results_panel_emit_row (PlResultsPanel *self, PlResultsTable table, guint position)
{
  g_autoptr (PlResultRow) row = NULL;

  pl_results_panel_flush_page (self, table);
  row = g_list_model_get_item (G_LIST_MODEL (self->stores[table]), position);
  if (row != NULL && row->part_id != NULL)
    g_signal_emit (self, signals[SIGNAL_PART_ACTIVATED], 0, row->part_id);
}

static void
column_view_activate_cb (GtkColumnView *view, guint position, PlResultsPanel *self)
{
  PlResultsTable table = GPOINTER_TO_UINT (g_object_get_data (G_OBJECT (view), "table"));

  pl_results_panel_emit_row (self, table, position);
}

static void
list_view_activate_cb (GtkListView *view, guint position, PlResultsPanel *self)
{
  pl_results_panel_emit_row (self, PL_RESULTS_TABLE_FINDINGS, position);
}

static GtkWidget *
pl_results_panel_make_table (PlResultsPanel *self, PlResultsTable table, const char *name,
                             guint n_columns, const gboolean *numeric)
{
  GtkSelectionModel *sel;
  GtkWidget *view, *scroller;

  self->stores[table] = g_list_store_new (PL_TYPE_RESULT_ROW);
  sel = GTK_SELECTION_MODEL (gtk_single_selection_new (
                               G_LIST_MODEL (g_object_ref (self->stores[table]))));
  /* No row is picked before the user picks one. */
  gtk_single_selection_set_autoselect (GTK_SINGLE_SELECTION (sel), FALSE);
  gtk_single_selection_set_can_unselect (GTK_SINGLE_SELECTION (sel), TRUE);
  gtk_single_selection_set_selected (GTK_SINGLE_SELECTION (sel), GTK_INVALID_LIST_POSITION);
  view = gtk_column_view_new (sel);
  gtk_column_view_set_show_column_separators (GTK_COLUMN_VIEW (view), TRUE);
  gtk_column_view_set_show_row_separators (GTK_COLUMN_VIEW (view), TRUE);
  gtk_column_view_set_reorderable (GTK_COLUMN_VIEW (view), FALSE);
  g_object_set_data (G_OBJECT (view), "table", GUINT_TO_POINTER (table));
  g_signal_connect (view, "activate", G_CALLBACK (column_view_activate_cb), self);
  gtk_accessible_update_property (GTK_ACCESSIBLE (view), GTK_ACCESSIBLE_PROPERTY_LABEL,
                                  name, -1);
  self->columns[table] = g_ptr_array_new_with_free_func (g_object_unref);
  for (guint c = 0; c < n_columns; c++)
    {
      GtkListItemFactory *f = gtk_signal_list_item_factory_new ();
      GtkColumnViewColumn *col;

      g_object_set_data (G_OBJECT (f), "numeric", GINT_TO_POINTER (numeric[c]));
      /* Not a reference: the factory lives inside the panel. */
      g_object_set_data (G_OBJECT (f), "panel", self);
      g_signal_connect (f, "setup", G_CALLBACK (cell_setup_cb), GUINT_TO_POINTER (c));
      g_signal_connect (f, "bind", G_CALLBACK (cell_bind_cb), NULL);
      g_signal_connect (f, "unbind", G_CALLBACK (cell_unbind_cb), NULL);
      col = gtk_column_view_column_new ("", f);
      gtk_column_view_column_set_resizable (col, TRUE);
      gtk_column_view_column_set_expand (col, !numeric[c] && c == n_columns - 1);
      gtk_column_view_append_column (GTK_COLUMN_VIEW (view), col);
      g_ptr_array_add (self->columns[table], col);
    }
  self->views[table] = view;
  scroller = gtk_scrolled_window_new ();
  gtk_scrolled_window_set_child (GTK_SCROLLED_WINDOW (scroller), view);
  gtk_widget_set_vexpand (scroller, TRUE);
  self->pages[table] = scroller;
  return scroller;
}

static void
pl_results_panel_set_titles (PlResultsPanel *self)
{
  const char *p = pl_results_panel_unit_symbol (self, PL_QUANTITY_PRESSURE);
  const char *q = pl_results_panel_unit_symbol (self, PL_QUANTITY_FLOW);
  char *points[] = {
    g_strdup (_("Part")), g_strdup (_("Port")),
    /* Translators: column titles with the unit, "Idle (bar)". */
    g_strdup_printf (_("Idle (%s)"), p), g_strdup_printf (_("All open (%s)"), p),
    g_strdup_printf (_("Cycle min (%s)"), p), g_strdup_printf (_("Cycle max (%s)"), p),
    g_strdup_printf (_("Recovery (%s)"), pl_results_panel_unit_symbol (self,
                                                                       PL_QUANTITY_TIME)),
  };
  char *parts[] = {
    g_strdup (_("Part")), g_strdup (_("Type")), g_strdup_printf (_("Flow, all open (%s)"), q),
    g_strdup_printf (_("Velocity (%s)"), pl_results_panel_unit_symbol (self,
                                                                       PL_QUANTITY_VELOCITY)),
    g_strdup (_("Reynolds")),
    g_strdup_printf (_("Shot (%s)"), pl_results_panel_unit_symbol (self, PL_QUANTITY_MASS)),
    g_strdup (_("Deviation")), g_strdup (_("Other figures")),
  };

  for (guint c = 0; c < G_N_ELEMENTS (points); c++)
    {
      gtk_column_view_column_set_title (g_ptr_array_index (self->columns[0], c), points[c]);
      g_free (points[c]);
    }
  for (guint c = 0; c < G_N_ELEMENTS (parts); c++)
    {
      gtk_column_view_column_set_title (g_ptr_array_index (self->columns[1], c), parts[c]);
      g_free (parts[c]);
    }
}

/* --- filling the tables --- */

static PlResults *
pl_results_panel_steady (PlResultsPanel *self)
{
  return self->fast != NULL ? self->fast : self->full;
}

/* The full snapshot when it belongs to the same revision as the steady
 * one: cycle figures of an older layout never sit beside new ones. */
static PlResults *
pl_results_panel_transient (PlResultsPanel *self)
{
  PlResults *s = pl_results_panel_steady (self);

  if (self->full == NULL || s == NULL
      || pl_results_get_revision (self->full) != pl_results_get_revision (s)
      || pl_results_get_transient_state (self->full) != PL_TRANSIENT_DONE)
    return NULL;
  return self->full;
}

/* The cells of the points row of a part's port. */
static GStrv
pl_results_panel_point_cells (PlResultsPanel *self, PlResults *s, PlResults *t,
                              const PlCompiledPart *part, guint p)
{
  const char *port = part->type->ports[p].key;
  GStrv cells = g_new0 (char *, 8);
  double v = 0.0;
  gboolean ok;

  cells[0] = g_strdup (part->tag);
  cells[1] = g_strdup (_(part->type->ports[p].label));
  ok = pl_results_get_port_pressure (s, part->id, port, PL_PRESSURE_IDLE, &v);
  cells[2] = pl_results_panel_fmt (self, ok, v, PL_QUANTITY_PRESSURE);
  ok = pl_results_get_port_pressure (s, part->id, port, PL_PRESSURE_STEADY_OPEN, &v);
  cells[3] = pl_results_panel_fmt (self, ok, v, PL_QUANTITY_PRESSURE);
  ok = t != NULL && pl_results_get_port_pressure (t, part->id, port, PL_PRESSURE_CYCLE_MIN,
                                                  &v);
  cells[4] = pl_results_panel_fmt (self, ok, v, PL_QUANTITY_PRESSURE);
  ok = t != NULL && pl_results_get_port_pressure (t, part->id, port, PL_PRESSURE_CYCLE_MAX,
                                                  &v);
  cells[5] = pl_results_panel_fmt (self, ok, v, PL_QUANTITY_PRESSURE);
  ok = t != NULL && pl_results_get_port_recovery (t, part->id, port, &v);
  cells[6] = ok && v < 0.0 ? g_strdup (_("none"))
             : pl_results_panel_fmt (self, ok, v, PL_QUANTITY_TIME);
  return cells;
}

static char *
pl_results_panel_other (PlResultsPanel *self, const PlCompiledPart *part, PlResults *s,
                        PlResults *t)
{
  g_autoptr (GString) out = g_string_new (NULL);

  switch (part->type->kind)
    {
    case PL_PART_PUMP:
      {
        pls_pump_result pr;
        pls_cycle_pump cp;

        if (pl_results_get_pump (s, part->id, PL_CASE_STEADY_OPEN, &pr))
          {
            g_autofree char *stall = pl_unit_format (pr.stall_pressure, PL_QUANTITY_PRESSURE,
                                                     &self->prefs, 4,
                                                     PL_UNIT_DECIMAL_FROM_LOCALE);
            g_autofree char *free_flow = pl_unit_format (pr.free_flow, PL_QUANTITY_FLOW,
                                                         &self->prefs, 4,
                                                         PL_UNIT_DECIMAL_FROM_LOCALE);

            /* Translators: pump figures in a table cell. */
            g_string_append_printf (out, _("stall %s, free flow %s"), stall, free_flow);
          }
        if (t != NULL && pl_results_get_pump_cycle (t, part->id, &cp))
          {
            g_autofree char *mean = pl_unit_format (cp.mean_flow, PL_QUANTITY_FLOW,
                                                    &self->prefs, 4,
                                                    PL_UNIT_DECIMAL_FROM_LOCALE);

            g_string_append_printf (out, out->len > 0 ? _("; cycle mean %s")
                                    : _("cycle mean %s"), mean);
          }
      }
      break;
    case PL_PART_ACCUMULATOR:
      {
        pls_accumulator_result ar;
        pls_cycle_accumulator ca;

        if (pl_results_get_accumulator (s, part->id, PL_CASE_IDLE, &ar))
          {
            g_autofree char *vol = pl_unit_format (ar.fluid_volume, PL_QUANTITY_VOLUME,
                                                   &self->prefs, 4,
                                                   PL_UNIT_DECIMAL_FROM_LOCALE);

            g_string_append_printf (out, _("holds %s at idle"), vol);
          }
        if (t != NULL && pl_results_get_accumulator_swing (t, part->id, &ca))
          {
            g_autofree char *swing = pl_unit_format (ca.max_fluid_volume - ca.min_fluid_volume,
                                                     PL_QUANTITY_VOLUME, &self->prefs, 4,
                                                     PL_UNIT_DECIMAL_FROM_LOCALE);

            g_string_append_printf (out, out->len > 0 ? _("; swings %s per cycle")
                                    : _("swings %s per cycle"), swing);
          }
      }
      break;
    case PL_PART_HOSE:
    case PL_PART_PIPE:
    case PL_PART_TEE:
    case PL_PART_DUMP_VALVE:
    case PL_PART_BALL_VALVE:
    case PL_PART_APPLICATOR:
    case PL_PART_GAUGE:
    case PL_PART_DRAIN:
    case PL_PART_SCENARIO:
    case PL_PART_TITLE:
    case PL_N_PART_KINDS:
    default:
      break;
    }
  if (!part->compiled)
    g_string_append (out, out->len > 0 ? _("; not solved") : _("not solved"));
  return g_string_free (g_steal_pointer (&out), FALSE);
}

/* The cells of a part's row in the parts table. */
static GStrv
pl_results_panel_part_cells (PlResultsPanel *self, PlResults *s, PlResults *t,
                             const PlCompiledPart *part)
{
  GStrv cells = g_new0 (char *, 9);
  pls_line_result lr;
  gboolean line = pl_results_get_line (s, part->id, PL_CASE_STEADY_OPEN, &lr);
  double flow = 0.0, mass = 0.0, dev = 0.0;
  gboolean ok;

  cells[0] = g_strdup (part->tag);
  cells[1] = g_strdup (_(part->type->name));
  ok = part->type->kind != PL_PART_GAUGE && part->type->kind != PL_PART_DRAIN
       && part->type->kind != PL_PART_TEE
       && pl_results_get_flow (s, part->id, 0, PL_CASE_STEADY_OPEN, &flow);
  cells[2] = pl_results_panel_fmt (self, ok, flow, PL_QUANTITY_FLOW);
  cells[3] = pl_results_panel_fmt (self, line, lr.velocity, PL_QUANTITY_VELOCITY);
  cells[4] = line ? g_strdup_printf ("%.0f", lr.reynolds) : g_strdup ("–");
  ok = t != NULL && pl_results_get_shot (t, part->id, &mass, &dev, NULL);
  cells[5] = pl_results_panel_fmt (self, ok, mass, PL_QUANTITY_MASS);
  /* Translators: a signed percentage in a table cell, "+1.2 %". */
  cells[6] = ok ? g_strdup_printf (_("%+.2f %%"), 100.0 * dev) : g_strdup ("–");
  cells[7] = pl_results_panel_other (self, part, s, t);
  return cells;
}

/* Replaces the rows of a table with rows (a GPtrArray of PlResultRow). */
static void
pl_results_panel_replace_rows (PlResultsPanel *self, PlResultsTable table, GPtrArray *rows)
{
  GListModel *model = G_LIST_MODEL (self->stores[table]);

  g_list_store_splice (self->stores[table], 0, g_list_model_get_n_items (model),
                       rows->pdata, rows->len);
  self->n_rebuilds[table]++;
}

/* The findings are few and change as a whole: the list is replaced only
 * when one of them reads differently. */
static void
pl_results_panel_refresh_findings (PlResultsPanel *self, PlResults *s, PlResults *t)
{
  /* The full snapshot repeats the steady findings and adds the cycle's and
   * the shutdown's; when it is current it is the whole story. */
  PlResults *r = t != NULL ? t : s;
  GListModel *model = G_LIST_MODEL (self->stores[PL_RESULTS_TABLE_FINDINGS]);
  g_autoptr (GPtrArray) rows = g_ptr_array_new_with_free_func (g_object_unref);
  gboolean same;

  for (guint i = 0; r != NULL && i < pl_results_get_n_findings (r); i++)
    {
      const PlFinding *f = pl_results_get_finding (r, i);
      GStrv cells = g_new0 (char *, 3);
      PlResultRow *row;

      cells[0] = g_strdup (pl_finding_get_severity_label (f->severity));
      cells[1] = pl_finding_format_sentence (f, r, &self->prefs);
      row = pl_result_row_new (PL_RESULTS_TABLE_FINDINGS, f->part_id, 0, 0, cells);
      row->severity = f->severity;
      g_ptr_array_add (rows, row);
    }
  if (r != NULL && pl_results_get_n_findings (r) == 0)
    {
      GStrv cells = g_new0 (char *, 3);

      cells[0] = g_strdup (pl_finding_get_severity_label (PLS_SEVERITY_INFO));
      cells[1] = g_strdup (_("The design checks found nothing to report."));
      g_ptr_array_add (rows, pl_result_row_new (PL_RESULTS_TABLE_FINDINGS, NULL, 0, 0, cells));
    }
  same = rows->len == g_list_model_get_n_items (model);
  for (guint i = 0; same && i < rows->len; i++)
    {
      g_autoptr (PlResultRow) old = g_list_model_get_item (model, i);
      PlResultRow *row = g_ptr_array_index (rows, i);

      same = old->severity == row->severity && g_strcmp0 (old->part_id, row->part_id) == 0
             && pl_result_row_same_cells (old, row->cells);
    }
  if (!same)
    pl_results_panel_replace_rows (self, PL_RESULTS_TABLE_FINDINGS, rows);
}

/* What the rows of a table are of, in order: a new row set is due when it
 * changes (parts added, removed, re-typed), not when figures or tags do. */
static char *
pl_results_panel_row_signature (PlCompiled *compiled)
{
  GString *sig = g_string_new (NULL);

  for (guint i = 0; i < pl_compiled_get_n_parts (compiled); i++)
    {
      const PlCompiledPart *part = pl_compiled_get_part (compiled, i);

      g_string_append_printf (sig, "%s:%s;", part->id, part->type->key);
    }
  return g_string_free (sig, FALSE);
}

static GStrv
pl_results_panel_make_cells (PlResultsPanel *self, PlResultsTable table, PlResultRow *row)
{
  PlResults *s = pl_results_panel_steady (self);
  PlResults *t = pl_results_panel_transient (self);
  PlCompiled *compiled = s != NULL ? pl_results_get_compiled (s) : NULL;
  const PlCompiledPart *part = NULL;

  if (compiled != NULL && row->part_index < pl_compiled_get_n_parts (compiled))
    part = pl_compiled_get_part (compiled, row->part_index);
  /* The row set follows the snapshot (its signature), so this holds; a
   * blank row is the safe answer if it ever did not. */
  if (part == NULL || g_strcmp0 (part->id, row->part_id) != 0
      || (table == PL_RESULTS_TABLE_POINTS && row->port_index >= part->type->n_ports))
    return g_new0 (char *, 1);
  return table == PL_RESULTS_TABLE_POINTS
         ? pl_results_panel_point_cells (self, s, t, part, row->port_index)
         : pl_results_panel_part_cells (self, s, t, part);
}

/* The row's cells for the current snapshot, worked out if they are older;
 * TRUE when they changed.  The row says so to the widgets showing it. */
static gboolean
pl_results_panel_update_row (PlResultsPanel *self, PlResultRow *row)
{
  GStrv cells;

  /* Findings rows are made with their cells and never go out of date. */
  if (row->table == PL_RESULTS_TABLE_FINDINGS || row->generation == self->generation)
    return FALSE;
  row->generation = self->generation;
  cells = pl_results_panel_make_cells (self, row->table, row);
  if (pl_result_row_same_cells (row, cells))
    {
      g_strfreev (cells);
      return FALSE;
    }
  g_strfreev (row->cells);
  row->cells = cells;
  return TRUE;
}

static char **
pl_results_panel_row_cells (PlResultsPanel *self, PlResultRow *row)
{
  pl_results_panel_update_row (self, row);
  return row->cells;
}

/* A table of per-part or per-port rows: new rows when the row set changed,
 * else the cells of the rows on screen in place (the others when shown). */
static void
pl_results_panel_refresh_rows (PlResultsPanel *self, PlResultsTable table, PlResults *s)
{
  GListModel *model = G_LIST_MODEL (self->stores[table]);
  PlCompiled *compiled = s != NULL ? pl_results_get_compiled (s) : NULL;
  g_autofree char *sig = compiled != NULL ? pl_results_panel_row_signature (compiled) : NULL;

  if (g_strcmp0 (sig, self->row_signature[table]) != 0)
    {
      g_autoptr (GPtrArray) rows = g_ptr_array_new_with_free_func (g_object_unref);

      for (guint i = 0; compiled != NULL && i < pl_compiled_get_n_parts (compiled); i++)
        {
          const PlCompiledPart *part = pl_compiled_get_part (compiled, i);

          if (table == PL_RESULTS_TABLE_PARTS)
            g_ptr_array_add (rows, pl_result_row_new (table, part->id, i, 0, NULL));
          else
            for (guint p = 0; p < part->type->n_ports; p++)
              g_ptr_array_add (rows, pl_result_row_new (table, part->id, i, p, NULL));
        }
      g_free (self->row_signature[table]);
      self->row_signature[table] = g_steal_pointer (&sig);
      pl_results_panel_replace_rows (self, table, rows);
      return;
    }
  for (guint i = 0; i < g_list_model_get_n_items (model); i++)
    {
      g_autoptr (PlResultRow) row = g_list_model_get_item (model, i);

      if (row->n_bound > 0 && pl_results_panel_update_row (self, row))
        g_signal_emit (row, row_signals[ROW_SIGNAL_CHANGED], 0);
    }
}

/* --- plot --- */

static gboolean
pl_results_panel_default_plotted (const PlCompiledPart *part)
{
  return part->type->kind == PL_PART_GAUGE || part->type->kind == PL_PART_APPLICATOR;
}

static gboolean
pl_results_panel_is_plotted (PlResultsPanel *self, const PlCompiledPart *part,
                             const char *port)
{
  g_autofree char *key = NULL;

  if (!self->user_chose)
    return pl_results_panel_default_plotted (part);
  key = g_strdup_printf ("%s/%s", part->id, port);
  return g_hash_table_contains (self->plotted, key);
}

static void pl_results_panel_refresh_plots (PlResultsPanel *self);

static void
chooser_toggled_cb (GtkCheckButton *check, PlResultsPanel *self)
{
  const char *key = g_object_get_data (G_OBJECT (check), "port");
  GtkWidget *child;

  if (self->building_chooser)
    return;
  if (!self->user_chose)
    {
      /* The first choice starts from what was shown by default. */
      for (child = gtk_widget_get_first_child (self->chooser); child != NULL;
           child = gtk_widget_get_next_sibling (child))
        {
          GtkWidget *c = gtk_list_box_row_get_child (GTK_LIST_BOX_ROW (child));

          if (gtk_check_button_get_active (GTK_CHECK_BUTTON (c)))
            g_hash_table_add (self->plotted, g_strdup (g_object_get_data (G_OBJECT (c),
                                                                          "port")));
        }
      self->user_chose = TRUE;
    }
  if (gtk_check_button_get_active (check))
    g_hash_table_add (self->plotted, g_strdup (key));
  else
    g_hash_table_remove (self->plotted, key);
  pl_results_panel_refresh_plots (self);
}

/* The list of ports to choose from, rebuilt only when the parts change. */
static void
pl_results_panel_build_chooser (PlResultsPanel *self, PlResults *s)
{
  PlCompiled *compiled = pl_results_get_compiled (s);
  g_autoptr (GString) sig = g_string_new (NULL);
  GtkWidget *child;

  for (guint i = 0; i < pl_compiled_get_n_parts (compiled); i++)
    {
      const PlCompiledPart *part = pl_compiled_get_part (compiled, i);
      g_string_append_printf (sig, "%s:%s;", part->id, part->tag);
    }
  if (g_strcmp0 (sig->str, self->chooser_signature) == 0)
    return;
  g_free (self->chooser_signature);
  self->chooser_signature = g_strdup (sig->str);

  self->building_chooser = TRUE;
  while ((child = gtk_widget_get_first_child (self->chooser)) != NULL)
    gtk_list_box_remove (GTK_LIST_BOX (self->chooser), child);
  for (guint i = 0; i < pl_compiled_get_n_parts (compiled); i++)
    {
      const PlCompiledPart *part = pl_compiled_get_part (compiled, i);

      if (part->type->kind == PL_PART_DRAIN)
        continue;
      for (guint p = 0; p < part->type->n_ports; p++)
        {
          const char *port = part->type->ports[p].key;
          g_autofree char *text = part->type->n_ports > 1
                                  /* Translators: a port in a list, "H3 End A". */
                                  ? g_strdup_printf (_("%s %s"), part->tag,
                                                     _(part->type->ports[p].label))
                                  : g_strdup (part->tag);
          GtkWidget *check = gtk_check_button_new_with_label (text);

          g_object_set_data_full (G_OBJECT (check), "port",
                                  g_strdup_printf ("%s/%s", part->id, port), g_free);
          gtk_check_button_set_active (GTK_CHECK_BUTTON (check),
                                       pl_results_panel_is_plotted (self, part, port));
          gtk_widget_set_tooltip_text (check, _("Show this point in the plots"));
          g_signal_connect (check, "toggled", G_CALLBACK (chooser_toggled_cb), self);
          gtk_list_box_append (GTK_LIST_BOX (self->chooser), check);
        }
    }
  self->building_chooser = FALSE;
}

static void
pl_results_panel_refresh_plots (PlResultsPanel *self)
{
  PlResults *s = pl_results_panel_steady (self);
  PlResults *t = pl_results_panel_transient (self);
  PlPlot *cycle_plot = PL_PLOT (self->plots[0]);
  PlPlot *shut_plot = PL_PLOT (self->plots[1]);
  const pls_cycle_result *cycle = t != NULL ? pl_results_get_cycle (t) : NULL;
  const pls_shutdown_result *shut = t != NULL ? pl_results_get_shutdown (t) : NULL;
  PlCompiled *compiled;

  pl_plot_clear (cycle_plot);
  pl_plot_clear (shut_plot);
  pl_plot_set_prefs (cycle_plot, &self->prefs);
  pl_plot_set_prefs (shut_plot, &self->prefs);
  pl_plot_set_stale (cycle_plot, self->stale);
  pl_plot_set_stale (shut_plot, self->stale);
  if (s == NULL)
    return;
  pl_plot_set_placeholder (cycle_plot, cycle == NULL
                           ? _("The firing cycle is being simulated, or could not be.")
                           : _("Choose points on the left to plot them."));
  pl_plot_set_placeholder (shut_plot, shut == NULL
                           ? _("The shutdown is being simulated, or could not be.")
                           : _("Choose points on the left to plot them."));
  compiled = pl_results_get_compiled (s);
  if (cycle != NULL)
    {
      const pls_transient_options *o = pl_compiled_get_transient_options (compiled);

      /* The shaded span is one shot's on-time, from the start of the cycle
       * (applicators with a firing delay open later). */
      if (o != NULL && o->on_time > 0.0)
        pl_plot_add_band (cycle_plot, 0.0, o->on_time);
    }
  if (shut != NULL)
    {
      const pls_transient_options *o = pl_compiled_get_transient_options (compiled);

      if (o != NULL)
        pl_plot_set_reference (shut_plot, o->safe_pressure, _("safe"));
    }

  for (guint i = 0; i < pl_compiled_get_n_parts (compiled); i++)
    {
      const PlCompiledPart *part = pl_compiled_get_part (compiled, i);

      for (guint p = 0; p < part->type->n_ports; p++)
        {
          const char *port = part->type->ports[p].key;
          int node = pl_compiled_get_port_node (compiled, part->id, port);
          g_autofree char *label = NULL;

          if (node < 0 || !pl_results_panel_is_plotted (self, part, port))
            continue;
          label = part->type->n_ports > 1
                  ? g_strdup_printf (_("%s %s"), part->tag, _(part->type->ports[p].label))
                  : g_strdup (part->tag);
          if (cycle != NULL)
            {
              size_t n = pls_cycle_sample_count (cycle);
              g_autofree double *tt = g_new (double, MAX (n, 1));
              g_autofree double *pp = g_new (double, MAX (n, 1));

              for (size_t k = 0; k < n; k++)
                {
                  tt[k] = pls_cycle_sample_time (cycle, k);
                  pp[k] = pls_cycle_sample_pressure (cycle, node, k);
                }
              if (n >= 2)
                pl_plot_add_series (cycle_plot, label, tt, pp, (guint) n);
            }
          if (shut != NULL)
            {
              size_t n = pls_shutdown_sample_count (shut);
              g_autofree double *tt = g_new (double, MAX (n, 1));
              g_autofree double *pp = g_new (double, MAX (n, 1));

              for (size_t k = 0; k < n; k++)
                {
                  tt[k] = pls_shutdown_sample_time (shut, k);
                  pp[k] = pls_shutdown_sample_pressure (shut, node, k);
                }
              if (n >= 2)
                pl_plot_add_series (shut_plot, label, tt, pp, (guint) n);
            }
        }
    }
}

/* --- bringing the pages up to date --- */

static guint
pl_results_panel_visible_page (PlResultsPanel *self)
{
  GtkWidget *child = gtk_stack_get_visible_child (GTK_STACK (self->stack));

  for (guint i = 0; i < PL_N_RESULTS_TABLES; i++)
    if (child == self->pages[i])
      return i;
  return PAGE_PLOT;
}

static void
pl_results_panel_flush_page (PlResultsPanel *self, guint page)
{
  PlResults *s = pl_results_panel_steady (self);
  PlResults *t = pl_results_panel_transient (self);

  if (!self->dirty[page])
    return;
  self->dirty[page] = FALSE;
  switch (page)
    {
    case PL_RESULTS_TABLE_POINTS:
    case PL_RESULTS_TABLE_PARTS:
      pl_results_panel_refresh_rows (self, page, s);
      break;
    case PL_RESULTS_TABLE_FINDINGS:
      pl_results_panel_refresh_findings (self, s, t);
      break;
    case PAGE_PLOT:
    default:
      if (s != NULL)
        pl_results_panel_build_chooser (self, s);
      pl_results_panel_refresh_plots (self);
      break;
    }
}

static gboolean
pl_results_panel_tick_cb (GtkWidget     *widget,
                          GdkFrameClock *clock,
                          gpointer       user_data)
{
  PlResultsPanel *self = PL_RESULTS_PANEL (widget);

  self->tick_id = 0;
  pl_results_panel_flush_page (self, pl_results_panel_visible_page (self));
  return G_SOURCE_REMOVE;
}

/* One update per frame, in the frame's update phase, however many
 * snapshots arrived since the last one; none while the panel is hidden. */
static void
pl_results_panel_schedule (PlResultsPanel *self)
{
  if (self->tick_id == 0 && gtk_widget_get_mapped (GTK_WIDGET (self))
      && self->dirty[pl_results_panel_visible_page (self)])
    self->tick_id = gtk_widget_add_tick_callback (GTK_WIDGET (self), pl_results_panel_tick_cb,
                                                  NULL, NULL);
}

/* The snapshot or the units changed: every page is out of date. */
static void
pl_results_panel_invalidate (PlResultsPanel *self)
{
  self->generation++;
  for (guint i = 0; i < N_PAGES; i++)
    self->dirty[i] = TRUE;
  gtk_widget_set_visible (self->stale_bar, self->stale);
  for (guint i = 0; i < PL_N_RESULTS_TABLES; i++)
    gtk_widget_set_opacity (self->pages[i], self->stale ? 0.5 : 1.0);
  pl_results_panel_schedule (self);
}

static void
stack_visible_child_cb (GObject *stack, GParamSpec *pspec, PlResultsPanel *self)
{
  /* A page coming into view is brought up to date before it is drawn. */
  pl_results_panel_flush_page (self, pl_results_panel_visible_page (self));
}

/* --- GObject --- */

static void
pl_results_panel_dispose (GObject *object)
{
  PlResultsPanel *self = PL_RESULTS_PANEL (object);

  if (self->tick_id != 0)
    {
      gtk_widget_remove_tick_callback (GTK_WIDGET (self), self->tick_id);
      self->tick_id = 0;
    }
  g_clear_object (&self->doc);
  g_clear_pointer (&self->fast, pl_results_unref);
  g_clear_pointer (&self->full, pl_results_unref);
  g_clear_pointer (&self->box, gtk_widget_unparent);
  for (guint i = 0; i < PL_N_RESULTS_TABLES; i++)
    {
      g_clear_object (&self->stores[i]);
      g_clear_pointer (&self->columns[i], g_ptr_array_unref);
    }
  G_OBJECT_CLASS (pl_results_panel_parent_class)->dispose (object);
}

static void
pl_results_panel_finalize (GObject *object)
{
  PlResultsPanel *self = PL_RESULTS_PANEL (object);

  g_hash_table_unref (self->plotted);
  g_free (self->chooser_signature);
  for (guint i = 0; i < PL_N_RESULTS_TABLES; i++)
    g_free (self->row_signature[i]);
  G_OBJECT_CLASS (pl_results_panel_parent_class)->finalize (object);
}

static void
pl_results_panel_map (GtkWidget *widget)
{
  GTK_WIDGET_CLASS (pl_results_panel_parent_class)->map (widget);
  pl_results_panel_schedule (PL_RESULTS_PANEL (widget));
}

static void
pl_results_panel_unmap (GtkWidget *widget)
{
  PlResultsPanel *self = PL_RESULTS_PANEL (widget);

  if (self->tick_id != 0)
    {
      gtk_widget_remove_tick_callback (widget, self->tick_id);
      self->tick_id = 0;
    }
  GTK_WIDGET_CLASS (pl_results_panel_parent_class)->unmap (widget);
}

static void
pl_results_panel_class_init (PlResultsPanelClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);

  object_class->dispose = pl_results_panel_dispose;
  object_class->finalize = pl_results_panel_finalize;
  widget_class->map = pl_results_panel_map;
  widget_class->unmap = pl_results_panel_unmap;
  signals[SIGNAL_PART_ACTIVATED] = g_signal_new ("part-activated", G_TYPE_FROM_CLASS (klass),
                                                 G_SIGNAL_RUN_LAST, 0, NULL, NULL, NULL,
                                                 G_TYPE_NONE, 1, G_TYPE_STRING);
  gtk_widget_class_set_layout_manager_type (widget_class, GTK_TYPE_BIN_LAYOUT);
  gtk_widget_class_set_css_name (widget_class, "plresultspanel");
  gtk_widget_class_set_accessible_role (widget_class, GTK_ACCESSIBLE_ROLE_GROUP);
}

static void
pl_results_panel_init (PlResultsPanel *self)
{
  static const gboolean points_numeric[] = { FALSE, FALSE, TRUE, TRUE, TRUE, TRUE, TRUE };
  static const gboolean parts_numeric[] = { FALSE, FALSE, TRUE, TRUE, TRUE, TRUE, TRUE,
                                            FALSE };
  GtkWidget *switcher, *header, *page, *scroller, *plot_switcher, *plot_box;
  GtkSelectionModel *sel;
  GtkListItemFactory *f;

  pl_unit_prefs_init (&self->prefs, PL_UNIT_SYSTEM_SI);
  self->plotted = g_hash_table_new_full (g_str_hash, g_str_equal, g_free, NULL);

  self->box = gtk_box_new (GTK_ORIENTATION_VERTICAL, 0);
  gtk_widget_set_parent (self->box, GTK_WIDGET (self));

  self->stack = gtk_stack_new ();
  gtk_widget_set_vexpand (self->stack, TRUE);
  header = gtk_box_new (GTK_ORIENTATION_HORIZONTAL, 12);
  gtk_widget_set_margin_start (header, 6);
  gtk_widget_set_margin_end (header, 6);
  gtk_widget_set_margin_top (header, 4);
  gtk_widget_set_margin_bottom (header, 4);
  switcher = gtk_stack_switcher_new ();
  gtk_stack_switcher_set_stack (GTK_STACK_SWITCHER (switcher), GTK_STACK (self->stack));
  gtk_accessible_update_property (GTK_ACCESSIBLE (switcher), GTK_ACCESSIBLE_PROPERTY_LABEL,
                                  _("Results pages"), -1);
  gtk_box_append (GTK_BOX (header), switcher);
  self->stale_bar = gtk_label_new (_("Results out of date"));
  gtk_widget_add_css_class (self->stale_bar, "warning");
  gtk_widget_add_css_class (self->stale_bar, "pl-stale-badge");
  gtk_widget_set_tooltip_text (self->stale_bar,
                               _("These figures belong to an earlier state of the layout; "
                                 "new ones follow when the solve is done."));
  gtk_widget_set_hexpand (self->stale_bar, TRUE);
  gtk_label_set_xalign (GTK_LABEL (self->stale_bar), 1.0);
  gtk_widget_set_visible (self->stale_bar, FALSE);
  gtk_box_append (GTK_BOX (header), self->stale_bar);
  gtk_box_append (GTK_BOX (self->box), header);
  gtk_box_append (GTK_BOX (self->box), self->stack);

  page = pl_results_panel_make_table (self, PL_RESULTS_TABLE_POINTS, _("Pressures at points"),
                                      G_N_ELEMENTS (points_numeric), points_numeric);
  gtk_stack_add_titled (GTK_STACK (self->stack), page, "points", _("Points"));
  page = pl_results_panel_make_table (self, PL_RESULTS_TABLE_PARTS, _("Figures per part"),
                                      G_N_ELEMENTS (parts_numeric), parts_numeric);
  gtk_stack_add_titled (GTK_STACK (self->stack), page, "parts", _("Parts"));

  /* Plot page: the ports to show on the left, the two plots on the right. */
  plot_box = gtk_paned_new (GTK_ORIENTATION_HORIZONTAL);
  self->chooser = gtk_list_box_new ();
  gtk_list_box_set_selection_mode (GTK_LIST_BOX (self->chooser), GTK_SELECTION_NONE);
  gtk_accessible_update_property (GTK_ACCESSIBLE (self->chooser),
                                  GTK_ACCESSIBLE_PROPERTY_LABEL, _("Points to plot"), -1);
  scroller = gtk_scrolled_window_new ();
  gtk_scrolled_window_set_policy (GTK_SCROLLED_WINDOW (scroller), GTK_POLICY_NEVER,
                                  GTK_POLICY_AUTOMATIC);
  gtk_scrolled_window_set_child (GTK_SCROLLED_WINDOW (scroller), self->chooser);
  gtk_widget_set_size_request (scroller, 140, -1);
  gtk_paned_set_start_child (GTK_PANED (plot_box), scroller);
  gtk_paned_set_shrink_start_child (GTK_PANED (plot_box), FALSE);
  gtk_paned_set_position (GTK_PANED (plot_box), 180);
  {
    GtkWidget *right = gtk_box_new (GTK_ORIENTATION_VERTICAL, 4);

    self->plot_stack = gtk_stack_new ();
    plot_switcher = gtk_stack_switcher_new ();
    gtk_widget_set_halign (plot_switcher, GTK_ALIGN_CENTER);
    gtk_widget_set_margin_top (plot_switcher, 4);
    gtk_stack_switcher_set_stack (GTK_STACK_SWITCHER (plot_switcher),
                                  GTK_STACK (self->plot_stack));
    gtk_accessible_update_property (GTK_ACCESSIBLE (plot_switcher),
                                    GTK_ACCESSIBLE_PROPERTY_LABEL, _("Plot range"), -1);
    for (guint i = 0; i < 2; i++)
      {
        self->plots[i] = pl_plot_new ();
        gtk_accessible_update_property (GTK_ACCESSIBLE (self->plots[i]),
                                        GTK_ACCESSIBLE_PROPERTY_LABEL,
                                        i == 0 ? _("Pressures over one firing cycle")
                                        : _("Pressures after the air goes off"), -1);
      }
    gtk_stack_add_titled (GTK_STACK (self->plot_stack), self->plots[0], "cycle",
                          _("Firing cycle"));
    gtk_stack_add_titled (GTK_STACK (self->plot_stack), self->plots[1], "shutdown",
                          _("Shutdown"));
    gtk_box_append (GTK_BOX (right), plot_switcher);
    gtk_box_append (GTK_BOX (right), self->plot_stack);
    gtk_paned_set_end_child (GTK_PANED (plot_box), right);
  }
  gtk_stack_add_titled (GTK_STACK (self->stack), plot_box, "plot", _("Plot"));

  /* Findings. */
  self->stores[PL_RESULTS_TABLE_FINDINGS] = g_list_store_new (PL_TYPE_RESULT_ROW);
  sel = GTK_SELECTION_MODEL (gtk_single_selection_new (
                               G_LIST_MODEL (g_object_ref (
                                 self->stores[PL_RESULTS_TABLE_FINDINGS]))));
  gtk_single_selection_set_autoselect (GTK_SINGLE_SELECTION (sel), FALSE);
  gtk_single_selection_set_can_unselect (GTK_SINGLE_SELECTION (sel), TRUE);
  f = gtk_signal_list_item_factory_new ();
  g_signal_connect (f, "setup", G_CALLBACK (finding_setup_cb), NULL);
  g_signal_connect (f, "bind", G_CALLBACK (finding_bind_cb), NULL);
  self->views[PL_RESULTS_TABLE_FINDINGS] = gtk_list_view_new (sel, f);
  gtk_list_view_set_single_click_activate (GTK_LIST_VIEW (
                                             self->views[PL_RESULTS_TABLE_FINDINGS]), TRUE);
  gtk_widget_add_css_class (self->views[PL_RESULTS_TABLE_FINDINGS], "pl-findings");
  gtk_accessible_update_property (GTK_ACCESSIBLE (self->views[PL_RESULTS_TABLE_FINDINGS]),
                                  GTK_ACCESSIBLE_PROPERTY_LABEL, _("Findings"), -1);
  g_signal_connect (self->views[PL_RESULTS_TABLE_FINDINGS], "activate",
                    G_CALLBACK (list_view_activate_cb), self);
  scroller = gtk_scrolled_window_new ();
  gtk_scrolled_window_set_child (GTK_SCROLLED_WINDOW (scroller),
                                 self->views[PL_RESULTS_TABLE_FINDINGS]);
  self->pages[PL_RESULTS_TABLE_FINDINGS] = scroller;
  self->columns[PL_RESULTS_TABLE_FINDINGS] = g_ptr_array_new ();
  gtk_stack_add_titled (GTK_STACK (self->stack), scroller, "findings", _("Findings"));

  gtk_accessible_update_property (GTK_ACCESSIBLE (self), GTK_ACCESSIBLE_PROPERTY_LABEL,
                                  _("Results"), -1);
  g_signal_connect (self->stack, "notify::visible-child", G_CALLBACK (stack_visible_child_cb),
                    self);
  pl_results_panel_set_titles (self);
  pl_results_panel_invalidate (self);
}

/* --- public --- */

GtkWidget *
pl_results_panel_new (void)
{
  return g_object_new (PL_TYPE_RESULTS_PANEL, NULL);
}

void
pl_results_panel_set_context (PlResultsPanel *self, PlDocument *doc, const PlUnitPrefs *prefs)
{
  g_return_if_fail (PL_IS_RESULTS_PANEL (self));
  g_return_if_fail (doc == NULL || PL_IS_DOCUMENT (doc));

  if (doc != self->doc)
    {
      /* Another document: its parts have other ids; forget the choice. */
      g_hash_table_remove_all (self->plotted);
      self->user_chose = FALSE;
      g_clear_pointer (&self->chooser_signature, g_free);
      g_clear_pointer (&self->fast, pl_results_unref);
      g_clear_pointer (&self->full, pl_results_unref);
    }
  g_set_object (&self->doc, doc);
  if (prefs != NULL)
    self->prefs = *prefs;
  else
    pl_unit_prefs_init (&self->prefs, PL_UNIT_SYSTEM_SI);
  pl_results_panel_set_titles (self);
  pl_results_panel_invalidate (self);
}

void
pl_results_panel_set_results (PlResultsPanel *self, PlResults *fast, PlResults *full,
                              gboolean stale)
{
  g_return_if_fail (PL_IS_RESULTS_PANEL (self));

  if (fast != NULL)
    pl_results_ref (fast);
  if (full != NULL)
    pl_results_ref (full);
  g_clear_pointer (&self->fast, pl_results_unref);
  g_clear_pointer (&self->full, pl_results_unref);
  self->fast = fast;
  self->full = full;
  self->stale = stale;
  pl_results_panel_invalidate (self);
}

void
pl_results_panel_show_page (PlResultsPanel *self, const char *name)
{
  g_return_if_fail (PL_IS_RESULTS_PANEL (self));
  g_return_if_fail (name != NULL);

  if (g_str_equal (name, "cycle") || g_str_equal (name, "shutdown"))
    {
      gtk_stack_set_visible_child_name (GTK_STACK (self->stack), "plot");
      gtk_stack_set_visible_child_name (GTK_STACK (self->plot_stack), name);
      return;
    }
  gtk_stack_set_visible_child_name (GTK_STACK (self->stack), name);
}

static PlResultRow *
pl_results_panel_peek_row (PlResultsPanel *self, PlResultsTable table, guint row)
{
  g_autoptr (PlResultRow) item = NULL;

  if (table >= PL_N_RESULTS_TABLES)
    return NULL;
  pl_results_panel_flush_page (self, table);
  item = g_list_model_get_item (G_LIST_MODEL (self->stores[table]), row);
  if (item != NULL)
    pl_results_panel_update_row (self, item);
  /* The store keeps its own reference: a borrowed pointer stays valid
   * until the next refresh. */
  return item;
}

guint
pl_results_panel_get_n_rows (PlResultsPanel *self, PlResultsTable table)
{
  g_return_val_if_fail (PL_IS_RESULTS_PANEL (self), 0);
  g_return_val_if_fail (table < PL_N_RESULTS_TABLES, 0);
  pl_results_panel_flush_page (self, table);
  return g_list_model_get_n_items (G_LIST_MODEL (self->stores[table]));
}

const char *
pl_results_panel_get_cell (PlResultsPanel *self, PlResultsTable table, guint row,
                           guint column)
{
  PlResultRow *r;

  g_return_val_if_fail (PL_IS_RESULTS_PANEL (self), NULL);
  r = pl_results_panel_peek_row (self, table, row);
  if (r == NULL || r->cells == NULL || column >= g_strv_length (r->cells))
    return NULL;
  return r->cells[column];
}

const char *
pl_results_panel_get_row_part_id (PlResultsPanel *self, PlResultsTable table, guint row)
{
  PlResultRow *r;

  g_return_val_if_fail (PL_IS_RESULTS_PANEL (self), NULL);
  r = pl_results_panel_peek_row (self, table, row);
  return r != NULL ? r->part_id : NULL;
}

GtkWidget *
pl_results_panel_get_view (PlResultsPanel *self, PlResultsTable table)
{
  g_return_val_if_fail (PL_IS_RESULTS_PANEL (self), NULL);
  g_return_val_if_fail (table < PL_N_RESULTS_TABLES, NULL);
  return self->views[table];
}

PlPlot *
pl_results_panel_get_plot (PlResultsPanel *self, gboolean shutdown)
{
  g_return_val_if_fail (PL_IS_RESULTS_PANEL (self), NULL);
  pl_results_panel_flush_page (self, PAGE_PLOT);
  return PL_PLOT (self->plots[shutdown ? 1 : 0]);
}

void
pl_results_panel_set_plotted (PlResultsPanel *self, const char *const *ports)
{
  g_return_if_fail (PL_IS_RESULTS_PANEL (self));

  g_hash_table_remove_all (self->plotted);
  self->user_chose = ports != NULL;
  for (guint i = 0; ports != NULL && ports[i] != NULL; i++)
    g_hash_table_add (self->plotted, g_strdup (ports[i]));
  g_clear_pointer (&self->chooser_signature, g_free);
  /* A choice made by hand (or by the caller) shows at once. */
  self->dirty[PAGE_PLOT] = TRUE;
  pl_results_panel_flush_page (self, PAGE_PLOT);
}

guint
pl_results_panel_get_n_rebuilds (PlResultsPanel *self, PlResultsTable table)
{
  g_return_val_if_fail (PL_IS_RESULTS_PANEL (self), 0);
  g_return_val_if_fail (table < PL_N_RESULTS_TABLES, 0);
  return self->n_rebuilds[table];
}

gboolean
pl_results_panel_get_stale (PlResultsPanel *self)
{
  g_return_val_if_fail (PL_IS_RESULTS_PANEL (self), FALSE);
  return self->stale;
}
