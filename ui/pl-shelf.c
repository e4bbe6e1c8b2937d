/* SPDX-License-Identifier: GPL-3.0-or-later */

#include "config.h"

#include "pl-shelf.h"

#include <glib/gi18n.h>

#include "pl-part-type.h"
#include "pl-render.h"

/* Symbol size on the shelf, px: big enough to tell a tee from a valve at a
 * glance, small enough that all ten types fit an 800 px window. */
#define ICON_PX 36

struct _PlShelf
{
  GtkWidget parent_instance;

  GtkWidget *scroller;
  GtkListBox *list;
  GPtrArray *icons;            /* GtkDrawingArea, borrowed */
  const PlPartType *armed;
  gboolean updating;
};

enum
{
  SIGNAL_TYPE_ARMED,
  N_SIGNALS
};

static guint signals[N_SIGNALS];

G_DEFINE_FINAL_TYPE (PlShelf, pl_shelf, GTK_TYPE_WIDGET)

static gboolean
pl_shelf_is_dark (GtkWidget *widget)
{
  GtkSettings *settings = gtk_widget_get_settings (widget);
  gboolean dark = FALSE;
  g_autofree char *theme = NULL;

  g_object_get (settings, "gtk-application-prefer-dark-theme", &dark,
                "gtk-theme-name", &theme, NULL);
  return dark || (theme != NULL && g_str_has_suffix (theme, "-dark"));
}

static void
pl_shelf_draw_icon (GtkDrawingArea *area,
                    cairo_t        *cr,
                    int             width,
                    int             height,
                    gpointer        user_data)
{
  const PlPartType *type = user_data;
  double size = MIN (width, height);

  cairo_translate (cr, (width - size) / 2, (height - size) / 2);
  pl_render_type_icon (cr, type, size,
                       pl_shelf_is_dark (GTK_WIDGET (area)) ? PL_RENDER_STYLE_DARK
                                                            : PL_RENDER_STYLE_LIGHT);
}

static GdkContentProvider *
pl_shelf_drag_prepare_cb (GtkDragSource *source,
                          double         x,
                          double         y,
                          gpointer       user_data)
{
  const PlPartType *type = user_data;
  GtkWidget *row = gtk_event_controller_get_widget (GTK_EVENT_CONTROLLER (source));
  GtkWidget *icon = g_object_get_data (G_OBJECT (row), "pl-icon");
  g_autoptr (GdkPaintable) paintable = gtk_widget_paintable_new (icon);

  gtk_drag_source_set_icon (source, paintable, ICON_PX / 2, ICON_PX / 2);
  return gdk_content_provider_new_typed (G_TYPE_STRING, type->key);
}

static void
pl_shelf_set_armed (PlShelf *self, const PlPartType *type)
{
  if (type == self->armed)
    return;
  self->armed = type;
  self->updating = TRUE;
  if (type == NULL)
    gtk_list_box_unselect_all (self->list);
  else
    for (guint i = 0; i < pl_part_type_get_n_placeable (); i++)
      if (pl_part_type_get_placeable (i) == type)
        gtk_list_box_select_row (self->list, gtk_list_box_get_row_at_index (self->list, i));
  self->updating = FALSE;
  g_signal_emit (self, signals[SIGNAL_TYPE_ARMED], 0, type != NULL ? type->key : NULL);
}

static void
pl_shelf_row_activated_cb (GtkListBox    *list,
                           GtkListBoxRow *row,
                           gpointer       user_data)
{
  PlShelf *self = PL_SHELF (user_data);
  int index = gtk_list_box_row_get_index (row);
  const PlPartType *type = pl_part_type_get_placeable (index);

  /* A second click on the armed entry disarms it. */
  pl_shelf_set_armed (self, type == self->armed ? NULL : type);
  if (self->armed == NULL)
    gtk_list_box_unselect_all (self->list);
}

static void
pl_shelf_theme_changed_cb (GtkSettings *settings,
                           GParamSpec  *pspec,
                           gpointer     user_data)
{
  PlShelf *self = PL_SHELF (user_data);

  for (guint i = 0; i < self->icons->len; i++)
    gtk_widget_queue_draw (g_ptr_array_index (self->icons, i));
}

static GtkWidget *
pl_shelf_make_row (const PlPartType *type)
{
  GtkWidget *row = gtk_list_box_row_new ();
  GtkWidget *box = gtk_box_new (GTK_ORIENTATION_HORIZONTAL, 8);
  GtkWidget *icon = gtk_drawing_area_new ();
  GtkWidget *label = gtk_label_new (_(type->name));
  GtkDragSource *source = gtk_drag_source_new ();
  g_autofree char *tip = g_strdup_printf (_("%s — click, then click on the drawing, or "
                                            "drag it there"), _(type->description));

  gtk_drawing_area_set_content_width (GTK_DRAWING_AREA (icon), ICON_PX);
  gtk_drawing_area_set_content_height (GTK_DRAWING_AREA (icon), ICON_PX);
  gtk_drawing_area_set_draw_func (GTK_DRAWING_AREA (icon), pl_shelf_draw_icon,
                                  (gpointer) type, NULL);
  gtk_label_set_xalign (GTK_LABEL (label), 0);
  gtk_box_append (GTK_BOX (box), icon);
  gtk_box_append (GTK_BOX (box), label);
  gtk_widget_add_css_class (box, "pl-shelf-entry");
  gtk_list_box_row_set_child (GTK_LIST_BOX_ROW (row), box);
  gtk_widget_set_tooltip_text (row, tip);
  gtk_accessible_update_property (GTK_ACCESSIBLE (row), GTK_ACCESSIBLE_PROPERTY_LABEL,
                                  _(type->name), GTK_ACCESSIBLE_PROPERTY_DESCRIPTION,
                                  _(type->description), -1);
  g_object_set_data (G_OBJECT (row), "pl-icon", icon);

  gtk_drag_source_set_actions (source, GDK_ACTION_COPY);
  g_signal_connect (source, "prepare", G_CALLBACK (pl_shelf_drag_prepare_cb), (gpointer) type);
  gtk_widget_add_controller (row, GTK_EVENT_CONTROLLER (source));
  return row;
}

