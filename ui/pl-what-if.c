/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-what-if.c: sliders that edit the document through the undo stack.
 */
#include "config.h"

#include "pl-what-if.h"

#include <glib/gi18n.h>
#include <math.h>

#include "pl-accumulator-fit.h"
#include "pl-command.h"
#include "pl-part-type.h"

typedef enum
{
  TARGET_HOSE,          /* the longest hose: the supply hose of a line */
  TARGET_SCENARIO,
  TARGET_ACCUMULATOR,   /* the first accumulator */
} Target;

/* The controls.  Ranges (SI) span what a class would try on a dispensing
 * line, inside every parameter's own range (pl-part-types.c); the figures
 * are the project's choice, no source.  Log sliders for quantities that
 * are tried by factors rather than steps. */
static const struct
{
  const char *key;
  const char *label;
  Target target;
  const char *param;     /* NULL: the scenario's viscosity parameter of its law */
  PlQuantity quantity;
  double lo, hi;
  gboolean log;
} controls[] = {
  { PL_WHAT_IF_HOSE_BORE, N_("Hose bore"), TARGET_HOSE, "bore", PL_QUANTITY_LENGTH,
    3e-3, 25e-3, FALSE },
  { PL_WHAT_IF_HOSE_LENGTH, N_("Hose length"), TARGET_HOSE, "length",
    PL_QUANTITY_LINE_LENGTH, 0.5, 50.0, TRUE },
  { PL_WHAT_IF_VISCOSITY, N_("Viscosity"), TARGET_SCENARIO, NULL, PL_QUANTITY_VISCOSITY,
    0.01, 100.0, TRUE },
  { PL_WHAT_IF_PRECHARGE, N_("Accumulator precharge"), TARGET_ACCUMULATOR, "precharge",
    PL_QUANTITY_PRESSURE, 5e5, 3e7, TRUE },
  { PL_WHAT_IF_AIR_PRESSURE, N_("Air pressure"), TARGET_SCENARIO, "air-pressure",
    PL_QUANTITY_PRESSURE, 1e5, 8e5, FALSE },
  { PL_WHAT_IF_ON_TIME, N_("On-time"), TARGET_SCENARIO, "on-time", PL_QUANTITY_TIME,
    5e-3, 0.3, TRUE },
};
#define N_CONTROLS G_N_ELEMENTS (controls)

struct _PlWhatIf
{
  GtkWidget parent_instance;

  GtkWidget *grid;
  GtkWidget *names[N_CONTROLS];
  GtkRange *scales[N_CONTROLS];
  GtkWidget *values[N_CONTROLS];
  GtkSwitch *acc_switch;
  GtkWidget *acc_name;
  GtkWidget *message;
  GtkWidget *fit_note;

  PlDocument *doc;
  PlUndoStack *undo;
  PlSolveScheduler *scheduler;   /* for sizing an accumulator to fit */
  /* The precharge control's value while the layout has no accumulator:
   * what a fitted one gets (NAN: half the idle pressure at its node). */
  double planned_precharge;
  gulong changed_id;
  PlUnitPrefs units;
  gboolean refreshing;        /* setting sliders from the document */
  gint64 last_change[N_CONTROLS];
  /* The document as it was before this panel removed the accumulator, and
   * that accumulator's id: what putting it back restores. */
  PlDocument *before_removal;
  char *removed_id;
};

G_DEFINE_FINAL_TYPE (PlWhatIf, pl_what_if, GTK_TYPE_WIDGET)

static const PlPart *
find_target (PlWhatIf *self, Target target)
{
  const PlPart *best = NULL;
  double best_length = -1.0;

  if (self->doc == NULL)
    return NULL;
  if (target == TARGET_SCENARIO)
    return pl_document_get_scenario (self->doc);
  for (guint i = 0; i < pl_document_get_n_parts (self->doc); i++)
    {
      const PlPart *part = pl_document_get_part (self->doc, i);
      PlPartKind kind = pl_part_get_part_type (part)->kind;

      if (target == TARGET_ACCUMULATOR && kind == PL_PART_ACCUMULATOR)
        return part;
      if (target == TARGET_HOSE && kind == PL_PART_HOSE
          && pl_part_get_number (part, "length") > best_length)
        {
          best = part;
          best_length = pl_part_get_number (part, "length");
        }
    }
  return best;
}

