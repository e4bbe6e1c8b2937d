/* SPDX-License-Identifier: GPL-3.0-or-later */

#include "config.h"

#include "pl-param-row.h"

#include <glib/gi18n.h>
#include <math.h>

#include "pl-command.h"

/* Spin steps closer together than this are one run: the arrows' step stays
 * as it was when the run began (holding an arrow repeats far faster). */
#define PL_PARAM_ROW_MERGE_USEC (800 * G_TIME_SPAN_MILLISECOND)

/* The spin button's range is left wide open: the spec's check refuses with
 * a sentence, where a clamped range would change the value silently. */
#define PL_PARAM_ROW_SPIN_LIMIT 1e15

struct _PlParamRow
{
  GtkBox parent_instance;

  PlDocument *doc;
  PlUndoStack *undo;
  PlUnitPrefs prefs;
  char *item_id;
  const PlParamSpec *spec;   /* NULL: the part's tag */
  PlUnitId unit;             /* numbers: the unit shown */

  GtkWidget *label;
  GtkWidget *editor;
  GtkWidget *unit_label;
  GtkWidget *reason;
  GtkStringList *choices;    /* drop-downs */

  char *reason_text;
  gboolean syncing;          /* the row itself sets the editor: no commands */
  gboolean keep_text;        /* a refused typed value stays in the field */
  gboolean have_pending;     /* the spin's value came from typed text ... */
  double pending_si;         /* ... which read as this (exactly, no round trip) */
  double pending_shown;      /* ... and is shown as this */
  gboolean have_shown;
  PlValue shown;             /* what the row last took from the document */
  gint64 last_spin_push;     /* monotonic time of the last spin push */
};

G_DEFINE_FINAL_TYPE (PlParamRow, pl_param_row, GTK_TYPE_BOX)


static const PlPart *
pl_param_row_get_part (PlParamRow *self)
{
  return pl_document_find_part (self->doc, self->item_id);
}

static void
pl_param_row_set_reason (PlParamRow *self, const char *reason)
{
  GtkAccessibleInvalidState invalid = reason != NULL ? GTK_ACCESSIBLE_INVALID_TRUE
                                      : GTK_ACCESSIBLE_INVALID_FALSE;

  g_free (self->reason_text);
  self->reason_text = g_strdup (reason);
  gtk_label_set_text (GTK_LABEL (self->reason), reason != NULL ? reason : "");
  gtk_widget_set_visible (self->reason, reason != NULL);
  if (reason != NULL)
    gtk_widget_add_css_class (self->editor, "error");
  else
    gtk_widget_remove_css_class (self->editor, "error");
  gtk_accessible_update_state (GTK_ACCESSIBLE (self->editor),
                               GTK_ACCESSIBLE_STATE_INVALID, invalid, -1);
}

/* A step of about a tenth of the value's leading digit, so the arrows move
 * a bore of 9.5 mm by 0.1 mm and a pressure of 250 bar by 10 bar. */
static void
pl_param_row_update_step (PlParamRow *self, double shown)
{
  double step = 1.0;

  if (shown != 0.0 && isfinite (shown))
    step = pow (10.0, floor (log10 (fabs (shown))) - 1.0);
  gtk_spin_button_set_increments (GTK_SPIN_BUTTON (self->editor), step, 10.0 * step);
}

/* --- pushing commands --- */

static gboolean
pl_param_row_push (PlParamRow *self, PlCommand *cmd, gboolean merge)
{
  g_autoptr (GError) error = NULL;
  gboolean ok;

  ok = merge ? pl_undo_stack_push_merge (self->undo, cmd, &error)
       : pl_undo_stack_push (self->undo, cmd, &error);
  pl_command_unref (cmd);
  if (!ok)
    {
      pl_param_row_set_reason (self, error->message);
      return FALSE;
    }
  pl_param_row_set_reason (self, NULL);
  /* Also right when no inspector relays the document's "changed". */
  pl_param_row_sync (self);
  return TRUE;
}

