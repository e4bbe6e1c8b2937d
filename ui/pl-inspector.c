/* SPDX-License-Identifier: GPL-3.0-or-later */

#include "config.h"

#include "pl-inspector.h"

#include <glib/gi18n.h>
#include <math.h>

#include "pl-param-row.h"

struct _PlInspector
{
  GtkWidget parent_instance;

  PlDocument *doc;
  PlUndoStack *undo;
  PlUnitPrefs prefs;
  GStrv selection;           /* never NULL; empty: scenario and title */
  PlResults *results;
  gboolean stale;
  gulong changed_id;

  GtkWidget *scroller;
  GtkWidget *title;
  GtkWidget *subtitle;
  GtkWidget *params;         /* box of headings and PlParamRows */
  GtkWidget *results_box;
  GtkWidget *stale_label;
  GtkWidget *results_grid;
  GPtrArray *rows;           /* PlParamRow, borrowed from params */
  GString *results_text;     /* what the grid shows, "label\tvalue\n" */
  char *shown_part;          /* id of the part the rows edit, or NULL */
};

G_DEFINE_FINAL_TYPE (PlInspector, pl_inspector, GTK_TYPE_WIDGET)

/* --- formatting --- */

static char *
pl_inspector_format (PlInspector *self, double si, PlQuantity quantity)
{
  return pl_unit_format (si, quantity, &self->prefs, PL_UNIT_DEFAULT_DIGITS,
                         PL_UNIT_DECIMAL_FROM_LOCALE);
}

static char *
pl_inspector_format_percent (double fraction)
{
  /* Translators: a relative deviation, "+1.25 %". */
  return g_strdup_printf (_("%+.2f %%"), 100.0 * fraction);
}

/* --- results section --- */

static void
pl_inspector_add_result (PlInspector *self, int *row, const char *label, char *value)
{
  GtkWidget *l = gtk_label_new (label);
  GtkWidget *v = gtk_label_new (value != NULL ? value : "–");

  gtk_label_set_xalign (GTK_LABEL (l), 0.0);
  gtk_label_set_xalign (GTK_LABEL (v), 1.0);
  gtk_label_set_selectable (GTK_LABEL (v), TRUE);
  gtk_widget_set_hexpand (l, TRUE);
  gtk_widget_add_css_class (l, "dim-label");
  gtk_widget_add_css_class (v, "numeric");
  gtk_grid_attach (GTK_GRID (self->results_grid), l, 0, *row, 5, 1);
  gtk_grid_attach (GTK_GRID (self->results_grid), v, 5, *row, 1, 1);
  g_string_append_printf (self->results_text, "%s\t%s\n", label, value != NULL ? value : "–");
  (*row)++;
  g_free (value);
}

static void
pl_inspector_add_heading (PlInspector *self, int *row, const char *text)
{
  GtkWidget *l = gtk_label_new (text);

  gtk_label_set_xalign (GTK_LABEL (l), 0.0);
  gtk_widget_add_css_class (l, "heading");
  gtk_widget_set_margin_top (l, *row > 0 ? 8 : 0);
  gtk_grid_attach (GTK_GRID (self->results_grid), l, 0, *row, 6, 1);
  g_string_append_printf (self->results_text, "%s\n", text);
  (*row)++;
}