/* The scenario's viscosity parameter for its law. */
static const char *
param_of (PlWhatIf *self, guint c)
{
  const char *law;

  if (controls[c].param != NULL)
    return controls[c].param;
  law = self->doc != NULL
        ? pl_part_get_choice_key (pl_document_get_scenario (self->doc), "viscosity-law")
        : NULL;
  if (g_strcmp0 (law, "power-law") == 0)
    return "consistency";
  if (g_strcmp0 (law, "carreau") == 0)
    return "zero-shear-viscosity";
  return "viscosity";
}

static double
to_slider (guint c, double v)
{
  return controls[c].log ? log10 (v) : v;
}

static double
from_slider (guint c, double x)
{
  return controls[c].log ? pow (10.0, x) : x;
}

/* The longest on-time the document accepts (pl-part-types.c): every
 * applicator's firing delay, the on-time and the closing ramp must fit in
 * one firing period, 1 / cycle rate.  NAN without a document. */
static double
on_time_cap (PlWhatIf *self)
{
  const PlPart *scenario;
  double latest_delay = 0.0;

  if (self->doc == NULL)
    return NAN;
  scenario = pl_document_get_scenario (self->doc);
  for (guint i = 0; i < pl_document_get_n_parts (self->doc); i++)
    {
      const PlPart *part = pl_document_get_part (self->doc, i);

      if (pl_part_get_part_type (part)->kind == PL_PART_APPLICATOR)
        latest_delay = MAX (latest_delay, pl_part_get_number (part, "firing-delay"));
    }
  return 1.0 / pl_part_get_number (scenario, "cycle-rate") - latest_delay
         - pl_part_get_number (scenario, "close-ramp");
}

/* The range a control may take now: its own, and for the on-time the
 * opening ramp at least and the cap above at most. */
static void
range_of (PlWhatIf *self, guint c, double *lo, double *hi)
{
  *lo = controls[c].lo;
  *hi = controls[c].hi;
  if (g_strcmp0 (controls[c].key, PL_WHAT_IF_ON_TIME) == 0 && self->doc != NULL)
    {
      double cap = on_time_cap (self);
      double open_ramp = pl_part_get_number (pl_document_get_scenario (self->doc), "open-ramp");

      *lo = MAX (*lo, open_ramp);
      if (isfinite (cap) && cap > *lo)
        *hi = MIN (*hi, cap);
    }
}

/* Three significant digits, towards lo..hi where rounding left them. */
static double
round_within (double v, double lo, double hi)
{
  double mag = pow (10.0, floor (log10 (v)) - 2.0);
  double r = round (v / mag) * mag;

  if (r > hi)
    r = floor (v / mag) * mag;
  if (r < lo)
    r = ceil (v / mag) * mag;
  return r;
}

/* The on-time slider stops where the document stops taking it, and its
 * tooltip says why. */
static void
update_on_time_range (PlWhatIf *self, guint c)
{
  double lo, hi;
  g_autofree char *cap = NULL;
  g_autofree char *tip = NULL;

  range_of (self, c, &lo, &hi);
  gtk_range_set_range (self->scales[c], to_slider (c, lo), to_slider (c, hi));
  cap = pl_unit_format (hi, PL_QUANTITY_TIME, &self->units, 3, PL_UNIT_DECIMAL_FROM_LOCALE);
  tip = g_strdup_printf (
    /* Translators: %s is a time, "0.247 s". */
    _("Up to %s: every applicator's firing delay, the on-time and the closing time must fit "
      "in one firing period (1 / firing rate), and the on-time must not be shorter than the "
      "opening time."), cap);
  gtk_widget_set_tooltip_text (GTK_WIDGET (self->scales[c]), tip);
}

