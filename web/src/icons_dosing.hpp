// Tab icons of the dosing screens, drawn with lines like the others in nav.cpp:
// c is the centre, s half the icon size, col the colour.
#pragma once

#include "imgui.h"

namespace twapp::icons {

void demand(ImDrawList* d, ImVec2 c, float s, ImU32 col);    // a falling trend with readings
void hatchery(ImDrawList* d, ImVec2 c, float s, ImU32 col);  // a pipe with a dosing line into it
void mixes(ImDrawList* d, ImVec2 c, float s, ImU32 col);     // a flask
void plan(ImDrawList* d, ImVec2 c, float s, ImU32 col);      // a calendar page

}  // namespace twapp::icons