static void
pl_shelf_root (GtkWidget *widget)
{
  GTK_WIDGET_CLASS (pl_shelf_parent_class)->root (widget);
  g_signal_connect_object (gtk_widget_get_settings (widget),
                           "notify::gtk-application-prefer-dark-theme",
                           G_CALLBACK (pl_shelf_theme_changed_cb), widget, 0);
}

static void
pl_shelf_unroot (GtkWidget *widget)
{
  g_signal_handlers_disconnect_by_func (gtk_widget_get_settings (widget),
                                        pl_shelf_theme_changed_cb, widget);
  GTK_WIDGET_CLASS (pl_shelf_parent_class)->unroot (widget);
}

static void
pl_shelf_dispose (GObject *object)
{
  PlShelf *self = PL_SHELF (object);

  g_clear_pointer (&self->scroller, gtk_widget_unparent);
  G_OBJECT_CLASS (pl_shelf_parent_class)->dispose (object);
}

static void
pl_shelf_finalize (GObject *object)
{
  g_ptr_array_unref (PL_SHELF (object)->icons);
  G_OBJECT_CLASS (pl_shelf_parent_class)->finalize (object);
}

static void
pl_shelf_class_init (PlShelfClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);

  object_class->dispose = pl_shelf_dispose;
  object_class->finalize = pl_shelf_finalize;
  widget_class->root = pl_shelf_root;
  widget_class->unroot = pl_shelf_unroot;

  signals[SIGNAL_TYPE_ARMED] =
    g_signal_new ("type-armed", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0, NULL, NULL,
                  NULL, G_TYPE_NONE, 1, G_TYPE_STRING);
  gtk_widget_class_set_layout_manager_type (widget_class, GTK_TYPE_BIN_LAYOUT);
  gtk_widget_class_set_css_name (widget_class, "pl-shelf");
}

static void
pl_shelf_init (PlShelf *self)
{
  self->icons = g_ptr_array_new ();
  self->scroller = gtk_scrolled_window_new ();
  gtk_scrolled_window_set_policy (GTK_SCROLLED_WINDOW (self->scroller), GTK_POLICY_NEVER,
                                  GTK_POLICY_AUTOMATIC);
  gtk_widget_set_parent (self->scroller, GTK_WIDGET (self));
  self->list = GTK_LIST_BOX (gtk_list_box_new ());
  gtk_list_box_set_selection_mode (self->list, GTK_SELECTION_SINGLE);
  gtk_widget_add_css_class (GTK_WIDGET (self->list), "navigation-sidebar");
  gtk_accessible_update_property (GTK_ACCESSIBLE (self->list), GTK_ACCESSIBLE_PROPERTY_LABEL,
                                  _("Parts shelf"), -1);
  gtk_scrolled_window_set_child (GTK_SCROLLED_WINDOW (self->scroller),
                                 GTK_WIDGET (self->list));
  for (guint i = 0; i < pl_part_type_get_n_placeable (); i++)
    {
      GtkWidget *row = pl_shelf_make_row (pl_part_type_get_placeable (i));
      g_ptr_array_add (self->icons, g_object_get_data (G_OBJECT (row), "pl-icon"));
      gtk_list_box_append (self->list, row);
    }
  g_signal_connect (self->list, "row-activated", G_CALLBACK (pl_shelf_row_activated_cb),
                    self);
}

GtkWidget *
pl_shelf_new (void)
{
  return g_object_new (PL_TYPE_SHELF, NULL);
}

gboolean
pl_shelf_arm (PlShelf    *self,
              const char *type_key)
{
  const PlPartType *type = NULL;

  g_return_val_if_fail (PL_IS_SHELF (self), FALSE);
  if (type_key != NULL)
    {
      type = pl_part_type_lookup (type_key);
      if (type == NULL || !type->placeable)
        return FALSE;
    }
  pl_shelf_set_armed (self, type);
  return TRUE;
}

const char *
pl_shelf_get_armed (PlShelf *self)
{
  g_return_val_if_fail (PL_IS_SHELF (self), NULL);
  return self->armed != NULL ? self->armed->key : NULL;
}

guint
pl_shelf_get_n_entries (PlShelf *self)
{
  g_return_val_if_fail (PL_IS_SHELF (self), 0);
  return self->icons->len;
}