static void
show_value (PlWhatIf *self, guint c, double v)
{
  /* The parameter's own quantity where there is one: the viscosity
   * control sets a power law's consistency, in Pa s^n. */
  const PlPart *part = find_target (self, controls[c].target);
  const PlParamSpec *spec = part != NULL
                            ? pl_part_type_find_param (pl_part_get_part_type (part),
                                                       param_of (self, c), NULL)
                            : NULL;
  g_autofree char *text = pl_unit_format (v, spec != NULL ? spec->quantity
                                                          : controls[c].quantity,
                                          &self->units, 3, PL_UNIT_DECIMAL_FROM_LOCALE);

  gtk_label_set_text (GTK_LABEL (self->values[c]), text);
}

/* An accumulator this panel could fit to a layout without one, sized for
 * the present state with precharge (NAN: the default); FALSE when there is
 * none (no pump, no applicator, not solved yet, a precharge too high). */
static gboolean
plan_fit (PlWhatIf *self, double precharge, PlAccumulatorFit *fit, GError **error)
{
  PlResults *fast = self->scheduler != NULL
                    ? pl_solve_scheduler_get_fast_results (self->scheduler) : NULL;

  if (self->doc == NULL)
    return FALSE;
  return pl_accumulator_fit_plan (self->doc, fast, precharge, fit, error);
}

static void
refresh (PlWhatIf *self)
{
  const PlPart *acc = find_target (self, TARGET_ACCUMULATOR);
  PlAccumulatorFit fit;
  /* Whether one can go in at all, by the default precharge: a planned
   * precharge that is too high is refused when the switch is turned on,
   * with the reason, and stays on its control to be lowered. */
  gboolean can_fit = acc == NULL && self->before_removal == NULL
                     && plan_fit (self, NAN, &fit, NULL);

  self->refreshing = TRUE;
  for (guint c = 0; c < N_CONTROLS; c++)
    {
      const PlPart *part = find_target (self, controls[c].target);
      double v = part != NULL ? pl_part_get_number (part, param_of (self, c)) : NAN;
      g_autofree char *name = NULL;

      /* Without an accumulator the precharge control sets the precharge
       * of the one the switch would fit. */
      if (controls[c].target == TARGET_ACCUMULATOR && part == NULL && can_fit)
        v = isfinite (self->planned_precharge) ? self->planned_precharge : fit.precharge;

      gtk_widget_set_sensitive (GTK_WIDGET (self->scales[c]), isfinite (v));
      if (g_strcmp0 (controls[c].key, PL_WHAT_IF_ON_TIME) == 0)
        update_on_time_range (self, c);
      if (controls[c].param == NULL && part != NULL)
        {
          /* The viscosity control sets the law's own parameter: its name. */
          const PlParamSpec *spec = pl_part_type_find_param (pl_part_get_part_type (part),
                                                             param_of (self, c), NULL);

          name = g_strdup (spec != NULL ? _(spec->label) : _(controls[c].label));
        }
      else if (controls[c].target == TARGET_HOSE && part != NULL)
        /* Translators: a what-if control's name for one part, "Hose bore (H1)". */
        name = g_strdup_printf (_("%s (%s)"), _(controls[c].label), pl_part_get_tag (part));
      else if (controls[c].target == TARGET_ACCUMULATOR && part != NULL)
        name = g_strdup_printf (_("%s (%s)"), _(controls[c].label), pl_part_get_tag (part));
      gtk_label_set_text (GTK_LABEL (self->names[c]), name != NULL ? name
                                                                   : _(controls[c].label));
      if (isfinite (v) && v > 0.0)
        {
          gtk_range_set_value (self->scales[c], to_slider (c, v));
          show_value (self, c, v);
        }
      else
        gtk_label_set_text (GTK_LABEL (self->values[c]), "–");
    }
  gtk_switch_set_active (self->acc_switch, acc != NULL);
  gtk_switch_set_state (self->acc_switch, acc != NULL);
  gtk_widget_set_sensitive (GTK_WIDGET (self->acc_switch),
                            acc != NULL || self->before_removal != NULL || can_fit);
  if (acc == NULL)
    gtk_widget_set_visible (self->fit_note, FALSE);
  self->refreshing = FALSE;
}

