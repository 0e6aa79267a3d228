// Who is signed in, and what their roles let them see.
import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import { authApi } from '@/api/auth';
import type { SessionUser } from '@shared/schemas/auth';
import type { Role } from '@shared/domain';
import { canSeeMoney, canSeeRetail } from '@shared/domain';
import { ApiError } from '@/api/http';
import { forgetUser, rememberedUser } from '@/offline/session';

export const useSessionStore = defineStore('session', () => {
  const user = ref<SessionUser | null>(null);
  const checked = ref(false);

  async function refresh() {
    try {
      user.value = (await authApi.me()).user;
    } catch (e) {
      // Offline (no answer at all): the person last seen here, so the shop floor opens; the server still decides.
      user.value = e instanceof ApiError && e.status === 0 ? rememberedUser() : null;
    }
    checked.value = true;
  }
  async function login(email: string, password: string) {
    user.value = (await authApi.login(email, password)).user;
    checked.value = true;
  }
  async function logout() {
    try {
      await authApi.logout();
    } finally {
      user.value = null;
      forgetUser();
    }
  }
  function forget() {
    user.value = null;
    forgetUser();
  }
  /** True when the person holds any of the roles (owners hold every right). */
  function can(...roles: Role[]) {
    return !!user.value && user.value.roles.some((r) => r === 'owner' || roles.includes(r));
  }
  const seesMoney = computed(() => !!user.value && canSeeMoney(user.value.roles));
  const seesRetail = computed(() => !!user.value && canSeeRetail(user.value.roles));
  return { user, checked, refresh, login, logout, forget, can, seesMoney, seesRetail };
});