/* One line per port: idle, steady-open, cycle minimum and maximum. */
static void
pl_inspector_add_port_pressures (PlInspector *self, int *row, const PlPart *part)
{
  static const PlPressureKind kinds[] = {
    PL_PRESSURE_IDLE, PL_PRESSURE_STEADY_OPEN, PL_PRESSURE_CYCLE_MIN, PL_PRESSURE_CYCLE_MAX,
  };
  const char *headers[] = {
    /* Translators: column heads of a small table of pressures, kept short. */
    C_("pressure", "Idle"), C_("pressure", "Open"), C_("pressure", "Min"),
    C_("pressure", "Max"),
  };
  const PlPartType *type = pl_part_get_part_type (part);
  const PlUnit *unit = pl_unit_get (pl_unit_prefs_get_unit (&self->prefs,
                                                            PL_QUANTITY_PRESSURE));
  g_autofree char *heading = g_strdup_printf (_("Pressure (%s)"), unit->symbol);

  pl_inspector_add_heading (self, row, heading);
  gtk_grid_attach (GTK_GRID (self->results_grid), gtk_label_new (""), 0, *row, 1, 1);
  for (guint k = 0; k < G_N_ELEMENTS (kinds); k++)
    {
      GtkWidget *h = gtk_label_new (headers[k]);

      gtk_label_set_xalign (GTK_LABEL (h), 1.0);
      gtk_widget_add_css_class (h, "dim-label");
      gtk_widget_add_css_class (h, "caption");
      gtk_grid_attach (GTK_GRID (self->results_grid), h, 2 + k, *row, 1, 1);
    }
  (*row)++;
  for (guint p = 0; p < type->n_ports; p++)
    {
      GtkWidget *l = gtk_label_new (_(type->ports[p].label));

      gtk_label_set_xalign (GTK_LABEL (l), 0.0);
      gtk_widget_add_css_class (l, "dim-label");
      gtk_grid_attach (GTK_GRID (self->results_grid), l, 0, *row, 2, 1);
      g_string_append_printf (self->results_text, "%s", _(type->ports[p].label));
      for (guint k = 0; k < G_N_ELEMENTS (kinds); k++)
        {
          double v = NAN;
          g_autofree char *text = NULL;
          GtkWidget *cell;

          if (self->results != NULL)
            pl_results_get_port_pressure (self->results, pl_part_get_id (part),
                                          type->ports[p].key, kinds[k], &v);
          text = pl_unit_format_number (v, PL_QUANTITY_PRESSURE, &self->prefs,
                                        PL_UNIT_DEFAULT_DIGITS, PL_UNIT_DECIMAL_FROM_LOCALE);
          cell = gtk_label_new (text);
          gtk_label_set_xalign (GTK_LABEL (cell), 1.0);
          gtk_widget_set_hexpand (cell, TRUE);
          gtk_widget_add_css_class (cell, "numeric");
          gtk_grid_attach (GTK_GRID (self->results_grid), cell, 2 + k, *row, 1, 1);
          g_string_append_printf (self->results_text, "\t%s", text);
        }
      g_string_append_c (self->results_text, '\n');
      (*row)++;
    }
}