static void
say (PlWhatIf *self, const char *text)
{
  gtk_label_set_text (GTK_LABEL (self->message), text != NULL ? text : "");
  gtk_widget_set_visible (self->message, text != NULL && *text != '\0');
}

static gboolean
push (PlWhatIf *self, PlCommand *cmd, gboolean merge)
{
  g_autoptr (PlCommand) owned = cmd;
  g_autoptr (GError) error = NULL;
  gboolean ok = merge ? pl_undo_stack_push_merge (self->undo, owned, &error)
                      : pl_undo_stack_push (self->undo, owned, &error);

  say (self, ok ? NULL : error->message);
  return ok;
}

static void
value_changed_cb (GtkRange *range, PlWhatIf *self)
{
  guint c;
  const PlPart *part;
  gint64 now = g_get_monotonic_time ();
  gboolean merge;
  double v, lo, hi;

  if (self->refreshing || self->undo == NULL)
    return;
  for (c = 0; c < N_CONTROLS && self->scales[c] != range; c++)
    ;
  g_return_if_fail (c < N_CONTROLS);
  part = find_target (self, controls[c].target);
  /* Three significant digits: what the value label shows is what is set. */
  v = from_slider (c, gtk_range_get_value (range));
  range_of (self, c, &lo, &hi);
  v = round_within (v, lo, hi);
  if (part == NULL && controls[c].target == TARGET_ACCUMULATOR)
    {
      /* No accumulator yet: the value waits for the switch. */
      self->planned_precharge = v;
      show_value (self, c, v);
      return;
    }
  if (part == NULL)
    return;
  if (v == pl_part_get_number (part, param_of (self, c)))
    return;
  merge = self->last_change[c] != 0 && now - self->last_change[c] < PL_WHAT_IF_MERGE_MS * 1000;
  self->last_change[c] = now;
  for (guint k = 0; k < N_CONTROLS; k++)
    if (k != c)
      self->last_change[k] = 0;
  /* push_merge folds only into a step that push_merge made itself, with
   * nothing in between (pl-undo-stack.h); an empty group is such a
   * "something" and records no step, so it starts a new drag's step. */
  if (!merge)
    {
      pl_undo_stack_begin_group (self->undo, NULL);
      pl_undo_stack_end_group (self->undo);
    }
  push (self, pl_command_new_set_number (pl_part_get_id (part), param_of (self, c), v), TRUE);
  /* A refused value springs back to the document's. */
  refresh (self);
}

/* Putting the accumulator back: the part with its values, then its wires,
 * as one step. */