static gboolean
pl_param_row_push_number (PlParamRow *self, double si, gboolean from_spin)
{
  g_autoptr (GError) error = NULL;
  const PlPart *part = pl_param_row_get_part (self);
  gint64 now = g_get_monotonic_time ();

  if (part == NULL)
    return FALSE;
  /* Checked here for the sentence in the user's units; the command checks
   * again (in SI) and has the last word. */
  if (!pl_param_spec_check_number (self->spec, si, &self->prefs, &error))
    {
      pl_param_row_set_reason (self, error->message);
      return FALSE;
    }
  if (pl_part_get_number (part, self->spec->key) == si)
    {
      pl_param_row_set_reason (self, NULL);
      return TRUE;
    }
  /* Spin steps fold into the step before them when that was a spin step
   * of the same field with nothing done in between (pl_undo_stack_push_merge);
   * a typed value is a step of its own and ends such a run. */
  self->last_spin_push = from_spin ? now : 0;
  return pl_param_row_push (self, pl_command_new_set_number (self->item_id, self->spec->key,
                                                             si),
                            from_spin);
}

/* --- spin button (numbers) --- */

static int
spin_input_cb (GtkSpinButton *spin, double *new_value, PlParamRow *self)
{
  g_autoptr (GError) error = NULL;
  const char *text = gtk_editable_get_text (GTK_EDITABLE (spin));
  double si = 0.0;

  if (self->syncing)
    return FALSE;
  if (!pl_unit_parse (text, self->spec->quantity, &self->prefs, PL_UNIT_DECIMAL_FROM_LOCALE,
                      &si, &error))
    {
      pl_param_row_set_reason (self, error->message);
      /* The spin button now re-shows its old value; the typed text stays
       * so the user can mend it (spin_output_cb). */
      self->keep_text = TRUE;
      self->have_pending = FALSE;
      return GTK_INPUT_ERROR;
    }
  self->have_pending = TRUE;
  self->pending_si = si;
  self->pending_shown = pl_unit_from_si (self->unit, si);
  *new_value = self->pending_shown;
  return TRUE;
}

static gboolean
spin_output_cb (GtkSpinButton *spin, PlParamRow *self)
{
  g_autofree char *text = NULL;
  double shown = gtk_spin_button_get_value (spin);

  if (self->keep_text)
    return TRUE;
  text = pl_unit_format_number_in (pl_unit_to_si (self->unit, shown), self->unit, 6,
                                   PL_UNIT_DECIMAL_FROM_LOCALE);
  if (g_strcmp0 (text, gtk_editable_get_text (GTK_EDITABLE (spin))) != 0)
    gtk_editable_set_text (GTK_EDITABLE (spin), text);
  return TRUE;
}

static void
spin_value_changed_cb (GtkSpinButton *spin, PlParamRow *self)
{
  double shown = gtk_spin_button_get_value (spin);
  gboolean typed = self->have_pending && shown == self->pending_shown;
  double si = typed ? self->pending_si : pl_unit_to_si (self->unit, shown);

  self->have_pending = FALSE;
  if (self->syncing)
    return;
  if (self->keep_text)
    {
      /* The spin button's own re-show after refused text: nothing new. */
      self->keep_text = FALSE;
      return;
    }
  pl_param_row_push_number (self, si, !typed);
}

/* --- other editors --- */

static void
dropdown_selected_cb (GtkDropDown *dropdown, GParamSpec *pspec, PlParamRow *self)
{
  guint selected = gtk_drop_down_get_selected (dropdown);
  const PlPart *part = pl_param_row_get_part (self);

  if (self->syncing || part == NULL || selected >= self->spec->n_choices
      || pl_part_get_choice (part, self->spec->key) == selected)
    return;
  pl_param_row_push (self, pl_command_new_set_choice (self->item_id, self->spec->key,
                                                      self->spec->choices[selected].key),
                     FALSE);
}

static void
switch_active_cb (GtkSwitch *sw, GParamSpec *pspec, PlParamRow *self)
{
  gboolean active = gtk_switch_get_active (sw);
  const PlPart *part = pl_param_row_get_part (self);

  if (self->syncing || part == NULL || pl_part_get_boolean (part, self->spec->key) == active)
    return;
  pl_param_row_push (self, pl_command_new_set_boolean (self->item_id, self->spec->key, active),
                     FALSE);
}

static void
entry_activate_cb (GtkEntry *entry, PlParamRow *self)
{
  pl_param_row_commit_text (self, gtk_editable_get_text (GTK_EDITABLE (entry)));
}

static void
entry_focus_leave_cb (GtkEventControllerFocus *focus, PlParamRow *self)
{
  const PlPart *part = pl_param_row_get_part (self);
  const char *text = gtk_editable_get_text (GTK_EDITABLE (self->editor));
  const char *now;

  if (part == NULL)
    return;
  now = self->spec == NULL ? pl_part_get_tag (part) : pl_part_get_text (part, self->spec->key);
  if (g_strcmp0 (text, now) != 0)
    pl_param_row_commit_text (self, text);
}