static void
pl_inspector_add_part_results (PlInspector *self, int *row, const PlPart *part)
{
  PlResults *r = self->results;
  const char *id = pl_part_get_id (part);
  const PlPartType *type = pl_part_get_part_type (part);
  double v = 0.0;

  pl_inspector_add_port_pressures (self, row, part);
  if (r == NULL)
    return;

  switch (type->kind)
    {
    case PL_PART_HOSE:
    case PL_PART_PIPE:
      {
        pls_line_result lr;

        pl_inspector_add_heading (self, row, _("Line, all applicators open"));
        if (pl_results_get_line (r, id, PL_CASE_STEADY_OPEN, &lr))
          {
            pl_inspector_add_result (self, row, _("Flow"),
                                     pl_inspector_format (self, lr.flow, PL_QUANTITY_FLOW));
            pl_inspector_add_result (self, row, _("Velocity"),
                                     pl_inspector_format (self, lr.velocity,
                                                          PL_QUANTITY_VELOCITY));
            pl_inspector_add_result (self, row, _("Reynolds number"),
                                     g_strdup_printf ("%.4g", lr.reynolds));
            pl_inspector_add_result (self, row, _("Wall shear rate"),
                                     pl_inspector_format (self, lr.wall_shear_rate,
                                                          PL_QUANTITY_SHEAR_RATE));
          }
        else
          pl_inspector_add_result (self, row, _("Flow"), NULL);
      }
      break;
    case PL_PART_APPLICATOR:
      {
        double mass = 0.0, dev = 0.0, first = 0.0;

        if (pl_results_get_flow (r, id, 0, PL_CASE_STEADY_OPEN, &v))
          pl_inspector_add_result (self, row, _("Flow, held open"),
                                   pl_inspector_format (self, v, PL_QUANTITY_FLOW));
        if (pl_results_get_shot (r, id, &mass, &dev, &first))
          {
            pl_inspector_add_result (self, row, _("Shot mass"),
                                     pl_inspector_format (self, mass, PL_QUANTITY_MASS));
            pl_inspector_add_result (self, row, _("Deviation from the mean"),
                                     pl_inspector_format_percent (dev));
            pl_inspector_add_result (self, row, _("First shot from idle"),
                                     pl_inspector_format (self, first, PL_QUANTITY_MASS));
          }
        else
          pl_inspector_add_result (self, row, _("Shot mass"), NULL);
      }
      break;
    case PL_PART_PUMP:
      {
        pls_pump_result pr;
        pls_cycle_pump cp;

        pl_inspector_add_heading (self, row, _("Operating point, all applicators open"));
        if (pl_results_get_pump (r, id, PL_CASE_STEADY_OPEN, &pr))
          {
            pl_inspector_add_result (self, row, _("Delivered flow"),
                                     pl_inspector_format (self, pr.flow, PL_QUANTITY_FLOW));
            pl_inspector_add_result (self, row, _("Outlet pressure"),
                                     pl_inspector_format (self, pr.outlet_pressure,
                                                          PL_QUANTITY_PRESSURE));
            pl_inspector_add_result (self, row, _("Stall pressure"),
                                     pl_inspector_format (self, pr.stall_pressure,
                                                          PL_QUANTITY_PRESSURE));
            pl_inspector_add_result (self, row, _("Free flow"),
                                     pl_inspector_format (self, pr.free_flow,
                                                          PL_QUANTITY_FLOW));
          }
        if (pl_results_get_pump_cycle (r, id, &cp))
          {
            pl_inspector_add_result (self, row, _("Mean flow over the cycle"),
                                     pl_inspector_format (self, cp.mean_flow,
                                                          PL_QUANTITY_FLOW));
            pl_inspector_add_result (self, row, _("Volume per cycle"),
                                     pl_inspector_format (self, cp.volume,
                                                          PL_QUANTITY_VOLUME));
          }
      }
      break;
    case PL_PART_ACCUMULATOR:
      {
        pls_accumulator_result ar;
        pls_cycle_accumulator ca;

        if (pl_results_get_accumulator (r, id, PL_CASE_IDLE, &ar))
          {
            pl_inspector_add_result (self, row, _("Precharge at gas temperature"),
                                     pl_inspector_format (self, ar.precharge,
                                                          PL_QUANTITY_PRESSURE));
            pl_inspector_add_result (self, row, _("Stored fluid at idle"),
                                     pl_inspector_format (self, ar.fluid_volume,
                                                          PL_QUANTITY_VOLUME));
            pl_inspector_add_result (self, row, _("Gas energy at idle"),
                                     pl_inspector_format (self, ar.gas_energy,
                                                          PL_QUANTITY_ENERGY));
          }
        if (pl_results_get_accumulator_swing (r, id, &ca))
          {
            pl_inspector_add_result (self, row, _("Fluid swing over the cycle"),
                                     pl_inspector_format (self,
                                                          ca.max_fluid_volume
                                                          - ca.min_fluid_volume,
                                                          PL_QUANTITY_VOLUME));
            pl_inspector_add_result (self, row, _("Pressure swing over the cycle"),
                                     pl_inspector_format (self,
                                                          ca.max_pressure - ca.min_pressure,
                                                          PL_QUANTITY_PRESSURE));
          }
      }
      break;
    case PL_PART_TEE:
      {
        const char *legs[] = { N_("Flow to end A"), N_("Flow to end B"),
                               N_("Flow to the branch") };

        pl_inspector_add_heading (self, row, _("All applicators open"));
        for (guint s = 0; s < 3; s++)
          pl_inspector_add_result (self, row, _(legs[s]),
                                   pl_results_get_flow (r, id, s, PL_CASE_STEADY_OPEN, &v)
                                   ? pl_inspector_format (self, v, PL_QUANTITY_FLOW) : NULL);
      }
      break;
    case PL_PART_BALL_VALVE:
    case PL_PART_DUMP_VALVE:
      pl_inspector_add_result (self, row, _("Flow, all applicators open"),
                               pl_results_get_flow (r, id, 0, PL_CASE_STEADY_OPEN, &v)
                               ? pl_inspector_format (self, v, PL_QUANTITY_FLOW) : NULL);
      break;
    case PL_PART_GAUGE:
    case PL_PART_DRAIN:
    case PL_PART_SCENARIO:
    case PL_PART_TITLE:
    case PL_N_PART_KINDS:
    default:
      break;
    }
}