static PlCommand *
restore_command (PlWhatIf *self)
{
  const PlPart *part = pl_document_find_part (self->before_removal, self->removed_id);
  const PlPartType *type;
  g_autoptr (GPtrArray) cmds = g_ptr_array_new_with_free_func ((GDestroyNotify) pl_command_unref);

  if (part == NULL)
    return NULL;
  type = pl_part_get_part_type (part);
  g_ptr_array_add (cmds, pl_command_new_add_part_full (type->key, pl_part_get_id (part),
                                                       pl_part_get_tag (part),
                                                       pl_part_get_x (part),
                                                       pl_part_get_y (part),
                                                       pl_part_get_rotation (part),
                                                       pl_part_get_mirrored (part)));
  for (guint i = 0; i < type->n_params; i++)
    g_ptr_array_add (cmds, pl_command_new_set_value (pl_part_get_id (part), type->params[i].key,
                                                     pl_part_get_nth_value (part, i)));
  for (guint i = 0; i < pl_document_get_n_wires (self->before_removal); i++)
    {
      const PlWire *w = pl_document_get_wire (self->before_removal, i);
      const char *a = pl_wire_get_part_id (w, 0), *b = pl_wire_get_part_id (w, 1);
      const PlPoint *bends;
      guint n_bends;

      if (g_strcmp0 (a, self->removed_id) != 0 && g_strcmp0 (b, self->removed_id) != 0)
        continue;
      /* The other end must still be there. */
      if (pl_document_find_part (self->doc, g_strcmp0 (a, self->removed_id) == 0 ? b : a)
          == NULL)
        continue;
      bends = pl_wire_get_bends (w, &n_bends);
      g_ptr_array_add (cmds, pl_command_new_add_wire (NULL, a, pl_wire_get_port_key (w, 0), b,
                                                      pl_wire_get_port_key (w, 1), bends,
                                                      n_bends));
    }
  return pl_command_new_sequence (_("Put Accumulator Back"),
                                  (PlCommand *const *) cmds->pdata, cmds->len);
}

/* A layout without an accumulator gets one at the applicators' feed node,
 * sized by the rule of pl-accumulator-fit.h; the note says what was done
 * and by which rule (the presentation's footer carries the cautions about
 * stored energy). */
static void
fit_accumulator (PlWhatIf *self)
{
  g_autoptr (GError) error = NULL;
  PlAccumulatorFit fit;
  const PlPart *feed, *acc;
  g_autofree char *volume = NULL;
  g_autofree char *precharge = NULL;
  g_autofree char *note = NULL;

  if (!plan_fit (self, self->planned_precharge, &fit, &error))
    {
      say (self, error->message);
      return;
    }
  feed = pl_document_find_part (self->doc, fit.part_id);
  if (!push (self, pl_accumulator_fit_command (self->doc, &fit), FALSE))
    return;
  acc = find_target (self, TARGET_ACCUMULATOR);
  volume = pl_unit_format (fit.gas_volume, PL_QUANTITY_VOLUME, &self->units, 3,
                           PL_UNIT_DECIMAL_FROM_LOCALE);
  precharge = pl_unit_format (fit.precharge, PL_QUANTITY_PRESSURE, &self->units, 3,
                              PL_UNIT_DECIMAL_FROM_LOCALE);
  note = g_strdup_printf (
    /* Translators: the accumulator's tag, the tag of the part it is fitted
     * at, a volume and a pressure. */
    _("What-if: %s fitted at %s, gas volume %s, precharge %s. Sized to give one shot of "
      "every applicator while the pressure there falls to 90 %% of idle (common practice, "
      "no source). Undo takes it out."),
    acc != NULL ? pl_part_get_tag (acc) : "", pl_part_get_tag (feed), volume, precharge);
  refresh (self);
  gtk_label_set_text (GTK_LABEL (self->fit_note), note);
  gtk_widget_set_visible (self->fit_note, TRUE);
}

static gboolean
acc_state_set_cb (GtkSwitch *sw, gboolean on, PlWhatIf *self)
{
  const PlPart *acc;

  if (self->refreshing || self->undo == NULL)
    return FALSE;
  acc = find_target (self, TARGET_ACCUMULATOR);
  if (!on && acc != NULL)
    {
      const char *ids[] = { pl_part_get_id (acc) };

      g_clear_object (&self->before_removal);
      g_free (self->removed_id);
      self->before_removal = pl_document_copy (self->doc);
      self->removed_id = g_strdup (ids[0]);
      push (self, pl_command_new_remove (ids, 1), FALSE);
    }
  else if (on && acc == NULL && self->before_removal != NULL)
    {
      PlCommand *cmd = restore_command (self);

      if (cmd != NULL)
        push (self, cmd, FALSE);
    }
  else if (on && acc == NULL)
    {
      refresh (self);
      fit_accumulator (self);
      return TRUE;
    }
  refresh (self);
  return TRUE;
}

