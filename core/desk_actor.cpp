#include "core/desk_actor.h"

namespace twinprobe {
namespace {
thread_local std::string tl_actor;
}  // namespace

DeskActorScope::DeskActorScope(std::string member) : previous_(std::move(tl_actor)) { tl_actor = std::move(member); }

DeskActorScope::~DeskActorScope() { tl_actor = std::move(previous_); }

const std::string& DeskActor() { return tl_actor; }

}  // namespace twinprobe