/* --- building --- */

static GtkWidget *
pl_param_row_make_editor (PlParamRow *self)
{
  const PlParamSpec *spec = self->spec;
  GtkWidget *editor = NULL;

  if (spec == NULL || spec->kind == PL_PARAM_TEXT)
    {
      GtkEventController *focus = gtk_event_controller_focus_new ();

      editor = gtk_entry_new ();
      gtk_editable_set_width_chars (GTK_EDITABLE (editor), 12);
      g_signal_connect (editor, "activate", G_CALLBACK (entry_activate_cb), self);
      g_signal_connect (focus, "leave", G_CALLBACK (entry_focus_leave_cb), self);
      gtk_widget_add_controller (editor, focus);
      return editor;
    }
  switch (spec->kind)
    {
    case PL_PARAM_NUMBER:
      {
        GtkAdjustment *adj = gtk_adjustment_new (0.0, -PL_PARAM_ROW_SPIN_LIMIT,
                                                 PL_PARAM_ROW_SPIN_LIMIT, 1.0, 10.0, 0.0);

        editor = gtk_spin_button_new (adj, 1.0, 6);
        gtk_spin_button_set_numeric (GTK_SPIN_BUTTON (editor), FALSE);
        gtk_spin_button_set_update_policy (GTK_SPIN_BUTTON (editor), GTK_UPDATE_IF_VALID);
        gtk_editable_set_width_chars (GTK_EDITABLE (editor), 8);
        g_signal_connect (editor, "input", G_CALLBACK (spin_input_cb), self);
        g_signal_connect (editor, "output", G_CALLBACK (spin_output_cb), self);
        g_signal_connect (editor, "value-changed", G_CALLBACK (spin_value_changed_cb), self);
      }
      break;
    case PL_PARAM_CHOICE:
      self->choices = gtk_string_list_new (NULL);
      for (guint i = 0; i < spec->n_choices; i++)
        gtk_string_list_append (self->choices, _(spec->choices[i].label));
      editor = gtk_drop_down_new (G_LIST_MODEL (g_object_ref (self->choices)), NULL);
      g_signal_connect (editor, "notify::selected", G_CALLBACK (dropdown_selected_cb), self);
      break;
    case PL_PARAM_BOOLEAN:
      editor = gtk_switch_new ();
      gtk_widget_set_valign (editor, GTK_ALIGN_CENTER);
      g_signal_connect (editor, "notify::active", G_CALLBACK (switch_active_cb), self);
      break;
    case PL_PARAM_TEXT:
    default:
      g_assert_not_reached ();
    }
  return editor;
}

/* --- GObject --- */

static void
pl_param_row_dispose (GObject *object)
{
  PlParamRow *self = PL_PARAM_ROW (object);

  g_clear_object (&self->doc);
  g_clear_object (&self->undo);
  g_clear_object (&self->choices);
  G_OBJECT_CLASS (pl_param_row_parent_class)->dispose (object);
}

static void
pl_param_row_finalize (GObject *object)
{
  PlParamRow *self = PL_PARAM_ROW (object);

  g_free (self->item_id);
  g_free (self->reason_text);
  if (self->have_shown)
    pl_value_clear (&self->shown);
  G_OBJECT_CLASS (pl_param_row_parent_class)->finalize (object);
}

static void
pl_param_row_class_init (PlParamRowClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);

  object_class->dispose = pl_param_row_dispose;
  object_class->finalize = pl_param_row_finalize;
  gtk_widget_class_set_css_name (GTK_WIDGET_CLASS (klass), "plparamrow");
}

static void
pl_param_row_init (PlParamRow *self)
{
  gtk_orientable_set_orientation (GTK_ORIENTABLE (self), GTK_ORIENTATION_VERTICAL);
  gtk_box_set_spacing (GTK_BOX (self), 2);
}

/* --- public --- */