static void
doc_changed_cb (PlDocument *doc, guint change, PlWhatIf *self)
{
  refresh (self);
}

static void
pl_what_if_dispose (GObject *object)
{
  PlWhatIf *self = PL_WHAT_IF (object);

  pl_what_if_set_document (self, NULL, NULL);
  g_clear_object (&self->scheduler);
  g_clear_object (&self->before_removal);
  g_clear_pointer (&self->removed_id, g_free);
  g_clear_pointer (&self->grid, gtk_widget_unparent);
  G_OBJECT_CLASS (pl_what_if_parent_class)->dispose (object);
}

static void
pl_what_if_class_init (PlWhatIfClass *klass)
{
  G_OBJECT_CLASS (klass)->dispose = pl_what_if_dispose;
  gtk_widget_class_set_layout_manager_type (GTK_WIDGET_CLASS (klass), GTK_TYPE_BIN_LAYOUT);
  gtk_widget_class_set_css_name (GTK_WIDGET_CLASS (klass), "pl-what-if");
}

static GtkWidget *
name_label (const char *text)
{
  GtkWidget *label = gtk_label_new (text);

  gtk_label_set_xalign (GTK_LABEL (label), 0.0);
  return label;
}

static void
pl_what_if_init (PlWhatIf *self)
{
  GtkGrid *grid;
  guint row = 0;

  pl_unit_prefs_init (&self->units, PL_UNIT_SYSTEM_SI);
  self->planned_precharge = NAN;
  self->grid = gtk_grid_new ();
  grid = GTK_GRID (self->grid);
  gtk_grid_set_row_spacing (grid, 6);
  gtk_grid_set_column_spacing (grid, 12);
  gtk_widget_set_parent (self->grid, GTK_WIDGET (self));

  self->acc_name = name_label (_("Accumulator fitted"));
  self->acc_switch = GTK_SWITCH (gtk_switch_new ());
  gtk_widget_set_halign (GTK_WIDGET (self->acc_switch), GTK_ALIGN_START);
  gtk_accessible_update_property (GTK_ACCESSIBLE (self->acc_switch),
                                  GTK_ACCESSIBLE_PROPERTY_LABEL, _("Accumulator fitted"), -1);
  gtk_widget_set_tooltip_text (
    GTK_WIDGET (self->acc_switch),
    /* xgettext:no-c-format */
    _("Off takes the accumulator out. On a layout without one, on fits one at the node that "
      "feeds the applicators, sized to give one shot of every applicator while the pressure "
      "there falls to 90 % of idle (common practice, no source), with the precharge set "
      "below."));
  g_signal_connect (self->acc_switch, "state-set", G_CALLBACK (acc_state_set_cb), self);
  for (guint c = 0; c < N_CONTROLS; c++)
    {
      double lo = to_slider (c, controls[c].lo), hi = to_slider (c, controls[c].hi);
      GtkWidget *scale = gtk_scale_new_with_range (GTK_ORIENTATION_HORIZONTAL, lo, hi,
                                                   (hi - lo) / 200.0);

      if (controls[c].target == TARGET_ACCUMULATOR)
        {
          gtk_grid_attach (grid, self->acc_name, 0, (int) row, 1, 1);
          gtk_grid_attach (grid, GTK_WIDGET (self->acc_switch), 1, (int) row, 2, 1);
          row++;
        }
      self->names[c] = name_label (_(controls[c].label));
      self->scales[c] = GTK_RANGE (scale);
      gtk_scale_set_draw_value (GTK_SCALE (scale), FALSE);
      gtk_widget_set_hexpand (scale, TRUE);
      gtk_widget_set_size_request (scale, 160, -1);
      gtk_accessible_update_property (GTK_ACCESSIBLE (scale), GTK_ACCESSIBLE_PROPERTY_LABEL,
                                      _(controls[c].label), -1);
      g_signal_connect (scale, "value-changed", G_CALLBACK (value_changed_cb), self);
      self->values[c] = name_label ("–");
      gtk_label_set_width_chars (GTK_LABEL (self->values[c]), 9);
      gtk_widget_add_css_class (self->values[c], "numeric");
      gtk_grid_attach (grid, self->names[c], 0, (int) row, 1, 1);
      gtk_grid_attach (grid, scale, 1, (int) row, 1, 1);
      gtk_grid_attach (grid, self->values[c], 2, (int) row, 1, 1);
      row++;
    }
  self->message = name_label ("");
  gtk_label_set_wrap (GTK_LABEL (self->message), TRUE);
  gtk_label_set_max_width_chars (GTK_LABEL (self->message), 40);
  gtk_widget_add_css_class (self->message, "error");
  gtk_widget_set_visible (self->message, FALSE);
  gtk_grid_attach (grid, self->message, 0, (int) row++, 3, 1);
  self->fit_note = name_label ("");
  gtk_label_set_wrap (GTK_LABEL (self->fit_note), TRUE);
  gtk_label_set_max_width_chars (GTK_LABEL (self->fit_note), 40);
  gtk_widget_add_css_class (self->fit_note, "dim-label");
  gtk_widget_set_visible (self->fit_note, FALSE);
  gtk_grid_attach (grid, self->fit_note, 0, (int) row, 3, 1);
  refresh (self);
}