static void
pl_inspector_add_summary (PlInspector *self, int *row)
{
  PlResults *r = self->results;
  double t = 0.0;
  const char *state;

  if (r == NULL)
    {
      pl_inspector_add_result (self, row, _("Results"), g_strdup (_("None yet")));
      return;
    }
  switch (pl_results_get_transient_state (r))
    {
    case PL_TRANSIENT_PENDING:
      state = _("Running in the background");
      break;
    case PL_TRANSIENT_DONE:
      state = _("Done");
      break;
    case PL_TRANSIENT_SKIPPED:
    default:
      state = _("Nothing to simulate");
      break;
    }
  pl_inspector_add_result (self, row, _("Idle solve"),
                           g_strdup (pl_results_get_converged (r, PL_CASE_IDLE)
                                     ? _("Converged") : _("Not solved")));
  pl_inspector_add_result (self, row, _("All-open solve"),
                           g_strdup (pl_results_get_converged (r, PL_CASE_STEADY_OPEN)
                                     ? _("Converged") : _("Not solved")));
  pl_inspector_add_result (self, row, _("Cycle and shutdown"), g_strdup (state));
  if (pl_results_get_shutdown_safe_time (r, &t))
    pl_inspector_add_result (self, row, _("Safe after shutdown in"),
                             t >= 0.0 ? pl_inspector_format (self, t, PL_QUANTITY_TIME)
                             : g_strdup (_("Not within the run")));
  pl_inspector_add_result (self, row, _("Errors"),
                           g_strdup_printf ("%u", pl_results_count_findings
                                            (r, PLS_SEVERITY_ERROR)));
  pl_inspector_add_result (self, row, _("Warnings"),
                           g_strdup_printf ("%u", pl_results_count_findings
                                            (r, PLS_SEVERITY_WARNING)
                                            - pl_results_count_findings
                                            (r, PLS_SEVERITY_ERROR)));
}

static void
pl_inspector_refresh_results (PlInspector *self)
{
  GtkWidget *child;
  int row = 0;
  const PlPart *part = NULL;

  while ((child = gtk_widget_get_first_child (self->results_grid)) != NULL)
    gtk_grid_remove (GTK_GRID (self->results_grid), child);
  g_string_truncate (self->results_text, 0);

  if (self->doc != NULL && self->shown_part != NULL)
    part = pl_document_find_part (self->doc, self->shown_part);
  if (self->doc == NULL || (self->shown_part != NULL && part == NULL)
      || g_strv_length (self->selection) > 1)
    {
      gtk_widget_set_visible (self->results_box, FALSE);
      return;
    }
  gtk_widget_set_visible (self->results_box, TRUE);
  if (part != NULL)
    pl_inspector_add_part_results (self, &row, part);
  else
    pl_inspector_add_summary (self, &row);

  gtk_widget_set_visible (self->stale_label, self->stale);
  if (self->stale)
    {
      g_string_prepend_c (self->results_text, '\n');
      g_string_prepend (self->results_text, gtk_label_get_text (GTK_LABEL (self->stale_label)));
    }
  gtk_widget_set_sensitive (self->results_grid, !self->stale);
  if (self->stale)
    gtk_widget_add_css_class (self->results_grid, "pl-stale");
  else
    gtk_widget_remove_css_class (self->results_grid, "pl-stale");
}

/* --- parameter rows --- */

static void
pl_inspector_add_section (PlInspector *self, const char *heading)
{
  GtkWidget *l = gtk_label_new (heading);

  gtk_label_set_xalign (GTK_LABEL (l), 0.0);
  gtk_widget_add_css_class (l, "heading");
  if (gtk_widget_get_first_child (self->params) != NULL)
    gtk_widget_set_margin_top (l, 12);
  gtk_box_append (GTK_BOX (self->params), l);
}

static void
pl_inspector_add_rows (PlInspector *self, const PlPart *part)
{
  const PlPartType *type = pl_part_get_part_type (part);

  for (guint i = 0; i < type->n_params; i++)
    {
      GtkWidget *row = pl_param_row_new (self->doc, self->undo, &self->prefs,
                                         pl_part_get_id (part), &type->params[i]);

      gtk_box_append (GTK_BOX (self->params), row);
      g_ptr_array_add (self->rows, row);
    }
}

static void
pl_inspector_update_relevance (PlInspector *self)
{
  for (guint i = 0; i < self->rows->len; i++)
    {
      PlParamRow *row = g_ptr_array_index (self->rows, i);
      const PlParamSpec *spec = pl_param_row_get_spec (row);
      const PlPart *part = pl_document_find_part (self->doc, pl_param_row_get_item_id (row));

      if (spec == NULL || part == NULL)
        continue;
      /* Irrelevant values are kept and saved; hiding them keeps the panel
       * about what the present choices use. */
      gtk_widget_set_visible (GTK_WIDGET (row), pl_part_param_is_relevant (part, spec));
    }
}