GtkWidget *
pl_param_row_new (PlDocument *doc, PlUndoStack *undo, const PlUnitPrefs *prefs,
                  const char *item_id, const PlParamSpec *spec)
{
  PlParamRow *self;
  GtkWidget *line;
  const char *label;
  g_autofree char *unit_name = NULL;

  g_return_val_if_fail (PL_IS_DOCUMENT (doc), NULL);
  g_return_val_if_fail (PL_IS_UNDO_STACK (undo), NULL);
  g_return_val_if_fail (item_id != NULL, NULL);

  self = g_object_new (PL_TYPE_PARAM_ROW, NULL);
  self->doc = g_object_ref (doc);
  self->undo = g_object_ref (undo);
  if (prefs != NULL)
    self->prefs = *prefs;
  else
    pl_unit_prefs_init (&self->prefs, PL_UNIT_SYSTEM_SI);
  self->item_id = g_strdup (item_id);
  self->spec = spec;

  line = gtk_box_new (GTK_ORIENTATION_HORIZONTAL, 6);
  label = spec != NULL ? _(spec->label) : _("Tag");
  self->label = gtk_label_new (label);
  gtk_label_set_xalign (GTK_LABEL (self->label), 0.0);
  /* Long labels wrap rather than lose their end ("Rated working
   * pressure"), between words only: room for the longest word of a label
   * ("temperature", "coefficient") keeps a narrow inspector from splitting
   * one in the middle. */
  gtk_label_set_wrap (GTK_LABEL (self->label), TRUE);
  gtk_label_set_wrap_mode (GTK_LABEL (self->label), PANGO_WRAP_WORD);
  gtk_label_set_width_chars (GTK_LABEL (self->label), 12);
  gtk_label_set_max_width_chars (GTK_LABEL (self->label), 18);
  gtk_widget_set_hexpand (self->label, TRUE);
  gtk_box_append (GTK_BOX (line), self->label);

  self->editor = pl_param_row_make_editor (self);
  gtk_box_append (GTK_BOX (line), self->editor);

  self->unit_label = gtk_label_new ("");
  gtk_label_set_xalign (GTK_LABEL (self->unit_label), 0.0);
  /* Wide enough for "mL/(m·bar)", so editors line up down the panel. */
  gtk_label_set_width_chars (GTK_LABEL (self->unit_label), 10);
  gtk_widget_add_css_class (self->unit_label, "dim-label");
  gtk_box_append (GTK_BOX (line), self->unit_label);
  if (spec != NULL && spec->kind == PL_PARAM_NUMBER)
    {
      const PlUnit *u;

      self->unit = pl_unit_prefs_get_unit (&self->prefs, spec->quantity);
      u = pl_unit_get (self->unit);
      gtk_label_set_text (GTK_LABEL (self->unit_label), u != NULL ? u->symbol : "");
      if (u != NULL)
        unit_name = g_strdup (_(u->name));
    }
  gtk_box_append (GTK_BOX (self), line);

  self->reason = gtk_label_new ("");
  gtk_label_set_xalign (GTK_LABEL (self->reason), 0.0);
  gtk_label_set_wrap (GTK_LABEL (self->reason), TRUE);
  gtk_label_set_max_width_chars (GTK_LABEL (self->reason), 36);
  gtk_widget_add_css_class (self->reason, "error");
  gtk_widget_add_css_class (self->reason, "pl-reason");
  gtk_widget_set_visible (self->reason, FALSE);
  gtk_box_append (GTK_BOX (self), self->reason);

  /* Tooltip: the spec's help and, for numbers, the units it accepts. */
  {
    g_autoptr (GString) tip = g_string_new (spec != NULL && spec->help != NULL
                                            ? _(spec->help)
                                            : _("Name of the part on the drawing; unique."));

    if (spec != NULL && spec->kind == PL_PARAM_NUMBER)
      {
        g_autofree char *units = pl_quantity_list_units (spec->quantity);

        g_string_append_c (tip, '\n');
        /* Translators: %s is a list of unit symbols, "m, cm, mm, in". */
        g_string_append_printf (tip, _("Type a value with any of: %s"), units);
      }
    gtk_widget_set_tooltip_text (self->editor, tip->str);
    gtk_widget_set_tooltip_text (self->label, tip->str);
  }
  {
    g_autofree char *name = unit_name != NULL ? g_strdup_printf ("%s (%s)", label, unit_name)
                            : g_strdup (label);

    gtk_accessible_update_property (GTK_ACCESSIBLE (self->editor),
                                    GTK_ACCESSIBLE_PROPERTY_LABEL, name, -1);
  }
  gtk_accessible_update_relation (GTK_ACCESSIBLE (self->editor),
                                  GTK_ACCESSIBLE_RELATION_DESCRIBED_BY, self->reason, NULL,
                                  -1);
  pl_param_row_sync (self);
  return GTK_WIDGET (self);
}