GtkWidget *
pl_what_if_new (void)
{
  return g_object_new (PL_TYPE_WHAT_IF, NULL);
}

void
pl_what_if_set_document (PlWhatIf *self, PlDocument *doc, PlUndoStack *undo)
{
  g_return_if_fail (PL_IS_WHAT_IF (self));
  if (self->doc != NULL)
    g_clear_signal_handler (&self->changed_id, self->doc);
  g_set_object (&self->doc, doc);
  g_set_object (&self->undo, undo);
  if (doc != NULL)
    self->changed_id = g_signal_connect (doc, "changed", G_CALLBACK (doc_changed_cb), self);
  for (guint c = 0; c < N_CONTROLS; c++)
    self->last_change[c] = 0;
  if (gtk_widget_get_parent (self->grid) != NULL)
    refresh (self);
}

void
pl_what_if_set_scheduler (PlWhatIf *self, PlSolveScheduler *scheduler)
{
  g_return_if_fail (PL_IS_WHAT_IF (self));
  g_set_object (&self->scheduler, scheduler);
  if (gtk_widget_get_parent (self->grid) != NULL)
    refresh (self);
}

const char *
pl_what_if_get_fit_note (PlWhatIf *self)
{
  g_return_val_if_fail (PL_IS_WHAT_IF (self), "");
  return gtk_widget_get_visible (self->fit_note) ? gtk_label_get_text (GTK_LABEL (self->fit_note))
                                                 : "";
}

void
pl_what_if_set_units (PlWhatIf *self, const PlUnitPrefs *units)
{
  g_return_if_fail (PL_IS_WHAT_IF (self) && units != NULL);
  self->units = *units;
  refresh (self);
}

GtkRange *
pl_what_if_get_control (PlWhatIf *self, const char *key)
{
  g_return_val_if_fail (PL_IS_WHAT_IF (self), NULL);
  for (guint c = 0; c < N_CONTROLS; c++)
    if (g_strcmp0 (controls[c].key, key) == 0)
      return self->scales[c];
  return NULL;
}

GtkSwitch *
pl_what_if_get_accumulator_switch (PlWhatIf *self)
{
  g_return_val_if_fail (PL_IS_WHAT_IF (self), NULL);
  return self->acc_switch;
}

const char *
pl_what_if_get_message (PlWhatIf *self)
{
  g_return_val_if_fail (PL_IS_WHAT_IF (self), "");
  return gtk_label_get_text (GTK_LABEL (self->message));
}