static void
pl_inspector_rebuild (PlInspector *self)
{
  GtkWidget *child;
  guint n = g_strv_length (self->selection);

  while ((child = gtk_widget_get_first_child (self->params)) != NULL)
    gtk_box_remove (GTK_BOX (self->params), child);
  g_ptr_array_set_size (self->rows, 0);
  g_clear_pointer (&self->shown_part, g_free);
  gtk_widget_set_visible (self->subtitle, FALSE);

  if (self->doc == NULL)
    {
      gtk_label_set_text (GTK_LABEL (self->title), _("No layout"));
      pl_inspector_refresh_results (self);
      return;
    }

  if (n == 1 && pl_document_find_part (self->doc, self->selection[0]) != NULL)
    {
      const PlPart *part = pl_document_find_part (self->doc, self->selection[0]);
      const PlPartType *type = pl_part_get_part_type (part);
      GtkWidget *tag_row;

      self->shown_part = g_strdup (pl_part_get_id (part));
      gtk_label_set_text (GTK_LABEL (self->title), pl_part_get_tag (part));
      gtk_label_set_text (GTK_LABEL (self->subtitle), _(type->name));
      gtk_widget_set_tooltip_text (self->subtitle, _(type->description));
      gtk_widget_set_visible (self->subtitle, TRUE);
      tag_row = pl_param_row_new (self->doc, self->undo, &self->prefs,
                                  pl_part_get_id (part), NULL);
      gtk_box_append (GTK_BOX (self->params), tag_row);
      g_ptr_array_add (self->rows, tag_row);
      pl_inspector_add_rows (self, part);
    }
  else if (n > 1)
    {
      g_autofree char *title = g_strdup_printf (ngettext ("%u part selected",
                                                          "%u parts selected", n), n);
      g_autoptr (GString) list = g_string_new (NULL);
      GtkWidget *l;

      gtk_label_set_text (GTK_LABEL (self->title), title);
      for (guint i = 0; i < n; i++)
        {
          const PlPart *part = pl_document_find_part (self->doc, self->selection[i]);

          if (part == NULL)
            continue;
          if (list->len > 0)
            g_string_append (list, "\n");
          /* Translators: one line of a list, tag and type, "H3 (Hose)". */
          g_string_append_printf (list, _("%s (%s)"), pl_part_get_tag (part),
                                  _(pl_part_get_part_type (part)->name));
        }
      l = gtk_label_new (list->str);
      gtk_label_set_xalign (GTK_LABEL (l), 0.0);
      gtk_label_set_wrap (GTK_LABEL (l), TRUE);
      gtk_box_append (GTK_BOX (self->params), l);
      l = gtk_label_new (_("Select one part to edit its values."));
      gtk_label_set_xalign (GTK_LABEL (l), 0.0);
      gtk_label_set_wrap (GTK_LABEL (l), TRUE);
      gtk_widget_add_css_class (l, "dim-label");
      gtk_box_append (GTK_BOX (self->params), l);
    }
  else
    {
      gtk_label_set_text (GTK_LABEL (self->title), _("Scenario"));
      gtk_label_set_text (GTK_LABEL (self->subtitle),
                          _("Fluid, air supply, firing schedule and design limits"));
      gtk_widget_set_visible (self->subtitle, TRUE);
      pl_inspector_add_rows (self, pl_document_get_scenario (self->doc));
      pl_inspector_add_section (self, _("Title block"));
      pl_inspector_add_rows (self, pl_document_get_title (self->doc));
    }
  pl_inspector_update_relevance (self);
  pl_inspector_refresh_results (self);
  gtk_accessible_update_property (GTK_ACCESSIBLE (self), GTK_ACCESSIBLE_PROPERTY_LABEL,
                                  gtk_label_get_text (GTK_LABEL (self->title)), -1);
}

static void
document_changed_cb (PlDocument *doc, guint change, PlInspector *self)
{
  /* A part that went away (deleted, or undo of its adding) takes its rows
   * with it; the window sends the new selection soon after. */
  if (self->shown_part != NULL && pl_document_find_part (doc, self->shown_part) == NULL)
    {
      pl_inspector_rebuild (self);
      return;
    }
  for (guint i = 0; i < self->rows->len; i++)
    pl_param_row_sync (g_ptr_array_index (self->rows, i));
  pl_inspector_update_relevance (self);
  if (self->shown_part != NULL && (change & PL_CHANGE_ANNOTATION) != 0)
    gtk_label_set_text (GTK_LABEL (self->title),
                        pl_part_get_tag (pl_document_find_part (doc, self->shown_part)));
}

