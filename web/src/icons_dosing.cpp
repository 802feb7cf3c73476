#include "icons_dosing.hpp"

namespace twapp::icons {

void demand(ImDrawList* d, ImVec2 c, float s, ImU32 col) {
  const float t = s * 0.16f;
  d->AddLine(ImVec2(c.x - s, c.y - s), ImVec2(c.x - s, c.y + s), col, t);
  d->AddLine(ImVec2(c.x - s, c.y + s), ImVec2(c.x + s, c.y + s), col, t);
  const ImVec2 p[4] = {ImVec2(c.x - s * 0.7f, c.y - s * 0.6f), ImVec2(c.x - s * 0.2f, c.y - s * 0.25f),
                       ImVec2(c.x + s * 0.25f, c.y + s * 0.05f), ImVec2(c.x + s * 0.8f, c.y + s * 0.5f)};
  d->AddPolyline(p, 4, col, 0, t);
  for (const ImVec2& q : p) d->AddCircleFilled(q, s * 0.17f, col);
}

void hatchery(ImDrawList* d, ImVec2 c, float s, ImU32 col) {
  const float t = s * 0.16f;
  d->AddLine(ImVec2(c.x - s, c.y + s * 0.1f), ImVec2(c.x + s, c.y + s * 0.1f), col, t);
  d->AddLine(ImVec2(c.x - s, c.y + s * 0.75f), ImVec2(c.x + s, c.y + s * 0.75f), col, t);
  d->AddLine(ImVec2(c.x, c.y - s), ImVec2(c.x, c.y + s * 0.1f), col, t);
  d->AddTriangleFilled(ImVec2(c.x - s * 0.3f, c.y - s * 0.35f), ImVec2(c.x + s * 0.3f, c.y - s * 0.35f),
                       ImVec2(c.x, c.y + s * 0.05f), col);
  d->AddTriangleFilled(ImVec2(c.x + s * 0.55f, c.y + s * 0.25f), ImVec2(c.x + s * 0.55f, c.y + s * 0.6f),
                       ImVec2(c.x + s * 0.85f, c.y + s * 0.425f), col);
}

void mixes(ImDrawList* d, ImVec2 c, float s, ImU32 col) {
  const float t = s * 0.16f;
  const ImVec2 p[6] = {ImVec2(c.x - s * 0.25f, c.y - s), ImVec2(c.x - s * 0.25f, c.y - s * 0.2f),
                       ImVec2(c.x - s * 0.85f, c.y + s), ImVec2(c.x + s * 0.85f, c.y + s),
                       ImVec2(c.x + s * 0.25f, c.y - s * 0.2f), ImVec2(c.x + s * 0.25f, c.y - s)};
  d->AddPolyline(p, 6, col, 0, t);
  d->AddTriangleFilled(ImVec2(c.x - s * 0.55f, c.y + s * 0.45f), ImVec2(c.x - s * 0.8f, c.y + s * 0.95f),
                       ImVec2(c.x + s * 0.8f, c.y + s * 0.95f), col);
  d->AddTriangleFilled(ImVec2(c.x - s * 0.55f, c.y + s * 0.45f), ImVec2(c.x + s * 0.8f, c.y + s * 0.95f),
                       ImVec2(c.x + s * 0.55f, c.y + s * 0.45f), col);
}

void plan(ImDrawList* d, ImVec2 c, float s, ImU32 col) {
  const float t = s * 0.16f;
  d->AddRect(ImVec2(c.x - s, c.y - s * 0.8f), ImVec2(c.x + s, c.y + s), col, s * 0.15f, 0, t);
  d->AddLine(ImVec2(c.x - s, c.y - s * 0.3f), ImVec2(c.x + s, c.y - s * 0.3f), col, t);
  d->AddLine(ImVec2(c.x - s * 0.5f, c.y - s * 1.05f), ImVec2(c.x - s * 0.5f, c.y - s * 0.6f), col, t);
  d->AddLine(ImVec2(c.x + s * 0.5f, c.y - s * 1.05f), ImVec2(c.x + s * 0.5f, c.y - s * 0.6f), col, t);
  for (int i = 0; i < 3; ++i) {
    for (int j = 0; j < 2; ++j) {
      const ImVec2 q(c.x - s * 0.55f + s * 0.55f * static_cast<float>(i), c.y + s * 0.1f + s * 0.45f * static_cast<float>(j));
      d->AddRectFilled(ImVec2(q.x - s * 0.14f, q.y - s * 0.12f), ImVec2(q.x + s * 0.14f, q.y + s * 0.12f), col);
    }
  }
}

}  // namespace twapp::icons