const PlParamSpec *
pl_param_row_get_spec (PlParamRow *self)
{
  g_return_val_if_fail (PL_IS_PARAM_ROW (self), NULL);
  return self->spec;
}

const char *
pl_param_row_get_item_id (PlParamRow *self)
{
  g_return_val_if_fail (PL_IS_PARAM_ROW (self), NULL);
  return self->item_id;
}

GtkWidget *
pl_param_row_get_editor (PlParamRow *self)
{
  g_return_val_if_fail (PL_IS_PARAM_ROW (self), NULL);
  return self->editor;
}

const char *
pl_param_row_get_reason (PlParamRow *self)
{
  g_return_val_if_fail (PL_IS_PARAM_ROW (self), NULL);
  return self->reason_text;
}

void
pl_param_row_sync (PlParamRow *self)
{
  const PlPart *part;
  PlValue now = { 0 };

  g_return_if_fail (PL_IS_PARAM_ROW (self));

  part = pl_param_row_get_part (self);
  if (part == NULL)
    return;
  if (self->spec == NULL)
    {
      now.kind = PL_PARAM_TEXT;
      now.text = (char *) pl_part_get_tag (part);
    }
  else
    now = *pl_part_get_value (part, self->spec->key);

  /* A refused value stays shown until the document's own value moves; an
   * unchanged one needs nothing (every row is told of every edit, and
   * setting a spin button again costs more than the solve of a small
   * layout). */
  if (self->have_shown && pl_value_equal (&self->shown, &now))
    return;
  if (self->have_shown)
    pl_value_clear (&self->shown);
  pl_value_copy (&now, &self->shown);
  self->have_shown = TRUE;

  self->syncing = TRUE;
  self->keep_text = FALSE;
  pl_param_row_set_reason (self, NULL);
  switch (now.kind)
    {
    case PL_PARAM_NUMBER:
      {
        double shown = pl_unit_from_si (self->unit, now.number);
        GtkSpinButton *spin = GTK_SPIN_BUTTON (self->editor);

        /* Keep the step during a run of spin steps (it would shrink as the
         * value falls past a power of ten and slow the run down). */
        if (g_get_monotonic_time () - self->last_spin_push >= PL_PARAM_ROW_MERGE_USEC)
          pl_param_row_update_step (self, shown);
        if (gtk_spin_button_get_value (spin) != shown)
          gtk_spin_button_set_value (spin, shown);
        spin_output_cb (spin, self);
      }
      break;
    case PL_PARAM_CHOICE:
      gtk_drop_down_set_selected (GTK_DROP_DOWN (self->editor), now.choice);
      break;
    case PL_PARAM_BOOLEAN:
      gtk_switch_set_active (GTK_SWITCH (self->editor), now.boolean);
      break;
    case PL_PARAM_TEXT:
      if (g_strcmp0 (gtk_editable_get_text (GTK_EDITABLE (self->editor)), now.text) != 0)
        gtk_editable_set_text (GTK_EDITABLE (self->editor), now.text);
      break;
    default:
      g_assert_not_reached ();
    }
  self->syncing = FALSE;
}

gboolean
pl_param_row_commit_text (PlParamRow *self, const char *text)
{
  g_return_val_if_fail (PL_IS_PARAM_ROW (self), FALSE);
  g_return_val_if_fail (text != NULL, FALSE);

  if (self->spec == NULL)
    return pl_param_row_push (self, pl_command_new_set_tag (self->item_id, text), FALSE);
  switch (self->spec->kind)
    {
    case PL_PARAM_NUMBER:
      {
        g_autoptr (GError) error = NULL;
        double si = 0.0;

        gtk_editable_set_text (GTK_EDITABLE (self->editor), text);
        if (!pl_unit_parse (text, self->spec->quantity, &self->prefs,
                            PL_UNIT_DECIMAL_FROM_LOCALE, &si, &error))
          {
            pl_param_row_set_reason (self, error->message);
            return FALSE;
          }
        return pl_param_row_push_number (self, si, FALSE);
      }
    case PL_PARAM_TEXT:
      return pl_param_row_push (self, pl_command_new_set_text (self->item_id, self->spec->key,
                                                               text),
                                FALSE);
    case PL_PARAM_CHOICE:
    case PL_PARAM_BOOLEAN:
    default:
      return FALSE;
    }
}