/* --- GObject --- */

static void
pl_inspector_dispose (GObject *object)
{
  PlInspector *self = PL_INSPECTOR (object);

  if (self->doc != NULL)
    g_clear_signal_handler (&self->changed_id, self->doc);
  g_clear_object (&self->doc);
  g_clear_object (&self->undo);
  g_clear_pointer (&self->results, pl_results_unref);
  g_clear_pointer (&self->scroller, gtk_widget_unparent);
  G_OBJECT_CLASS (pl_inspector_parent_class)->dispose (object);
}

static void
pl_inspector_finalize (GObject *object)
{
  PlInspector *self = PL_INSPECTOR (object);

  g_strfreev (self->selection);
  g_ptr_array_unref (self->rows);
  g_string_free (self->results_text, TRUE);
  g_free (self->shown_part);
  G_OBJECT_CLASS (pl_inspector_parent_class)->finalize (object);
}

static void
pl_inspector_class_init (PlInspectorClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);

  object_class->dispose = pl_inspector_dispose;
  object_class->finalize = pl_inspector_finalize;
  gtk_widget_class_set_layout_manager_type (widget_class, GTK_TYPE_BIN_LAYOUT);
  gtk_widget_class_set_css_name (widget_class, "plinspector");
  gtk_widget_class_set_accessible_role (widget_class, GTK_ACCESSIBLE_ROLE_GROUP);
}

static void
pl_inspector_init (PlInspector *self)
{
  GtkWidget *box, *header, *l;

  self->selection = g_new0 (char *, 1);
  self->rows = g_ptr_array_new ();
  self->results_text = g_string_new (NULL);
  pl_unit_prefs_init (&self->prefs, PL_UNIT_SYSTEM_SI);

  self->scroller = gtk_scrolled_window_new ();
  gtk_scrolled_window_set_policy (GTK_SCROLLED_WINDOW (self->scroller), GTK_POLICY_NEVER,
                                  GTK_POLICY_AUTOMATIC);
  gtk_widget_set_parent (self->scroller, GTK_WIDGET (self));

  box = gtk_box_new (GTK_ORIENTATION_VERTICAL, 6);
  gtk_widget_set_margin_start (box, 12);
  gtk_widget_set_margin_end (box, 12);
  gtk_widget_set_margin_top (box, 12);
  gtk_widget_set_margin_bottom (box, 12);
  gtk_scrolled_window_set_child (GTK_SCROLLED_WINDOW (self->scroller), box);

  self->title = gtk_label_new ("");
  gtk_label_set_xalign (GTK_LABEL (self->title), 0.0);
  gtk_label_set_ellipsize (GTK_LABEL (self->title), PANGO_ELLIPSIZE_END);
  gtk_widget_add_css_class (self->title, "title-2");
  gtk_box_append (GTK_BOX (box), self->title);
  self->subtitle = gtk_label_new ("");
  gtk_label_set_xalign (GTK_LABEL (self->subtitle), 0.0);
  gtk_label_set_wrap (GTK_LABEL (self->subtitle), TRUE);
  gtk_widget_add_css_class (self->subtitle, "dim-label");
  gtk_box_append (GTK_BOX (box), self->subtitle);

  self->params = gtk_box_new (GTK_ORIENTATION_VERTICAL, 6);
  gtk_widget_set_margin_top (self->params, 6);
  gtk_box_append (GTK_BOX (box), self->params);

  self->results_box = gtk_box_new (GTK_ORIENTATION_VERTICAL, 6);
  gtk_widget_set_margin_top (self->results_box, 12);
  gtk_box_append (GTK_BOX (box), gtk_separator_new (GTK_ORIENTATION_HORIZONTAL));
  gtk_box_append (GTK_BOX (box), self->results_box);
  header = gtk_box_new (GTK_ORIENTATION_HORIZONTAL, 6);
  l = gtk_label_new (_("Live results"));
  gtk_label_set_xalign (GTK_LABEL (l), 0.0);
  gtk_widget_set_hexpand (l, TRUE);
  gtk_widget_add_css_class (l, "title-4");
  gtk_box_append (GTK_BOX (header), l);
  self->stale_label = gtk_label_new (_("Results out of date"));
  gtk_widget_add_css_class (self->stale_label, "warning");
  gtk_widget_add_css_class (self->stale_label, "pl-stale-badge");
  gtk_widget_set_tooltip_text (self->stale_label,
                               _("These figures belong to an earlier state of the layout; "
                                 "new ones follow when the solve is done."));
  gtk_widget_set_visible (self->stale_label, FALSE);
  gtk_box_append (GTK_BOX (header), self->stale_label);
  gtk_box_append (GTK_BOX (self->results_box), header);
  self->results_grid = gtk_grid_new ();
  gtk_grid_set_column_spacing (GTK_GRID (self->results_grid), 8);
  gtk_grid_set_row_spacing (GTK_GRID (self->results_grid), 2);
  gtk_box_append (GTK_BOX (self->results_box), self->results_grid);

  gtk_accessible_update_property (GTK_ACCESSIBLE (self), GTK_ACCESSIBLE_PROPERTY_LABEL,
                                  _("Inspector"), -1);
  pl_inspector_rebuild (self);
}

/* --- public --- */

GtkWidget *
pl_inspector_new (void)
{
  return g_object_new (PL_TYPE_INSPECTOR, NULL);
}

void
pl_inspector_set_context (PlInspector *self, PlDocument *doc, PlUndoStack *undo,
                          const PlUnitPrefs *prefs)
{
  g_return_if_fail (PL_IS_INSPECTOR (self));
  g_return_if_fail (doc == NULL || PL_IS_DOCUMENT (doc));
  g_return_if_fail (undo == NULL || PL_IS_UNDO_STACK (undo));
  g_return_if_fail ((doc == NULL) == (undo == NULL));

  if (self->doc != NULL)
    g_clear_signal_handler (&self->changed_id, self->doc);
  g_set_object (&self->doc, doc);
  g_set_object (&self->undo, undo);
  if (prefs != NULL)
    self->prefs = *prefs;
  else
    pl_unit_prefs_init (&self->prefs, PL_UNIT_SYSTEM_SI);
  if (doc != NULL)
    self->changed_id = g_signal_connect (doc, "changed", G_CALLBACK (document_changed_cb),
                                         self);
  g_strfreev (self->selection);
  self->selection = g_new0 (char *, 1);
  pl_inspector_rebuild (self);
}

void
pl_inspector_set_selection (PlInspector *self, const char *const *part_ids)
{
  g_return_if_fail (PL_IS_INSPECTOR (self));

  if (part_ids != NULL && self->selection != NULL
      && g_strv_equal ((const char *const *) self->selection, part_ids))
    return;
  g_strfreev (self->selection);
  self->selection = part_ids != NULL ? g_strdupv ((char **) part_ids) : g_new0 (char *, 1);
  pl_inspector_rebuild (self);
}

void
pl_inspector_set_results (PlInspector *self, PlResults *results, gboolean stale)
{
  g_return_if_fail (PL_IS_INSPECTOR (self));

  if (results != NULL)
    pl_results_ref (results);
  g_clear_pointer (&self->results, pl_results_unref);
  self->results = results;
  self->stale = stale;
  pl_inspector_refresh_results (self);
}

GtkWidget *
pl_inspector_get_row (PlInspector *self, const char *key)
{
  g_return_val_if_fail (PL_IS_INSPECTOR (self), NULL);
  g_return_val_if_fail (key != NULL, NULL);

  for (guint i = 0; i < self->rows->len; i++)
    {
      PlParamRow *row = g_ptr_array_index (self->rows, i);
      const PlParamSpec *spec = pl_param_row_get_spec (row);

      if (spec == NULL ? g_str_equal (key, "tag") : g_str_equal (key, spec->key))
        return GTK_WIDGET (row);
    }
  return NULL;
}

const char *
pl_inspector_get_title (PlInspector *self)
{
  g_return_val_if_fail (PL_IS_INSPECTOR (self), NULL);
  return gtk_label_get_text (GTK_LABEL (self->title));
}

char *
pl_inspector_dup_results_text (PlInspector *self)
{
  g_return_val_if_fail (PL_IS_INSPECTOR (self), NULL);
  return g_strdup (self->results_text->str);
}

gboolean
pl_inspector_get_results_stale (PlInspector *self)
{
  g_return_val_if_fail (PL_IS_INSPECTOR (self), FALSE);
  return self->stale;
}
